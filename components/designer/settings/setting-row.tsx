"use client";
/** One row of the settings table: every field of a setting edited in place, units beside numbers. */
import { useEffect, useRef } from "react";
import { effectiveUnit, type Setting } from "@/machines/schema";
import { EditableCell } from "./editable-cell";
import type { DerivedValue } from "./derived-values";
import { formatQuantity } from "./parse-quantity";
import { checkBound, checkSettingFormula, checkSettingName, checkUnit, checkValue } from "./setting-rules";

export interface SettingRowProps {
  name: string;
  setting: Setting;
  settings: Readonly<Record<string, Setting>>;
  derived: DerivedValue | undefined;
  readOnly: boolean;
  highlighted: boolean;
  onRename: (to: string) => void;
  onChange: (next: Setting, group?: string) => void;
  onRemove: () => void;
}

function numberText(n: number | undefined): string {
  return n === undefined ? "" : String(Number(n.toPrecision(6)));
}

export function SettingRow({ name, setting: s, settings, derived, readOnly, highlighted, onRename, onChange, onRemove }: SettingRowProps) {
  const row = useRef<HTMLTableRowElement>(null);
  useEffect(() => {
    if (highlighted) row.current?.scrollIntoView({ block: "nearest", behavior: "smooth" });
  }, [highlighted]);

  // A unitBy setting (a trigger sensitivity) is in the unit of the current choice: show and convert by it.
  const unit = effectiveUnit(s, settings);

  const set = (patch: Partial<Setting>) => {
    const next: Setting = { ...s, ...patch };
    for (const k of Object.keys(patch) as Array<keyof Setting>) if (patch[k] === undefined) delete next[k];
    onChange(next);
  };

  return (
    <tr ref={row} className={`align-top ${highlighted ? "bg-glass-50 outline outline-2 outline-glass-400" : ""}`} data-testid={`setting-row-${name}`}>
      <td className="p-1">
        <EditableCell label={`Name of ${name}`} value={name} mono disabled={readOnly} validate={(d) => checkSettingName(d, name, settings)} onCommit={onRename} testId={`setting-name-${name}`} />
        {s.label ? <span className="text-[11px] text-ink-500">{s.label}</span> : null}
      </td>
      <td className="p-1">
        <ValueCell name={name} s={s} unit={unit} derived={derived} readOnly={readOnly} onValue={(value) => set({ value })} />
      </td>
      <td className="p-1">
        <EditableCell label={`Unit of ${name}`} value={s.unit} mono disabled={readOnly} width="w-24" validate={checkUnit} onCommit={(u) => set({ unit: u })} testId={`setting-unit-${name}`} />
        {s.unitBy ? (
          <span className="block text-[11px] text-ink-500" data-testid={`setting-effective-unit-${name}`}>
            {unit || "no unit"} while {s.unitBy.setting} is {JSON.stringify(settings[s.unitBy.setting]?.value ?? "")}
          </span>
        ) : null}
      </td>
      <td className="p-1">
        <EditableCell
          label={`Minimum of ${name}`}
          value={numberText(s.min)}
          disabled={readOnly}
          width="w-20"
          validate={(d) => checkBound(d, s, "min", unit)}
          onCommit={(d) => set({ min: checkBound(d, s, "min", unit).value })}
          testId={`setting-min-${name}`}
        />
      </td>
      <td className="p-1">
        <EditableCell
          label={`Maximum of ${name}`}
          value={numberText(s.max)}
          disabled={readOnly}
          width="w-20"
          validate={(d) => checkBound(d, s, "max", unit)}
          onCommit={(d) => set({ max: checkBound(d, s, "max", unit).value })}
          testId={`setting-max-${name}`}
        />
      </td>
      <td className="p-1">
        <EditableCell
          label={`Formula of ${name}`}
          value={s.formula ?? ""}
          mono
          disabled={readOnly}
          placeholder="—"
          validate={(d) => checkSettingFormula(d, name, settings)}
          onCommit={(d) => {
            const formula = d.trim() === "" ? undefined : d.trim();
            // Dropping a formula keeps the value it last gave, so the setting does not fall back to nothing.
            const value = !formula && derived?.ok ? Number(derived.value.toPrecision(6)) : s.value;
            set({ formula, value });
          }}
          testId={`setting-formula-${name}`}
        />
      </td>
      <td className="p-1">
        <EditableCell label={`Description of ${name}`} value={s.description ?? ""} disabled={readOnly} validate={(d) => ({ error: d.length > 500 ? "keep it to 500 characters" : null })} onCommit={(d) => set({ description: d.trim() === "" ? undefined : d })} />
      </td>
      <td className="p-1">
        {readOnly ? null : (
          <button type="button" onClick={onRemove} className="rounded px-1 text-xs text-red-800 hover:bg-red-50" aria-label={`Remove setting ${name}`} data-testid={`setting-remove-${name}`}>
            remove
          </button>
        )}
      </td>
    </tr>
  );
}

function ValueCell({ name, s, unit, derived, readOnly, onValue }: { name: string; s: Setting; unit: string; derived: DerivedValue | undefined; readOnly: boolean; onValue: (v: number | string) => void }) {
  if (s.formula) {
    return (
      <span className="block px-1.5 py-0.5 text-sm text-ink-700" data-testid={`setting-value-${name}`}>
        {derived?.ok ? `= ${formatQuantity(derived.value, unit)}` : <span className="text-red-700">{derived?.error ?? "not computed"}</span>}
        <span className="ml-1 text-[11px] text-ink-500">derived</span>
      </span>
    );
  }
  if (s.options && s.options.length > 0) {
    return (
      <select aria-label={`Value of ${name}`} value={String(s.value ?? s.options[0])} disabled={readOnly} onChange={(e) => onValue(e.target.value)} className="rounded border border-ink-300 px-1 py-0.5 text-sm" data-testid={`setting-value-${name}`}>
        {s.options.map((o) => (
          <option key={o}>{o}</option>
        ))}
      </select>
    );
  }
  return (
    <EditableCell
      label={`Value of ${name}${unit ? ` in ${unit}` : ""}`}
      value={typeof s.value === "number" ? numberText(s.value) : String(s.value ?? "")}
      disabled={readOnly}
      width="w-28"
      placeholder={unit ? `e.g. 5 ${unit}` : undefined}
      validate={(d) => checkValue(d, s, unit)}
      onCommit={(d) => {
        const c = checkValue(d, s, unit);
        if (c.value !== undefined) onValue(Number(c.value.toPrecision(10)));
      }}
      testId={`setting-value-${name}`}
    />
  );
}
