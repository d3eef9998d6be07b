/** Shared helpers for the engine tests. */
import { simulate } from "@/lib/sim/simulate";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import type { PatientInput, RigInput, SimOptions, SimResult } from "@/lib/sim/types";
import { getTemplate } from "@/machines/templates";

/** 1 hPa = 1.019716 cmH2O (derived from 100 Pa / 98.0665 Pa). */
export const CMH2O_PER_HPA = 100 / 98.0665;

export function run(
  template: string,
  settings: Record<string, number | string>,
  patient: PatientInput,
  rig: RigInput | "ideal",
  durationS: number,
  extra: Partial<SimOptions> = {},
): SimResult {
  const t = getTemplate(template);
  if (!t) throw new Error(`no template ${template}`);
  return simulate({ definition: t.definition, settings, patient, rig, durationS, ...extra });
}

/** The default rig with noise-free sensors (deterministic thresholds for latency comparisons). */
export function quietRig(overrides: Partial<RigInput["sensor"]> = {}): RigInput {
  return {
    ...DEFAULT_RIG,
    sensor: { ...DEFAULT_RIG.sensor, pressureNoiseCmH2O: 0, flowNoiseLpm: 0, pressureResolutionCmH2O: 0, flowResolutionLpm: 0, ...overrides },
  };
}

/** Waveform sample at time t (samples at t = k·dt). */
export function sampleAt(r: SimResult, series: "volume" | "paw" | "flow" | "pmus", t: number): number {
  const w = r.waveforms;
  const dt = w.t[1] - w.t[0];
  const i = Math.round((t - w.t[0]) / dt);
  return w[series][i];
}
