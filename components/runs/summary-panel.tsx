import type { Summary } from "@/lib/sim/types";
import { formatIE, formatNumber } from "./lib/format";
import { SUMMARY_FIELDS, SUMMARY_GROUPS, SUMMARY_GROUP_LABELS, type SummaryField } from "./lib/summary-fields";
import { PANEL } from "./panel";

/** Asynchrony index above this is called severe (Thille et al., Intensive Care Med 2006;32:1515). */
const SEVERE_ASYNCHRONY_PCT = 10;

export function fieldValue(field: SummaryField, value: number | null): string {
  return field.kind === "ie" ? formatIE(value, field.digits) : formatNumber(value, field.digits);
}

/** The run's summary figures, grouped, each with its unit. */
export function SummaryPanel({ summary }: { summary: Summary }) {
  return (
    <section aria-labelledby="run-summary-heading" data-testid="summary-panel" className={`${PANEL} p-3`}>
      <h2 id="run-summary-heading" className="mb-2 text-sm font-semibold text-ink-800">
        Summary
      </h2>
      <div className="grid gap-3">
        {SUMMARY_GROUPS.map((group) => (
          <div key={group}>
            <h3 className="mb-1 text-[11px] font-medium uppercase tracking-wide text-ink-500">{SUMMARY_GROUP_LABELS[group]}</h3>
            <dl className="grid grid-cols-2 gap-x-3 gap-y-1">
              {SUMMARY_FIELDS.filter((f) => f.group === group).map((field) => {
                const raw = field.get(summary);
                const text = fieldValue(field, raw);
                const severe = field.key === "asynchronyIndex" && raw !== null && raw > SEVERE_ASYNCHRONY_PCT;
                return (
                  <div key={field.key} className="flex items-baseline justify-between gap-2 border-b border-ink-100 py-0.5" data-testid={`summary-${field.key}`}>
                    <dt className="text-xs text-ink-600">
                      {field.label}
                      {severe ? <span className="ml-1 rounded bg-danger-100 px-1 text-[10px] font-semibold text-danger-700">severe</span> : null}
                    </dt>
                    <dd className="text-right text-sm tabular-nums text-ink-900">
                      <span data-testid={`summary-${field.key}-value`} className={severe ? "font-semibold text-danger-700" : undefined}>
                        {text}
                      </span>{" "}
                      <span className="text-[11px] text-ink-500" data-testid={`summary-${field.key}-unit`}>
                        {field.unit}
                      </span>
                    </dd>
                  </div>
                );
              })}
            </dl>
          </div>
        ))}
      </div>
    </section>
  );
}
