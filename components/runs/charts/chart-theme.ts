/**
 * Colours of the run charts. Canvas drawing cannot use Tailwind classes, so the charts read the app's CSS
 * custom properties when they exist and fall back to these values (ink and sea-glass tones, one warm
 * accent). Alarm colours follow the IEC 60601-1-8 priorities; nothing here copies a ventilator's palette.
 */
export interface ChartTheme {
  ink: string;
  inkSoft: string;
  grid: string;
  accent: string;
  traces: { paw: string; flow: string; volume: string; pmus: string };
  compareA: string;
  compareB: string;
  stepTones: string[];
  stepLabel: string;
  marker: string;
  font: string;
}

export const DEFAULT_CHART_THEME: ChartTheme = {
  ink: "#15232d",
  inkSoft: "#51646f",
  grid: "rgba(21, 35, 45, 0.08)",
  accent: "#c8642c",
  traces: { paw: "#1d4a5e", flow: "#2f7f73", volume: "#4a5a8a", pmus: "#7a5c7e" },
  compareA: "#1d4a5e",
  compareB: "#c8642c",
  stepTones: [
    "rgba(127, 183, 168, 0.16)",
    "rgba(29, 74, 94, 0.07)",
    "rgba(166, 207, 196, 0.24)",
    "rgba(74, 90, 138, 0.08)",
    "rgba(200, 228, 220, 0.32)",
    "rgba(93, 143, 145, 0.12)",
  ],
  stepLabel: "rgba(21, 35, 45, 0.55)",
  marker: "rgba(21, 35, 45, 0.45)",
  font: "11px ui-sans-serif, system-ui, sans-serif",
};

function cssVar(style: CSSStyleDeclaration | null, name: string, fallback: string): string {
  const value = style?.getPropertyValue(name).trim();
  return value ? value : fallback;
}

/** Reads the theme at chart creation (client only). */
export function readChartTheme(): ChartTheme {
  const style = typeof window === "undefined" ? null : getComputedStyle(document.documentElement);
  return {
    ...DEFAULT_CHART_THEME,
    ink: cssVar(style, "--color-ink", DEFAULT_CHART_THEME.ink),
    inkSoft: cssVar(style, "--color-ink-soft", DEFAULT_CHART_THEME.inkSoft),
    accent: cssVar(style, "--color-accent", DEFAULT_CHART_THEME.accent),
    compareB: cssVar(style, "--color-accent", DEFAULT_CHART_THEME.compareB),
    traces: {
      paw: cssVar(style, "--color-trace-pressure", DEFAULT_CHART_THEME.traces.paw),
      flow: cssVar(style, "--color-trace-flow", DEFAULT_CHART_THEME.traces.flow),
      volume: cssVar(style, "--color-trace-volume", DEFAULT_CHART_THEME.traces.volume),
      pmus: cssVar(style, "--color-trace-effort", DEFAULT_CHART_THEME.traces.pmus),
    },
  };
}

/** Device pixels per CSS pixel; uPlot draws in device pixels. */
export function pixelRatio(): number {
  return typeof window === "undefined" ? 1 : window.devicePixelRatio || 1;
}

export function scaledFont(theme: ChartTheme, ratio: number): string {
  return theme.font.replace(/(\d+(?:\.\d+)?)px/, (_, size: string) => `${Number(size) * ratio}px`);
}
