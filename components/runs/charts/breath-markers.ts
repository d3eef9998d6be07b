/**
 * uPlot plugin: a line at each breath start, styled by trigger source so the source reads without colour:
 * patient solid with a filled triangle, timer dashed with an open circle, operator dash-dot with a filled
 * square (the same glyphs as the legend and the breath table). The chosen breath is drawn in the accent.
 */
import type uPlot from "uplot";
import type { TriggerSource } from "@/lib/sim/types";
import type { ChartTheme } from "./chart-theme";
import { pixelRatio } from "./chart-theme";
import { type OverlaySource, xRangeOf } from "./overlay";

export const TRIGGER_DASH: Record<TriggerSource, number[]> = {
  patient: [],
  timer: [5, 4],
  operator: [6, 3, 1, 3],
};

/** Glyph path centred on (x, y), size in device pixels. */
export function traceGlyph(ctx: CanvasRenderingContext2D, trigger: TriggerSource, x: number, y: number, size: number): void {
  const h = size / 2;
  ctx.beginPath();
  if (trigger === "patient") {
    ctx.moveTo(x, y - h);
    ctx.lineTo(x + h, y + h);
    ctx.lineTo(x - h, y + h);
    ctx.closePath();
  } else if (trigger === "timer") {
    ctx.arc(x, y, h * 0.85, 0, Math.PI * 2);
  } else {
    ctx.rect(x - h * 0.8, y - h * 0.8, h * 1.6, h * 1.6);
  }
}

export function breathMarkersPlugin(overlay: OverlaySource, theme: ChartTheme, options: { glyphs: boolean }): uPlot.Plugin {
  return {
    hooks: {
      draw: (u: uPlot) => {
        const range = xRangeOf(u);
        if (!range) return;
        const { breaths, selectedBreath } = overlay();
        const { left, top, width, height } = u.bbox;
        const ratio = pixelRatio();
        const ctx = u.ctx;
        ctx.save();
        ctx.beginPath();
        ctx.rect(left, top - 1, width, height + 2);
        ctx.clip();
        breaths.forEach((breath, position) => {
          if (breath.start < range.min || breath.start > range.max) return;
          const x = Math.round(u.valToPos(breath.start, "x", true)) + 0.5;
          const chosen = position === selectedBreath;
          const colour = chosen ? theme.accent : theme.marker;
          ctx.strokeStyle = colour;
          ctx.lineWidth = (chosen ? 2 : 1) * ratio;
          ctx.setLineDash(TRIGGER_DASH[breath.trigger].map((d) => d * ratio));
          ctx.beginPath();
          ctx.moveTo(x, top + (options.glyphs ? 12 * ratio : 0));
          ctx.lineTo(x, top + height);
          ctx.stroke();
          if (options.glyphs) {
            ctx.setLineDash([]);
            traceGlyph(ctx, breath.trigger, x, top + 6 * ratio, 9 * ratio);
            if (breath.trigger === "timer") {
              ctx.lineWidth = 1.5 * ratio;
              ctx.stroke();
            } else {
              ctx.fillStyle = colour;
              ctx.fill();
            }
          }
        });
        ctx.restore();
      },
    },
  };
}
