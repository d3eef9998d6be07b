/** Edits of steps: add, rename (updating every target), delete, mark initial, change meta. */
import type { SequenceDefinition, StateConfig, StepKind, StepMeta, Transition } from "@/machines/schema";
import { defaultCommand, defaultStepName } from "./defaults";
import type { EditorDoc } from "./doc";

export function addStep(doc: EditorDoc, kind: StepKind, position: { x: number; y: number }): { doc: EditorDoc; name: string } {
  const def = doc.definition;
  const name = defaultStepName(def, kind);
  const state: StateConfig = { meta: { kind, command: defaultCommand(kind), alarms: [] } };
  const states = { ...def.machine.states, [name]: state };
  return {
    name,
    doc: {
      definition: { ...def, machine: { ...def.machine, states } },
      layout: { nodes: { ...doc.layout.nodes, [name]: { x: Math.round(position.x), y: Math.round(position.y) } } },
    },
  };
}

type ListRewrite = (t: Transition) => Transition | null;

/** Apply `f` to every transition of a state; `null` removes it. Keys left empty are dropped. */
export function mapStateTransitions(state: StateConfig, f: ListRewrite): StateConfig {
  const apply = (v: Transition | Transition[]): Transition | Transition[] | null => {
    if (!Array.isArray(v)) return f(v);
    const out = v.map(f).filter((t): t is Transition => t !== null);
    return out.length === 0 && v.length > 0 ? null : out;
  };
  const out: StateConfig = { meta: state.meta };
  if (state.after) {
    const after: Record<string, Transition | Transition[]> = {};
    for (const [k, v] of Object.entries(state.after)) {
      const r = apply(v);
      if (r !== null) after[k] = r;
    }
    if (Object.keys(after).length > 0 || Object.keys(state.after).length === 0) out.after = after;
  }
  if (state.on) {
    const on: Record<string, Transition | Transition[]> = {};
    for (const [k, v] of Object.entries(state.on)) {
      if (v === undefined) continue;
      const r = apply(v);
      if (r !== null) on[k] = r;
    }
    if (Object.keys(on).length > 0 || Object.keys(state.on).length === 0) out.on = on as StateConfig["on"];
  }
  return out;
}

export function renameStep(doc: EditorDoc, from: string, to: string): EditorDoc {
  const def = doc.definition;
  if (from === to) return doc;
  if (!(from in def.machine.states)) throw new Error(`there is no step ${from}`);
  if (to in def.machine.states) throw new Error(`a step named ${to} already exists`);
  const retarget: ListRewrite = (t) => (t.target === from ? { ...t, target: to } : t);
  const states: Record<string, StateConfig> = {};
  for (const [k, s] of Object.entries(def.machine.states)) states[k === from ? to : k] = mapStateTransitions(s, retarget);
  const nodes: EditorDoc["layout"]["nodes"] = {};
  for (const [k, p] of Object.entries(doc.layout.nodes)) nodes[k === from ? to : k] = p;
  return {
    definition: {
      ...def,
      machine: { ...def.machine, initial: def.machine.initial === from ? to : def.machine.initial, states },
    },
    layout: { nodes },
  };
}

/**
 * Remove steps and every transition that led into them (a transition to a missing step would only
 * become a problem to fix by hand). If the initial step goes, the first remaining step becomes initial.
 */
export function deleteSteps(doc: EditorDoc, names: string[]): EditorDoc {
  const gone = new Set(names);
  const def = doc.definition;
  const states: Record<string, StateConfig> = {};
  for (const [k, s] of Object.entries(def.machine.states)) {
    if (gone.has(k)) continue;
    states[k] = mapStateTransitions(s, (t) => (gone.has(t.target) ? null : t));
  }
  const remaining = Object.keys(states);
  const initial = gone.has(def.machine.initial) ? (remaining[0] ?? def.machine.initial) : def.machine.initial;
  const nodes = Object.fromEntries(Object.entries(doc.layout.nodes).filter(([k]) => !gone.has(k)));
  return { definition: { ...def, machine: { ...def.machine, initial, states } }, layout: { nodes } };
}

export function setInitialStep(def: SequenceDefinition, name: string): SequenceDefinition {
  return { ...def, machine: { ...def.machine, initial: name } };
}

export function updateStepMeta(def: SequenceDefinition, name: string, meta: StepMeta): SequenceDefinition {
  const state = def.machine.states[name];
  if (!state) return def;
  return { ...def, machine: { ...def.machine, states: { ...def.machine.states, [name]: { ...state, meta } } } };
}

export function moveSteps(doc: EditorDoc, positions: Record<string, { x: number; y: number }>): EditorDoc {
  const nodes = { ...doc.layout.nodes };
  for (const [k, p] of Object.entries(positions)) nodes[k] = { x: Math.round(p.x), y: Math.round(p.y) };
  return { ...doc, layout: { nodes } };
}
