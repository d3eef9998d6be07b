import { render, screen, within } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { SummaryDiffTable } from "@/components/runs/summary-diff-table";
import { SUMMARY_FIELDS } from "@/components/runs/lib/summary-fields";
import { makeSummary } from "./fixtures";

function cells(key: string): string[] {
  const row = screen.getByTestId(`diff-${key}`);
  return [within(row).getByRole("rowheader"), ...within(row).getAllByRole("cell")].map((c) => c.textContent ?? "");
}

describe("SummaryDiffTable", () => {
  it("shows A, B, B − A and the change with units for every summary figure", () => {
    const a = makeSummary({ pip: 20, vti: 500, ie: 2, triggerLatencyMs: { mean: 80, p95: 120, max: 150, n: 10 } });
    const b = makeSummary({ pip: 24.5, vti: 450, ie: 1.5, triggerLatencyMs: { mean: 50, p95: 70, max: 90, n: 12 } });
    render(<SummaryDiffTable a={a} b={b} labelA="timed" labelB="triggered" />);
    expect(screen.getAllByRole("row")).toHaveLength(SUMMARY_FIELDS.length + 1);
    expect(cells("pip")).toEqual(["PIP", "cmH2O", "20.0", "24.5", "+4.5", "+22.5"]);
    expect(cells("vti")).toEqual(["Vt inspired", "mL", "500", "450", "\u221250", "\u221210.0"]);
    expect(cells("ie")).toEqual(["I:E", "ratio", "1:2.0", "1:1.5", "\u22120.5", "\u221225.0"]);
    expect(cells("latencyP95")).toEqual(["Latency p95", "ms", "120", "70", "\u221250", "\u221241.7"]);
    expect(screen.getByRole("columnheader", { name: "A" })).toHaveAttribute("title", "timed");
  });

  it("leaves the difference blank when a figure is missing on one side", () => {
    render(<SummaryDiffTable a={makeSummary({ pplat: null })} b={makeSummary({ pplat: 17 })} labelA="a" labelB="b" />);
    expect(cells("pplat")).toEqual(["Plateau", "cmH2O", "—", "17.0", "—", "—"]);
  });
});
