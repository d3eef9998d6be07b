/**
 * uPlot plugin: the active step as bands behind the traces (drawn in `drawClear`, before grid and series),
 * with a thin boundary at each step entry and, on the top chart, the step's name when the band has room.
 * The names and boundaries make steps readable without relying on the tones.
 */
import type uPlot from "uplot";
import { stepToneIndex, visibleSteps } from "../lib/steps";
import type { ChartTheme } from "./chart-theme";
import { pixelRatio, scaledFont } from "./chart-theme";
import { type OverlaySource, xRangeOf } from "./overlay";

export function stepBandsPlugin(overlay: OverlaySource, theme: ChartTheme, options: { labels: boolean }): uPlot.Plugin {
  return {
    hooks: {
      drawClear: (u: uPlot) => {
        const range = xRangeOf(u);
        if (!range) return;
        const { steps, stepNames } = overlay();
        const { left, top, width, height } = u.bbox;
        const ratio = pixelRatio();
        const ctx = u.ctx;
        ctx.save();
        ctx.beginPath();
        ctx.rect(left, top, width, height);
        ctx.clip();
        ctx.font = scaledFont(theme, ratio);
        ctx.textBaseline = "top";
        for (const step of visibleSteps(steps, range.min, range.max)) {
          const x0 = u.valToPos(Math.max(step.from, range.min), "x", true);
          const x1 = u.valToPos(Math.min(step.to, range.max), "x", true);
          ctx.fillStyle = theme.stepTones[stepToneIndex(stepNames, step.step, theme.stepTones.length)];
          ctx.fillRect(x0, top, Math.max(1, x1 - x0), height);
          if (step.from >= range.min) {
            ctx.fillStyle = theme.grid;
            ctx.fillRect(u.valToPos(step.from, "x", true), top, Math.max(1, ratio), height);
          }
          if (options.labels) {
            const label = step.step;
            const textWidth = ctx.measureText(label).width;
            if (x1 - x0 > textWidth + 8 * ratio) {
              ctx.fillStyle = theme.stepLabel;
              ctx.fillText(label, x0 + 4 * ratio, top + height - 14 * ratio);
            }
          }
        }
        ctx.restore();
      },
    },
  };
}
