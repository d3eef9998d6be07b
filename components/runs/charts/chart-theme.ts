/**
 * Colours of the run charts. Canvas drawing cannot use Tailwind classes, so the charts read the palette's CSS
 * custom properties (app/globals.css: ink, glass, ember) and fall back to the same values. Traces are told
 * apart by their chart and label, not by a monitor's colour code.
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

/** Fallbacks: the values of app/globals.css's palette (ink, glass, ember), so SSR and tests draw the same. */
export const DEFAULT_CHART_THEME: ChartTheme = {
  ink: "#13232d", // ink-900
  inkSoft: "#5f7884", // ink-500
  grid: "rgba(19, 35, 45, 0.08)",
  accent: "#d7812e", // ember-500
  traces: { paw: "#1d323e", flow: "#2d6a63", volume: "#4a5a8a", pmus: "#6b5a7e" },
  compareA: "#1d323e", // ink-800
  compareB: "#b9651f", // ember-600
  stepTones: [
    "rgba(162, 211, 200, 0.30)", // glass-300
    "rgba(210, 221, 225, 0.45)", // ink-200
    "rgba(201, 231, 223, 0.55)", // glass-200
    "rgba(175, 192, 199, 0.28)", // ink-300
    "rgba(118, 185, 171, 0.20)", // glass-400
    "rgba(231, 238, 240, 0.80)", // ink-100
  ],
  stepLabel: "rgba(19, 35, 45, 0.55)",
  marker: "rgba(19, 35, 45, 0.45)",
  font: "11px ui-sans-serif, system-ui, sans-serif",
};

function cssVar(style: CSSStyleDeclaration | null, name: string, fallback: string): string {
  const value = style?.getPropertyValue(name).trim();
  return value ? value : fallback;
}

/** Reads the theme at chart creation (client only): the app's palette tokens when present, and its font. */
export function readChartTheme(): ChartTheme {
  const style = typeof window === "undefined" ? null : getComputedStyle(document.documentElement);
  const bodyFont = typeof document === "undefined" || !document.body ? "" : getComputedStyle(document.body).fontFamily;
  return {
    ...DEFAULT_CHART_THEME,
    ink: cssVar(style, "--color-ink-900", DEFAULT_CHART_THEME.ink),
    inkSoft: cssVar(style, "--color-ink-500", DEFAULT_CHART_THEME.inkSoft),
    accent: cssVar(style, "--color-ember-500", DEFAULT_CHART_THEME.accent),
    compareA: cssVar(style, "--color-ink-800", DEFAULT_CHART_THEME.compareA),
    compareB: cssVar(style, "--color-ember-600", DEFAULT_CHART_THEME.compareB),
    traces: {
      ...DEFAULT_CHART_THEME.traces,
      paw: cssVar(style, "--color-ink-800", DEFAULT_CHART_THEME.traces.paw),
      flow: cssVar(style, "--color-glass-700", DEFAULT_CHART_THEME.traces.flow),
    },
    font: bodyFont ? `11px ${bodyFont}` : DEFAULT_CHART_THEME.font,
  };
}

/** Device pixels per CSS pixel; uPlot draws in device pixels. */
export function pixelRatio(): number {
  return typeof window === "undefined" ? 1 : window.devicePixelRatio || 1;
}

export function scaledFont(theme: ChartTheme, ratio: number): string {
  return theme.font.replace(/(\d+(?:\.\d+)?)px/, (_, size: string) => `${Number(size) * ratio}px`);
}
