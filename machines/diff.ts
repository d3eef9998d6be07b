/**
 * What changed between two sequence definitions, for the revision compare view: a list to read and
 * the step / transition addresses to highlight on both canvases.
 *
 * A transition's identity is its source step, its trigger (timer key, SCAN, or event) and its target,
 * so moving an exit to another target reads as one removed and one added, while editing its condition
 * reads as a change. Two exits with the same identity are matched in order of appearance.
 */
import { canonicalJson } from "@/machines/hash";
import type { TransitionVia } from "@/machines/checks/types";
import type {
  Monitor,
  SequenceDefinition,
  Setting,
  StateConfig,
  StepMeta,
  Transition,
} from "@/machines/schema";

export type { TransitionVia };

/** Where a transition sits in one definition: `after[key][index]` or `on[via][index]`. */
export interface TransitionAddress {
  step: string;
  via: TransitionVia;
  /** Timer key, for `after`. */
  key?: string;
  index: number;
}

export interface TransitionRef {
  /** Identity shared by both sides when matched: "step|via|key|target#n". */
  id: string;
  step: string;
  via: TransitionVia;
  key?: string;
  target: string;
  transition: Transition;
  /** Address in the side it comes from (`a` for removed, `b` for added). */
  at: TransitionAddress;
}

export type TransitionField = "guard" | "priority" | "meta";

export interface TransitionChange {
  id: string;
  step: string;
  via: TransitionVia;
  key?: string;
  target: string;
  fields: TransitionField[];
  from: Transition;
  to: Transition;
  /** Address on the left (a) and right (b) canvas. */
  atA: TransitionAddress;
  atB: TransitionAddress;
}

export type StepField = keyof StepMeta;

export interface SettingChange {
  name: string;
  fields: Array<keyof Setting>;
  from: Setting;
  to: Setting;
}

export interface MonitorChange {
  fromIndex: number;
  toIndex: number;
  from: Monitor;
  to: Monitor;
}

export interface ValueChange<T> {
  from: T;
  to: T;
}

export interface DefinitionDiff {
  /** True when nothing differs (the hashes would be equal too). */
  identical: boolean;
  steps: { added: string[]; removed: string[]; changed: Array<{ step: string; fields: StepField[] }> };
  transitions: { added: TransitionRef[]; removed: TransitionRef[]; changed: TransitionChange[] };
  settings: { added: string[]; removed: string[]; changed: SettingChange[] };
  monitors: {
    added: Array<{ index: number; monitor: Monitor }>;
    removed: Array<{ index: number; monitor: Monitor }>;
    changed: MonitorChange[];
  };
  meta: {
    name?: ValueChange<string>;
    description?: ValueChange<string | undefined>;
    machineId?: ValueChange<string>;
    initial?: ValueChange<string>;
  };
}

const same = (x: unknown, y: unknown): boolean => canonicalJson(x ?? null) === canonicalJson(y ?? null);

function changedKeys<T extends object>(a: T, b: T): Array<keyof T> {
  const keys = new Set([...Object.keys(a), ...Object.keys(b)] as Array<keyof T>);
  return [...keys].filter((k) => !same(a[k], b[k])).sort();
}

function asList(t: Transition | Transition[] | undefined): Transition[] {
  if (t === undefined) return [];
  return Array.isArray(t) ? t : [t];
}

interface Listed {
  ref: TransitionRef;
  /** Step, trigger and key: the list the transition sits in, whose order is its priority. */
  list: string;
  /** List plus target: the identity, before duplicates are told apart. */
  base: string;
}

