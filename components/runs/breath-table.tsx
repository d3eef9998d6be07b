"use client";
/**
 * The breath table (@tanstack/react-table): sortable by any column, a click (or Enter) on a row jumps the
 * charts to that breath, and "Download CSV" saves the table as shown, in its current order, units in the header.
 */
import {
  type ColumnDef,
  type SortingState,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
} from "@tanstack/react-table";
import { useEffect, useMemo, useRef, useState } from "react";
import type { Breath } from "@/lib/sim/types";
import { BREATH_COLUMNS, breathsToCsv, displayCell } from "./lib/breath-columns";
import { downloadText } from "./lib/download";
import { TriggerGlyph } from "./trigger-glyph";
import { PANEL } from "./panel";
import { buttonClasses } from "@/components/ui/button";

interface BreathTableProps {
  breaths: readonly Breath[];
  /** Position (in `breaths`) of the chosen breath. */
  selected: number | null;
  onSelect: (position: number) => void;
  /** File name of the CSV download. */
  csvName: string;
}

const columns: ColumnDef<Breath>[] = BREATH_COLUMNS.map((column) => ({
  id: column.id,
  // undefined (not null) so that missing values sort last in both directions (sortUndefined).
  accessorFn: (breath: Breath) => column.value(breath) ?? undefined,
  sortUndefined: "last",
  header: () => (
    <span className="inline-flex flex-col leading-tight">
      <span>{column.label}</span>
      {column.unit ? <span className="text-[10px] font-normal text-ink-500">{column.unit}</span> : null}
    </span>
  ),
  cell: ({ row }) =>
    column.id === "trigger" ? (
      <span className="inline-flex items-center gap-1">
        <TriggerGlyph trigger={row.original.trigger} />
        {displayCell(column, row.original)}
      </span>
    ) : (
      displayCell(column, row.original)
    ),
  meta: { align: column.align },
}));

const ALIGN: Record<"left" | "right", string> = { left: "text-left", right: "text-right" };

function alignOf(meta: unknown): "left" | "right" {
  return typeof meta === "object" && meta !== null && (meta as { align?: unknown }).align === "left" ? "left" : "right";
}

export function BreathTable({ breaths, selected, onSelect, csvName }: BreathTableProps) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const data = useMemo(() => [...breaths], [breaths]);
  // TanStack Table returns fresh functions each render; this component does not rely on memoisation of them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const bodyRef = useRef<HTMLTableSectionElement>(null);

  useEffect(() => {
    if (selected === null) return;
    const row = bodyRef.current?.querySelector<HTMLElement>(`[data-position="${selected}"]`);
    row?.scrollIntoView?.({ block: "nearest" });
  }, [selected]);

  const rows = table.getRowModel().rows;
  const download = () => downloadText(csvName, breathsToCsv(rows.map((r) => r.original)));

  return (
    <section aria-labelledby="breath-table-heading" data-testid="breath-table" className={PANEL}>
      <div className="flex items-center justify-between gap-2 px-3 py-2">
        <h2 id="breath-table-heading" className="text-sm font-semibold text-ink-800">
          Breaths <span className="font-normal text-ink-500" data-testid="breath-count">({breaths.length})</span>
        </h2>
        <button
          type="button"
          onClick={download}
          disabled={breaths.length === 0}
          data-testid="breath-csv-download"
          className={buttonClasses("secondary", "sm")}
        >
          Download CSV
        </button>
      </div>
      <div className="max-h-96 overflow-auto">
        <table className="w-full border-collapse text-xs tabular-nums">
          <thead className="sticky top-0 z-10 bg-ink-50">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const align = alignOf(header.column.columnDef.meta);
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none"}
                      className={`border-b border-line px-2 py-1 font-medium text-ink-700 ${ALIGN[align]}`}
                    >
                      <button
                        type="button"
                        onClick={header.column.getToggleSortingHandler()}
                        className="inline-flex items-end gap-1 hover:text-glass-800"
                        data-testid={`sort-${header.column.id}`}
                      >
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        <span aria-hidden="true" className="w-2 text-[10px]">
                          {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : ""}
                        </span>
                      </button>
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody ref={bodyRef}>
            {rows.map((row) => {
              const chosen = row.index === selected;
              return (
                <tr
                  key={row.id}
                  data-testid="breath-row"
                  data-position={row.index}
                  data-breath-index={row.original.index}
                  aria-selected={chosen}
                  tabIndex={0}
                  onClick={() => onSelect(row.index)}
                  onKeyDown={(event) => {
                    if (event.key === "Enter" || event.key === " ") {
                      event.preventDefault();
                      onSelect(row.index);
                    }
                  }}
                  className={
                    "cursor-pointer border-b border-ink-100 hover:bg-glass-50 " +
                    (chosen ? "bg-ember-100 shadow-[inset_3px_0_0_var(--color-ember-500)]" : "")
                  }
                >
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className={`px-2 py-0.5 text-ink-800 ${ALIGN[alignOf(cell.column.columnDef.meta)]}`}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </section>
  );
}
