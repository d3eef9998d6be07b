/**
 * Static checks: for each check a definition that trips it and one that does not. Every case starts
 * from the base sequence below, which passes all checks, and breaks exactly one thing.
 */
import { describe, expect, it } from "vitest";
import { runStaticChecks, hasBlockingProblems, type Problem } from "@/machines/checks";
import { FORMAT_ID, sequenceDefinition, type SequenceDefinition, type SequenceDefinitionInput } from "@/machines/schema";

const baseInput = (): SequenceDefinitionInput => ({
  format: FORMAT_ID,
  name: "Check fixture",
  settings: {
    PEEP: { unit: "cmH2O", value: 5, min: 0, max: 20 },
    Pmax: { unit: "cmH2O", value: 35, min: 10, max: 60 },
    sens: { unit: "cmH2O", value: 2, min: 0.5, max: 5 },
    RR: { unit: "/min", value: 15, min: 4, max: 30 },
    Ti: { unit: "s", value: 1, min: 0.3, max: 2 },
    Te: { unit: "s", formula: "60 / RR - Ti", min: 0 },
    Vt: { unit: "mL", value: 500, min: 100, max: 1000 },
  },
  monitors: [{ when: "paw > Pmax + 5", alarm: { kind: "over-pressure", message: "Pressure above the limit" } }],
  machine: {
    id: "fixture",
    initial: "inhale",
    states: {
      inhale: {
        meta: { kind: "inhale", command: { kind: "flow", flow: "Vt / Ti * 60 / 1000" } },
        after: { Ti: { target: "exhale" } },
        on: { SCAN: [{ target: "limit", guard: { type: "formula", params: { expr: "paw > Pmax" } } }], STOP: { target: "standby" } },
      },
      exhale: {
        meta: { kind: "exhale", command: { kind: "release" } },
        after: { "0.5": { target: "wait" } },
      },
      wait: {
        meta: { kind: "wait-for-trigger", command: { kind: "release" } },
        on: { SCAN: [{ target: "inhale", guard: { type: "formula", params: { expr: "tStep > 0.05 and paw < PEEP - sens" } } }] },
        after: { Te: { target: "inhale" } },
      },
      limit: {
        meta: { kind: "safe", command: { kind: "release" } },
        after: { "0.5": { target: "exhale" } },
        on: { STOP: { target: "standby" } },
      },
      standby: {
        meta: { kind: "safe", command: { kind: "release" } },
        on: { START: { target: "inhale" } },
      },
    },
  },
});

type States = SequenceDefinitionInput["machine"]["states"];

/** The base definition with `edit` applied to a fresh copy, parsed through the schema (defaults filled). */
function variant(edit: (d: SequenceDefinitionInput & { machine: { states: States } }) => void = () => {}): SequenceDefinition {
  const input = baseInput();
  edit(input);
  return sequenceDefinition.parse(input);
}

const guard = (expr: string) => ({ type: "formula" as const, params: { expr } });

const ids = (problems: Problem[]): string[] => problems.map((p) => p.id);
const only = (d: SequenceDefinition, id: string): Problem[] => runStaticChecks(d).filter((p) => p.id === id);

describe("the base fixture", () => {
  it("passes every check", () => {
    expect(runStaticChecks(variant())).toEqual([]);
  });
});

describe("unknown-target / unknown-initial", () => {
  it("reports a transition to a step that does not exist", () => {
    const d = variant((x) => {
      x.machine.states.exhale.after = { "0.5": { target: "nowhere" } };
    });
    const [p] = only(d, "unknown-target");
    expect(p).toMatchObject({ severity: "error", target: { type: "transition", step: "exhale", via: "after", key: "0.5", index: 0 } });
    expect(p.message).toContain("nowhere");
  });
  it("reports an initial step that does not exist, and does not then call every step unreachable", () => {
    const d = variant((x) => {
      x.machine.initial = "start";
    });
    expect(ids(runStaticChecks(d))).toContain("unknown-initial");
    expect(ids(runStaticChecks(d))).not.toContain("unreachable-step");
  });
});

