"use client";
/**
 * Two runs overlaid on shared axes — pressure, flow, volume — A solid, B dashed (so the two read apart
 * without colour), one synced cursor, and one window for both: zoom and pan fetch the same window of each run.
 */
import { useEffect, useId, useMemo, useRef, useState } from "react";
import type uPlot from "uplot";
import type { WaveformWindow } from "../lib/api";
import { joinOnTime } from "../lib/align";
import { type TimeWindow, clampWindow, fullWindow, sameWindow } from "../lib/time-window";
import { pointsForWidth, useWaveform } from "../use-waveform";
import { readChartTheme } from "./chart-theme";
import { signalChartOptions } from "./signal-options";
import { type ChartOptions, UplotChart } from "./uplot-chart";
import { useElementWidth } from "./use-element-width";
import { WindowControls } from "./window-controls";
import "./runs-charts.css";

const COMPARE_SIGNALS = ["paw", "flow", "volume"] as const;
type CompareSignal = (typeof COMPARE_SIGNALS)[number];

const SPECS: Record<CompareSignal, { title: string; axis: string; unit: string; digits: number; height: number }> = {
  paw: { title: "Airway pressure", axis: "Paw (cmH2O)", unit: "cmH2O", digits: 1, height: 190 },
  flow: { title: "Flow", axis: "Flow (L/min)", unit: "L/min", digits: 1, height: 170 },
  volume: { title: "Volume", axis: "Volume (mL)", unit: "mL", digits: 0, height: 170 },
};

interface CompareOverlayProps {
  aId: string;
  bId: string;
  durationS: number;
}

function joined(a: WaveformWindow | undefined, b: WaveformWindow | undefined): uPlot.AlignedData[] | null {
  if (!a || !b) return null;
  const j = joinOnTime(
    { t: a.t, values: COMPARE_SIGNALS.map((s) => a.signals[s] ?? []) },
    { t: b.t, values: COMPARE_SIGNALS.map((s) => b.signals[s] ?? []) },
  );
  return COMPARE_SIGNALS.map((_, k) => [j.t, j.a[k], j.b[k]] as uPlot.AlignedData);
}

export function CompareOverlay({ aId, bId, durationS }: CompareOverlayProps) {
  const wrapperRef = useRef<HTMLDivElement>(null);
  const width = useElementWidth(wrapperRef, 900);
  const points = pointsForWidth((width ?? 900) - 80);
  const [view, setView] = useState<TimeWindow>(() => fullWindow(durationS));
  const qa = useWaveform(aId, view, points, COMPARE_SIGNALS, width !== null);
  const qb = useWaveform(bId, view, points, COMPARE_SIGNALS, width !== null);
  const syncKey = `runs-compare-${useId()}`;

  const stateRef = useRef({ view, durationS });
  useEffect(() => {
    stateRef.current = { view, durationS };
  });

  const makeOptions = useMemo(() => {
    const change = (next: TimeWindow) => {
      const clamped = clampWindow(next, stateRef.current.durationS);
      if (!sameWindow(clamped, stateRef.current.view)) setView(clamped);
    };
    const behaviour = { syncKey, onSelect: change, onReset: () => change(fullWindow(stateRef.current.durationS)) };
    return COMPARE_SIGNALS.map((key, i) => (): ChartOptions => {
      const theme = readChartTheme();
      const spec = SPECS[key];
      return signalChartOptions({
        theme,
        axisLabel: spec.axis,
        series: [
          { label: `A ${spec.title}`, unit: spec.unit, digits: spec.digits, stroke: theme.compareA },
          { label: `B ${spec.title}`, unit: spec.unit, digits: spec.digits, stroke: theme.compareB, dash: [6, 4] },
        ],
        showTimeAxis: i === COMPARE_SIGNALS.length - 1,
        behaviour,
        plugins: [],
      });
    });
  }, [syncKey]);

  const data = useMemo(() => joined(qa.data, qb.data), [qa.data, qb.data]);
  const xRange = useMemo(() => ({ min: view.from, max: view.to }), [view.from, view.to]);
  const error = qa.error ?? qb.error;
  const ready = data && !qa.isPlaceholderData && !qb.isPlaceholderData;

  return (
    <div className="flex flex-col gap-2">
      <WindowControls view={view} durationS={durationS} onChange={setView} loading={qa.isFetching || qb.isFetching} />
      <div
        ref={wrapperRef}
        className="runs-charts rounded-md border border-line bg-surface p-1"
        data-testid="compare-overlay"
        data-state={error ? "error" : ready ? "ready" : "loading"}
        data-from={view.from.toFixed(3)}
        data-to={view.to.toFixed(3)}
      >
        {error ? (
          <p role="alert" className="p-4 text-sm text-danger-700">
            Could not load the waveforms: {error.message}
          </p>
        ) : null}
        {!data && !error ? <p className="p-4 text-sm text-ink-500">Loading waveforms…</p> : null}
        {data
          ? COMPARE_SIGNALS.map((key, i) => (
              <UplotChart
                key={key}
                testId={`compare-chart-${key}`}
                className={i === 0 ? "runs-chart runs-chart-first" : "runs-chart"}
                makeOptions={makeOptions[i]}
                data={data[i]}
                height={SPECS[key].height}
                xRange={xRange}
              />
            ))
          : null}
      </div>
    </div>
  );
}
