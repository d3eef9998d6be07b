/**
 * `npm run bench:sim` — prints the engine's speed figures (issue 3 §8). A script, not a timed test.
 * Targets: engine ≤ 2× a bare RK4 single-compartment loop; ≥ 100× faster than mathjs solveODE;
 * the 8 ISO 80601-2-12 rows × 60 s under 0.25 s.
 */
import * as mathjs from "mathjs";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { simulate } from "@/lib/sim/simulate";
import type { SimOptions } from "@/lib/sim/types";
import { getTemplate } from "@/machines/templates";

const { solveODE } = mathjs as unknown as {
  solveODE: (f: (t: number, y: number[]) => number[], span: number[], y0: number[], opts: object) => { t: number[]; y: number[][] };
};

const DURATION_S = 60;
const DT_S = 0.001;
const CMH2O_PER_HPA = 100 / 98.0665;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time(fn: () => void, repeats: number): number {
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
  }
  return median(times);
}

// 1. The engine: 60 s adult assist-volume with patient effort, dt 1 ms, scan 10 ms, default rig.
const assistCase: SimOptions = {
  definition: getTemplate("assist-volume")!.definition,
  patient: {
    complianceMlPerCmH2O: 50,
    resistanceCmH2OPerLps: 8,
    effort: { shape: "half-sine", amplitudeCmH2O: 6, ratePerMin: 18, effortTimeS: 0.9, onsetS: 1, variability: 0.2 },
  },
  rig: DEFAULT_RIG,
  durationS: DURATION_S,
  dtS: DT_S,
  scanS: 0.01,
  seed: 1,
};

// 2. A bare single-compartment RK4 loop for the same 60 s and dt: dV/dt = (Paw(t) − V/C)/R with a square
// pressure wave, volume and flow stored (so the loop cannot be optimised away).
function bareRk4(): number {
  const n = Math.round(DURATION_S / DT_S);
  const vol = new Float64Array(n);
  const flow = new Float64Array(n);
  const C = 0.05;
  const R = 8;
  const paw = (t: number) => (t % 3 < 1 ? 15 : 5);
  const f = (t: number, v: number) => (paw(t) - v / C) / R;
  let v = 5 * C;
  const h = DT_S;
  for (let i = 0; i < n; i++) {
    const t = i * h;
    const k1 = f(t, v);
    const k2 = f(t + h / 2, v + (h / 2) * k1);
    const k3 = f(t + h / 2, v + (h / 2) * k2);
    const k4 = f(t + h, v + h * k3);
    v += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    vol[i] = v;
    flow[i] = k1;
  }
  return vol[n - 1] + flow[n - 1];
}

// 3. The 8 ISO rows (transcribed) under pressure-control on the ideal circuit, 60 s each.
const ISO = [
  [50, 5, 20, 1, 10, 5],
  [50, 20, 12, 1, 15, 10],
  [20, 5, 20, 1, 25, 5],
  [20, 20, 20, 1, 25, 10],
  [20, 20, 20, 1, 15, 5],
  [20, 50, 12, 1, 25, 10],
  [10, 50, 20, 1, 30, 5],
  [10, 10, 20, 1, 25, 10],
];
const pc = getTemplate("pressure-control")!.definition;
function isoRows(): void {
  for (const [C, R, f, Ti, dP, peep] of ISO) {
    simulate({
      definition: pc,
      settings: { PEEP: peep * CMH2O_PER_HPA, Pinsp: dP * CMH2O_PER_HPA, RR: f, Ti, rise: 0 },
      patient: { complianceMlPerCmH2O: C / CMH2O_PER_HPA, resistanceCmH2OPerLps: R * CMH2O_PER_HPA },
      rig: "ideal",
      durationS: DURATION_S,
    });
  }
}

