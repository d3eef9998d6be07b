/** Settings calculators. */
import { describe, expect, it } from "vitest";
import { breathTiming, predictedBodyWeightKg, pulseRateForFlow, tidalVolumeMl } from "@/lib/calculators";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";

describe("breath timing from RR and I:E", () => {
  it("RR 20, I:E 1:2 → Ti 1 s, Te 2 s (derived; the ISO 80601-2-12 row 1 timing)", () => {
    const t = breathTiming(20, "1:2");
    expect(t.tiS).toBeCloseTo(1, 12);
    expect(t.teS).toBeCloseTo(2, 12);
  });
  it("RR 10 /min at 1:1 and units on the rate", () => {
    expect(breathTiming("10 /min", "1:1")).toEqual({ periodS: 6, tiS: 3, teS: 3 });
    expect(breathTiming(12, 3).tiS).toBeCloseTo(1.25, 12);
    expect(() => breathTiming(12, "two")).toThrow(/I:E/);
  });
});

describe("predicted body weight (NIH NHLBI ARDS Network protocol, published)", () => {
  it("male 50 + 2.3 × (in − 60); female 45.5 + 2.3 × (in − 60)", () => {
    expect(predictedBodyWeightKg("male", "60 in")).toBeCloseTo(50, 9);
    expect(predictedBodyWeightKg("female", "60 in")).toBeCloseTo(45.5, 9);
    // 170 cm = 66.929 in → 50 + 2.3 × 6.929 = 65.94 kg (derived)
    expect(predictedBodyWeightKg("male", 170)).toBeCloseTo(65.94, 2);
    expect(predictedBodyWeightKg("female", "1.6 m")).toBeCloseTo(45.5 + 2.3 * (160 / 2.54 - 60), 9);
  });
  it("Vt at 6 mL/kg PBW (the protocol's target)", () => {
    expect(tidalVolumeMl("male", "170 cm")).toBeCloseTo(6 * 65.94, 0);
    expect(tidalVolumeMl("female", "60 in", 8)).toBeCloseTo(364, 9);
    expect(() => predictedBodyWeightKg("male", "70 kg")).toThrow(/expected a length/);
  });
});

describe("pulse rate a rig needs for a flow", () => {
  it("uses the bag calibration slope and the actuator's steps/rev × microstepping × drive ratio (derived)", () => {
    // Default rig: 670 mL over 90° → 7.444 mL/deg; 60 L/min = 1000 mL/s → 134.3 deg/s; 200·8·5/360 = 22.22 pulses/deg.
    const r = pulseRateForFlow("60 L/min", DEFAULT_RIG);
    expect(r.slopeMlPerDeg).toBeCloseTo(670 / 90, 6);
    expect(r.armSpeedDegPerS).toBeCloseTo(1000 / (670 / 90), 6);
    expect(r.pulseRateHz).toBeCloseTo((1000 / (670 / 90)) * ((200 * 8 * 5) / 360), 6);
    expect(r.exceedsMax).toBe(false);
    // At 45°, in the 40–50° segment (10 mL/deg): 100 deg/s, 2222 Hz.
    expect(pulseRateForFlow(60, DEFAULT_RIG, 45).pulseRateHz).toBeCloseTo(2222.22, 1);
    expect(pulseRateForFlow("1 L/s", DEFAULT_RIG, 45).pulseRateHz).toBeCloseTo(2222.22, 1);
    expect(pulseRateForFlow("600 L/min", { ...DEFAULT_RIG, actuator: { ...DEFAULT_RIG.actuator, maxPulseRateHz: 5000 } }).exceedsMax).toBe(true);
  });
});
