/** uPlot plugin: the time the charts jumped to (from the alarm and event list), as an accent line. */
import type uPlot from "uplot";
import type { ChartTheme } from "./chart-theme";
import { pixelRatio } from "./chart-theme";
import { type OverlaySource, xRangeOf } from "./overlay";

export function focusMarkerPlugin(overlay: OverlaySource, theme: ChartTheme): uPlot.Plugin {
  return {
    hooks: {
      draw: (u: uPlot) => {
        const range = xRangeOf(u);
        const { focusT } = overlay();
        if (!range || focusT === null || focusT < range.min || focusT > range.max) return;
        const ratio = pixelRatio();
        const x = Math.round(u.valToPos(focusT, "x", true)) + 0.5;
        const ctx = u.ctx;
        ctx.save();
        ctx.strokeStyle = theme.accent;
        ctx.lineWidth = 2 * ratio;
        ctx.setLineDash([2 * ratio, 2 * ratio]);
        ctx.beginPath();
        ctx.moveTo(x, u.bbox.top);
        ctx.lineTo(x, u.bbox.top + u.bbox.height);
        ctx.stroke();
        ctx.restore();
      },
    },
  };
}
