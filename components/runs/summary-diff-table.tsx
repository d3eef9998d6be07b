import type { Summary } from "@/lib/sim/types";
import { formatSigned } from "./lib/format";
import { diffSummaries } from "./lib/summary-diff";
import { fieldValue } from "./summary-panel";
import { PANEL } from "./panel";

interface SummaryDiffTableProps {
  a: Summary;
  b: Summary;
  labelA: string;
  labelB: string;
}

/** Summary figures of two runs side by side: A, B, B − A (and the relative change), each with its unit. */
export function SummaryDiffTable({ a, b, labelA, labelB }: SummaryDiffTableProps) {
  const rows = diffSummaries(a, b);
  return (
    <section aria-labelledby="summary-diff-heading" data-testid="summary-diff-table" className={PANEL}>
      <h2 id="summary-diff-heading" className="px-3 pt-2 text-sm font-semibold text-ink-800">
        Summary differences
      </h2>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-xs tabular-nums">
          <thead className="bg-ink-50 text-ink-700">
            <tr>
              <th scope="col" className="px-2 py-1 text-left font-medium">
                Figure
              </th>
              <th scope="col" className="px-2 py-1 text-left font-medium">
                Unit
              </th>
              <th scope="col" className="px-2 py-1 text-right font-medium" title={labelA}>
                A
              </th>
              <th scope="col" className="px-2 py-1 text-right font-medium" title={labelB}>
                B
              </th>
              <th scope="col" className="px-2 py-1 text-right font-medium">
                B − A
              </th>
              <th scope="col" className="px-2 py-1 text-right font-medium">
                Change (%)
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => {
              const changed = row.delta !== null && Number(row.delta.toFixed(row.field.digits)) !== 0;
              return (
                <tr key={row.field.key} data-testid={`diff-${row.field.key}`} className="border-b border-ink-100">
                  <th scope="row" className="px-2 py-0.5 text-left font-normal text-ink-700">
                    {row.field.label}
                  </th>
                  <td className="px-2 py-0.5 text-ink-500">{row.field.unit}</td>
                  <td className="px-2 py-0.5 text-right text-ink-900">{fieldValue(row.field, row.a)}</td>
                  <td className="px-2 py-0.5 text-right text-ink-900">{fieldValue(row.field, row.b)}</td>
                  <td className={`px-2 py-0.5 text-right ${changed ? "font-semibold text-ink-900" : "text-ink-500"}`} data-testid={`diff-${row.field.key}-delta`}>
                    {formatSigned(row.delta, row.field.digits)}
                  </td>
                  <td className="px-2 py-0.5 text-right text-ink-500">{row.percent === null ? "—" : `${formatSigned(row.percent, 1)}`}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </section>
  );
}

