/**
 * Breath metrics and asynchrony (ENGINE.md "Metrics"). Asynchrony definitions after Thille et al.,
 * Intensive Care Med 2006;32:1515–1522:
 * - ineffective effort: an effort starting during expiration or a wait that produced no breath;
 * - double triggering: two cycles separated by an expiratory time under half the mean inspiratory time,
 *   the first patient-triggered (the second cycle is flagged);
 * - auto-triggering: a breath the controller took as patient-triggered with no effort under way;
 * - short cycle: Ti < ½ mean Ti; prolonged cycle: Ti > 2 × mean Ti;
 * - asynchrony index (%) = events / (ventilator cycles + ineffective efforts) × 100 (> 10 % is severe).
 */
import type { StepKind } from "@/machines/schema";
import type { EffortSchedule } from "./effort";
import type { Breath, StepInterval, Summary, TriggerSource } from "./types";

/** A breath as the controller records it during the run (SI-ish internal units). */
export interface BreathRecord {
  start: number;
  trigger: TriggerSource;
  inspEnd: number | null;
  end: number | null;
  pip: number;
  pplat: number | null;
  peep: number | null;
  vtiL: number;
  vteL: number;
  peakFlowLps: number;
  reliefL: number;
}

/** Step kinds during which an effort onset counts as expiratory. */
const EXPIRATORY_KINDS: ReadonlySet<StepKind> = new Set(["exhale", "wait-for-trigger"]);

export interface MetricsInput {
  records: BreathRecord[];
  efforts: EffortSchedule;
  steps: StepInterval[];
  stepKinds: Record<string, StepKind>;
  /** Simulated time so far, s. */
  timeS: number;
  /** True airway pressure at a time (from the waveform), for end-expiratory pressure before an effort. */
  pawAt?: (tS: number) => number;
}

export interface Metrics {
  breaths: Breath[];
  efforts: Array<{ onset: number; end: number; amplitude: number; triggered: boolean }>;
  summary: Summary;
}

function mean(xs: number[]): number | null {
  return xs.length ? xs.reduce((a, b) => a + b, 0) / xs.length : null;
}

/** p-th percentile by nearest rank (p in 0..100). */
export function percentile(xs: number[], p: number): number | null {
  if (!xs.length) return null;
  const s = [...xs].sort((a, b) => a - b);
  const rank = Math.max(1, Math.ceil((p / 100) * s.length));
  return s[rank - 1];
}

function stepKindAt(steps: StepInterval[], kinds: Record<string, StepKind>, t: number): StepKind | null {
  // Binary search over intervals [from, to).
  let lo = 0;
  let hi = steps.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const s = steps[mid];
    if (t < s.from) hi = mid - 1;
    else if (t >= s.to) lo = mid + 1;
    else return kinds[s.step] ?? null;
  }
  return null;
}

