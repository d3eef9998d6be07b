/**
 * Sequence definition ↔ canvas graph (React Flow nodes and edges), pure.
 *
 * The definition stays the source of truth in the editor; the graph is a projection of it. The
 * projection keeps everything needed to write the machine back unchanged: the order of a step's
 * `after` / `on` keys (also when a key has no transitions left), and whether a trigger held a single
 * transition object or an array (XState accepts both), so definition → graph → definition is identity.
 */
import type { Edge, Node } from "@xyflow/react";
import type {
  SequenceDefinition,
  SequenceEvent,
  SequenceLayout,
  StateConfig,
  StepMeta,
  Transition,
} from "@/machines/schema";

/** Where a transition lives in its step: `after[key][index]` or `on[key][index]`. */
export interface TransitionRef {
  step: string;
  group: "after" | "on";
  /** Timer key (setting name or formula, seconds) for `after`; `SCAN` or an event name for `on`. */
  key: string;
  index: number;
}

export type Trigger =
  | { type: "timer"; key: string }
  | { type: "condition"; expr: string | null }
  | { type: "event"; event: SequenceEvent; expr: string | null };

export type StepNodeData = {
  name: string;
  meta: StepMeta;
  initial: boolean;
  /** Timer keys in their written order (undefined when the step has no `after`). */
  afterKeys?: string[];
  /** Event keys in their written order (undefined when the step has no `on`). */
  onKeys?: string[];
};

export type TransitionEdgeData = {
  ref: TransitionRef;
  transition: Transition;
  trigger: Trigger;
  /** The trigger's transitions were written as one object rather than an array. */
  single: boolean;
  /** 1-based position among the step's SCAN exits; null for timers and events. */
  priority: number | null;
  /** How many edges join the same two steps, and this edge's place among them (to fan them out). */
  parallelIndex: number;
  parallelCount: number;
};

export const STEP_NODE_TYPE = "step";
export const TRANSITION_EDGE_TYPE = "transition";

export type StepNode = Node<StepNodeData, typeof STEP_NODE_TYPE>;
export type TransitionEdge = Edge<TransitionEdgeData, typeof TRANSITION_EDGE_TYPE>;

export interface SequenceGraph {
  nodes: StepNode[];
  edges: TransitionEdge[];
}

/** Node box used by the canvas and the auto-layout (the node components draw inside it). */
export const STEP_NODE_SIZE = { width: 184, height: 72 } as const;
const FALLBACK_SPACING = { x: 260, y: 150 };

export function edgeId(ref: TransitionRef): string {
  // The key goes last: timer keys may be formulas containing any character.
  return `t:${ref.step}:${ref.group}:${ref.index}:${ref.key}`;
}

export function sameRef(a: TransitionRef, b: TransitionRef): boolean {
  return a.step === b.step && a.group === b.group && a.key === b.key && a.index === b.index;
}

function asList(value: Transition | Transition[]): Transition[] {
  return Array.isArray(value) ? value : [value];
}

function triggerOf(group: "after" | "on", key: string, t: Transition): Trigger {
  if (group === "after") return { type: "timer", key };
  const expr = t.guard?.params.expr ?? null;
  if (key === "SCAN") return { type: "condition", expr };
  return { type: "event", event: key as SequenceEvent, expr };
}

/** Position for a step without a stored one: a simple grid in definition order. */
function fallbackPosition(index: number): { x: number; y: number } {
  return { x: (index % 4) * FALLBACK_SPACING.x, y: Math.floor(index / 4) * FALLBACK_SPACING.y };
}

export function definitionToGraph(def: SequenceDefinition, layout: SequenceLayout | null): SequenceGraph {
  const nodes: StepNode[] = [];
  const edges: TransitionEdge[] = [];
  Object.entries(def.machine.states).forEach(([name, state], i) => {
    const data: StepNodeData = { name, meta: state.meta, initial: def.machine.initial === name };
    if (state.after) data.afterKeys = Object.keys(state.after);
    if (state.on) data.onKeys = Object.keys(state.on);
    nodes.push({
      id: name,
      type: STEP_NODE_TYPE,
      position: layout?.nodes[name] ?? fallbackPosition(i),
      data,
      width: STEP_NODE_SIZE.width,
      height: STEP_NODE_SIZE.height,
    });
    edges.push(...stepEdges(name, state));
  });
  return { nodes, edges: withParallelIndices(edges) };
}