describe("unreachable-step", () => {
  it("reports a step nothing leads to", () => {
    const d = variant((x) => {
      x.machine.states.spare = { meta: { kind: "hold", command: { kind: "hold" } }, after: { "1": { target: "exhale" } } };
    });
    expect(only(d, "unreachable-step")).toMatchObject([{ severity: "warning", target: { type: "step", step: "spare" } }]);
  });
  it("counts event transitions as paths (standby is only reached on STOP)", () => {
    expect(only(variant(), "unreachable-step")).toEqual([]);
  });
});

describe("no-exit / safe-step-no-exit", () => {
  it("is an error for a non-safe step without exits", () => {
    const d = variant((x) => {
      x.machine.states.exhale = { meta: { kind: "exhale", command: { kind: "release" } } };
    });
    expect(only(d, "no-exit")).toMatchObject([{ severity: "error", target: { type: "step", step: "exhale" } }]);
    expect(hasBlockingProblems(runStaticChecks(d))).toBe(true);
  });
  it("does not count a self-transition as an exit", () => {
    const d = variant((x) => {
      x.machine.states.exhale = { meta: { kind: "exhale", command: { kind: "release" } }, after: { "1": { target: "exhale" } } };
    });
    expect(ids(only(d, "no-exit"))).toEqual(["no-exit"]);
  });
  it("only warns for a safe step that latches", () => {
    const d = variant((x) => {
      x.machine.states.standby = { meta: { kind: "safe", command: { kind: "release" } } };
    });
    expect(only(d, "no-exit")).toEqual([]);
    expect(only(d, "safe-step-no-exit")).toMatchObject([{ severity: "warning", target: { step: "standby" } }]);
    expect(hasBlockingProblems(runStaticChecks(d))).toBe(false);
  });
});

describe("inhale-no-pressure-limit", () => {
  const withLimitGuard = (expr: string, target = "limit") =>
    variant((x) => {
      x.machine.states.inhale.on = { SCAN: [{ target, guard: guard(expr) }], STOP: { target: "standby" } };
    });
  it("warns when an inhale step has no scan exit on high paw", () => {
    const d = variant((x) => {
      x.machine.states.inhale.on = { STOP: { target: "standby" } };
    });
    expect(only(d, "inhale-no-pressure-limit")).toMatchObject([{ severity: "warning", target: { type: "step", step: "inhale" } }]);
  });
  it("does not accept a comparison in the wrong direction", () => {
    expect(only(withLimitGuard("paw < Pmax"), "inhale-no-pressure-limit")).toHaveLength(1);
  });
  it("accepts the limit written either way round and inside a larger condition", () => {
    expect(only(withLimitGuard("Pmax < paw"), "inhale-no-pressure-limit")).toEqual([]);
    expect(only(withLimitGuard("tStep > 0.01 and paw >= Pmax"), "inhale-no-pressure-limit")).toEqual([]);
  });
  it("needs the exit to lead to a safe or exhaling step", () => {
    const d = variant((x) => {
      x.machine.states.inhale.on = { SCAN: [{ target: "boost", guard: guard("paw > Pmax") }] };
      x.machine.states.boost = { meta: { kind: "custom", command: { kind: "flow", flow: "30" } }, after: { "1": { target: "exhale" } } };
    });
    expect(only(d, "inhale-no-pressure-limit")).toHaveLength(1);
    expect(only(withLimitGuard("paw > Pmax", "exhale"), "inhale-no-pressure-limit")).toEqual([]);
  });
});

describe("trigger-no-backup-timer", () => {
  it("warns when a wait-for-trigger step has no timer exit", () => {
    const d = variant((x) => {
      delete x.machine.states.wait.after;
    });
    expect(only(d, "trigger-no-backup-timer")).toMatchObject([{ severity: "warning", target: { step: "wait" } }]);
  });
});

