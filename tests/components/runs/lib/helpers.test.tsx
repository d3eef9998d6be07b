import { describe, expect, it } from "vitest";
import { joinOnTime } from "@/components/runs/lib/align";
import { buildEventList } from "@/components/runs/lib/events";
import { loopPath, loopPoints, paddedExtent } from "@/components/runs/lib/loop";
import { stepNamesOf, stepToneIndex, visibleSteps } from "@/components/runs/lib/steps";
import { waveformUrl } from "@/components/runs/lib/api";
import { pointsForWidth } from "@/components/runs/use-waveform";
import { ALARMS, BREATHS } from "../fixtures";

describe("joinOnTime", () => {
  it("merges two time bases into one ascending axis with nulls where a run has no sample", () => {
    const j = joinOnTime({ t: [0, 1, 2], values: [[10, 11, 12]] }, { t: [0, 1.5, 2, 3], values: [[20, 21, 22, 23]] });
    expect(Array.from(j.t)).toEqual([0, 1, 1.5, 2, 3]);
    expect(j.a[0]).toEqual([10, 11, null, 12, null]);
    expect(j.b[0]).toEqual([20, null, 21, 22, 23]);
    expect(j.a[0]).toHaveLength(j.t.length);
  });
});

describe("buildEventList", () => {
  it("lists alarms and breath flags in time order", () => {
    const events = buildEventList(ALARMS, BREATHS);
    expect(events.map((e) => [e.t, e.source, e.kind])).toEqual([
      [1.25, "alarm", "low-volume"],
      [3, "event", "double-trigger"],
      [4.5, "alarm", "high-pressure"],
    ]);
    expect(events[1].breathPosition).toBe(1);
    expect(events[1].message).toContain("breath 2");
  });
});

describe("loops", () => {
  it("pairs samples, dropping non-finite ones", () => {
    expect(loopPoints([1, 2, Number.NaN, 4], [10, 20, 30])).toEqual([
      { x: 1, y: 10 },
      { x: 2, y: 20 },
    ]);
    expect(loopPoints(undefined, [1])).toEqual([]);
  });
  it("pads the extent and keeps zero in view", () => {
    const e = paddedExtent([5, 25]);
    expect(e.min).toBeLessThanOrEqual(0);
    expect(e.max).toBeGreaterThanOrEqual(25);
  });
  it("draws the path in time order, left open", () => {
    const d = loopPath([{ x: 0, y: 0 }, { x: 1, y: 2 }], (v) => v * 10, (v) => 100 - v * 10);
    expect(d).toBe("M0.0,100.0L10.0,80.0");
  });
});

describe("steps", () => {
  const steps = [
    { step: "inhale", from: 0, to: 1 },
    { step: "exhale", from: 1, to: 3 },
    { step: "inhale", from: 3, to: 4 },
  ];
  it("keeps the intervals that overlap the window", () => {
    expect(visibleSteps(steps, 1.5, 3.5).map((s) => s.from)).toEqual([1, 3]);
    expect(visibleSteps(steps, 4, 5)).toEqual([]);
  });
  it("gives each step name one tone", () => {
    expect(stepToneIndex(["inhale", "exhale"], "exhale", 6)).toBe(1);
    expect(stepToneIndex(["inhale"], "unknown", 6)).toBe(stepToneIndex(["inhale"], "unknown", 6));
    expect(stepNamesOf(steps, null)).toEqual(["inhale", "exhale"]);
    expect(stepNamesOf(steps, ["a"])).toEqual(["a"]);
  });
});

describe("waveform requests", () => {
  it("asks for the window in ms precision with the signals listed", () => {
    expect(waveformUrl("r 1", { from: 1.23456, to: 2, points: 800, signals: ["paw", "flow"] })).toBe(
      "/api/runs/r%201/waveform?from=1.235&to=2&points=800&signals=paw%2Cflow",
    );
  });
  it("asks for two points per pixel, within bounds", () => {
    expect(pointsForWidth(1000)).toBe(2000);
    expect(pointsForWidth(10)).toBe(200);
    expect(pointsForWidth(10000)).toBe(4000);
  });
});
