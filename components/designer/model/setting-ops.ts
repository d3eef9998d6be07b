/** Edits of settings. Renaming rewrites every formula that names the setting, as renaming a step retargets. */
import type { SequenceDefinition, Setting } from "@/machines/schema";
import { renameIdentifier, rewriteFormulas } from "./formulas";

export function putSetting(def: SequenceDefinition, name: string, setting: Setting): SequenceDefinition {
  return { ...def, settings: { ...def.settings, [name]: setting } };
}

export function removeSetting(def: SequenceDefinition, name: string): SequenceDefinition {
  const settings = { ...def.settings };
  delete settings[name];
  return { ...def, settings };
}

export function renameSetting(def: SequenceDefinition, from: string, to: string): SequenceDefinition {
  if (from === to) return def;
  if (to in def.settings) throw new Error(`a setting named ${to} already exists`);
  // Keep the table order: rebuild the record with the new key in the old place.
  const settings = Object.fromEntries(Object.entries(def.settings).map(([k, s]) => [k === from ? to : k, s]));
  return rewriteFormulas({ ...def, settings }, (f) => renameIdentifier(f, from, to));
}

export function uniqueSettingName(def: SequenceDefinition, base = "setting"): string {
  if (!(base in def.settings)) return base;
  for (let i = 2; ; i++) if (!(`${base}${i}` in def.settings)) return `${base}${i}`;
}
