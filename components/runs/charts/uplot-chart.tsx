"use client";
/**
 * One uPlot chart in React: created in an effect (uPlot touches window), destroyed on cleanup, resized with
 * its container, fed new data without being rebuilt. `makeOptions` must be stable (memoised by the caller): a
 * new function rebuilds the chart. The container carries data attributes the browser tests read (points drawn,
 * visible x range, draw count).
 */
import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { useElementWidth } from "./use-element-width";

export type ChartOptions = Omit<uPlot.Options, "width" | "height">;

export interface XRange {
  min: number;
  max: number;
}

interface UplotChartProps {
  /** Builds the chart's options when it is created (in an effect); a new function rebuilds the chart. */
  makeOptions: () => ChartOptions;
  data: uPlot.AlignedData;
  height: number;
  /** Visible x range; defaults to the data's extent. */
  xRange?: XRange | null;
  testId: string;
  /** Called with the instance after creation and with null before it is destroyed. */
  onInstance?: (u: uPlot | null) => void;
  className?: string;
}

function canvasAvailable(): boolean {
  if (typeof window === "undefined" || typeof HTMLCanvasElement === "undefined") return false;
  // jsdom defines HTMLCanvasElement but has no 2D context; uPlot cannot draw there.
  return !/jsdom/i.test(window.navigator.userAgent);
}

function recordDraw(u: uPlot): void {
  const root = u.root.parentElement;
  if (!root) return;
  const draws = Number(root.dataset.draws ?? "0") + 1;
  root.dataset.draws = String(draws);
  const { min, max } = u.scales.x;
  if (typeof min === "number" && typeof max === "number") {
    root.dataset.xMin = min.toFixed(3);
    root.dataset.xMax = max.toFixed(3);
  }
  root.dataset.points = String(u.data[0]?.length ?? 0);
}

export function UplotChart({ makeOptions, data, height, xRange, testId, onInstance, className }: UplotChartProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const chartRef = useRef<uPlot | null>(null);
  const dataRef = useRef({ data, xRange });
  const onInstanceRef = useRef(onInstance);
  const width = useElementWidth(containerRef, 800) ?? 800;
  const widthRef = useRef(width);

  useEffect(() => {
    dataRef.current = { data, xRange };
    onInstanceRef.current = onInstance;
    widthRef.current = width;
  });

  useEffect(() => {
    const container = containerRef.current;
    if (!container || !canvasAvailable()) return;
    const options = makeOptions();
    const withRecorder: uPlot.Options = {
      ...options,
      width: Math.max(100, container.clientWidth || widthRef.current),
      height,
      plugins: [...(options.plugins ?? []), { hooks: { draw: recordDraw } }],
    };
    const u = new uPlot(withRecorder, dataRef.current.data, container);
    const range = dataRef.current.xRange;
    if (range) u.setScale("x", range);
    chartRef.current = u;
    onInstanceRef.current?.(u);
    return () => {
      onInstanceRef.current?.(null);
      chartRef.current = null;
      u.destroy();
    };
  }, [makeOptions, height]);

  const xMin = xRange?.min;
  const xMax = xRange?.max;
  useEffect(() => {
    const u = chartRef.current;
    if (!u) return;
    u.setData(data, true);
    if (xMin !== undefined && xMax !== undefined) u.setScale("x", { min: xMin, max: xMax });
  }, [data, xMin, xMax]);

  useEffect(() => {
    const u = chartRef.current;
    if (u && Math.abs(u.width - width) >= 1) u.setSize({ width: Math.max(100, width), height });
  }, [width, height]);

  return <div ref={containerRef} data-testid={testId} className={className} style={{ minHeight: height }} />;
}