// 4. mathjs solveODE on the same pressure-control case (ISO row 1, 60 s), phase by phase (the pressure
// steps are discontinuities), at a tolerance that matches the engine's accuracy on this case.
const row1 = { C: 0.05, R: 5, dP: 10, Ti: 1, period: 3 };
function analyticVti(): number {
  return row1.C * row1.dP * (1 - Math.exp(-row1.Ti / (row1.C * row1.R))) * 1000;
}
function solveOdeRow1(tol: number): number {
  let v = 0;
  let vti = 0;
  for (let t0 = 0; t0 < DURATION_S - 1e-9; t0 += row1.period) {
    const insp = solveODE((_t, y) => [(row1.dP - y[0] / row1.C) / row1.R], [t0, t0 + row1.Ti], [v], { tol });
    const vEnd = insp.y[insp.y.length - 1][0];
    if (t0 === 0) vti = vEnd * 1000;
    const exp = solveODE((_t, y) => [(-y[0] / row1.C) / row1.R], [t0 + row1.Ti, t0 + row1.period], [vEnd], { tol });
    v = exp.y[exp.y.length - 1][0];
  }
  return vti;
}

function main(): void {
  // Warm up the JIT on every path.
  for (let i = 0; i < 3; i++) {
    simulate(assistCase);
    bareRk4();
    isoRows();
  }
  const engineMs = time(() => simulate(assistCase), 7);
  const rk4Ms = time(bareRk4, 15);
  const isoMs = time(isoRows, 5);
  const engineRow1 = simulate({
    definition: pc,
    settings: { PEEP: 5, Pinsp: 10, RR: 20, Ti: 1, rise: 0 },
    patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 },
    rig: "ideal",
    durationS: DURATION_S,
  });
  const engineRow1Ms = time(
    () =>
      simulate({
        definition: pc,
        settings: { PEEP: 5, Pinsp: 10, RR: 20, Ti: 1, rise: 0 },
        patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 },
        rig: "ideal",
        durationS: DURATION_S,
      }),
    7,
  );
  const engineErr = Math.abs(engineRow1.breaths[0].vti - analyticVti()) / analyticVti();
  // Loosest solveODE tolerance whose first-breath Vti error is no worse than the engine's. The engine's
  // exponential update is exact for a constant pressure (its error is rounding), so the search stops at
  // the 1e-9 floor: solveODE's tolerance is then tighter than anything a test asks of either.
  let tol = 1e-3;
  while (tol > 1e-12 && Math.abs(solveOdeRow1(tol) - analyticVti()) / analyticVti() > Math.max(engineErr, 1e-9)) tol /= 10;
  const odeErr = Math.abs(solveOdeRow1(tol) - analyticVti()) / analyticVti();
  const odeMs = time(() => solveOdeRow1(tol), 3);

  const fmt = (x: number, d = 2) => x.toFixed(d);
  const lines = [
    `Tidewright engine benchmark (Node ${process.version}, median of repeated runs)`,
    ``,
    `assist-volume, adult with effort, 60 s, dt 1 ms, scan 10 ms, default rig`,
    `  engine wall time                 ${fmt(engineMs)} ms   (full-resolution waveforms: 7 typed arrays × 60 000 samples)`,
    `  bare single-compartment RK4 loop ${fmt(rk4Ms)} ms   (same 60 s, dt 1 ms, same process)`,
    `  ratio engine / bare loop         ${fmt(engineMs / rk4Ms, 1)}×   (target ≤ 2×)`,
    `  real-time factor                 ${fmt((DURATION_S * 1000) / engineMs, 0)}× faster than real time`,
    ``,
    `ISO 80601-2-12 rows 1–8 × 60 s, pressure-control, ideal circuit`,
    `  total                            ${fmt(isoMs)} ms   (target < 250 ms)`,
    ``,
    `pressure-control, ISO row 1, 60 s: engine vs mathjs solveODE at matching accuracy`,
    `  engine                           ${fmt(engineRow1Ms)} ms   (first-breath Vti error ${engineErr.toExponential(1)})`,
    `  solveODE (RK45, tol ${tol.toExponential(0)})        ${fmt(odeMs)} ms   (first-breath Vti error ${odeErr.toExponential(1)})`,
    `  ratio solveODE / engine          ${fmt(odeMs / engineRow1Ms, 0)}×   (target ≥ 100×)`,
  ];
  process.stdout.write(lines.join("\n") + "\n");
}

main();
