"use client";
/**
 * The run's four traces stacked on one time axis — airway pressure, flow, volume, muscle pressure — with one
 * synced cursor, the active step as bands behind the traces, breath starts marked by trigger source and
 * trigger latency on patient-triggered breaths. Zoom (drag, buttons, keys) and pan change the window; each
 * window is fetched from the server at the resolution the chart's width can show.
 */
import { useEffect, useId, useMemo, useRef } from "react";
import type uPlot from "uplot";
import { SIGNALS, type SignalKey } from "../lib/api";
import { type TimeWindow, clampWindow, fullWindow, panWindow, sameWindow, zoomWindow } from "../lib/time-window";
import { pointsForWidth, useWaveform } from "../use-waveform";
import { breathMarkersPlugin } from "./breath-markers";
import { readChartTheme } from "./chart-theme";
import { focusMarkerPlugin } from "./focus-marker";
import { latencyMarkersPlugin } from "./latency-markers";
import type { ChartOverlay } from "./overlay";
import { signalChartOptions } from "./signal-options";
import { stepBandsPlugin } from "./step-bands";
import { type ChartOptions, UplotChart } from "./uplot-chart";
import { useElementWidth } from "./use-element-width";
import { WindowControls } from "./window-controls";
import "./runs-charts.css";

interface SignalChart {
  key: Exclude<SignalKey, "arm">;
  title: string;
  axis: string;
  unit: string;
  digits: number;
  height: number;
}

export const SIGNAL_CHARTS: readonly SignalChart[] = [
  { key: "paw", title: "Airway pressure", axis: "Paw (cmH2O)", unit: "cmH2O", digits: 1, height: 180 },
  { key: "flow", title: "Flow", axis: "Flow (L/min)", unit: "L/min", digits: 1, height: 150 },
  { key: "volume", title: "Volume", axis: "Volume (mL)", unit: "mL", digits: 0, height: 140 },
  { key: "pmus", title: "Muscle pressure", axis: "Pmus (cmH2O)", unit: "cmH2O", digits: 1, height: 150 },
];

interface StackedWaveformsProps {
  runId: string;
  durationS: number;
  view: TimeWindow;
  onViewChange: (view: TimeWindow) => void;
  overlay: ChartOverlay;
  /** A plain click on a chart, at time t (s). */
  onPickTime?: (t: number) => void;
}

function toTyped(values: readonly number[] | undefined, length: number): Float64Array {
  const out = new Float64Array(length);
  if (values) for (let i = 0; i < length; i += 1) out[i] = values[i] ?? Number.NaN;
  return out;
}

