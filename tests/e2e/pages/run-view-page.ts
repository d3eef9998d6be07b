import type { Download, Locator, Page } from "playwright-core";

export const CHART_SIGNALS = ["paw", "flow", "volume", "pmus"] as const;
export type ChartSignal = (typeof CHART_SIGNALS)[number];

export interface ChartState {
  draws: number;
  points: number;
  xMin: number;
  xMax: number;
  /** Canvas pixels that are not blank, sampled over the plot. */
  inkedPixels: number;
}

/** The run view (components/runs/run-view.tsx) on /runs/:id. */
export class RunViewPage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(runId: string): Promise<void> {
    await this.page.goto(`${this.baseUrl}/runs/${runId}`);
    await this.view().waitFor();
  }

  view(): Locator {
    return this.page.getByTestId("run-view");
  }

  charts(): Locator {
    return this.page.getByTestId("waveform-charts");
  }

  async waitForDone(timeoutMs = 60_000): Promise<void> {
    await this.page.locator('[data-testid="run-view"][data-status="done"]').waitFor({ timeout: timeoutMs });
  }

  /** Waits until the charts show the window they asked for (not a placeholder). */
  async waitForChartsReady(timeoutMs = 15_000): Promise<void> {
    await this.page.locator('[data-testid="waveform-charts"][data-state="ready"]').waitFor({ timeout: timeoutMs });
    await this.page.waitForFunction(
      () => Number((document.querySelector('[data-testid="chart-paw"]') as HTMLElement | null)?.dataset.draws ?? "0") > 0,
      undefined,
      { timeout: timeoutMs },
    );
  }

  async window(): Promise<{ from: number; to: number; loadedFrom: number; loadedTo: number }> {
    return this.charts().evaluate((el) => {
      const d = (el as HTMLElement).dataset;
      return { from: Number(d.from), to: Number(d.to), loadedFrom: Number(d.loadedFrom), loadedTo: Number(d.loadedTo) };
    });
  }

  async chart(signal: ChartSignal): Promise<ChartState> {
    return this.page.getByTestId(`chart-${signal}`).evaluate((el) => {
      const d = (el as HTMLElement).dataset;
      const canvas = el.querySelector("canvas");
      let inked = 0;
      const ctx = canvas?.getContext("2d");
      if (canvas && ctx) {
        const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
        for (let i = 3; i < data.length; i += 4 * 7) if (data[i] > 0) inked += 1;
      }
      return { draws: Number(d.draws ?? 0), points: Number(d.points ?? 0), xMin: Number(d.xMin), xMax: Number(d.xMax), inkedPixels: inked };
    });
  }

  /** Drags across the airway-pressure chart from time `from` to time `to` (s), as a person zooms in. */
  async dragZoom(from: number, to: number): Promise<void> {
    const state = await this.chart("paw");
    const over = await this.page.getByTestId("chart-paw").locator(".u-over").boundingBox();
    if (!over) throw new Error("the pressure chart has no plot area");
    const x = (t: number) => over.x + ((t - state.xMin) / (state.xMax - state.xMin)) * over.width;
    const y = over.y + over.height / 2;
    await this.page.mouse.move(x(from), y);
    await this.page.mouse.down();
    await this.page.mouse.move(x(to), y + 5, { steps: 8 });
    await this.page.mouse.up();
  }

  breathRows(): Locator {
    return this.page.getByTestId("breath-row");
  }

  async breathStarts(): Promise<number[]> {
    return this.breathRows().evaluateAll((rows) =>
      rows.map((r) => Number(r.querySelectorAll("td")[1]?.textContent ?? Number.NaN)),
    );
  }

  async summaryText(key: string): Promise<string> {
    return ((await this.page.getByTestId(`summary-${key}`).textContent()) ?? "").trim();
  }

  async downloadWaveformCsv(): Promise<Download> {
    const [download] = await Promise.all([this.page.waitForEvent("download"), this.page.getByTestId("waveform-csv-link").click()]);
    return download;
  }

  async downloadBreathCsv(): Promise<Download> {
    const [download] = await Promise.all([this.page.waitForEvent("download"), this.page.getByTestId("breath-csv-download").click()]);
    return download;
  }

  async chooseLoopBreath(position: number): Promise<void> {
    await this.page.getByTestId("loop-breath-select").selectOption(String(position));
  }

  /** Points drawn in a loop once it has loaded its breath. */
  async loopPoints(which: "pv" | "fv", timeoutMs = 10_000): Promise<number> {
    await this.page.locator('[data-testid="loops-body"][data-state="ready"]').waitFor({ timeout: timeoutMs });
    return Number(await this.page.getByTestId(`loop-${which}`).getAttribute("data-points"));
  }

  loopPath(which: "pv" | "fv"): Locator {
    return this.page.getByTestId(`loop-${which}`).locator("path");
  }
}

/** Reads a download's text. */
export async function downloadText(download: Download): Promise<string> {
  const stream = await download.createReadStream();
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(Buffer.from(chunk as Uint8Array));
  return Buffer.concat(chunks).toString("utf8");
}