describe("formula checks", () => {
  const withGuard = (expr: string) =>
    variant((x) => {
      x.machine.states.wait.on = { SCAN: [{ target: "inhale", guard: guard(expr) }] };
    });
  const waitScan = { type: "transition", step: "wait", via: "SCAN", index: 0 };

  it("formula-syntax: reports where the parser stopped", () => {
    const [p] = only(withGuard("paw <"), "formula-syntax");
    expect(p).toMatchObject({ severity: "error", target: waitScan });
    expect(p.message).toMatch(/end of the formula/);
  });
  it("formula-unsupported: refuses an assignment", () => {
    expect(only(withGuard("paw = 3"), "formula-unsupported")[0].message).toMatch(/use == to compare/);
  });
  it("formula-unknown-name: names the unknown symbol, with a hint for units", () => {
    expect(only(withGuard("paww < PEEP"), "formula-unknown-name")[0].message).toContain("paww");
    const d = variant((x) => {
      x.machine.states.inhale.meta.command = { kind: "flow", flow: "30 lpm" };
    });
    const [p] = only(d, "formula-unknown-name");
    expect(p.target).toEqual({ type: "step", step: "inhale", field: "command.flow" });
    expect(p.message).toMatch(/leave the unit "lpm" out/);
  });
  it("formula-unknown-name: in a setting formula and in a monitor", () => {
    const d = variant((x) => {
      x.settings.Te = { unit: "s", formula: "60 / rate - Ti" };
      x.monitors = [{ when: "pressure > 50", alarm: { kind: "x", message: "x" } }];
    });
    expect(only(d, "formula-unknown-name").map((p) => p.target)).toEqual([
      { type: "setting", setting: "Te" },
      { type: "definition", monitor: 0 },
    ]);
  });
  it("formula-unknown-function: a function the engine does not offer", () => {
    expect(only(withGuard("clamp(paw, 0, 10) < PEEP"), "formula-unknown-function")[0].message).toContain("clamp");
  });
  it("formula-unknown-option: a choice compared with a string it cannot take", () => {
    const d = (value: string) =>
      variant((x) => {
        x.settings.mode = { options: ["pressure", "flow"], value: "pressure" };
        x.machine.states.wait.on = { SCAN: [{ target: "inhale", guard: guard(`mode == "${value}" and paw < PEEP - sens`) }] };
      });
    expect(only(d("presure"), "formula-unknown-option")).toHaveLength(1);
    expect(only(d("flow"), "formula-unknown-option")).toEqual([]);
  });
  it("unit-mismatch: a time compared with a pressure, a volume as a timer, a volume as a flow", () => {
    expect(only(withGuard("tStep > PEEP"), "unit-mismatch")[0].message).toMatch(/compares a time with a pressure/);
    const timer = variant((x) => {
      x.machine.states.exhale.after = { Vt: { target: "wait" } };
    });
    expect(only(timer, "unit-mismatch")[0]).toMatchObject({ target: { via: "after", key: "Vt" } });
    const flow = variant((x) => {
      x.machine.states.inhale.meta.command = { kind: "flow", flow: "Vt" };
    });
    expect(only(flow, "unit-mismatch")[0].message).toMatch(/gives a volume, but a flow is expected/);
  });
  it("unit-mismatch: a derived setting whose formula does not give its unit", () => {
    const d = variant((x) => {
      x.settings.Te = { unit: "s", formula: "RR - Ti" };
    });
    expect(only(d, "unit-mismatch")[0].target).toEqual({ type: "setting", setting: "Te" });
  });
  it("unitless-setting: warns where a setting without a unit stands in for a pressure, not in a product", () => {
    const d = (expr: string) =>
      variant((x) => {
        x.settings.k = { value: 2, min: 0, max: 5 };
        x.machine.states.wait.on = { SCAN: [{ target: "inhale", guard: guard(expr) }] };
      });
    expect(only(d("tStep > 0.05 and paw < PEEP - k"), "unitless-setting")).toMatchObject([{ severity: "warning" }]);
    expect(only(d("tStep > 0.05 and paw < PEEP - k * sens"), "unitless-setting")).toEqual([]);
    expect(only(d("tStep > 0.05 and paw < PEEP - k"), "unit-mismatch")).toEqual([]);
  });
});

