/**
 * Circuit node at the patient connection (ENGINE.md):
 *
 *     Cc · dPaw/dt = Qin − V̇ − Qexh − Qrelief − Qleak + Qinlet
 *
 * All flows in L/s, pressures cmH2O. Every path is a function of Paw; the node is advanced with backward
 * Euler and the implicit equation solved by a bracketed Newton iteration. Each outflow rises with Paw
 * (and the inlet inflow falls), so the residual is strictly increasing and the root unique: stable for any
 * Cc ≥ 0 (including 0, the ideal circuit) and any valve resistance at the 1 ms step.
 */

export interface CircuitParams {
  /** Circuit compliance, L/cmH2O (0 = none). */
  complianceLPerCmH2O: number;
  /** PEEP valve opening pressure, cmH2O (threshold resistor). */
  peepValveCmH2O: number;
  /** Expiratory path resistance through the PEEP valve once open, cmH2O/(L/s). */
  expiratoryResistanceCmH2OPerLps: number;
  /** Relief valve opening pressure, cmH2O (Infinity = none). */
  reliefOpenCmH2O: number;
  reliefResistanceCmH2OPerLps: number;
  /** 0 none, 1 orifice (Q ∝ √P), 2 linear. */
  leakKind: number;
  /** orifice: L/s at 10 cmH2O; linear: L/s per cmH2O. */
  leakCoefficient: number;
  /** Inlet valve cracking pressure below ambient, cmH2O (the valve opens when Paw < −crack). */
  inletCrackingCmH2O: number;
  inletResistanceCmH2OPerLps: number;
}

export const LEAK_NONE = 0;
export const LEAK_ORIFICE = 1;
export const LEAK_LINEAR = 2;

/** Below this pressure the orifice law is replaced by a line through 0, so its slope stays finite. */
const ORIFICE_LINEAR_BELOW_CmH2O = 0.05;

/** PEEP valve: a threshold resistor, flow only while Paw exceeds its setting and the valve is open. */
export function peepValveFlowLps(pawCmH2O: number, peepCmH2O: number, resistanceCmH2OPerLps: number): number {
  return pawCmH2O > peepCmH2O ? (pawCmH2O - peepCmH2O) / resistanceCmH2OPerLps : 0;
}

/** Relief (pop-off) valve: opens above its set pressure. */
export function reliefValveFlowLps(pawCmH2O: number, openCmH2O: number, resistanceCmH2OPerLps: number): number {
  return pawCmH2O > openCmH2O ? (pawCmH2O - openCmH2O) / resistanceCmH2OPerLps : 0;
}

/** Mask/circuit leak to ambient (outflow only). */
export function leakFlowLps(pawCmH2O: number, kind: number, coefficient: number): number {
  if (kind === LEAK_NONE || pawCmH2O <= 0) return 0;
  if (kind === LEAK_LINEAR) return coefficient * pawCmH2O;
  if (pawCmH2O < ORIFICE_LINEAR_BELOW_CmH2O) {
    return (coefficient * Math.sqrt(ORIFICE_LINEAR_BELOW_CmH2O / 10) * pawCmH2O) / ORIFICE_LINEAR_BELOW_CmH2O;
  }
  return coefficient * Math.sqrt(pawCmH2O / 10);
}

function leakSlope(pawCmH2O: number, kind: number, coefficient: number): number {
  if (kind === LEAK_NONE || pawCmH2O <= 0) return 0;
  if (kind === LEAK_LINEAR) return coefficient;
  if (pawCmH2O < ORIFICE_LINEAR_BELOW_CmH2O) {
    return (coefficient * Math.sqrt(ORIFICE_LINEAR_BELOW_CmH2O / 10)) / ORIFICE_LINEAR_BELOW_CmH2O;
  }
  return coefficient / (2 * Math.sqrt(10 * pawCmH2O));
}

/** Inlet (one-way) valve for spontaneous inspiration from ambient: inflow when Paw < −cracking pressure. */
export function inletValveFlowLps(pawCmH2O: number, crackingCmH2O: number, resistanceCmH2OPerLps: number): number {
  return pawCmH2O < -crackingCmH2O ? (-crackingCmH2O - pawCmH2O) / resistanceCmH2OPerLps : 0;
}

