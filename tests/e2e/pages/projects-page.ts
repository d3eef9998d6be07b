import type { Page } from "playwright-core";

export class ProjectsPage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/projects`);
    await this.page.getByRole("heading", { name: "Projects", level: 1 }).waitFor();
  }

  /** The "New project" control (absent for roles that cannot create). */
  newProjectControl() {
    return this.page.getByRole("link", { name: "New project" });
  }

  async projectNames(): Promise<string[]> {
    const list = this.page.getByRole("list", { name: "Projects" });
    await list.waitFor();
    return (await list.getByRole("heading").allTextContents()).map((s) => s.trim());
  }

  /** Create through the form; resolves on the new project's page. */
  async createProject(name: string, description = ""): Promise<void> {
    await this.newProjectControl().click();
    await this.page.getByLabel("Name").fill(name);
    if (description) await this.page.getByLabel("Description").fill(description);
    await Promise.all([
      this.page.waitForURL(/\/projects\/[0-9a-f-]{36}$/),
      this.page.getByRole("button", { name: "Create project" }).click(),
    ]);
    await this.page.getByTestId("project-name").waitFor();
  }

  /** POST /api/projects from inside the page (same origin, the page's session cookie). */
  async createViaApi(name: string): Promise<{ status: number; body: unknown }> {
    return this.page.evaluate(async (projectName) => {
      const res = await fetch("/api/projects", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ name: projectName, description: "" }),
      });
      return { status: res.status, body: (await res.json()) as unknown };
    }, name);
  }
}