describe("exit-never-true / exit-always-true / exit-shadows-later", () => {
  const scanExits = (...exprs: Array<string | null>) =>
    variant((x) => {
      x.machine.states.wait.on = {
        SCAN: exprs.map((e, i) => (e === null ? { target: i ? "exhale" : "inhale" } : { target: i ? "exhale" : "inhale", guard: guard(e) })),
      };
    });
  it("warns about a condition that can never hold (a clock below zero)", () => {
    expect(only(scanExits("tStep < 0"), "exit-never-true")).toMatchObject([{ severity: "warning", target: { step: "wait", index: 0 } }]);
  });
  it("uses setting bounds: PEEP > 30 is impossible with PEEP ≤ 20, PEEP > 10 is not", () => {
    expect(only(scanExits("PEEP > 30"), "exit-never-true")).toHaveLength(1);
    expect(only(scanExits("PEEP > 10"), "exit-never-true")).toEqual([]);
  });
  it("warns about an always-true condition and names the exits it hides", () => {
    const [p] = only(scanExits("tStep >= 0", "paw < PEEP - sens"), "exit-always-true");
    expect(p).toMatchObject({ severity: "warning", target: { step: "wait", via: "SCAN", index: 0 } });
    expect(p.message).toContain("to exhale on scan");
    expect(p.message).toContain("to inhale after `Te`");
    expect(only(scanExits("tStep >= 0.1", "paw < PEEP - sens"), "exit-always-true")).toEqual([]);
  });
  it("warns when an exit without a condition comes before others", () => {
    const [p] = only(scanExits(null, "paw < PEEP - sens"), "exit-shadows-later");
    expect(p.message).toContain("to exhale on scan");
    // Last in its list it hides no scan exit, but it still leaves before the step's timer can run.
    const [last] = only(scanExits("paw < PEEP - sens", null), "exit-shadows-later");
    expect(last.message).not.toContain("on scan)");
    expect(last.message).toContain("to inhale after `Te`");
    const noTimer = variant((x) => {
      x.machine.states.wait.on = { SCAN: [{ target: "inhale", guard: guard("paw < PEEP - sens") }, { target: "exhale" }] };
      delete x.machine.states.wait.after;
    });
    expect(only(noTimer, "exit-shadows-later")).toEqual([]);
  });
});

describe("zero-time-cycle / possible-zero-time-cycle", () => {
  const loop = (aToB: { after?: string; guard?: string }, bToA: { guard?: string }) =>
    variant((x) => {
      x.machine.states.exhale.after = { "0.5": { target: "a" } };
      x.machine.states.a = {
        meta: { kind: "custom", command: { kind: "hold" } },
        ...(aToB.after !== undefined
          ? { after: { [aToB.after]: { target: "b" } } }
          : { on: { SCAN: [aToB.guard ? { target: "b", guard: guard(aToB.guard) } : { target: "b" }] } }),
      };
      x.machine.states.b = {
        meta: { kind: "custom", command: { kind: "hold" } },
        on: { SCAN: [bToA.guard ? { target: "a", guard: guard(bToA.guard) } : { target: "a" }], STOP: { target: "wait" } },
      };
    });
  it("is an error for unconditional scan exits round a loop, naming the steps", () => {
    const [p] = only(loop({}, {}), "zero-time-cycle");
    expect(p.severity).toBe("error");
    expect(p.message).toContain("a → b → a");
  });
  it("counts a zero delay and an always-true condition as instantaneous", () => {
    expect(only(loop({ after: "0" }, { guard: "tStep >= 0" }), "zero-time-cycle")).toHaveLength(1);
  });
  it("is not tripped when one exit needs time", () => {
    expect(only(loop({ after: "0.1" }, {}), "zero-time-cycle")).toEqual([]);
    expect(only(loop({ after: "0.1" }, {}), "possible-zero-time-cycle")).toEqual([]);
    expect(only(loop({ guard: "tStep > 0.2" }, {}), "zero-time-cycle")).toEqual([]);
  });
  it("warns when conditions on live signals could close the loop at once", () => {
    const d = loop({ guard: "paw > 5" }, { guard: "paw > 3" });
    expect(only(d, "zero-time-cycle")).toEqual([]);
    expect(only(d, "possible-zero-time-cycle")).toMatchObject([{ severity: "warning" }]);
  });
  it("catches a self-loop", () => {
    const d = variant((x) => {
      x.machine.states.exhale.on = { SCAN: [{ target: "exhale" }] };
    });
    expect(only(d, "zero-time-cycle")[0].message).toContain("exhale → exhale");
  });
});

