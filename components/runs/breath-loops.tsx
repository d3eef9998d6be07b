"use client";
/**
 * Pressure–volume and flow–volume loops of one breath, from the breath's own window of the waveforms at
 * high resolution. The breath is chosen here, in the breath table, or by clicking a chart.
 */
import type { Breath } from "@/lib/sim/types";
import { DEFAULT_CHART_THEME } from "./charts/chart-theme";
import { formatNumber } from "./lib/format";
import { loopPoints } from "./lib/loop";
import { breathSpan } from "./lib/time-window";
import { LoopPlot } from "./loop-plot";
import { useWaveform } from "./use-waveform";
import { PANEL } from "./panel";

const LOOP_SIGNALS = ["paw", "flow", "volume"] as const;
const LOOP_POINTS = 1000;

interface BreathLoopsProps {
  runId: string;
  breaths: readonly Breath[];
  durationS: number;
  /** Position in `breaths`. */
  selected: number;
  onSelect: (position: number) => void;
}

export function defaultLoopBreath(breaths: readonly Breath[]): number {
  // The first breath often starts from rest; the second is the first representative one.
  return breaths.length > 1 ? 1 : 0;
}

export function BreathLoops({ runId, breaths, durationS, selected, onSelect }: BreathLoopsProps) {
  const span = breathSpan(breaths, selected, durationS);
  const query = useWaveform(runId, span ?? { from: 0, to: 1 }, LOOP_POINTS, LOOP_SIGNALS, span !== null);
  const stale = query.isPlaceholderData;
  const signals = query.data?.signals;
  const pv = loopPoints(signals?.paw, signals?.volume);
  const fv = loopPoints(signals?.volume, signals?.flow);
  const breath = breaths[selected];
  return (
    <section aria-labelledby="loops-heading" data-testid="breath-loops" className={`${PANEL} p-3`}>
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h2 id="loops-heading" className="text-sm font-semibold text-ink-800">
          Loops
        </h2>
        <label className="flex items-center gap-1 text-xs text-ink-600">
          Breath
          <select
            className="rounded border border-ink-300 bg-surface px-1 py-0.5 text-xs"
            value={selected}
            onChange={(event) => onSelect(Number(event.target.value))}
            data-testid="loop-breath-select"
          >
            {breaths.map((b, position) => (
              <option key={position} value={position}>
                {b.index} at {formatNumber(b.start, 2)} s ({b.trigger})
              </option>
            ))}
          </select>
        </label>
      </div>
      {breath ? (
        <p className="mb-2 text-[11px] text-ink-500" data-testid="loop-breath-info">
          Breath {breath.index}: {formatNumber(span?.from, 2)}–{formatNumber(span?.to, 2)} s, Vti {formatNumber(breath.vti, 0)} mL, PIP{" "}
          {formatNumber(breath.pip, 1)} cmH2O
        </p>
      ) : null}
      {query.isError ? (
        <p role="alert" className="text-xs text-danger-700">
          Could not load this breath: {query.error.message}
        </p>
      ) : (
        <div className={`grid grid-cols-1 gap-3 sm:grid-cols-2 xl:grid-cols-1 ${stale ? "opacity-50" : ""}`} data-state={query.data && !stale ? "ready" : "loading"} data-testid="loops-body">
          <LoopPlot
            title="Pressure–volume"
            points={stale ? [] : pv}
            xLabel="Paw (cmH2O)"
            yLabel="Volume (mL)"
            stroke={DEFAULT_CHART_THEME.traces.paw}
            testId="loop-pv"
          />
          <LoopPlot
            title="Flow–volume"
            points={stale ? [] : fv}
            xLabel="Volume (mL)"
            yLabel="Flow (L/min)"
            stroke={DEFAULT_CHART_THEME.traces.flow}
            testId="loop-fv"
          />
        </div>
      )}
    </section>
  );
}
