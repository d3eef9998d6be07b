import type { Summary } from "@/lib/sim/types";
import { SUMMARY_FIELDS, type SummaryField } from "./summary-fields";

export interface SummaryDiffRow {
  field: SummaryField;
  a: number | null;
  b: number | null;
  /** B − A; null when either side is missing. */
  delta: number | null;
  /** (B − A) / |A| × 100; null when A is missing or 0. */
  percent: number | null;
}

function finiteOrNull(value: number | null | undefined): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

export function diffSummaries(a: Summary, b: Summary, fields: readonly SummaryField[] = SUMMARY_FIELDS): SummaryDiffRow[] {
  return fields.map((field) => {
    const va = finiteOrNull(field.get(a));
    const vb = finiteOrNull(field.get(b));
    const delta = va !== null && vb !== null ? vb - va : null;
    const percent = delta !== null && va !== null && va !== 0 ? (delta / Math.abs(va)) * 100 : null;
    return { field, a: va, b: vb, delta, percent };
  });
}