describe("delay checks", () => {
  const timer = (key: string) =>
    variant((x) => {
      x.machine.states.exhale.after = { [key]: { target: "wait" } };
    });
  it("delay-negative: negative with the saved values", () => {
    expect(only(timer("Ti - 2"), "delay-negative")).toMatchObject([{ severity: "error", target: { via: "after", key: "Ti - 2" } }]);
    expect(only(timer("Ti - 2"), "delay-negative")[0].message).toContain("-1 s");
  });
  it("delay-invalid: infinite", () => {
    expect(only(timer("1 / 0"), "delay-invalid")).toHaveLength(1);
  });
  it("delay-can-be-negative: fine at the saved values, negative at the allowed extremes", () => {
    expect(only(timer("Ti - 0.5"), "delay-can-be-negative")).toMatchObject([{ severity: "warning" }]);
    expect(only(timer("Ti - 0.5"), "delay-negative")).toEqual([]);
    expect(only(timer("max(0, Ti - 0.5)"), "delay-can-be-negative")).toEqual([]);
  });
});

describe("setting checks", () => {
  it("setting-out-of-range: a value above its maximum", () => {
    const d = variant((x) => {
      x.settings.PEEP = { unit: "cmH2O", value: 30, min: 0, max: 20 };
    });
    expect(only(d, "setting-out-of-range")).toMatchObject([{ severity: "error", target: { type: "setting", setting: "PEEP" } }]);
  });
  it("setting-out-of-range: a derived value below its minimum", () => {
    const d = variant((x) => {
      x.settings.Te = { unit: "s", formula: "60 / RR - Ti", min: 5 };
    });
    expect(only(d, "setting-out-of-range")[0].message).toMatch(/Te is 3 s \(from its formula/);
  });
  it("setting-bounds-inverted, setting-invalid-choice, setting-no-value", () => {
    const d = variant((x) => {
      x.settings.Vt = { unit: "mL", value: 500, min: 1000, max: 100 };
      x.settings.mode = { options: ["pressure", "flow"], value: "volume" };
      x.settings.spare = { unit: "s" };
    });
    expect(only(d, "setting-bounds-inverted")[0].target).toEqual({ type: "setting", setting: "Vt" });
    expect(only(d, "setting-invalid-choice")[0].target).toEqual({ type: "setting", setting: "mode" });
    expect(only(d, "setting-no-value")[0].target).toEqual({ type: "setting", setting: "spare" });
  });
  it("setting-cycle: settings computed from each other", () => {
    const d = variant((x) => {
      x.settings.Ti = { unit: "s", formula: "60 / RR - Te" };
    });
    const [p] = only(d, "setting-cycle");
    expect(p.severity).toBe("error");
    expect(p.message).toMatch(/Te → Ti → Te|Ti → Te → Ti/);
  });
  it("setting-uses-signal: a setting cannot follow a live signal", () => {
    const d = variant((x) => {
      x.settings.Pmax = { unit: "cmH2O", formula: "paw + 10" };
    });
    expect(only(d, "setting-uses-signal")).toHaveLength(1);
  });
  it("setting-shadows-signal and setting-unit-unknown", () => {
    const d = variant((x) => {
      x.settings.paw = { unit: "cmH2O", value: 1 };
      x.settings.Plimit = { unit: "psi", value: 0.5 };
    });
    expect(only(d, "setting-shadows-signal")[0].target).toEqual({ type: "setting", setting: "paw" });
    expect(only(d, "setting-unit-unknown")).toMatchObject([{ severity: "warning", target: { setting: "Plimit" } }]);
  });
});

describe("every problem", () => {
  it("has a known severity and a sentence", () => {
    const d = variant((x) => {
      x.machine.states.exhale = { meta: { kind: "exhale", command: { kind: "release" } } };
      x.machine.states.wait.on = { SCAN: [{ target: "inhale", guard: guard("tStep > PEEP") }] };
    });
    for (const p of runStaticChecks(d)) {
      expect(["error", "warning"]).toContain(p.severity);
      expect(p.message).toMatch(/^[A-Z`].*[.)]$/);
    }
  });
});
