/**
 * Every formula in a definition, reachable by one walk, so renaming a setting can rewrite them all
 * and the inspector can list where a name is used.
 */
import type { Command, SequenceDefinition, StateConfig, Transition } from "@/machines/schema";

type Rewrite = (formula: string) => string;

function rewriteCommand(c: Command, f: Rewrite): Command {
  switch (c.kind) {
    case "flow":
      return { ...c, flow: f(c.flow) };
    case "pressure":
      return { ...c, target: f(c.target), rise: f(c.rise) };
    case "arm":
      return { ...c, angle: f(c.angle), pulseRate: f(c.pulseRate) };
    default:
      return c;
  }
}

function rewriteTransition(t: Transition, f: Rewrite): Transition {
  return t.guard ? { ...t, guard: { ...t.guard, params: { expr: f(t.guard.params.expr) } } } : t;
}

function rewriteList(v: Transition | Transition[], f: Rewrite): Transition | Transition[] {
  return Array.isArray(v) ? v.map((t) => rewriteTransition(t, f)) : rewriteTransition(v, f);
}

function rewriteState(s: StateConfig, f: Rewrite): StateConfig {
  const out: StateConfig = { ...s, meta: { ...s.meta, command: rewriteCommand(s.meta.command, f) } };
  if (s.after) {
    // Timer keys are formulas too (or a setting name, which is the simplest formula).
    out.after = Object.fromEntries(Object.entries(s.after).map(([k, v]) => [f(k), rewriteList(v, f)]));
  }
  if (s.on) {
    out.on = Object.fromEntries(
      Object.entries(s.on).map(([k, v]) => [k, v === undefined ? v : rewriteList(v, f)]),
    ) as StateConfig["on"];
  }
  return out;
}

export function rewriteFormulas(def: SequenceDefinition, f: Rewrite): SequenceDefinition {
  return {
    ...def,
    settings: Object.fromEntries(
      Object.entries(def.settings).map(([k, s]) => [k, s.formula ? { ...s, formula: f(s.formula) } : s]),
    ),
    monitors: def.monitors.map((m) => ({ ...m, when: f(m.when) })),
    machine: {
      ...def.machine,
      states: Object.fromEntries(Object.entries(def.machine.states).map(([k, s]) => [k, rewriteState(s, f)])),
    },
  };
}

function escapeRegExp(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
}

/** Replace the identifier `from` by `to` where it stands alone (not inside a longer name or after a dot). */
export function renameIdentifier(formula: string, from: string, to: string): string {
  const re = new RegExp(`(?<![A-Za-z0-9_.])${escapeRegExp(from)}(?![A-Za-z0-9_])`, "g");
  return formula.replace(re, to);
}
