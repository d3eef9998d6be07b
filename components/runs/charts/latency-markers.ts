/**
 * uPlot plugin: trigger latency on patient-triggered breaths, from the effort onset to the entry into the
 * inhale step (the breath start). A bracket with end ticks and, when there is room, the latency in ms;
 * with `shade`, the interval is also tinted over the whole plot height (used on the muscle-pressure chart).
 */
import type uPlot from "uplot";
import type { ChartTheme } from "./chart-theme";
import { pixelRatio, scaledFont } from "./chart-theme";
import { type OverlaySource, xRangeOf } from "./overlay";

export function latencyMarkersPlugin(
  overlay: OverlaySource,
  theme: ChartTheme,
  options: { labels: boolean; shade: boolean },
): uPlot.Plugin {
  return {
    hooks: {
      draw: (u: uPlot) => {
        const range = xRangeOf(u);
        if (!range) return;
        const { left, top, width, height } = u.bbox;
        const ratio = pixelRatio();
        const ctx = u.ctx;
        ctx.save();
        ctx.beginPath();
        ctx.rect(left, top, width, height);
        ctx.clip();
        ctx.font = scaledFont(theme, ratio);
        ctx.textBaseline = "bottom";
        ctx.textAlign = "center";
        const y = top + 20 * ratio;
        const breaths = overlay().breaths;
        breaths.forEach((breath, position) => {
          if (breath.trigger !== "patient" || breath.effortOnset === null) return;
          if (breath.start < range.min || breath.effortOnset > range.max) return;
          const x0 = u.valToPos(breath.effortOnset, "x", true);
          const x1 = u.valToPos(breath.start, "x", true);
          if (options.shade) {
            ctx.fillStyle = withAlpha(theme.accent, 0.14);
            ctx.fillRect(x0, top, Math.max(ratio, x1 - x0), height);
          }
          ctx.strokeStyle = theme.accent;
          ctx.lineWidth = 1.5 * ratio;
          ctx.setLineDash([]);
          ctx.beginPath();
          ctx.moveTo(x0, y - 4 * ratio);
          ctx.lineTo(x0, y + 4 * ratio);
          ctx.moveTo(x0, y);
          ctx.lineTo(x1, y);
          ctx.moveTo(x1, y - 4 * ratio);
          ctx.lineTo(x1, y + 4 * ratio);
          ctx.stroke();
          if (options.labels && breath.latencyMs !== null) {
            const label = `${Math.round(breath.latencyMs)} ms`;
            const textWidth = ctx.measureText(label).width;
            ctx.fillStyle = theme.accent;
            if (x1 - x0 > textWidth + 4 * ratio) {
              ctx.fillText(label, (x0 + x1) / 2, y - 3 * ratio);
            } else {
              // Too short to hold its label: write it before the onset when the previous breath leaves room.
              const previous = breaths[position - 1];
              const room = previous ? x0 - u.valToPos(previous.start, "x", true) : Infinity;
              if (room > textWidth + 12 * ratio) {
                ctx.textAlign = "right";
                ctx.textBaseline = "middle";
                ctx.fillText(label, x0 - 5 * ratio, y);
                ctx.textAlign = "center";
                ctx.textBaseline = "bottom";
              }
            }
          }
        });
        ctx.restore();
      },
    },
  };
}

/** "#rrggbb" → rgba with alpha; other colour syntaxes are returned unchanged. */
export function withAlpha(colour: string, alpha: number): string {
  const hex = /^#([0-9a-f]{6})$/i.exec(colour.trim());
  if (!hex) return colour;
  const n = parseInt(hex[1], 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}
