/** Number formatting for figures with units. A missing value shows as an em dash, never as 0 or NaN. */

export const MISSING = "—";
/** U+2212, so a negative difference reads as a minus rather than a hyphen. */
const MINUS = "\u2212";

function isNumber(value: number | null | undefined): value is number {
  return typeof value === "number" && Number.isFinite(value);
}

export function formatNumber(value: number | null | undefined, digits = 1): string {
  if (!isNumber(value)) return MISSING;
  const text = value.toFixed(digits);
  // "-0.0" reads as a real negative; show the zero plainly.
  if (Number(text) === 0) return (0).toFixed(digits);
  return text.startsWith("-") ? MINUS + text.slice(1) : text;
}

/** "12.3 cmH2O"; counts and ratios use the same path so every figure carries its unit. */
export function formatWithUnit(value: number | null | undefined, unit: string, digits = 1): string {
  const number = formatNumber(value, digits);
  if (number === MISSING) return MISSING;
  return unit ? `${number} ${unit}` : number;
}

/** The engine stores I:E as x in 1:x. */
export function formatIE(x: number | null | undefined, digits = 1): string {
  if (!isNumber(x)) return MISSING;
  return `1:${formatNumber(x, digits)}`;
}

/** A difference with an explicit sign: "+1.2", "−0.4", "0.0". */
export function formatSigned(value: number | null | undefined, digits = 1): string {
  const text = formatNumber(value, digits);
  if (text === MISSING || Number(value?.toFixed(digits)) === 0) return text;
  return text.startsWith(MINUS) ? text : `+${text}`;
}

/** Seconds on a time axis, with as many decimals as the visible span needs. */
export function formatSeconds(seconds: number, spanS: number): string {
  const digits = spanS < 2 ? 2 : spanS < 20 ? 1 : 0;
  return formatNumber(seconds, digits);
}

/**
 * Round tick values for a linear axis ("nice numbers", Heckbert, Graphics Gems 1990): steps of 1, 2, 5 × 10^k.
 */
export function niceTicks(min: number, max: number, target = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
  if (min === max) return [min];
  const lo = Math.min(min, max);
  const hi = Math.max(min, max);
  const rough = (hi - lo) / Math.max(1, target);
  const magnitude = 10 ** Math.floor(Math.log10(rough));
  const residual = rough / magnitude;
  const step = (residual < 1.5 ? 1 : residual < 3 ? 2 : residual < 7 ? 5 : 10) * magnitude;
  const first = Math.ceil(lo / step - 1e-9) * step;
  const ticks: number[] = [];
  for (let value = first; value <= hi + step * 1e-9; value += step) {
    // Strip float noise such as 0.30000000000000004.
    ticks.push(Number(value.toPrecision(12)));
  }
  return ticks;
}
