/**
 * Single-compartment lung, equation of motion (Chatburn, Respir Care 2014;59(4):e61):
 *
 *     Paw + Pmus = Pel(V) + R·V̇,   Pel(V) = P0 + E1·V + E2·V²   (V above the volume at P0)
 *
 * E1 = 1/C; E2 (cmH2O/L²) adds over-distension above the reference volume (off by default).
 * Units: pressure cmH2O, volume L, flow L/s, resistance cmH2O/(L/s), elastance cmH2O/L.
 */

/** Elastic recoil pressure at volume V (L above the reference volume), cmH2O. */
export function elasticPressureCmH2O(volumeL: number, p0CmH2O: number, e1CmH2OPerL: number, e2CmH2OPerL2: number): number {
  const over = volumeL > 0 ? volumeL : 0;
  return p0CmH2O + e1CmH2OPerL * volumeL + e2CmH2OPerL2 * over * over;
}

/** dPel/dV at V, cmH2O/L. */
export function localElastanceCmH2OPerL(volumeL: number, e1CmH2OPerL: number, e2CmH2OPerL2: number): number {
  return volumeL > 0 ? e1CmH2OPerL + 2 * e2CmH2OPerL2 * volumeL : e1CmH2OPerL;
}

/**
 * Lung admittance over one step of dt, L/s per cmH2O: with the driving pressure
 * Paw + Pmus − Pel held over the step and the lung linearised at V, the exact (exponential) solution
 * gives a mean flow V̇ = g·(Paw + Pmus − Pel(V)), g = (1 − e^(−dt·E/R)) / (dt·E). Unconditionally stable,
 * exact for a linear lung under a constant pressure (the textbook PC case).
 */
export function lungAdmittanceLpsPerCmH2O(dtS: number, elastanceCmH2OPerL: number, resistanceCmH2OPerLps: number): number {
  const x = (dtS * elastanceCmH2OPerL) / resistanceCmH2OPerLps;
  // -expm1 keeps precision when dt ≪ τ.
  return -Math.expm1(-x) / (dtS * elastanceCmH2OPerL);
}

/** Reference volume for a lung at rest at pressure P0: V = 0 by definition. Kept for readability. */
export const RELAXED_VOLUME_L = 0;
