/**
 * Copy and paste of steps. Transitions between copied steps follow the copies; transitions to steps
 * outside the selection keep pointing at the originals (an exit to a shared safe state stays one).
 */
import type { StateConfig } from "@/machines/schema";
import type { EditorDoc } from "./doc";
import { uniqueStepName } from "./defaults";
import { mapStateTransitions } from "./step-ops";

export const CLIPBOARD_FORMAT = "tidewright.steps/1";

export interface StepClipboard {
  format: typeof CLIPBOARD_FORMAT;
  states: Record<string, StateConfig>;
  positions: Record<string, { x: number; y: number }>;
}

export function copySteps(doc: EditorDoc, names: string[]): StepClipboard | null {
  const present = names.filter((n) => n in doc.definition.machine.states);
  if (present.length === 0) return null;
  return {
    format: CLIPBOARD_FORMAT,
    states: structuredClone(Object.fromEntries(present.map((n) => [n, doc.definition.machine.states[n]]))),
    positions: Object.fromEntries(present.map((n) => [n, doc.layout.nodes[n] ?? { x: 0, y: 0 }])),
  };
}

/** Paste with fresh names, shifted by `offset` so the copies do not hide the originals. */
export function pasteSteps(doc: EditorDoc, clip: StepClipboard, offset = { x: 40, y: 40 }): { doc: EditorDoc; names: string[] } {
  let def = doc.definition;
  const renamed = new Map<string, string>();
  for (const name of Object.keys(clip.states)) {
    const fresh = uniqueStepName(def, name);
    renamed.set(name, fresh);
    // Reserve the name before choosing the next one.
    def = { ...def, machine: { ...def.machine, states: { ...def.machine.states, [fresh]: clip.states[name] } } };
  }
  const states = { ...doc.definition.machine.states };
  const nodes = { ...doc.layout.nodes };
  for (const [orig, fresh] of renamed) {
    states[fresh] = mapStateTransitions(structuredClone(clip.states[orig]), (t) => {
      const inside = renamed.get(t.target);
      if (inside) return { ...t, target: inside };
      return t.target in states || t.target in clip.states ? t : null;
    });
    const p = clip.positions[orig] ?? { x: 0, y: 0 };
    nodes[fresh] = { x: p.x + offset.x, y: p.y + offset.y };
  }
  return {
    doc: { definition: { ...doc.definition, machine: { ...doc.definition.machine, states } }, layout: { nodes } },
    names: [...renamed.values()],
  };
}

export function parseClipboard(text: string): StepClipboard | null {
  try {
    const v = JSON.parse(text) as Partial<StepClipboard>;
    return v && v.format === CLIPBOARD_FORMAT && typeof v.states === "object" && v.states !== null ? (v as StepClipboard) : null;
  } catch {
    return null;
  }
}
