import type { Page } from "playwright-core";

/** The runs page of one revision (/runs?revisionId=…) with the run launcher (built by runs-server). */
export class RunLauncherPage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(revisionId: string): Promise<void> {
    await this.page.goto(`${this.baseUrl}/runs?revisionId=${encodeURIComponent(revisionId)}`);
    await this.page.getByTestId("run-launcher").waitFor();
  }

  /** Ticks one case, sets the duration, starts the run and waits for the run page it opens; returns the run id. */
  async runOne(caseName: string, durationS: number): Promise<string> {
    const launcher = this.page.getByTestId("run-launcher");
    await launcher.getByLabel(caseName, { exact: true }).check();
    await launcher.getByLabel("Duration (s)").fill(String(durationS));
    await Promise.all([
      this.page.waitForURL(/\/runs\/[0-9a-f-]{36}$/, { timeout: 60_000 }),
      launcher.getByRole("button", { name: /^Run/ }).click(),
    ]);
    return new URL(this.page.url()).pathname.split("/").pop() ?? "";
  }
}
