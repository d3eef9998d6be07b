/**
 * uPlot options shared by the run charts: a numeric time axis in seconds, a fixed y-axis width so stacked
 * charts line up, y ranges that keep zero in view, values with units in the legend, drag-to-select handed to
 * the caller (which fetches the finer window) instead of uPlot's own zoom.
 */
import uPlot from "uplot";
import { formatSeconds } from "../lib/format";
import type { TimeWindow } from "../lib/time-window";
import type { ChartTheme } from "./chart-theme";
import type { ChartOptions } from "./uplot-chart";

export const Y_AXIS_SIZE = 68;

export interface SignalSeries {
  label: string;
  unit: string;
  digits: number;
  stroke: string;
  dash?: number[];
}

export interface ChartBehaviour {
  syncKey: string;
  onSelect: (window: TimeWindow) => void;
  onReset: () => void;
  onClickTime?: (t: number) => void;
}

export function rangeWithZero(min: number | null, max: number | null): uPlot.Range.MinMax {
  const lo = Math.min(0, min ?? 0);
  const hi = Math.max(0, max ?? 0);
  if (lo === hi) return [lo - 1, hi + 1];
  return uPlot.rangeNum(lo, hi, 0.08, true);
}

function withUnit(value: number | null | undefined, digits: number, unit: string): string {
  return typeof value === "number" && Number.isFinite(value) ? `${value.toFixed(digits)} ${unit}` : "—";
}

export function signalChartOptions(args: {
  theme: ChartTheme;
  axisLabel: string;
  series: SignalSeries[];
  showTimeAxis: boolean;
  behaviour: ChartBehaviour;
  plugins: uPlot.Plugin[];
  topPadding?: number;
}): ChartOptions {
  const { theme, behaviour } = args;
  const axisCommon = {
    stroke: theme.inkSoft,
    grid: { stroke: theme.grid, width: 1 },
    ticks: { stroke: theme.grid, width: 1, size: 4 },
    font: theme.font,
    labelFont: theme.font,
  };
  return {
    padding: [args.topPadding ?? 6, 14, 0, 0],
    legend: { show: true, live: true },
    cursor: {
      sync: { key: behaviour.syncKey, setSeries: false },
      drag: { x: true, y: false, setScale: false },
      points: { size: 6 },
      bind: {
        dblclick: () => () => {
          behaviour.onReset();
          return null;
        },
      },
    },
    scales: { x: { time: false }, y: { range: (_u, min, max) => rangeWithZero(min, max) } },
    axes: [
      {
        ...axisCommon,
        size: args.showTimeAxis ? 42 : 20,
        label: args.showTimeAxis ? "Time (s)" : undefined,
        labelSize: 14,
        values: (u, splits) => {
          if (!args.showTimeAxis) return splits.map(() => "");
          const { min, max } = u.scales.x;
          const span = typeof min === "number" && typeof max === "number" ? max - min : 10;
          return splits.map((v) => formatSeconds(v, span));
        },
      },
      { ...axisCommon, size: Y_AXIS_SIZE, label: args.axisLabel, labelSize: 16 },
    ],
    series: [
      { label: "Time", value: (_u, v) => withUnit(v, 3, "s") },
      ...args.series.map<uPlot.Series>((s) => ({
        label: s.label,
        stroke: s.stroke,
        width: 1.5,
        dash: s.dash,
        spanGaps: true,
        points: { show: false },
        value: (_u, v) => withUnit(v, s.digits, s.unit),
      })),
    ],
    plugins: args.plugins,
    hooks: {
      setSelect: [
        (u) => {
          const { left, width } = u.select;
          if (width < 3) return;
          const from = u.posToVal(left, "x");
          const to = u.posToVal(left + width, "x");
          u.setSelect({ left: 0, top: 0, width: 0, height: 0 }, false);
          behaviour.onSelect({ from, to });
        },
      ],
      ready: [
        (u) => {
          const onClickTime = behaviour.onClickTime;
          if (!onClickTime) return;
          // uPlot swallows the click that ends a drag, so this only fires on a plain click.
          u.over.addEventListener("click", () => {
            const left = u.cursor.left;
            if (typeof left === "number" && left >= 0) onClickTime(u.posToVal(left, "x"));
          });
        },
      ],
    },
  };
}
