/**
 * The plant against analytic single-compartment results and published bench conditions.
 * Sources are named beside each check, tagged published, derived, memory or common practice.
 */
import { describe, expect, it } from "vitest";
import { CMH2O_PER_HPA, run, sampleAt } from "./helpers";

const passive = (c: number, r: number) => ({ complianceMlPerCmH2O: c, resistanceCmH2OPerLps: r });

describe("equation of motion (Chatburn, Respir Care 2014;59(4):e61 — published)", () => {
  it("constant-flow worked example: Vt 500 mL, 60 L/min, R 10, C 50, PEEP 5 → Pplat 15, PIP 25 (derived)", () => {
    const r = run("volume-control", { PEEP: 5, Vt: 500, Ti: 0.5, pause: 0.3, RR: 12 }, passive(50, 10), "ideal", 10);
    expect(r.breaths.length).toBeGreaterThanOrEqual(2);
    for (const b of r.breaths) {
      // Pplat = PEEP + Vt/C; PIP = Pplat + R·flow (Chatburn, Respir Care 2014;59(4):e61 equation of motion; derived)
      expect(b.pplat).toBeCloseTo(15, 1);
      expect(b.pip).toBeCloseTo(25, 1);
      expect(b.vti).toBeCloseTo(500, 0);
      // Static compliance Vt/(Pplat − PEEP) and resistance (PIP − Pplat)/flow (standard mechanics — published)
      expect(b.vti / ((b.pplat as number) - 5)).toBeCloseTo(50, 0);
      expect((b.pip - (b.pplat as number)) / 1).toBeCloseTo(10, 1);
    }
  });

  it("pressure control from a relaxed lung: V(t) = C·ΔP·(1 − e^(−t/τ)), peak flow ΔP/R (derived)", () => {
    const C = 50;
    const R = 5;
    const dP = 10;
    const tau = (C / 1000) * R;
    const r = run("pressure-control", { PEEP: 5, Pinsp: dP, RR: 20, Ti: 1, rise: 0 }, passive(C, R), "ideal", 3);
    for (const t of [0.05, 0.1, 0.25, 0.5, 1.0]) {
      const expected = C * dP * (1 - Math.exp(-t / tau));
      expect(Math.abs(sampleAt(r, "volume", t) - expected)).toBeLessThan(0.002 * C * dP);
    }
    // Peak inspiratory flow ΔP/R = 2 L/s = 120 L/min at the start; the first 1 ms step averages it (−0.2 %).
    expect(r.breaths[0].peakFlow).toBeGreaterThan(120 * 0.997);
    expect(r.breaths[0].peakFlow).toBeLessThanOrEqual(120);
    expect(r.breaths[0].vti).toBeCloseTo(490.8, 0); // ISO 80601-2-12:2020 Table 201.105 row 1, transcribed; analytic C·ΔP·(1 − e^(−4)) (derived)
  });

  it("passive exhalation: fraction exhaled after 1–5 τ is 1 − e^(−n) (derived: 0.63212 … 0.99326)", () => {
    const C = 50;
    const R = 5; // τ = 0.25 s
    const tau = 0.25;
    const r = run("pressure-control", { PEEP: 5, Pinsp: 10, RR: 12, Ti: 2, rise: 0 }, passive(C, R), "ideal", 5);
    const v0 = sampleAt(r, "volume", 2);
    const fractions = [0.63212, 0.86466, 0.95021, 0.98168, 0.99326];
    fractions.forEach((f, i) => {
      const n = i + 1;
      const exhaled = (v0 - sampleAt(r, "volume", 2 + n * tau)) / v0;
      expect(exhaled).toBeCloseTo(f, 3);
    });
  });
});

/**
 * ISO 80601-2-12:2020 Table 201.105 (transcribed), adult pressure-controlled test-lung rows.
 * Units hPa, mL/hPa, hPa/(L/s); converted with 1 hPa = 1.019716 cmH2O. The VT column is nominal: we
 * assert the single-compartment analytic value instead (derived).
 */
const ISO_ROWS = [
  { row: 1, C: 50, R: 5, f: 20, Ti: 1, dP: 10, PEEP: 5 },
  { row: 2, C: 50, R: 20, f: 12, Ti: 1, dP: 15, PEEP: 10 },
  { row: 3, C: 20, R: 5, f: 20, Ti: 1, dP: 25, PEEP: 5 },
  { row: 4, C: 20, R: 20, f: 20, Ti: 1, dP: 25, PEEP: 10 },
  { row: 5, C: 20, R: 20, f: 20, Ti: 1, dP: 15, PEEP: 5 },
  { row: 6, C: 20, R: 50, f: 12, Ti: 1, dP: 25, PEEP: 10 },
  { row: 7, C: 10, R: 50, f: 20, Ti: 1, dP: 30, PEEP: 5 },
  { row: 8, C: 10, R: 10, f: 20, Ti: 1, dP: 25, PEEP: 10 },
];

describe("ISO 80601-2-12:2020 Table 201.105 (transcribed) under pressure-control, ideal circuit", () => {
  for (const row of ISO_ROWS) {
    it(`row ${row.row}: delivered Vt and PIP match the single-compartment prediction (derived)`, () => {
      const C = row.C / CMH2O_PER_HPA; // mL/cmH2O
      const R = row.R * CMH2O_PER_HPA; // cmH2O/(L/s)
      const dP = row.dP * CMH2O_PER_HPA;
      const peep = row.PEEP * CMH2O_PER_HPA;
      const tau = (C / 1000) * R;
      const te = 60 / row.f - row.Ti;
      const r = run("pressure-control", { PEEP: peep, Pinsp: dP, RR: row.f, Ti: row.Ti, rise: 0 }, passive(C, R), "ideal", 60);
      const a = Math.exp(-row.Ti / tau);
      const b = Math.exp(-te / tau);
      // First breath from a relaxed lung: C·ΔP·(1 − e^(−Ti/τ)); steady state (periodic): × (1 − b)/(1 − a·b).
      const first = C * dP * (1 - a);
      const steady = (first * (1 - b)) / (1 - a * b);
      expect(r.breaths[0].vti / first).toBeCloseTo(1, 3);
      const last = r.breaths[r.breaths.length - 2];
      expect(last.vti / steady).toBeCloseTo(1, 3);
      for (const br of r.breaths) expect(br.pip).toBeCloseTo(peep + dP, 3);
      // Well inside the standard family's volume accuracy, ±(4 mL + 15 %) (memory).
      expect(Math.abs(last.vti - steady)).toBeLessThan(4 + 0.15 * steady);
      expect(r.alarms.filter((x) => x.kind === "high-pressure")).toHaveLength(0);
    });
  }
});
