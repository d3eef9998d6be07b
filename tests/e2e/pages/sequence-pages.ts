import type { Page } from "playwright-core";

/** The demo project every seeded database has. */
export const DEMO_PROJECT = "Lowtide bag-compressor build";

/** Project lookup through the API, from inside the signed-in page. */
export async function projectIdByName(page: Page, name: string): Promise<string> {
  return page.evaluate(async (projectName) => {
    const res = await fetch("/api/projects");
    const body = (await res.json()) as { projects: Array<{ id: string; name: string }> };
    const p = body.projects.find((x) => x.name === projectName);
    if (!p) throw new Error(`no project named ${projectName}`);
    return p.id;
  }, name);
}

/** /projects/:id/sequences/new: name plus a starting template; lands in the editor on revision 1. */
export class NewSequencePage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async create(projectId: string, name: string, template: string): Promise<string> {
    await this.page.goto(`${this.baseUrl}/projects/${projectId}/sequences/new?template=${template}`);
    await this.page.getByLabel("Name").fill(name);
    await Promise.all([
      this.page.waitForURL(/\/sequences\/[0-9a-f-]{36}$/),
      this.page.getByRole("button", { name: "Create sequence" }).click(),
    ]);
    return new URL(this.page.url()).pathname.split("/").pop() ?? "";
  }
}

/** /projects/:id/sequences/:sid/history: the revision list and the compare button. */
export class HistoryPage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(projectId: string, sequenceId: string): Promise<void> {
    await this.page.goto(`${this.baseUrl}/projects/${projectId}/sequences/${sequenceId}/history`);
    await this.page.getByTestId("revision-row").first().waitFor();
  }

  async revisions(): Promise<Array<{ number: number; message: string }>> {
    const rows = this.page.getByTestId("revision-row");
    const out: Array<{ number: number; message: string }> = [];
    for (let i = 0; i < (await rows.count()); i++) {
      const cells = rows.nth(i).locator("td");
      out.push({
        number: Number(((await cells.nth(1).textContent()) ?? "").match(/r(\d+)/)?.[1]),
        message: ((await cells.nth(2).textContent()) ?? "").trim(),
      });
    }
    return out;
  }

  /** Compare the two ticked revisions (the newest two by default). */
  async compareTicked(): Promise<void> {
    await Promise.all([this.page.waitForURL(/\/compare\?a=\d+&b=\d+/), this.page.getByTestId("compare-revisions").click()]);
    await this.page.getByTestId("revision-compare").waitFor();
  }
}

/** The side-by-side compare (components/designer/revision-compare.tsx). */
export class ComparePage {
  constructor(private readonly page: Page) {}

  async differences(): Promise<Array<{ kind: string; text: string }>> {
    const items = this.page.getByTestId("diff-item");
    await items.first().waitFor();
    const out: Array<{ kind: string; text: string }> = [];
    for (let i = 0; i < (await items.count()); i++) {
      out.push({ kind: (await items.nth(i).getAttribute("data-diff")) ?? "", text: ((await items.nth(i).textContent()) ?? "").trim() });
    }
    return out;
  }

  /** Steps drawn with a diff mark on one side ("a" older, "b" newer). */
  async markedSteps(side: "a" | "b"): Promise<Record<string, string>> {
    const canvas = this.page.getByTestId(`compare-canvas-${side}`);
    await canvas.locator(".react-flow__node").first().waitFor();
    return canvas.locator("[data-testid^='step-node-'][data-diff]").evaluateAll((els) =>
      Object.fromEntries(els.map((e) => [(e.getAttribute("data-testid") ?? "").replace(/^step-node-/, ""), e.getAttribute("data-diff") ?? ""])),
    );
  }
}