function stepEdges(name: string, state: StateConfig): TransitionEdge[] {
  const out: TransitionEdge[] = [];
  const groups: Array<["after" | "on", Record<string, Transition | Transition[] | undefined> | undefined]> = [
    ["after", state.after],
    ["on", state.on],
  ];
  for (const [group, record] of groups) {
    if (!record) continue;
    for (const [key, value] of Object.entries(record)) {
      if (value === undefined) continue;
      asList(value).forEach((transition, index) => {
        const ref: TransitionRef = { step: name, group, key, index };
        out.push({
          id: edgeId(ref),
          type: TRANSITION_EDGE_TYPE,
          source: name,
          target: transition.target,
          data: {
            ref,
            transition,
            trigger: triggerOf(group, key, transition),
            single: !Array.isArray(value),
            priority: group === "on" && key === "SCAN" ? index + 1 : null,
            parallelIndex: 0,
            parallelCount: 1,
          },
        });
      });
    }
  }
  return out;
}

/** Number edges joining the same unordered pair of steps so the canvas can spread them apart. */
function withParallelIndices(edges: TransitionEdge[]): TransitionEdge[] {
  const byPair = new Map<string, TransitionEdge[]>();
  for (const e of edges) {
    const pair = [e.source, e.target].sort().join("\u0000");
    const list = byPair.get(pair) ?? [];
    list.push(e);
    byPair.set(pair, list);
  }
  for (const list of byPair.values()) {
    list.forEach((e, i) => {
      if (!e.data) return;
      e.data.parallelIndex = i;
      e.data.parallelCount = list.length;
    });
  }
  return edges;
}

/**
 * Write the graph back into a definition. `base` supplies everything that is not the step graph
 * (format, name, settings, monitors, the machine id). The initial step is the node marked initial,
 * or the base's when none is.
 */
export function graphToDefinition(base: SequenceDefinition, graph: SequenceGraph): SequenceDefinition {
  const states: Record<string, StateConfig> = {};
  let initial = base.machine.initial;
  for (const node of graph.nodes) {
    const { name, meta } = node.data;
    if (node.data.initial) initial = name;
    const state: StateConfig = { meta };
    const own = graph.edges.filter((e) => e.data && e.data.ref.step === name);
    const after = buildGroup("after", node.data.afterKeys, own);
    const on = buildGroup("on", node.data.onKeys, own);
    if (after) state.after = after;
    if (on) state.on = on as StateConfig["on"];
    states[name] = state;
  }
  return { ...base, machine: { ...base.machine, initial, states } };
}

function buildGroup(
  group: "after" | "on",
  declaredKeys: string[] | undefined,
  edges: TransitionEdge[],
): Record<string, Transition | Transition[]> | undefined {
  const mine = edges.filter((e) => e.data?.ref.group === group);
  if (!declaredKeys && mine.length === 0) return undefined;
  const keys = [...(declaredKeys ?? [])];
  for (const e of mine) if (e.data && !keys.includes(e.data.ref.key)) keys.push(e.data.ref.key);
  const out: Record<string, Transition | Transition[]> = {};
  for (const key of keys) {
    const list = mine
      .filter((e) => e.data?.ref.key === key)
      .sort((a, b) => (a.data?.ref.index ?? 0) - (b.data?.ref.index ?? 0));
    const transitions = list.map((e) => ({ ...(e.data as TransitionEdgeData).transition, target: e.target }));
    const single = list.length === 1 && list[0].data?.single === true;
    out[key] = single ? transitions[0] : transitions;
  }
  return out;
}

/** Positions of the nodes as a stored layout. */
export function layoutFromNodes(nodes: Array<Pick<StepNode, "id" | "position">>): SequenceLayout {
  const out: SequenceLayout = { nodes: {} };
  for (const n of nodes) out.nodes[n.id] = { x: Math.round(n.position.x), y: Math.round(n.position.y) };
  return out;
}

/** The stored layout, completed with fallback positions for steps that have none. */
export function completeLayout(def: SequenceDefinition, layout: SequenceLayout | null): SequenceLayout {
  return layoutFromNodes(definitionToGraph(def, layout).nodes);
}

/** Every transition of a definition with its reference, in graph order. */
export function listTransitions(def: SequenceDefinition): Array<{ ref: TransitionRef; transition: Transition }> {
  return definitionToGraph(def, null).edges.map((e) => ({
    ref: (e.data as TransitionEdgeData).ref,
    transition: (e.data as TransitionEdgeData).transition,
  }));
}

/** The transition a reference points at, if it still exists. */
export function getTransition(def: SequenceDefinition, ref: TransitionRef): Transition | undefined {
  const state = def.machine.states[ref.step];
  const record = ref.group === "after" ? state?.after : state?.on;
  const value = (record as Record<string, Transition | Transition[] | undefined> | undefined)?.[ref.key];
  if (value === undefined) return undefined;
  return asList(value)[ref.index];
}

/** A short text for a trigger, as shown on edges and in lists. */
export function describeTrigger(trigger: Trigger): string {
  switch (trigger.type) {
    case "timer":
      return `after ${trigger.key} s`;
    case "condition":
      return trigger.expr ?? "every scan";
    case "event":
      return trigger.expr ? `${trigger.event} if ${trigger.expr}` : trigger.event;
  }
}