function listTransitions(definition: SequenceDefinition): Listed[] {
  const out: Listed[] = [];
  const add = (step: string, via: TransitionVia, key: string | undefined, transitions: Transition[]): void => {
    const list = `${step}|${via}|${key ?? ""}`;
    transitions.forEach((transition, index) => {
      const base = `${list}|${transition.target}`;
      const at: TransitionAddress = key === undefined ? { step, via, index } : { step, via, key, index };
      const ref: TransitionRef = { id: base, step, via, target: transition.target, transition, at };
      if (key !== undefined) ref.key = key;
      out.push({ ref, list, base });
    });
  };
  for (const [step, config] of Object.entries(definition.machine.states) as Array<[string, StateConfig]>) {
    for (const [key, t] of Object.entries(config.after ?? {})) add(step, "after", key, asList(t));
    for (const [via, t] of Object.entries(config.on ?? {}) as Array<[TransitionVia, Transition | Transition[] | undefined]>) {
      add(step, via, undefined, asList(t));
    }
  }
  return out;
}

/**
 * Give matching transitions of both sides the same id. Exits sharing an identity (two scan exits from
 * inhale to exhale) pair first with an identical twin, so reordering them reads as a priority change
 * rather than two edited conditions; the rest pair in order of appearance.
 */
function assignIds(left: Listed[], right: Listed[]): void {
  const groups = new Map<string, { a: Listed[]; b: Listed[] }>();
  for (const l of left) (groups.get(l.base) ?? groups.set(l.base, { a: [], b: [] }).get(l.base)!).a.push(l);
  for (const r of right) (groups.get(r.base) ?? groups.set(r.base, { a: [], b: [] }).get(r.base)!).b.push(r);
  for (const [base, { a, b }] of groups) {
    let n = 0;
    const freeB = new Set(b);
    const unpairedA: Listed[] = [];
    for (const l of a) {
      const twin = [...freeB].find((r) => same(l.ref.transition, r.ref.transition));
      if (twin) {
        freeB.delete(twin);
        l.ref.id = twin.ref.id = `${base}#${n++}`;
      } else unpairedA.push(l);
    }
    const restB = [...freeB];
    unpairedA.forEach((l, i) => {
      l.ref.id = `${base}#${n++}`;
      if (restB[i]) restB[i].ref.id = l.ref.id;
    });
    for (const r of restB.slice(unpairedA.length)) r.ref.id = `${base}#${n++}`;
  }
}

/** Rank of each id among the transitions of its list that exist on both sides. */
function ranks(listed: Listed[], common: Set<string>): Map<string, number> {
  const counters = new Map<string, number>();
  const rank = new Map<string, number>();
  for (const { ref, list } of listed) {
    if (!common.has(ref.id)) continue;
    const r = counters.get(list) ?? 0;
    counters.set(list, r + 1);
    rank.set(ref.id, r);
  }
  return rank;
}

function diffTransitions(a: SequenceDefinition, b: SequenceDefinition): DefinitionDiff["transitions"] {
  const left = listTransitions(a);
  const right = listTransitions(b);
  assignIds(left, right);
  const leftById = new Map(left.map((l) => [l.ref.id, l.ref]));
  const rightById = new Map(right.map((r) => [r.ref.id, r.ref]));
  const common = new Set([...leftById.keys()].filter((id) => rightById.has(id)));
  // Priority is order among surviving exits: removing the first exit does not "change" the others.
  const rankA = ranks(left, common);
  const rankB = ranks(right, common);
  const changed: TransitionChange[] = [];
  for (const id of common) {
    const from = leftById.get(id)!;
    const to = rightById.get(id)!;
    const fields: TransitionField[] = [];
    if (!same(from.transition.guard, to.transition.guard)) fields.push("guard");
    if (rankA.get(id) !== rankB.get(id)) fields.push("priority");
    if (!same(from.transition.meta, to.transition.meta)) fields.push("meta");
    if (fields.length === 0) continue;
    const change: TransitionChange = {
      id,
      step: from.step,
      via: from.via,
      target: from.target,
      fields,
      from: from.transition,
      to: to.transition,
      atA: from.at,
      atB: to.at,
    };
    if (from.key !== undefined) change.key = from.key;
    changed.push(change);
  }
  return {
    added: right.map((r) => r.ref).filter((r) => !leftById.has(r.id)),
    removed: left.map((l) => l.ref).filter((l) => !rightById.has(l.id)),
    changed,
  };
}

