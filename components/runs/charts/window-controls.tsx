"use client";
import { formatNumber } from "../lib/format";
import { type TimeWindow, fullWindow, panWindow, zoomWindow } from "../lib/time-window";
import { buttonClasses } from "@/components/ui/button";

interface WindowControlsProps {
  view: TimeWindow;
  durationS: number;
  onChange: (view: TimeWindow) => void;
  loading?: boolean;
}

const button = buttonClasses("secondary", "sm", "h-7 px-2 text-xs");

/** Zoom and pan buttons for the charts; drag across a chart to zoom into a range, double-click for the whole run. */
export function WindowControls({ view, durationS, onChange, loading }: WindowControlsProps) {
  const whole = fullWindow(durationS);
  const atStart = view.from <= 1e-6;
  const atEnd = view.to >= whole.to - 1e-6;
  const isWhole = atStart && atEnd;
  return (
    <div className="flex flex-wrap items-center gap-2" data-testid="window-controls">
      <button type="button" className={button} onClick={() => onChange(panWindow(view, -0.5, durationS))} disabled={atStart} aria-label="Pan back half a window">
        ◀ Pan
      </button>
      <button type="button" className={button} onClick={() => onChange(panWindow(view, 0.5, durationS))} disabled={atEnd} aria-label="Pan forward half a window">
        Pan ▶
      </button>
      <button type="button" className={button} onClick={() => onChange(zoomWindow(view, 0.5, durationS))} aria-label="Zoom in">
        Zoom in
      </button>
      <button type="button" className={button} onClick={() => onChange(zoomWindow(view, 2, durationS))} disabled={isWhole} aria-label="Zoom out">
        Zoom out
      </button>
      <button type="button" className={button} onClick={() => onChange(whole)} disabled={isWhole} data-testid="zoom-reset">
        Whole run
      </button>
      <span className="text-xs tabular-nums text-ink-500" data-testid="window-range">
        {formatNumber(view.from, 2)}–{formatNumber(view.to, 2)} s
        {loading ? <span className="ml-2 text-ink-400">loading…</span> : null}
      </span>
      <span className="ml-auto text-xs text-ink-500">Drag across a chart to zoom; double-click for the whole run.</span>
    </div>
  );
}
