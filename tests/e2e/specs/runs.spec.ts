/**
 * Run view and compare in a real browser (issue 5, sections 3, 4 and 6): the charts draw on canvas, zoom
 * fetches the finer window from the server, the breath table fills, CSVs download, loops draw.
 * uPlot cannot draw in jsdom, so this is where chart behaviour is tested.
 */
import { assert, eventually, test } from "../harness";
import { RunComparePage } from "../pages/run-compare-page";
import { RunLauncherPage } from "../pages/run-launcher-page";
import { CHART_SIGNALS, RunViewPage, downloadText } from "../pages/run-view-page";
import { EFFORT_CASE, RunsDemoData, TIMED_SEQUENCE, TRIGGERED_SEQUENCE } from "../pages/runs-demo-data";
import { SignInPage } from "../pages/sign-in-page";

const near = (a: number, b: number, tolerance: number) => Math.abs(a - b) <= tolerance;

export const tests = [
  test("runs: an engineer runs the triggered demo sequence on a case, sees the charts and breaths, zooms into a breath, downloads the CSV", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const revisionId = await new RunsDemoData(page).latestRevisionId(TRIGGERED_SEQUENCE);
    const launcher = new RunLauncherPage(page, baseUrl);
    await launcher.goto(revisionId);
    const runId = await launcher.runOne(EFFORT_CASE, 20);
    assert.ok(runId.length > 0, "the launcher opened the run page");

    const view = new RunViewPage(page, baseUrl);
    await view.waitForDone();
    await view.waitForChartsReady();

    // Four stacked charts over the whole run, each drawn on its canvas.
    for (const signal of CHART_SIGNALS) {
      const chart = await view.chart(signal);
      assert.ok(chart.draws > 0, `${signal} chart drew`);
      assert.ok(chart.points > 10, `${signal} chart has data (${chart.points} points)`);
      assert.ok(chart.inkedPixels > 100, `${signal} canvas is not blank`);
      assert.ok(near(chart.xMin, 0, 0.01) && near(chart.xMax, 20, 0.01), `${signal} shows 0–20 s, got ${chart.xMin}–${chart.xMax}`);
    }
    assert.match(await view.summaryText("pip"), /cmH2O/);
    assert.match(await view.summaryText("latencyMean"), /ms/);

    // The breath table fills; at 20 s there are several breaths.
    const starts = await view.breathStarts();
    assert.ok(starts.length >= 4, `breath table has ${starts.length} rows`);

    // Zoom into one breath by dragging across it: the window narrows and is fetched from the server.
    const requested: URL[] = [];
    page.on("request", (req) => {
      const url = new URL(req.url());
      if (url.pathname === `/api/runs/${runId}/waveform`) requested.push(url);
    });
    const [from, to] = [starts[2], starts[3]];
    await view.dragZoom(from, to);
    const pxTolerance = 0.15; // s: a few pixels of a 20 s axis
    const zoomed = await eventually(async () => {
      const w = await view.window();
      assert.ok(near(w.from, from, pxTolerance) && near(w.to, to, pxTolerance), `window ${w.from}–${w.to}, wanted ${from}–${to}`);
      assert.ok(near(w.loadedFrom, w.from, 0.002) && near(w.loadedTo, w.to, 0.002), "the finer window has loaded");
      return w;
    });
    const fetched = requested.find((u) => near(Number(u.searchParams.get("from")), zoomed.from, 0.002));
    assert.ok(fetched, "the zoomed window was fetched from the server");
    assert.equal(fetched.searchParams.get("signals"), "paw,flow,volume,pmus");
    await view.waitForChartsReady();
    const paw = await view.chart("paw");
    assert.ok(near(paw.xMin, zoomed.from, 0.002) && near(paw.xMax, zoomed.to, 0.002), "the pressure chart shows the breath");
    assert.ok(paw.inkedPixels > 100, "the zoomed chart drew");

    // The full-resolution waveform CSV, units in its header.
    const csv = await view.downloadWaveformCsv();
    assert.match(csv.suggestedFilename(), /\.csv$/);
    const lines = (await downloadText(csv)).trim().split(/\r?\n/);
    assert.match(lines[0], /cmH2O/);
    assert.match(lines[0], /L\/min/);
    assert.match(lines[0], /mL/);
    assert.ok(lines.length > 1000, `waveform CSV has ${lines.length} lines`);

    // The breath table's CSV: one row per breath.
    const breathCsv = await view.downloadBreathCsv();
    assert.equal(breathCsv.suggestedFilename(), `run-${runId}-breaths.csv`);
    const breathLines = (await downloadText(breathCsv)).trim().split(/\r?\n/);
    assert.match(breathLines[0], /^Breath,Start \(s\),Trigger,Latency \(ms\),PIP \(cmH2O\)/);
    assert.equal(breathLines.length, starts.length + 1);
  }),

  test("runs: a clinician opens a run, reads a patient-triggered breath's latency and its pressure–volume loop", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("clinician");
    const runId = await new RunsDemoData(page).run(TRIGGERED_SEQUENCE, EFFORT_CASE, 15);
    const view = new RunViewPage(page, baseUrl);
    await view.goto(runId);
    await view.waitForDone();
    await view.waitForChartsReady();

    // A patient-triggered breath carries its latency in ms.
    const patientRow = view.breathRows().filter({ hasText: "patient" }).first();
    await patientRow.waitFor();
    const latency = Number((await patientRow.locator("td").nth(3).textContent())?.trim());
    assert.ok(Number.isFinite(latency) && latency >= 0, `latency of a patient-triggered breath: ${latency} ms`);

    // Choosing the breath in the table jumps the charts to it and loads its loops.
    const position = Number(await patientRow.getAttribute("data-position"));
    await patientRow.click();
    await eventually(async () => {
      const w = await view.window();
      assert.ok(w.to - w.from < 10, `the charts show one breath, got ${w.from}–${w.to}`);
    });
    await eventually(async () => {
      assert.equal(await page.getByTestId("loop-breath-select").inputValue(), String(position));
    });
    const points = await view.loopPoints("pv");
    assert.ok(points > 20, `P–V loop has ${points} points`);
    const d = (await view.loopPath("pv").getAttribute("d")) ?? "";
    assert.ok(d.startsWith("M") && d.split("L").length > 20, "the P–V loop is drawn");
    assert.ok((await view.loopPoints("fv")) > 20, "the flow–volume loop is drawn too");
    const svgText = (await page.getByTestId("loop-pv").textContent()) ?? "";
    assert.match(svgText, /Paw \(cmH2O\)/);
    assert.match(svgText, /Volume \(mL\)/);
  }),

  test("runs: a timed-only sequence and the triggered one on one case, overlaid with a table of differences", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const demo = new RunsDemoData(page);
    const a = await demo.run(TIMED_SEQUENCE, EFFORT_CASE, 15);
    const b = await demo.run(TRIGGERED_SEQUENCE, EFFORT_CASE, 15);
    const compare = new RunComparePage(page, baseUrl);
    await compare.goto(a, b);
    await compare.waitForOverlay();
    const series = await compare.pressureSeries();
    assert.ok(series.includes("A Airway pressure") && series.includes("B Airway pressure"), `legend: ${series.join(", ")}`);
    const pip = await compare.diffCells("pip");
    assert.equal(pip.length, 6);
    assert.equal(pip[0], "PIP");
    assert.equal(pip[1], "cmH2O");
    assert.match(pip[4], /^([+\u2212]?\d+\.\d|—)$/);
    const latency = await compare.diffCells("latencyMean");
    assert.equal(latency[1], "ms");
  }),
];
