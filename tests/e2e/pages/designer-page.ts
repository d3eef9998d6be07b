import type { Locator, Page } from "playwright-core";

/** The sequence designer (components/designer/sequence-editor.tsx) on /projects/:id/sequences/:sid. */
export class DesignerPage {
  constructor(
    readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(projectId: string, sequenceId: string, rev?: number): Promise<void> {
    await this.page.goto(`${this.baseUrl}/projects/${projectId}/sequences/${sequenceId}${rev ? `?rev=${rev}` : ""}`);
    await this.waitReady();
  }

  /** The editor is mounted and React Flow has drawn the steps. */
  async waitReady(): Promise<void> {
    await this.editor().waitFor();
    await this.page.locator(".react-flow__node").first().waitFor();
  }

  editor(): Locator {
    return this.page.getByTestId("sequence-editor");
  }

  async isReadOnly(): Promise<boolean> {
    return (await this.editor().getAttribute("data-readonly")) === "true";
  }

  async baseRevision(): Promise<number> {
    return Number(await this.editor().getAttribute("data-base-revision"));
  }

  node(step: string): Locator {
    return this.page.getByTestId(`step-node-${step}`);
  }

  async stepNames(): Promise<string[]> {
    const ids = await this.page.locator("[data-testid^='step-node-']").evaluateAll((els) => els.map((e) => e.getAttribute("data-testid") ?? ""));
    return ids.map((id) => id.replace(/^step-node-/, ""));
  }

  edgeLabel(from: string, to: string): Locator {
    return this.page.getByTestId(`edge-label-${from}-${to}`);
  }

  palette(kind: string): Locator {
    return this.page.getByTestId(`palette-${kind}`);
  }

  /** Add a step from the palette; resolves with its name (the inspector opens on it). */
  async addStep(kind: string): Promise<string> {
    const before = new Set(await this.stepNames());
    await this.palette(kind).click();
    const name = this.page.getByTestId("step-name");
    await name.waitFor();
    const created = (await name.inputValue()).trim();
    if (before.has(created)) throw new Error(`no new step appeared (inspector shows ${created})`);
    return created;
  }

  async autoLayout(): Promise<void> {
    await this.page.getByTestId("auto-layout").click();
    await this.settle();
  }

  /** Wait until the canvas stops moving (layout and zoom-to-fit animate). */
  async settle(): Promise<void> {
    const first = this.page.locator(".react-flow__node").first();
    let last = "";
    for (let i = 0; i < 40; i++) {
      const box = JSON.stringify(await first.boundingBox());
      const viewport = await this.page.locator(".react-flow__viewport").first().getAttribute("style");
      const now = `${box}|${viewport}`;
      if (now === last) return;
      last = now;
      await this.page.waitForTimeout(150);
    }
  }

  /** Drag from a step's port onto another step: the way an engineer draws a transition. */
  async connect(from: string, to: string): Promise<void> {
    await this.settle();
    const handle = this.page.locator(`.react-flow__node[data-id="${from}"] .react-flow__handle[data-handleid="out"]`);
    const source = await handle.boundingBox();
    const target = await this.node(to).boundingBox();
    if (!source || !target) throw new Error(`cannot see ${from}'s port or step ${to}`);
    const mouse = this.page.mouse;
    await mouse.move(source.x + source.width / 2, source.y + source.height / 2);
    await mouse.down();
    await mouse.move(target.x + target.width / 2, target.y + target.height / 2, { steps: 12 });
    await mouse.up();
    await this.edgeLabel(from, to).first().waitFor();
  }

  async selectStep(step: string): Promise<void> {
    await this.node(step).click();
    await this.page.getByTestId("step-form").waitFor();
  }

  async selectTransition(from: string, to: string, nth = 0): Promise<void> {
    await this.edgeLabel(from, to).nth(nth).click();
    await this.page.getByTestId("transition-form").waitFor();
  }

  /** In the inspector of a selected transition: fire it on a timer (setting name or formula, s). */
  async setTimer(key: string): Promise<void> {
    await this.page.getByTestId("trigger-type").selectOption("timer");
    await this.page.getByTestId("timer-key").fill(key);
  }

  async setTarget(step: string): Promise<void> {
    await this.page.getByTestId("transition-target").selectOption(step);
  }

  /** Save with a message; resolves with the new revision number. */
  async save(message: string): Promise<number> {
    await this.page.getByTestId("save-message").fill(message);
    await this.page.getByTestId("save-revision").click();
    const saved = this.page.getByTestId("saved-revision");
    await saved.waitFor();
    return Number(await saved.getAttribute("data-revision"));
  }

  /** Save expecting a refusal; resolves with the status banner's kind (stale, invalid, refused). */
  async saveExpectingRefusal(message: string): Promise<string> {
    await this.page.getByTestId("save-message").fill(message);
    await this.page.getByTestId("save-revision").click();
    const status = this.page.locator("[data-testid='editor-status']:not([data-status='saving'])");
    await status.waitFor();
    return (await status.getAttribute("data-status")) ?? "";
  }

  async openSettings(): Promise<void> {
    await this.page.getByTestId("tab-settings").click();
    await this.page.getByTestId("settings-table").waitFor();
  }

  /** Type a value (units allowed) into a setting's value cell and commit it with Enter. */
  async setSetting(name: string, value: string): Promise<void> {
    const cell = this.page.getByTestId(`setting-value-${name}`);
    await cell.fill(value);
    await cell.press("Enter");
  }

  settingValue(name: string): Promise<string> {
    return this.page.getByTestId(`setting-value-${name}`).inputValue();
  }

  /** Keyboard shortcut, with focus out of any field (a click on the pane would clear the selection). */
  async shortcut(keys: string): Promise<void> {
    await this.page.evaluate(() => (document.activeElement as HTMLElement | null)?.blur());
    await this.page.keyboard.press(keys);
  }

  /** Click steps with Ctrl held: React Flow's multi-selection. */
  async selectSteps(steps: string[]): Promise<void> {
    await this.node(steps[0]).click();
    for (const s of steps.slice(1)) await this.node(s).click({ modifiers: ["Control"] });
  }

  async selectedSteps(): Promise<string[]> {
    return this.page.locator(".react-flow__node.selected").evaluateAll((els) => els.map((e) => e.getAttribute("data-id") ?? ""));
  }

  /** Import a definition file through the file picker. */
  async importFile(name: string, text: string): Promise<string> {
    await this.page.getByTestId("import-file").setInputFiles({ name, mimeType: "application/json", buffer: Buffer.from(text) });
    const status = this.page.getByTestId("editor-status");
    await status.waitFor();
    return (await status.getAttribute("data-status")) ?? "";
  }

  /** Export the definition; resolves with the downloaded file's name and text. */
  async exportFile(): Promise<{ name: string; text: string }> {
    const [download] = await Promise.all([this.page.waitForEvent("download"), this.page.getByTestId("export-json").click()]);
    const stream = await download.createReadStream();
    const chunks: Buffer[] = [];
    for await (const c of stream) chunks.push(c as Buffer);
    return { name: download.suggestedFilename(), text: Buffer.concat(chunks).toString("utf8") };
  }

  async problemCountText(): Promise<string> {
    return (await this.page.getByTestId("problem-count").textContent())?.trim() ?? "";
  }

  // Live preview

  async play(speed?: 1 | 2 | 5): Promise<void> {
    if (speed) await this.page.getByTestId(`preview-speed-${speed}`).click();
    await this.page.getByTestId("preview-play").click();
  }

  async pause(): Promise<void> {
    await this.page.getByTestId("preview-play").click();
  }

  /** The step lit on the canvas (data-active on the node), or null. */
  async activeStep(): Promise<string | null> {
    const lit = this.page.locator("[data-testid^='step-node-'][data-active='true']");
    if ((await lit.count()) === 0) return null;
    return ((await lit.first().getAttribute("data-testid")) ?? "").replace(/^step-node-/, "");
  }

  /**
   * Record, inside the page, every step that lights up from now on (a MutationObserver on the nodes'
   * data-active): polling from the test would miss a 0.1 s pause step.
   */
  async recordLitSteps(): Promise<void> {
    await this.page.evaluate(() => {
      const w = window as unknown as { __litSteps: string[] };
      w.__litSteps = [];
      const root = document.querySelector("[data-testid='sequence-editor']");
      if (!root) throw new Error("no editor");
      new MutationObserver((records) => {
        for (const r of records) {
          const el = r.target as HTMLElement;
          if (el.dataset.active === "true") w.__litSteps.push((el.dataset.testid ?? "").replace(/^step-node-/, ""));
        }
      }).observe(root, { subtree: true, attributes: true, attributeFilter: ["data-active"] });
    });
  }

  async litSteps(): Promise<string[]> {
    return this.page.evaluate(() => (window as unknown as { __litSteps?: string[] }).__litSteps ?? []);
  }

  async previewStats(): Promise<{ fps: number; scans: number; engineMs: number } | null> {
    const el = this.page.getByTestId("preview-stats");
    if ((await el.count()) === 0) return null;
    return {
      fps: Number(await el.getAttribute("data-fps")),
      scans: Number(await el.getAttribute("data-scans")),
      engineMs: Number(await el.getAttribute("data-engine-ms")),
    };
  }
}
