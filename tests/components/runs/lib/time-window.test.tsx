import { describe, expect, it } from "vitest";
import {
  MIN_WINDOW_S,
  breathAtTime,
  breathSpan,
  breathWindow,
  clampWindow,
  panWindow,
  windowAround,
  zoomWindow,
} from "@/components/runs/lib/time-window";
import { BREATHS } from "../fixtures";

describe("clampWindow", () => {
  it("keeps the window inside the run, keeping its width", () => {
    expect(clampWindow({ from: -2, to: 3 }, 60)).toEqual({ from: 0, to: 5 });
    expect(clampWindow({ from: 58, to: 63 }, 60)).toEqual({ from: 55, to: 60 });
  });
  it("orders reversed bounds, widens to the minimum and caps at the run length", () => {
    expect(clampWindow({ from: 5, to: 4 }, 60)).toEqual({ from: 4, to: 5 });
    expect(clampWindow({ from: 1, to: 1 }, 60).to - 1).toBeCloseTo(MIN_WINDOW_S);
    expect(clampWindow({ from: -10, to: 100 }, 60)).toEqual({ from: 0, to: 60 });
  });
});

describe("zoom and pan", () => {
  it("zooms about the centre", () => {
    expect(zoomWindow({ from: 10, to: 20 }, 0.5, 60)).toEqual({ from: 12.5, to: 17.5 });
    expect(zoomWindow({ from: 10, to: 20 }, 2, 60)).toEqual({ from: 5, to: 25 });
  });
  it("pans by a fraction of the width and stops at the ends", () => {
    expect(panWindow({ from: 10, to: 20 }, 0.5, 60)).toEqual({ from: 15, to: 25 });
    expect(panWindow({ from: 2, to: 12 }, -0.5, 60)).toEqual({ from: 0, to: 10 });
  });
  it("centres a window on a time", () => {
    expect(windowAround(30, 8, 60)).toEqual({ from: 26, to: 34 });
    expect(windowAround(1, 8, 60)).toEqual({ from: 0, to: 8 });
  });
});

describe("breaths and times", () => {
  it("finds the breath under a time", () => {
    expect(breathAtTime(BREATHS, -0.1)).toBe(-1);
    expect(breathAtTime(BREATHS, 0)).toBe(0);
    expect(breathAtTime(BREATHS, 2.99)).toBe(0);
    expect(breathAtTime(BREATHS, 3)).toBe(1);
    expect(breathAtTime(BREATHS, 100)).toBe(2);
    expect(breathAtTime([], 1)).toBe(-1);
  });
  it("spans a breath to the next breath's start, or Ti + Te for the last", () => {
    expect(breathSpan(BREATHS, 0, 9)).toEqual({ from: 0, to: 3 });
    expect(breathSpan(BREATHS, 2, 9)).toEqual({ from: 6, to: 9 });
    expect(breathSpan(BREATHS, 5, 9)).toBeNull();
  });
  it("windows a patient-triggered breath from its effort onset, with a margin", () => {
    const w = breathWindow(BREATHS, 1, 9);
    expect(w).not.toBeNull();
    // onset 2.94 → next start 6: width 3.06, margin 0.459
    expect(w!.from).toBeCloseTo(2.94 - 0.459, 6);
    expect(w!.to).toBeCloseTo(6 + 0.459, 6);
  });
});
