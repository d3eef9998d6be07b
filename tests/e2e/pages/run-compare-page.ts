import type { Locator, Page } from "playwright-core";

/** The run comparison (components/runs/run-compare.tsx) on /runs/compare?a=…&b=…. */
export class RunComparePage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(aId: string, bId: string): Promise<void> {
    await this.page.goto(`${this.baseUrl}/runs/compare?a=${aId}&b=${bId}`);
    await this.page.getByTestId("run-compare").waitFor();
  }

  async waitForOverlay(timeoutMs = 15_000): Promise<void> {
    await this.page.locator('[data-testid="compare-overlay"][data-state="ready"]').waitFor({ timeout: timeoutMs });
    await this.page.waitForFunction(
      () => Number((document.querySelector('[data-testid="compare-chart-paw"]') as HTMLElement | null)?.dataset.draws ?? "0") > 0,
      undefined,
      { timeout: timeoutMs },
    );
  }

  /** Series in the pressure overlay's legend (uPlot), e.g. "A Airway pressure", "B Airway pressure". */
  async pressureSeries(): Promise<string[]> {
    return this.page
      .getByTestId("compare-chart-paw")
      .locator(".u-legend .u-series .u-label")
      .evaluateAll((labels) => labels.map((l) => (l.textContent ?? "").trim()));
  }

  diffRow(key: string): Locator {
    return this.page.getByTestId(`diff-${key}`);
  }

  async diffCells(key: string): Promise<string[]> {
    return this.diffRow(key)
      .locator("th, td")
      .evaluateAll((cells) => cells.map((c) => (c.textContent ?? "").trim()));
  }
}
