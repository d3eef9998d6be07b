import { screen, waitFor } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { RunCompare } from "@/components/runs/run-compare";
import { makeRun, makeSummary, makeWaveform, mockFetch, renderWithQuery } from "./fixtures";

afterEach(() => {
  vi.unstubAllGlobals();
});

describe("RunCompare", () => {
  it("overlays both runs' windows and lists the summary differences", async () => {
    const runA = makeRun({ id: "a", summary: makeSummary({ pip: 20 }) });
    const runB = makeRun({
      id: "b",
      revision: { ...makeRun().revision, number: 4, sequenceName: "Timed volume" },
      summary: makeSummary({ pip: 23.5 }),
    });
    const fetchMock = mockFetch((url) => {
      if (url.pathname === "/api/runs/a") return { body: runA };
      if (url.pathname === "/api/runs/b") return { body: runB };
      if (url.pathname.endsWith("/waveform")) {
        return { body: makeWaveform(Number(url.searchParams.get("from")), Number(url.searchParams.get("to"))) };
      }
      return undefined;
    });
    renderWithQuery(<RunCompare aId="a" bId="b" />);
    expect(await screen.findByTestId("compare-run-a")).toHaveTextContent("Assisted volume rev 3 on Normal lungs");
    expect(screen.getByTestId("compare-run-b")).toHaveTextContent("Timed volume rev 4 on Normal lungs");

    const table = await screen.findByTestId("summary-diff-table");
    expect(table).toBeInTheDocument();
    expect(screen.getByTestId("diff-pip-delta")).toHaveTextContent("+3.5");

    await waitFor(() => expect(screen.getByTestId("compare-overlay")).toHaveAttribute("data-state", "ready"));
    const windows = fetchMock.mock.calls
      .map(([input]) => new URL(String(input), "http://localhost"))
      .filter((u) => u.pathname.endsWith("/waveform"));
    expect(windows.map((u) => u.pathname).sort()).toEqual(["/api/runs/a/waveform", "/api/runs/b/waveform"]);
    for (const u of windows) {
      expect(u.searchParams.get("signals")).toBe("paw,flow,volume");
      expect(u.searchParams.get("from")).toBe("0");
      expect(u.searchParams.get("to")).toBe("9");
    }
  });

  it("waits for both runs to finish", async () => {
    mockFetch((url) => {
      if (url.pathname === "/api/runs/a") return { body: makeRun({ id: "a" }) };
      if (url.pathname === "/api/runs/b") return { body: makeRun({ id: "b", status: "running", progress: 0.5 }) };
      return undefined;
    });
    renderWithQuery(<RunCompare aId="a" bId="b" />);
    expect(await screen.findByTestId("compare-not-ready")).toHaveTextContent("B: running");
    expect(screen.queryByTestId("summary-diff-table")).not.toBeInTheDocument();
  });
});
