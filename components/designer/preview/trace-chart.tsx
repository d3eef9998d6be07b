"use client";
/**
 * The scrolling pressure/flow trace under the canvas (uPlot). uPlot touches `window` when it is
 * built, so it is created in an effect and destroyed on cleanup. The preview pushes samples into a
 * TraceBuffer and calls `redraw()` once per frame; React does not re-render for the trace at all.
 * Step changes are drawn as labelled vertical lines.
 */
import "uplot/dist/uPlot.min.css";
import { forwardRef, useEffect, useImperativeHandle, useRef } from "react";
import uPlot from "uplot";
import type { TraceBuffer } from "./trace-buffer";

export interface TraceChartHandle {
  redraw: (nowS: number) => void;
}

interface TraceChartProps {
  buffer: TraceBuffer;
  windowS: number;
  height?: number;
}

const PAW_COLOUR = "#2d6a63";
const FLOW_COLOUR = "#b9651f";
const MARK_COLOUR = "#435d6a";

function stepMarks(buffer: TraceBuffer) {
  return (u: uPlot) => {
    const { ctx, bbox } = u;
    const dpr = devicePixelRatio || 1;
    ctx.save();
    ctx.font = `${10 * dpr}px ui-sans-serif, system-ui, sans-serif`;
    ctx.fillStyle = MARK_COLOUR;
    ctx.strokeStyle = MARK_COLOUR;
    ctx.setLineDash([3 * dpr, 3 * dpr]);
    ctx.lineWidth = dpr;
    const min = u.scales.x.min ?? 0;
    buffer.marks.forEach((m, i) => {
      if (m.t < min) return;
      const x = Math.round(u.valToPos(m.t, "x", true));
      ctx.beginPath();
      ctx.moveTo(x, bbox.top);
      ctx.lineTo(x, bbox.top + bbox.height);
      ctx.stroke();
      // Alternate two label rows: a short step (a 0.2 s pause) would otherwise print over the next.
      ctx.fillText(m.step, x + 3 * dpr, bbox.top + (i % 2 === 0 ? 10 : 22) * dpr);
    });
    ctx.restore();
  };
}

export const TraceChart = forwardRef<TraceChartHandle, TraceChartProps>(function TraceChart({ buffer, windowS, height = 170 }, ref) {
  const box = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const opts: uPlot.Options = {
      width: Math.max(200, el.clientWidth),
      height,
      pxAlign: false,
      cursor: { show: false },
      // The cursor is off (the trace scrolls), so uPlot's value legend would only show dashes.
      legend: { show: false },
      scales: { x: { time: false }, paw: { auto: true }, flow: { auto: true } },
      series: [
        { label: "t (s)" },
        { label: "pressure (cmH2O)", scale: "paw", stroke: PAW_COLOUR, width: 1.5, value: (_u, v) => (v == null ? "–" : v.toFixed(1)) },
        { label: "flow (L/min)", scale: "flow", stroke: FLOW_COLOUR, width: 1.2, value: (_u, v) => (v == null ? "–" : v.toFixed(1)) },
      ],
      axes: [
        { label: "time (s)", size: 30, labelSize: 14 },
        { scale: "paw", label: "cmH2O", stroke: PAW_COLOUR, size: 44, labelSize: 14 },
        { scale: "flow", label: "L/min", side: 1, stroke: FLOW_COLOUR, grid: { show: false }, size: 44, labelSize: 14 },
      ],
      hooks: { draw: [stepMarks(buffer)] },
    };
    const u = new uPlot(opts, [new Float64Array(0), new Float64Array(0), new Float64Array(0)], el);
    plot.current = u;
    const ro = new ResizeObserver(() => u.setSize({ width: Math.max(200, el.clientWidth), height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
      plot.current = null;
    };
  }, [buffer, height]);

  useImperativeHandle(
    ref,
    () => ({
      redraw(nowS: number) {
        const u = plot.current;
        if (!u) return;
        const max = Math.max(windowS, nowS);
        u.batch(() => {
          u.setData(buffer.view(), false);
          u.setScale("x", { min: max - windowS, max });
        });
      },
    }),
    [buffer, windowS],
  );

  return (
    <figure className="flex flex-col gap-1">
      <div ref={box} className="w-full" data-testid="preview-trace" role="img" aria-label="Airway pressure and flow over the last seconds of the preview, step changes marked" />
      <figcaption className="flex gap-4 text-[11px] text-ink-600">
        <span className="flex items-center gap-1">
          <span aria-hidden="true" className="inline-block h-0.5 w-4" style={{ background: PAW_COLOUR }} /> airway pressure, cmH2O (left)
        </span>
        <span className="flex items-center gap-1">
          <span aria-hidden="true" className="inline-block h-0.5 w-4" style={{ background: FLOW_COLOUR }} /> flow, L/min (right)
        </span>
        <span className="flex items-center gap-1">
          <span aria-hidden="true" className="inline-block h-3 border-l border-dashed" style={{ borderColor: MARK_COLOUR }} /> step change
        </span>
      </figcaption>
    </figure>
  );
});
