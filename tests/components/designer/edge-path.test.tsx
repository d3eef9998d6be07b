/** Edge geometry: curves leave and enter the right sides and never cut through the steps between. */
import { describe, expect, it } from "vitest";
import { edgeGeometry, selfLoop, type Box } from "@/components/designer/canvas/edge-path";

const box = (x: number, y: number): Box => ({ x, y, width: 184, height: 72 });
const numbers = (path: string) => path.replace(/[MC]/g, " ").trim().split(/[\s,]+/).map(Number);
const xs = (path: string) => numbers(path).filter((_, i) => i % 2 === 0);

describe("edge geometry", () => {
  it("joins a step to the next row straight down", () => {
    const g = edgeGeometry(box(0, 0), box(0, 150), 0, 1);
    expect(numbers(g.path).slice(0, 2)).toEqual([92, 72]);
    expect(numbers(g.path).slice(-2)).toEqual([92, 150]);
  });

  it("loops a return edge up the right side, clear of the steps between", () => {
    const g = edgeGeometry(box(0, 300), box(0, 0), 0, 1);
    expect(Math.min(...xs(g.path))).toBeGreaterThanOrEqual(184);
    expect(g.labelX).toBeGreaterThan(184);
  });

  it("loops an edge that skips a row down the left side", () => {
    const g = edgeGeometry(box(0, 0), box(0, 300), 0, 1);
    expect(Math.max(...xs(g.path))).toBeLessThanOrEqual(0);
  });

  it("keeps the labels of parallel edges apart", () => {
    const a = edgeGeometry(box(0, 300), box(0, 0), 0, 2);
    const b = edgeGeometry(box(0, 300), box(0, 0), 1, 2);
    expect(Math.abs(a.labelY - b.labelY)).toBeGreaterThanOrEqual(20);
    expect(a.path).not.toBe(b.path);
  });

  it("runs a forward edge in a row from the right side to the left side", () => {
    const g = edgeGeometry(box(0, 0), box(400, 0), 0, 1);
    expect(numbers(g.path).slice(0, 2)).toEqual([184, 36]);
    expect(numbers(g.path).slice(-2)).toEqual([400, 36]);
  });

  it("draws a self-loop above the step", () => {
    const g = selfLoop(box(0, 100), 0);
    expect(g.labelY).toBeLessThan(100);
  });
});