function diffSteps(a: SequenceDefinition, b: SequenceDefinition): DefinitionDiff["steps"] {
  const sa = a.machine.states;
  const sb = b.machine.states;
  return {
    added: Object.keys(sb).filter((s) => !(s in sa)),
    removed: Object.keys(sa).filter((s) => !(s in sb)),
    changed: Object.keys(sa)
      .filter((s) => s in sb)
      .map((step) => ({ step, fields: changedKeys(sa[step].meta, sb[step].meta) }))
      .filter((c) => c.fields.length > 0),
  };
}

function diffSettings(a: SequenceDefinition, b: SequenceDefinition): DefinitionDiff["settings"] {
  const sa = a.settings;
  const sb = b.settings;
  return {
    added: Object.keys(sb).filter((s) => !(s in sa)),
    removed: Object.keys(sa).filter((s) => !(s in sb)),
    changed: Object.keys(sa)
      .filter((s) => s in sb)
      .map((name) => ({ name, fields: changedKeys(sa[name], sb[name]), from: sa[name], to: sb[name] }))
      .filter((c) => c.fields.length > 0),
  };
}

/**
 * Monitors have no names: identical ones match first, then a remaining pair with the same alarm kind
 * counts as one monitor changed.
 */
function diffMonitors(a: SequenceDefinition, b: SequenceDefinition): DefinitionDiff["monitors"] {
  const unmatchedB = new Set(b.monitors.map((_, i) => i));
  const unmatchedA: number[] = [];
  a.monitors.forEach((m, i) => {
    const j = [...unmatchedB].find((k) => same(m, b.monitors[k]));
    if (j === undefined) unmatchedA.push(i);
    else unmatchedB.delete(j);
  });
  const changed: MonitorChange[] = [];
  const removed: Array<{ index: number; monitor: Monitor }> = [];
  for (const i of unmatchedA) {
    const j = [...unmatchedB].find((k) => b.monitors[k].alarm.kind === a.monitors[i].alarm.kind);
    if (j === undefined) {
      removed.push({ index: i, monitor: a.monitors[i] });
    } else {
      unmatchedB.delete(j);
      changed.push({ fromIndex: i, toIndex: j, from: a.monitors[i], to: b.monitors[j] });
    }
  }
  return { added: [...unmatchedB].map((index) => ({ index, monitor: b.monitors[index] })), removed, changed };
}

function diffMeta(a: SequenceDefinition, b: SequenceDefinition): DefinitionDiff["meta"] {
  const meta: DefinitionDiff["meta"] = {};
  if (a.name !== b.name) meta.name = { from: a.name, to: b.name };
  if ((a.description ?? "") !== (b.description ?? "")) meta.description = { from: a.description, to: b.description };
  if (a.machine.id !== b.machine.id) meta.machineId = { from: a.machine.id, to: b.machine.id };
  if (a.machine.initial !== b.machine.initial) meta.initial = { from: a.machine.initial, to: b.machine.initial };
  return meta;
}

export function diffDefinitions(a: SequenceDefinition, b: SequenceDefinition): DefinitionDiff {
  const steps = diffSteps(a, b);
  const transitions = diffTransitions(a, b);
  const settings = diffSettings(a, b);
  const monitors = diffMonitors(a, b);
  const meta = diffMeta(a, b);
  const counts = [
    steps.added, steps.removed, steps.changed,
    transitions.added, transitions.removed, transitions.changed,
    settings.added, settings.removed, settings.changed,
    monitors.added, monitors.removed, monitors.changed,
  ].reduce((n, list) => n + list.length, 0);
  return { identical: counts === 0 && Object.keys(meta).length === 0, steps, transitions, settings, monitors, meta };
}
