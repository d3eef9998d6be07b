/**
 * Edits of transitions: add (by connecting two steps), change trigger/target/meta, delete, and move
 * a SCAN exit up or down — array order of a step's SCAN transitions is its priority.
 */
import type { BreathCause, SequenceDefinition, StateConfig, Transition } from "@/machines/schema";
import { getTransition, sameRef, type Trigger, type TransitionRef } from "@/machines/graph";

/** What the inspector edits about a transition. */
export interface TransitionSpec {
  trigger: Trigger;
  target: string;
  label?: string;
  cause?: BreathCause;
}

/** The condition a freshly drawn connection gets: true after a second in the step, easy to see and replace. */
export const NEW_CONDITION = "tStep >= 1";

type Group = Record<string, Transition | Transition[]>;

function groupOf(state: StateConfig, group: "after" | "on"): Group {
  return { ...((group === "after" ? state.after : state.on) as Group | undefined) };
}

function withGroup(state: StateConfig, group: "after" | "on", record: Group): StateConfig {
  const out: StateConfig = { ...state };
  const empty = Object.keys(record).length === 0;
  if (group === "after") {
    if (empty) delete out.after;
    else out.after = record;
  } else if (empty) delete out.on;
  else out.on = record as StateConfig["on"];
  return out;
}

function listOf(v: Transition | Transition[] | undefined): Transition[] {
  return v === undefined ? [] : Array.isArray(v) ? [...v] : [v];
}

function putState(def: SequenceDefinition, name: string, state: StateConfig): SequenceDefinition {
  return { ...def, machine: { ...def.machine, states: { ...def.machine.states, [name]: state } } };
}

function placeOf(trigger: Trigger): { group: "after" | "on"; key: string } {
  switch (trigger.type) {
    case "timer":
      return { group: "after", key: trigger.key.trim() };
    case "condition":
      return { group: "on", key: "SCAN" };
    case "event":
      return { group: "on", key: trigger.event };
  }
}

function buildTransition(spec: TransitionSpec, previous: Transition | undefined): Transition {
  const t: Transition = { target: spec.target };
  const expr = spec.trigger.type === "timer" ? undefined : spec.trigger.expr?.trim() || undefined;
  if (expr) t.guard = { type: "formula", params: { expr } };
  // A guard on a timer cannot be edited in the inspector; keep one the file already had rather than drop it.
  else if (spec.trigger.type === "timer" && previous?.guard) t.guard = previous.guard;
  const meta: NonNullable<Transition["meta"]> = {};
  if (spec.label?.trim()) meta.label = spec.label.trim();
  if (spec.cause) meta.cause = spec.cause;
  if (Object.keys(meta).length > 0) t.meta = meta;
  return t;
}

function insert(def: SequenceDefinition, step: string, group: "after" | "on", key: string, t: Transition, at?: number): { def: SequenceDefinition; ref: TransitionRef } {
  const state = def.machine.states[step];
  const record = groupOf(state, group);
  const list = listOf(record[key]);
  const index = at === undefined ? list.length : Math.min(at, list.length);
  list.splice(index, 0, t);
  // One transition stays a single object (as engineers write it); more become a priority list.
  record[key] = list.length === 1 && !Array.isArray(record[key]) ? list[0] : list;
  return { def: putState(def, step, withGroup(state, group, record)), ref: { step, group, key, index } };
}

function remove(def: SequenceDefinition, ref: TransitionRef): SequenceDefinition {
  const state = def.machine.states[ref.step];
  if (!state) return def;
  const record = groupOf(state, ref.group);
  const wasList = Array.isArray(record[ref.key]);
  const list = listOf(record[ref.key]);
  if (ref.index >= list.length) return def;
  list.splice(ref.index, 1);
  if (list.length === 0) delete record[ref.key];
  else record[ref.key] = wasList ? list : list[0];
  return putState(def, ref.step, withGroup(state, ref.group, record));
}

export function addTransition(def: SequenceDefinition, source: string, spec: TransitionSpec): { def: SequenceDefinition; ref: TransitionRef } {
  const { group, key } = placeOf(spec.trigger);
  return insert(def, source, group, key, buildTransition(spec, undefined));
}

/** A connection drawn on the canvas: a SCAN condition, to be refined in the inspector. */
export function connectSteps(def: SequenceDefinition, source: string, target: string): { def: SequenceDefinition; ref: TransitionRef } {
  return addTransition(def, source, { trigger: { type: "condition", expr: NEW_CONDITION }, target });
}

/** Replace a transition. Same trigger place → same position; a new place → appended there. */
export function updateTransition(def: SequenceDefinition, ref: TransitionRef, spec: TransitionSpec): { def: SequenceDefinition; ref: TransitionRef } {
  const previous = getTransition(def, ref);
  if (!previous) return { def, ref };
  // Only a timer's own guard carries over; a condition's guard is the condition being replaced.
  const next = buildTransition(spec, ref.group === "after" ? previous : undefined);
  const place = placeOf(spec.trigger);
  if (place.group === ref.group && place.key === ref.key) {
    const state = def.machine.states[ref.step];
    const record = groupOf(state, ref.group);
    const value = record[ref.key];
    if (Array.isArray(value)) record[ref.key] = value.map((t, i) => (i === ref.index ? next : t));
    else record[ref.key] = next;
    return { def: putState(def, ref.step, withGroup(state, ref.group, record)), ref };
  }
  return insert(remove(def, ref), ref.step, place.group, place.key, next);
}

/** Delete several transitions; later indices go first so earlier references stay valid. */
export function deleteTransitions(def: SequenceDefinition, refs: TransitionRef[]): SequenceDefinition {
  const unique = refs.filter((r, i) => refs.findIndex((o) => sameRef(o, r)) === i);
  const ordered = [...unique].sort((a, b) => b.index - a.index);
  return ordered.reduce(remove, def);
}

/** Move a transition `delta` places within its trigger's list (priority for SCAN). */
export function moveTransition(def: SequenceDefinition, ref: TransitionRef, delta: number): { def: SequenceDefinition; ref: TransitionRef } {
  const state = def.machine.states[ref.step];
  const value = state ? groupOf(state, ref.group)[ref.key] : undefined;
  if (!Array.isArray(value)) return { def, ref };
  const to = ref.index + delta;
  if (to < 0 || to >= value.length) return { def, ref };
  const list = [...value];
  const [t] = list.splice(ref.index, 1);
  list.splice(to, 0, t);
  const record = groupOf(state, ref.group);
  record[ref.key] = list;
  return { def: putState(def, ref.step, withGroup(state, ref.group, record)), ref: { ...ref, index: to } };
}

/** The inspector's view of an existing transition. */
export function specOf(ref: TransitionRef, t: Transition): TransitionSpec {
  const expr = t.guard?.params.expr ?? null;
  const trigger: Trigger =
    ref.group === "after"
      ? { type: "timer", key: ref.key }
      : ref.key === "SCAN"
        ? { type: "condition", expr }
        : { type: "event", event: ref.key as Extract<Trigger, { type: "event" }>["event"], expr };
  return { trigger, target: t.target, label: t.meta?.label, cause: t.meta?.cause };
}
