/**
 * Columns of the breath table. The table and its CSV come from this one list, so the download holds
 * exactly what the table shows (in the table's order), with units in the header.
 */
import type { Breath } from "@/lib/sim/types";
import { MISSING, formatIE, formatNumber } from "./format";

export type BreathCellValue = number | string | null;

export interface BreathColumn {
  id: string;
  label: string;
  /** Empty for columns without a unit (index, trigger source, flags). */
  unit: string;
  /** Decimals shown in the table; the CSV keeps full precision. */
  digits: number;
  align: "left" | "right";
  value: (breath: Breath) => BreathCellValue;
  /** Table text for a value; defaults to the number with `digits` decimals. */
  display?: (breath: Breath) => string;
}

export const TRIGGER_LABELS: Record<Breath["trigger"], string> = {
  patient: "patient",
  timer: "timer",
  operator: "operator",
};

export const BREATH_COLUMNS: readonly BreathColumn[] = [
  { id: "index", label: "Breath", unit: "", digits: 0, align: "right", value: (b) => b.index },
  { id: "start", label: "Start", unit: "s", digits: 2, align: "right", value: (b) => b.start },
  { id: "trigger", label: "Trigger", unit: "", digits: 0, align: "left", value: (b) => b.trigger },
  { id: "latencyMs", label: "Latency", unit: "ms", digits: 0, align: "right", value: (b) => b.latencyMs },
  { id: "pip", label: "PIP", unit: "cmH2O", digits: 1, align: "right", value: (b) => b.pip },
  { id: "pplat", label: "Plateau", unit: "cmH2O", digits: 1, align: "right", value: (b) => b.pplat },
  { id: "peep", label: "PEEP", unit: "cmH2O", digits: 1, align: "right", value: (b) => b.peep },
  { id: "vti", label: "Vti", unit: "mL", digits: 0, align: "right", value: (b) => b.vti },
  { id: "vte", label: "Vte", unit: "mL", digits: 0, align: "right", value: (b) => b.vte },
  { id: "ti", label: "Ti", unit: "s", digits: 2, align: "right", value: (b) => b.ti },
  { id: "te", label: "Te", unit: "s", digits: 2, align: "right", value: (b) => b.te },
  {
    id: "ie",
    label: "I:E",
    unit: "1:x",
    digits: 1,
    align: "right",
    value: (b) => b.ie,
    display: (b) => formatIE(b.ie),
  },
  { id: "peakFlow", label: "Peak flow", unit: "L/min", digits: 1, align: "right", value: (b) => b.peakFlow },
  { id: "reliefVolume", label: "Relief", unit: "mL", digits: 0, align: "right", value: (b) => b.reliefVolume },
  {
    id: "flags",
    label: "Flags",
    unit: "",
    digits: 0,
    align: "left",
    value: (b) => (b.flags.length > 0 ? b.flags.join(";") : null),
    display: (b) => (b.flags.length > 0 ? b.flags.join(", ") : ""),
  },
];

export function columnHeader(column: BreathColumn): string {
  return column.unit ? `${column.label} (${column.unit})` : column.label;
}

export function displayCell(column: BreathColumn, breath: Breath): string {
  if (column.display) return column.display(breath);
  const value = column.value(breath);
  if (value === null) return MISSING;
  return typeof value === "number" ? formatNumber(value, column.digits) : value;
}

function csvField(value: BreathCellValue): string {
  if (value === null) return "";
  const text = typeof value === "number" ? (Number.isFinite(value) ? String(value) : "") : value;
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** RFC 4180 CSV: header with units, one row per breath in the order given, CRLF line ends. */
export function breathsToCsv(breaths: readonly Breath[], columns: readonly BreathColumn[] = BREATH_COLUMNS): string {
  const lines = [columns.map((c) => csvField(columnHeader(c))).join(",")];
  for (const breath of breaths) lines.push(columns.map((c) => csvField(c.value(breath))).join(","));
  return lines.join("\r\n") + "\r\n";
}
