import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, describe, expect, it, vi } from "vitest";
import { RunView } from "@/components/runs/run-view";
import type { RunDetail } from "@/components/runs/lib/api";
import { makeRun, makeWaveform, mockFetch, renderWithQuery } from "./fixtures";

afterEach(() => {
  vi.unstubAllGlobals();
});

/** Serves the run (a list of answers, the last repeating) and any waveform window. */
function serveRun(answers: RunDetail[]) {
  let served = 0;
  return mockFetch((url) => {
    if (url.pathname === "/api/runs/run-a") {
      const answer = answers[Math.min(served, answers.length - 1)];
      served += 1;
      return { body: answer };
    }
    if (url.pathname === "/api/runs/run-a/waveform") {
      const from = Number(url.searchParams.get("from"));
      const to = Number(url.searchParams.get("to"));
      return { body: makeWaveform(from, to) };
    }
    return undefined;
  });
}

function waveformCalls(fetchMock: ReturnType<typeof mockFetch>): URL[] {
  return fetchMock.mock.calls
    .map(([input]) => new URL(String(input), "http://localhost"))
    .filter((u) => u.pathname.endsWith("/waveform"));
}

describe("RunView", () => {
  it("shows progress while the run is running and the results once it is done", async () => {
    const fetchMock = serveRun([makeRun({ status: "running", progress: 0.4, summary: null, breaths: null }), makeRun()]);
    renderWithQuery(<RunView runId="run-a" />);
    const bar = await screen.findByRole("progressbar", { name: "Simulation progress" });
    expect(bar).toHaveAttribute("aria-valuenow", "40");
    expect(screen.getByTestId("run-status")).toHaveTextContent("Running");
    expect(screen.queryByTestId("waveform-csv-link")).not.toBeInTheDocument();

    await screen.findByTestId("summary-panel", {}, { timeout: 3000 });
    expect(screen.queryByRole("progressbar")).not.toBeInTheDocument();
    expect(screen.getByTestId("run-view")).toHaveAttribute("data-status", "done");
    expect(screen.getAllByTestId("breath-row")).toHaveLength(3);
    expect(screen.getByTestId("waveform-csv-link")).toHaveAttribute("href", "/api/runs/run-a/waveform.csv");
    expect(screen.getByRole("heading", { level: 1 })).toHaveTextContent("Assisted volume rev 3 on Normal lungs");

    // The whole run is fetched first, all four signals.
    await waitFor(() => expect(screen.getByTestId("waveform-charts")).toHaveAttribute("data-state", "ready"));
    const chartCalls = waveformCalls(fetchMock).filter((u) => u.searchParams.get("signals") === "paw,flow,volume,pmus");
    expect(chartCalls).toHaveLength(1);
    expect(chartCalls[0].searchParams.get("from")).toBe("0");
    expect(chartCalls[0].searchParams.get("to")).toBe("9");
  });

  it("cancels a running run, and offers no cancel to a caller who may not run", async () => {
    const user = userEvent.setup();
    const fetchMock = mockFetch((url, init) => {
      if (url.pathname === "/api/runs/run-a/cancel" && init?.method === "POST") return { body: { status: "cancelled" } };
      if (url.pathname === "/api/runs/run-a") return { body: makeRun({ status: "running", progress: 0.1, canRun: true }) };
      return undefined;
    });
    const { unmount } = renderWithQuery(<RunView runId="run-a" />);
    await user.click(await screen.findByRole("button", { name: "Cancel run" }));
    await waitFor(() =>
      expect(fetchMock.mock.calls.some(([input, init]) => String(input) === "/api/runs/run-a/cancel" && init?.method === "POST")).toBe(true),
    );
    unmount();

    mockFetch(() => ({ body: makeRun({ status: "running", progress: 0.1, canRun: false }) }));
    renderWithQuery(<RunView runId="run-a" />);
    await screen.findByRole("progressbar");
    expect(screen.queryByRole("button", { name: "Cancel run" })).not.toBeInTheDocument();
  });

  it("shows the engine's error when the run failed", async () => {
    serveRun([makeRun({ status: "failed", error: "zero-time loop between inhale and exhale", summary: null })]);
    renderWithQuery(<RunView runId="run-a" />);
    const alert = await screen.findByTestId("run-error");
    expect(alert).toHaveAttribute("role", "alert");
    expect(alert).toHaveTextContent("zero-time loop between inhale and exhale");
    expect(screen.queryByTestId("summary-panel")).not.toBeInTheDocument();
  });

  it("says when the run cannot be loaded", async () => {
    mockFetch(() => ({ status: 404, body: { error: "Run not found" } }));
    renderWithQuery(<RunView runId="run-a" />);
    expect(await screen.findByTestId("run-load-error")).toHaveTextContent("Run not found");
  });

  it("jumps the charts to a breath from the table and loads its loops", async () => {
    const user = userEvent.setup();
    const fetchMock = serveRun([makeRun()]);
    renderWithQuery(<RunView runId="run-a" />);
    const charts = await screen.findByTestId("waveform-charts");
    expect(charts).toHaveAttribute("data-from", "0.000");

    const row = screen.getAllByTestId("breath-row")[1];
    await user.click(within(row).getByText("530"));
    // Breath 2: effort onset 2.94 s to next start 6 s, 15 % margin each side.
    expect(charts).toHaveAttribute("data-from", "2.481");
    expect(charts).toHaveAttribute("data-to", "6.459");
    expect(row).toHaveAttribute("aria-selected", "true");
    await waitFor(() => expect(charts).toHaveAttribute("data-loaded-from", "2.481"));

    // The loops follow the chosen breath: its own span, at high resolution.
    expect(screen.getByTestId("loop-breath-select")).toHaveValue("1");
    await waitFor(() => expect(Number(screen.getByTestId("loop-pv").getAttribute("data-points"))).toBeGreaterThan(0));
    const loopCall = waveformCalls(fetchMock).find((u) => u.searchParams.get("from") === "3" && u.searchParams.get("to") === "6");
    expect(loopCall?.searchParams.get("signals")).toBe("paw,flow,volume");
    expect(screen.getByTestId("loop-pv").querySelector("path")).not.toBeNull();
  });

  it("jumps the charts to an alarm's time", async () => {
    const user = userEvent.setup();
    serveRun([makeRun()]);
    renderWithQuery(<RunView runId="run-a" />);
    const charts = await screen.findByTestId("waveform-charts");
    await user.click(screen.getByText("Airway pressure above 40 cmH2O"));
    // 8 s around 4.5 s in a 9 s run.
    expect(charts).toHaveAttribute("data-from", "0.500");
    expect(charts).toHaveAttribute("data-to", "8.500");
  });

  it("zooms and pans with the buttons and returns to the whole run", async () => {
    const user = userEvent.setup();
    serveRun([makeRun()]);
    renderWithQuery(<RunView runId="run-a" />);
    const charts = await screen.findByTestId("waveform-charts");
    await user.click(screen.getByRole("button", { name: "Zoom in" }));
    expect(charts).toHaveAttribute("data-from", "2.250");
    expect(charts).toHaveAttribute("data-to", "6.750");
    await user.click(screen.getByRole("button", { name: "Pan forward half a window" }));
    expect(charts).toHaveAttribute("data-from", "4.500");
    expect(charts).toHaveAttribute("data-to", "9.000");
    await user.click(screen.getByTestId("zoom-reset"));
    expect(charts).toHaveAttribute("data-from", "0.000");
    expect(charts).toHaveAttribute("data-to", "9.000");
  });
});
