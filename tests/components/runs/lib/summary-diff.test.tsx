import { describe, expect, it } from "vitest";
import { diffSummaries } from "@/components/runs/lib/summary-diff";
import { SUMMARY_FIELDS } from "@/components/runs/lib/summary-fields";
import { makeSummary } from "../fixtures";

describe("diffSummaries", () => {
  it("gives B − A and the relative change for every figure", () => {
    const a = makeSummary({ pip: 20, vti: 500 });
    const b = makeSummary({ pip: 25, vti: 450 });
    const rows = diffSummaries(a, b);
    expect(rows.map((r) => r.field.key)).toEqual(SUMMARY_FIELDS.map((f) => f.key));
    const pip = rows.find((r) => r.field.key === "pip")!;
    expect(pip).toMatchObject({ a: 20, b: 25, delta: 5, percent: 25 });
    const vti = rows.find((r) => r.field.key === "vti")!;
    expect(vti.delta).toBe(-50);
    expect(vti.percent).toBe(-10);
  });
  it("leaves the difference empty when a side is missing, and the percentage when A is 0", () => {
    const a = makeSummary({ pplat: null, doubleTriggers: 0, triggerLatencyMs: { mean: null, p95: null, max: null, n: 0 } });
    const b = makeSummary({ pplat: 18, doubleTriggers: 2 });
    const rows = diffSummaries(a, b);
    expect(rows.find((r) => r.field.key === "pplat")).toMatchObject({ a: null, b: 18, delta: null, percent: null });
    expect(rows.find((r) => r.field.key === "latencyMean")!.delta).toBeNull();
    expect(rows.find((r) => r.field.key === "doubleTriggers")).toMatchObject({ delta: 2, percent: null });
  });
  it("every summary figure has a unit", () => {
    for (const field of SUMMARY_FIELDS) expect(field.unit, field.key).not.toBe("");
  });
});