export function computeMetrics(input: MetricsInput): Metrics {
  const { records, efforts, steps, stepKinds, timeS } = input;
  const done = records.filter((r) => r.inspEnd !== null);
  const nEff = efforts.count;
  const triggered = new Array<boolean>(nEff).fill(false);
  const used = new Array<boolean>(nEff).fill(false);
  const breathStarts = done.map((r) => r.start);

  const breaths: Breath[] = done.map((r, index) => {
    const inspEnd = r.inspEnd as number;
    const end = r.end ?? timeS;
    const ti = inspEnd - r.start;
    const te = end - inspEnd;
    // The effort under way at the breath start: the first one not already credited with a breath; failing
    // that, one already credited (a second cycle within the same effort: double triggering, not auto).
    let effortIdx = -1;
    let underWay = -1;
    for (let i = 0; i < nEff && efforts.onsetS[i] <= r.start + 1e-9; i++) {
      if (efforts.endS[i] >= r.start - 1e-9) {
        if (underWay < 0) underWay = i;
        if (!used[i]) {
          effortIdx = i;
          break;
        }
      }
    }
    const flags: Breath["flags"] = [];
    let latencyMs: number | null = null;
    if (effortIdx >= 0) used[effortIdx] = true;
    if (r.trigger === "patient") {
      if (effortIdx >= 0) {
        triggered[effortIdx] = true;
        latencyMs = (r.start - efforts.onsetS[effortIdx]) * 1000;
      } else {
        flags.push("auto-trigger");
      }
    }
    if (r.trigger === "patient" && effortIdx < 0 && underWay >= 0) flags.pop();
    const onsetIdx = effortIdx >= 0 ? effortIdx : underWay;
    return {
      index,
      start: r.start,
      trigger: r.trigger,
      effortOnset: onsetIdx >= 0 ? efforts.onsetS[onsetIdx] : null,
      latencyMs,
      pip: r.pip,
      pplat: r.pplat,
      peep: r.peep ?? r.pip,
      vti: r.vtiL * 1000,
      vte: r.vteL * 1000,
      ti,
      te,
      ie: ti > 0 ? te / ti : null,
      peakFlow: r.peakFlowLps * 60,
      reliefVolume: r.reliefL * 1000,
      flags,
    };
  });

  // End-expiratory pressure: at the end of expiration, which for a breath the patient started is the
  // onset of that effort (the trigger itself pulls Paw below PEEP by the sensitivity).
  if (input.pawAt) {
    for (let i = 0; i + 1 < breaths.length; i++) {
      const next = breaths[i + 1];
      if (next.effortOnset !== null && next.effortOnset >= breaths[i].start + breaths[i].ti && next.effortOnset < next.start) {
        breaths[i].peep = input.pawAt(next.effortOnset);
      }
    }
  }

  const meanTi = mean(breaths.map((b) => b.ti));
  let doubleTriggers = 0;
  let shortCycles = 0;
  let prolongedCycles = 0;
  if (meanTi !== null) {
    for (let i = 0; i < breaths.length; i++) {
      const b = breaths[i];
      if (b.ti < 0.5 * meanTi) {
        b.flags.push("short-cycle");
        shortCycles++;
      } else if (b.ti > 2 * meanTi) {
        b.flags.push("prolonged-cycle");
        prolongedCycles++;
      }
      if (i > 0) {
        const prev = breaths[i - 1];
        if (prev.trigger === "patient" && b.start - (prev.start + prev.ti) < 0.5 * meanTi) {
          b.flags.push("double-trigger");
          doubleTriggers++;
        }
      }
    }
  }
  const autoTriggers = breaths.filter((b) => b.flags.includes("auto-trigger")).length;

  // Ineffective efforts: onset during expiration or a wait, no breath started while the effort lasted.
  const effortList: Metrics["efforts"] = [];
  let ineffectiveEfforts = 0;
  let effortsSoFar = 0;
  for (let i = 0; i < nEff; i++) {
    const onset = efforts.onsetS[i];
    if (onset >= timeS) break;
    effortsSoFar++;
    const end = efforts.endS[i];
    effortList.push({ onset, end, amplitude: efforts.amplitudeCmH2O[i], triggered: triggered[i] });
    const kind = stepKindAt(steps, stepKinds, onset);
    if (kind === null || !EXPIRATORY_KINDS.has(kind)) continue;
    if (end > timeS) continue; // still under way: not yet ineffective
    const anyBreath = breathStarts.some((s) => s >= onset - 1e-9 && s <= end + 1e-9);
    if (!anyBreath) ineffectiveEfforts++;
  }

  const latencies = breaths.filter((b) => b.latencyMs !== null).map((b) => b.latencyMs as number);
  let rr: number | null = null;
  if (breaths.length >= 2) {
    rr = (60 * (breaths.length - 1)) / (breaths[breaths.length - 1].start - breaths[0].start);
  } else if (breaths.length === 1 && timeS > 0) {
    rr = 60 / timeS;
  }
  const vte = mean(breaths.map((b) => b.vte));
  const events = ineffectiveEfforts + doubleTriggers + autoTriggers + shortCycles + prolongedCycles;
  const cycles = breaths.length + ineffectiveEfforts;
  const pplats = breaths.filter((b) => b.pplat !== null).map((b) => b.pplat as number);
  const ies = breaths.filter((b) => b.ie !== null).map((b) => b.ie as number);

  const summary: Summary = {
    breaths: breaths.length,
    pip: mean(breaths.map((b) => b.pip)),
    pplat: mean(pplats),
    peep: mean(breaths.map((b) => b.peep)),
    vti: mean(breaths.map((b) => b.vti)),
    vte,
    rr,
    ie: mean(ies),
    minuteVolume: rr !== null && vte !== null ? (rr * vte) / 1000 : null,
    peakFlow: mean(breaths.map((b) => b.peakFlow)),
    triggerLatencyMs: {
      mean: mean(latencies),
      p95: percentile(latencies, 95),
      max: latencies.length ? Math.max(...latencies) : null,
      n: latencies.length,
    },
    asynchronyIndex: cycles > 0 ? (events / cycles) * 100 : null,
    ineffectiveEfforts,
    doubleTriggers,
    autoTriggers,
    shortCycles,
    prolongedCycles,
    efforts: effortsSoFar,
  };
  return { breaths, efforts: effortList, summary };
}
