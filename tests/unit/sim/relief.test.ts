/**
 * Pressure safety on the rig circuit. MHRA RMVS v1 (20 March 2020, published): a mechanical failsafe opening
 * at 40 cmH2O, the patient never exposed to more than 40 cmH2O; "inspiratory pressure exceeded" alarm.
 */
import { describe, expect, it } from "vitest";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { run } from "./helpers";

const stiff = { complianceMlPerCmH2O: 3, resistanceCmH2OPerLps: 5 };
const peak = (paw: Float32Array) => paw.reduce((m, p) => (p > m ? p : m), -Infinity);

describe("stiff lung under volume-control on the rig circuit (RMVS v1)", () => {
  it("the relief valve limits the pressure when the electronic limit is set out of the way", () => {
    // 800 mL over 0.5 s (96 L/min) into a 3 mL/cmH2O lung would need ~270 cmH2O.
    const r = run("volume-control", { Vt: 800, Ti: 0.5, RR: 15, Plimit: 60 }, stiff, DEFAULT_RIG, 12);
    expect(DEFAULT_RIG.reliefValveCmH2O).toBe(40);
    // Opening pressure plus the valve's own drop at 1.6 L/s through 1 cmH2O/(L/s): a small overshoot.
    expect(peak(r.waveforms.paw)).toBeLessThanOrEqual(40 + 2);
    expect(peak(r.waveforms.paw)).toBeGreaterThan(39);
    for (const b of r.breaths) expect(b.reliefVolume).toBeGreaterThan(100);
  });

  it("with the default limit, the high-pressure exit releases and raises a high-pressure alarm with its time", () => {
    const r = run("volume-control", { Vt: 800, Ti: 0.5, RR: 15 }, stiff, DEFAULT_RIG, 12);
    const hp = r.alarms.filter((a) => a.kind === "high-pressure");
    expect(hp.length).toBe(r.breaths.length);
    for (const [i, a] of hp.entries()) {
      expect(a.priority).toBe("high");
      expect(a.t).toBeGreaterThan(r.breaths[i].start);
      expect(a.t).toBeLessThan(r.breaths[i].start + 0.5);
    }
    expect(peak(r.waveforms.paw)).toBeLessThanOrEqual(40 + 2);
    // The breath was cut short: far less than the set 800 mL went in.
    for (const b of r.breaths) expect(b.vti).toBeLessThan(400);
    // The safe step is visited after each exit.
    expect(r.steps.filter((s) => s.step === "highPressure").length).toBe(hp.length);
  });

  it("a normal adult under the default settings never reaches the relief valve", () => {
    const r = run("volume-control", {}, { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 }, DEFAULT_RIG, 20);
    expect(peak(r.waveforms.paw)).toBeLessThan(30);
    expect(r.alarms).toEqual([]);
    for (const b of r.breaths) expect(b.reliefVolume).toBe(0);
  });
});
