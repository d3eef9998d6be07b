/** Unit parsing to canonical units (1 cmH2O = 98.0665 Pa conventional; 1 psi = 6894.757 Pa; 1 hPa = 100 Pa; mathjs units as the reference library). */
import { describe, expect, it } from "vitest";
import { UnitError, parseQuantity, parseSettingValue, quantityOfUnit } from "@/lib/units";

describe("parseQuantity", () => {
  it("0.1 psi = 7.0307 cmH2O (derived: 6894.757 Pa / 98.0665 Pa; mathjs gives the same)", () => {
    expect(parseQuantity("0.1 psi", "pressure")).toBeCloseTo(7.0307, 4);
  });

  it("1 hPa = 1.019716 cmH2O (derived)", () => {
    expect(parseQuantity("1 hPa", "pressure")).toBeCloseTo(1.019716, 6);
  });

  it("ISO 80601-2-12 test-lung units: mL/hPa and hPa/(L/s) (derived)", () => {
    expect(parseQuantity("3 mL/hPa", "compliance")).toBeCloseTo(3 * 0.980665, 9); // 1 hPa = 100/98.0665 cmH2O
    expect(parseQuantity("50 mL/hPa", "compliance")).toBeCloseTo(49.0333, 4);
    expect(parseQuantity("10 hPa/(L/s)", "resistance")).toBeCloseTo(10.19716, 5);
  });

  it("times, rates, volumes and flows", () => {
    expect(parseQuantity("1 s", "time")).toBe(1);
    expect(parseQuantity("250 ms", "time")).toBeCloseTo(0.25, 12);
    expect(parseQuantity("20 /min", "rate")).toBe(20);
    expect(parseQuantity("0.5 L", "volume")).toBe(500);
    expect(parseQuantity("1 L/s", "flow")).toBe(60);
  });

  it("the rig's actuator limits: arm speed in deg/s, pulse-rate ramp in Hz/s (common practice units)", () => {
    expect(parseQuantity("0.5 cycle/s", "angularSpeed")).toBeCloseTo(180, 9);
    expect(parseQuantity("1 rad/s", "angularSpeed")).toBeCloseTo(180 / Math.PI, 9);
    expect(parseQuantity("2 kHz/s", "pulseAcceleration")).toBeCloseTo(2000, 9);
    expect(() => parseQuantity("90 deg", "angularSpeed")).toThrow("expected an angular speed (deg/s), got 90 deg");
  });

  it("bare numbers are canonical", () => {
    expect(parseQuantity("42", "pressure")).toBe(42);
    expect(parseQuantity(7, "volume")).toBe(7);
  });

  it("gives clear errors", () => {
    expect(() => parseQuantity("3 mL", "pressure")).toThrowError(UnitError);
    expect(() => parseQuantity("3 mL", "pressure")).toThrow("expected a pressure (cmH2O), got 3 mL (volume)");
    expect(() => parseQuantity("3 bananas", "volume")).toThrow(/unknown unit "bananas"/);
    expect(() => parseQuantity("import(1)", "volume")).toThrow(/not a number with a unit/);
    expect(() => parseQuantity("", "time")).toThrow(/expected a time/);
  });
});

describe("settings by unit string", () => {
  it("maps the definition's unit strings to quantities", () => {
    expect(quantityOfUnit("cmH2O")).toBe("pressure");
    expect(quantityOfUnit("/min")).toBe("rate");
    expect(quantityOfUnit("cmH2O/(L/s)")).toBe("resistance");
    expect(quantityOfUnit("furlong")).toBeNull();
    expect(parseSettingValue("0.1 psi", "cmH2O")).toBeCloseTo(7.0307, 4);
    expect(parseSettingValue("25 %", "%")).toBe(25);
    expect(() => parseSettingValue("2 s", "cmH2O")).toThrow(/expected a pressure/);
  });
});
