/** One-line descriptions of a case's mechanics, effort and leak, with units. Pure. */
import type { Patient } from "@/lib/sim/types";

const fmt = (x: number, digits = 2) => String(Number(x.toFixed(digits)));

export function mechanicsText(p: Patient): string {
  const tauS = (p.complianceMlPerCmH2O / 1000) * p.resistanceCmH2OPerLps;
  const e2 = p.e2CmH2OPerL2 > 0 ? `, E2 ${fmt(p.e2CmH2OPerL2)} cmH2O/L²` : "";
  return `C ${fmt(p.complianceMlPerCmH2O)} mL/cmH2O, R ${fmt(p.resistanceCmH2OPerLps)} cmH2O/(L/s), τ ${fmt(tauS, 3)} s${e2}`;
}

export function effortText(p: Patient): string {
  const e = p.effort;
  if (e.shape === "none" || e.amplitudeCmH2O === 0) return "passive (no effort)";
  const variability = e.variability > 0 ? `, ±${fmt(e.variability * 100, 0)} % variability` : "";
  return `${e.shape}, ${fmt(e.amplitudeCmH2O)} cmH2O, ${fmt(e.ratePerMin)} /min, ${fmt(e.effortTimeS)} s${variability}`;
}

export function leakText(p: Patient): string {
  const l = p.leak;
  if (l.kind === "none" || l.coefficient === 0) return "no leak";
  return l.kind === "orifice" ? `orifice, ${fmt(l.coefficient)} L/min at 10 cmH2O` : `linear, ${fmt(l.coefficient)} L/min per cmH2O`;
}
