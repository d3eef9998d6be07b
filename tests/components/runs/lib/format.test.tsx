import { describe, expect, it } from "vitest";
import { MISSING, formatIE, formatNumber, formatSigned, formatWithUnit, niceTicks } from "@/components/runs/lib/format";

describe("formatNumber", () => {
  it("rounds to the given decimals and shows missing values as a dash", () => {
    expect(formatNumber(12.345, 1)).toBe("12.3");
    expect(formatNumber(null)).toBe(MISSING);
    expect(formatNumber(Number.NaN)).toBe(MISSING);
    expect(formatNumber(Infinity)).toBe(MISSING);
  });
  it("writes negatives with a minus sign and never shows −0", () => {
    expect(formatNumber(-2.5, 1)).toBe("\u22122.5");
    expect(formatNumber(-0.04, 1)).toBe("0.0");
  });
});

describe("formatWithUnit, formatIE, formatSigned", () => {
  it("puts the unit after the number, not after a dash", () => {
    expect(formatWithUnit(21.56, "cmH2O")).toBe("21.6 cmH2O");
    expect(formatWithUnit(undefined, "mL")).toBe(MISSING);
  });
  it("writes I:E as 1:x", () => {
    expect(formatIE(2)).toBe("1:2.0");
    expect(formatIE(null)).toBe(MISSING);
  });
  it("signs differences", () => {
    expect(formatSigned(1.24, 1)).toBe("+1.2");
    expect(formatSigned(-0.5, 1)).toBe("\u22120.5");
    expect(formatSigned(0.01, 1)).toBe("0.0");
    expect(formatSigned(null)).toBe(MISSING);
  });
});

describe("niceTicks", () => {
  it("gives steps of 1, 2 or 5 × 10^k covering the range", () => {
    expect(niceTicks(0, 10, 5)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(niceTicks(-43, 61, 5)).toEqual([-40, -20, 0, 20, 40, 60]);
    expect(niceTicks(0, 0.3, 3)).toEqual([0, 0.1, 0.2, 0.3]);
  });
  it("handles a flat or reversed range", () => {
    expect(niceTicks(4, 4)).toEqual([4]);
    expect(niceTicks(10, 0, 5)).toEqual([0, 2, 4, 6, 8, 10]);
  });
});