/** Slots of the solver's in/out array (see solveCircuitNodeCmH2O). */
export const NODE_PAW = 0;
export const NODE_DT = 1;
export const NODE_QIN = 2;
export const NODE_G = 3;
export const NODE_BACK = 4;
/** Length of the solver's in/out array. */
export const NODE_IO_LENGTH = 5;

/**
 * Paw at the end of one step (backward Euler), given the previous Paw, the driver inflow qIn (L/s,
 * constant over the step), the lung as V̇ = g·(Paw − back) (see lung.ts; back = Pel(V) − Pmus) and whether
 * the PEEP valve path is open.
 *
 * Inputs and the result travel through `io` (io[NODE_PAW] = previous Paw in, new Paw out; io[NODE_DT],
 * io[NODE_QIN], io[NODE_G], io[NODE_BACK]), not through arguments and a return value: this function is too
 * large for V8 to inline into the step loop, and every double passed to or returned from a call that is not
 * inlined is boxed in a fresh heap number (measured: ~5 MB of garbage per 60 s run, most of the engine's GC).
 */
export function solveCircuitNodeCmH2O(io: Float64Array, c: CircuitParams, valveOpen: boolean): void {
  const pawPrevCmH2O = io[NODE_PAW];
  const qInLps = io[NODE_QIN];
  const lungAdmittance = io[NODE_G];
  const lungBackPressureCmH2O = io[NODE_BACK];
  const cdt = c.complianceLPerCmH2O / io[NODE_DT];
  const rExp = c.expiratoryResistanceCmH2OPerLps;
  const piecewiseLinear = c.leakKind !== LEAK_ORIFICE;
  let x = pawPrevCmH2O;
  let lo = -Infinity;
  let hi = Infinity;
  for (let iter = 0; iter < 60; iter++) {
    let g = cdt * (x - pawPrevCmH2O) + lungAdmittance * (x - lungBackPressureCmH2O) - qInLps;
    let slope = cdt + lungAdmittance;
    // Which valves conduct at x (bit set): with only linear paths, a Newton step that stays in the same
    // set of conducting paths lands exactly on the root.
    let active = 0;
    if (valveOpen && x > c.peepValveCmH2O) {
      g += (x - c.peepValveCmH2O) / rExp;
      slope += 1 / rExp;
      active |= 1;
    }
    if (x > c.reliefOpenCmH2O) {
      g += (x - c.reliefOpenCmH2O) / c.reliefResistanceCmH2OPerLps;
      slope += 1 / c.reliefResistanceCmH2OPerLps;
      active |= 2;
    }
    if (c.leakKind !== LEAK_NONE) {
      g += leakFlowLps(x, c.leakKind, c.leakCoefficient);
      slope += leakSlope(x, c.leakKind, c.leakCoefficient);
      if (x > 0) active |= 4;
    }
    if (x < -c.inletCrackingCmH2O) {
      g -= (-c.inletCrackingCmH2O - x) / c.inletResistanceCmH2OPerLps;
      slope += 1 / c.inletResistanceCmH2OPerLps;
      active |= 8;
    }
    if (g === 0) {
      io[NODE_PAW] = x;
      return;
    }
    if (g > 0) hi = x;
    else lo = x;
    let next = x - g / slope;
    // Newton can cycle across the valves' kinks: fall back to bisection inside the bracket.
    if (!(next > lo && next < hi)) {
      if (lo > -Infinity && hi < Infinity) next = 0.5 * (lo + hi);
      else next = g > 0 ? Math.max(next, x - 1000) : Math.min(next, x + 1000);
    }
    if (piecewiseLinear && activeAt(next, c, valveOpen) === active) {
      io[NODE_PAW] = next;
      return;
    }
    if (Math.abs(next - x) <= 1e-10 * (1 + Math.abs(x))) {
      io[NODE_PAW] = next;
      return;
    }
    x = next;
  }
  io[NODE_PAW] = x;
}

function activeAt(x: number, c: CircuitParams, valveOpen: boolean): number {
  let a = 0;
  if (valveOpen && x > c.peepValveCmH2O) a |= 1;
  if (x > c.reliefOpenCmH2O) a |= 2;
  if (c.leakKind !== LEAK_NONE && x > 0) a |= 4;
  if (x < -c.inletCrackingCmH2O) a |= 8;
  return a;
}