export function StackedWaveforms({ runId, durationS, view, onViewChange, overlay, onPickTime }: StackedWaveformsProps) {
  const wrapperRef = useRef<HTMLDivElement>(null);
  const width = useElementWidth(wrapperRef, 900);
  const points = pointsForWidth((width ?? 900) - 80);
  const query = useWaveform(runId, view, points, SIGNALS, width !== null);
  const syncKey = `runs-${useId()}`;

  const instances = useRef<(uPlot | null)[]>([]);
  const overlayRef = useRef(overlay);
  const behaviourRef = useRef({ onViewChange, onPickTime, view, durationS });
  useEffect(() => {
    behaviourRef.current = { onViewChange, onPickTime, view, durationS };
  });
  useEffect(() => {
    overlayRef.current = overlay;
    for (const u of instances.current) u?.redraw(false);
  }, [overlay]);

  const makeOptions = useMemo(() => {
    const source = () => overlayRef.current;
    const change = (next: TimeWindow) => {
      const { view: current, durationS: total, onViewChange: notify } = behaviourRef.current;
      const clamped = clampWindow(next, total);
      if (!sameWindow(clamped, current)) notify(clamped);
    };
    const behaviour = {
      syncKey,
      onSelect: change,
      onReset: () => change(fullWindow(behaviourRef.current.durationS)),
      onClickTime: (t: number) => behaviourRef.current.onPickTime?.(t),
    };
    return SIGNAL_CHARTS.map((spec, i) => (): ChartOptions => {
      const theme = readChartTheme();
      const plugins = [
        stepBandsPlugin(source, theme, { labels: i === 0 }),
        breathMarkersPlugin(source, theme, { glyphs: i === 0 }),
        focusMarkerPlugin(source, theme),
      ];
      if (spec.key === "paw") plugins.push(latencyMarkersPlugin(source, theme, { labels: true, shade: false }));
      if (spec.key === "pmus") plugins.push(latencyMarkersPlugin(source, theme, { labels: false, shade: true }));
      return signalChartOptions({
        theme,
        axisLabel: spec.axis,
        series: [{ label: spec.title, unit: spec.unit, digits: spec.digits, stroke: theme.traces[spec.key] }],
        showTimeAxis: i === SIGNAL_CHARTS.length - 1,
        behaviour,
        plugins,
        topPadding: i === 0 ? 10 : 6,
      });
    });
  }, [syncKey]);

  const onInstance = useMemo(
    () =>
      SIGNAL_CHARTS.map((_, i) => (u: uPlot | null) => {
        instances.current[i] = u;
      }),
    [],
  );

  const loaded = query.data;
  const chartData = useMemo(() => {
    if (!loaded) return null;
    const n = loaded.t.length;
    const x = Float64Array.from(loaded.t);
    return SIGNAL_CHARTS.map((spec) => {
      const values = loaded.signals[spec.key];
      return values ? ([x, toTyped(values, n)] as uPlot.AlignedData) : null;
    });
  }, [loaded]);

  const xRange = useMemo(() => ({ min: view.from, max: view.to }), [view.from, view.to]);

  const onKeyDown = (event: React.KeyboardEvent) => {
    const moves: Record<string, () => TimeWindow> = {
      ArrowLeft: () => panWindow(view, -0.25, durationS),
      ArrowRight: () => panWindow(view, 0.25, durationS),
      "+": () => zoomWindow(view, 0.5, durationS),
      "=": () => zoomWindow(view, 0.5, durationS),
      "-": () => zoomWindow(view, 2, durationS),
      Home: () => fullWindow(durationS),
    };
    const move = moves[event.key];
    if (!move) return;
    event.preventDefault();
    onViewChange(move());
  };

  const state = query.isError ? "error" : loaded && !query.isPlaceholderData ? "ready" : "loading";

  return (
    <div className="flex flex-col gap-2">
      <WindowControls view={view} durationS={durationS} onChange={onViewChange} loading={query.isFetching} />
      <div
        ref={wrapperRef}
        className="runs-charts rounded-md border border-line bg-surface p-1"
        data-testid="waveform-charts"
        data-state={state}
        data-from={view.from.toFixed(3)}
        data-to={view.to.toFixed(3)}
        data-loaded-from={loaded ? loaded.from.toFixed(3) : undefined}
        data-loaded-to={loaded ? loaded.to.toFixed(3) : undefined}
        tabIndex={0}
        role="group"
        aria-label="Waveforms: arrow keys pan, plus and minus zoom, Home shows the whole run"
        onKeyDown={onKeyDown}
      >
        {query.isError ? (
          <p role="alert" className="p-4 text-sm text-danger-700">
            Could not load the waveforms: {query.error.message}{" "}
            <button type="button" className="underline" onClick={() => void query.refetch()}>
              Retry
            </button>
          </p>
        ) : null}
        {!chartData && !query.isError ? (
          <p className="p-4 text-sm text-ink-500" data-testid="waveform-loading">
            Loading waveforms…
          </p>
        ) : null}
        {chartData
          ? SIGNAL_CHARTS.map((spec, i) =>
              chartData[i] ? (
                <UplotChart
                  key={spec.key}
                  testId={`chart-${spec.key}`}
                  className={i === 0 ? "runs-chart runs-chart-first" : "runs-chart"}
                  makeOptions={makeOptions[i]}
                  data={chartData[i]}
                  height={spec.height}
                  xRange={xRange}
                  onInstance={onInstance[i]}
                />
              ) : (
                <p key={spec.key} className="px-4 py-2 text-xs text-ink-500" data-testid={`chart-${spec.key}-missing`}>
                  {spec.title} ({spec.unit}) was not recorded in this run.
                </p>
              ),
            )
          : null}
      </div>
    </div>
  );
}
