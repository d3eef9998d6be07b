"use client";
/**
 * The sequence's settings: name, value with units (typed in any unit, stored canonical), bounds,
 * optional formula (derived settings), description; add and remove; the settings calculators below.
 */
import { useMemo } from "react";
import type { SequenceDefinition } from "@/machines/schema";
import type { Rig } from "@/lib/sim/types";
import { putSetting, removeSetting, renameSetting, uniqueSettingName } from "../model/setting-ops";
import { derivedValues } from "./derived-values";
import { SettingRow } from "./setting-row";
import { CalculatorsPanel } from "./calculators-panel";

export interface SettingsTableProps {
  definition: SequenceDefinition;
  rig: Rig;
  readOnly: boolean;
  highlight?: string;
  onChange: (definition: SequenceDefinition, group?: string) => void;
}

export function SettingsTable({ definition, rig, readOnly, highlight, onChange }: SettingsTableProps) {
  const settings = definition.settings;
  const derived = useMemo(() => derivedValues(settings), [settings]);
  const names = Object.keys(settings);
  return (
    <div className="flex flex-col gap-3" data-testid="settings-table">
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Settings of the sequence</caption>
          <thead className="text-xs text-ink-600">
            <tr>
              <th scope="col" className="p-1 font-medium">Name</th>
              <th scope="col" className="p-1 font-medium">Value</th>
              <th scope="col" className="p-1 font-medium">Unit (canonical)</th>
              <th scope="col" className="p-1 font-medium">Min</th>
              <th scope="col" className="p-1 font-medium">Max</th>
              <th scope="col" className="p-1 font-medium">Formula</th>
              <th scope="col" className="p-1 font-medium">Description</th>
              <th scope="col" className="p-1"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {names.map((name) => (
              <SettingRow
                key={name}
                name={name}
                setting={settings[name]}
                settings={settings}
                derived={derived[name]}
                readOnly={readOnly}
                highlighted={highlight === name}
                onRename={(to) => onChange(renameSetting(definition, name, to))}
                onChange={(next) => onChange(putSetting(definition, name, next))}
                onRemove={() => onChange(removeSetting(definition, name))}
              />
            ))}
          </tbody>
        </table>
        {names.length === 0 ? <p className="p-2 text-xs text-ink-500">No settings yet.</p> : null}
      </div>
      {readOnly ? null : (
        <button
          type="button"
          className="self-start rounded border border-ink-300 px-2 py-0.5 text-xs hover:bg-ink-50"
          onClick={() => onChange(putSetting(definition, uniqueSettingName(definition), { unit: "", value: 0 }))}
          data-testid="add-setting"
        >
          Add setting
        </button>
      )}
      <CalculatorsPanel definition={definition} rig={rig} readOnly={readOnly} onChange={onChange} />
    </div>
  );
}
