import { render, screen, within } from "@testing-library/react";
import { describe, expect, it } from "vitest";
import { SummaryPanel } from "@/components/runs/summary-panel";
import { SUMMARY_FIELDS } from "@/components/runs/lib/summary-fields";
import { makeSummary } from "./fixtures";

describe("SummaryPanel", () => {
  it("shows every summary figure with its unit", () => {
    render(<SummaryPanel summary={makeSummary()} />);
    for (const field of SUMMARY_FIELDS) {
      const row = screen.getByTestId(`summary-${field.key}`);
      expect(within(row).getByText(field.label)).toBeInTheDocument();
      expect(screen.getByTestId(`summary-${field.key}-unit`)).toHaveTextContent(field.unit);
    }
  });

  it("formats the figures: pressures to 0.1 cmH2O, I:E as 1:x, latency in ms", () => {
    render(<SummaryPanel summary={makeSummary({ pip: 21.64, ie: 2.5, triggerLatencyMs: { mean: 61.4, p95: 88.2, max: 97, n: 4 } })} />);
    expect(screen.getByTestId("summary-pip")).toHaveTextContent("PIP21.6 cmH2O");
    expect(screen.getByTestId("summary-ie-value")).toHaveTextContent("1:2.5");
    expect(screen.getByTestId("summary-latencyP95")).toHaveTextContent("88 ms");
    expect(screen.getByTestId("summary-minuteVolume")).toHaveTextContent("9.76 L/min");
  });

  it("shows a dash for a missing figure and keeps its unit", () => {
    render(<SummaryPanel summary={makeSummary({ pplat: null })} />);
    expect(screen.getByTestId("summary-pplat-value")).toHaveTextContent("—");
    expect(screen.getByTestId("summary-pplat-unit")).toHaveTextContent("cmH2O");
  });

  it("calls an asynchrony index over 10 % severe, in words", () => {
    const { rerender } = render(<SummaryPanel summary={makeSummary({ asynchronyIndex: 12.5 })} />);
    expect(screen.getByTestId("summary-asynchronyIndex")).toHaveTextContent("severe");
    expect(screen.getByTestId("summary-asynchronyIndex-value")).toHaveTextContent("12.5");
    rerender(<SummaryPanel summary={makeSummary({ asynchronyIndex: 4 })} />);
    expect(screen.getByTestId("summary-asynchronyIndex")).not.toHaveTextContent("severe");
  });
});
