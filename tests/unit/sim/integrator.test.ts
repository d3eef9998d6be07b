/**
 * The fixed-step integrator (exponential lung update, implicit circuit node) against mathjs `solveODE`
 * (RK45, adaptive, tight tolerance) on the same equations (ENGINE.md "Integration").
 */
import * as mathjs from "mathjs";
import { describe, expect, it } from "vitest";
import { CMD_FLOW, CMD_RELEASE } from "@/lib/sim/plant";
import { run, sampleAt } from "./helpers";
import { makePlant } from "./plant-helpers";

// mathjs 15 has solveODE but its type declarations do not list it.
const { solveODE } = mathjs as unknown as {
  solveODE: (f: (t: number, y: number[]) => number[], span: number[], y0: number[], opts: object) => { y: number[][] };
};

/** State at time `to` from y0 at `from`, by solveODE at tol 1e-10 (reference). */
function reference(f: (t: number, y: number[]) => number[], from: number, to: number, y0: number[]): number[] {
  const sol = solveODE(f, [from, to], y0, { tol: 1e-10, maxStep: 0.01 });
  return sol.y[sol.y.length - 1];
}

describe("integrator vs mathjs solveODE", () => {
  it("pressure control with a linear rise on a single-compartment lung (ideal circuit)", () => {
    const C = 0.05; // L/cmH2O
    const R = 5;
    const dP = 15;
    const rise = 0.2;
    const r = run("pressure-control", { PEEP: 5, Pinsp: dP, RR: 20, Ti: 1, rise }, { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: R }, "ideal", 1.5);
    // dV/dt = (ΔP(t) − V/C)/R, V above the PEEP volume (Chatburn 2014 equation of motion)
    const f = (t: number, y: number[]) => [(dP * Math.min(1, t / rise) - y[0] / C) / R];
    for (const t of [0.05, 0.1, 0.2, 0.4, 0.7, 1.0]) {
      const vRef = reference(f, 0, t, [0])[0] * 1000;
      const v = sampleAt(r, "volume", t);
      expect(Math.abs(v - vRef)).toBeLessThan(0.5);
      expect(Math.abs(v - vRef) / vRef).toBeLessThan(0.002);
    }
  });

  it("flow source into a compliant circuit node, then release through the PEEP valve", () => {
    const k = { cMlPerCmH2O: 50, rCmH2OPerLps: 5, peepCmH2O: 5, circuit: { complianceLPerCmH2O: 0.002, expiratoryResistanceCmH2OPerLps: 3 }, durationS: 1.5 };
    const plant = makePlant(k);
    const qIn = 0.5; // L/s
    const Cc = 0.002;
    const C = 0.05;
    const R = 5;
    const Rexp = 3;
    const peep = 5;
    const rhs = (open: boolean, q: number) => (_t: number, y: number[]) => {
      const [p, v] = y;
      const vdot = (p - (peep + v / C)) / R;
      const qexh = open && p > peep ? (p - peep) / Rexp : 0;
      return [(q - vdot - qexh) / Cc, vdot];
    };
    plant.setCommand(CMD_FLOW, 0, qIn);
    const checks: Array<[number, number, number]> = [];
    let y = [peep, 0];
    let t = 0;
    for (const tc of [0.05, 0.2, 0.4]) {
      plant.run(t, Math.round((tc - t) / 0.001));
      y = reference(rhs(false, qIn), t, tc, y);
      checks.push([plant.pawCmH2O - y[0], plant.volumeL - y[1], y[0]]);
      t = tc;
    }
    plant.setCommand(CMD_RELEASE, t);
    for (const tc of [0.45, 0.6, 1.0, 1.5]) {
      plant.run(t, Math.round((tc - t) / 0.001));
      y = reference(rhs(true, 0), t, tc, y);
      checks.push([plant.pawCmH2O - y[0], plant.volumeL - y[1], y[0]]);
      t = tc;
    }
    for (const [dp, dv] of checks) {
      expect(Math.abs(dp)).toBeLessThan(0.1); // cmH2O
      expect(Math.abs(dv) * 1000).toBeLessThan(1); // mL
    }
  });

  it("stays stable on a stiff circuit at dt = 1 ms (Cc·Rexp = 10 µs, where explicit Euler diverges)", () => {
    const k = { cMlPerCmH2O: 20, rCmH2OPerLps: 5, peepCmH2O: 5, circuit: { complianceLPerCmH2O: 0.00005, expiratoryResistanceCmH2OPerLps: 0.2 }, durationS: 3 };
    const plant = makePlant(k);
    plant.setCommand(CMD_FLOW, 0, 1);
    plant.run(0, 500);
    const pPeak = plant.pawCmH2O;
    plant.setCommand(CMD_RELEASE, 0.5);
    plant.run(0.5, 2500);
    const w = plant.wave;
    for (let i = 0; i < plant.samples; i++) {
      expect(Number.isFinite(w.paw[i])).toBe(true);
      expect(w.paw[i]).toBeGreaterThan(peep(k) - 0.01);
      expect(w.paw[i]).toBeLessThan(pPeak + 0.01);
    }
    // Release: the node is quasi-static, Paw ≈ PEEP + V̇·Rexp, decaying with the lung (no ringing).
    for (let i = 600; i < plant.samples - 1; i++) expect(w.paw[i + 1]).toBeLessThanOrEqual(w.paw[i] + 1e-6);
    expect(plant.pawCmH2O).toBeCloseTo(5, 2);
    // (Explicit Euler on the node alone would multiply its error by |1 − dt/(Cc·Rexp)| = 99 per step.)
  });
});

function peep(k: { peepCmH2O: number }): number {
  return k.peepCmH2O;
}
