/** compile(): validation errors that name the problem, the restricted formula language, the XState machine. */
import fc from "fast-check";
import { createActor } from "xstate";
import { describe, expect, it } from "vitest";
import { ScanClock } from "@/lib/sim/clock";
import { SequenceError, compile, tryCompile, type SequenceIssue } from "@/machines/compile";
import { compileFormula, formulaSymbols, internString, restrictedMath } from "@/machines/formula";
import { getTemplate } from "@/machines/templates";

type Def = ReturnType<typeof minimal>;
function minimal() {
  return {
    format: "tidewright.sequence/1" as const,
    name: "minimal",
    settings: {
      PEEP: { unit: "cmH2O", value: 5, min: 0, max: 25 },
      Ti: { unit: "s", value: 1, min: 0.2, max: 5 },
      RR: { unit: "/min", value: 15, min: 4, max: 60 },
      Te: { unit: "s", formula: "60 / RR - Ti", min: 0.1 } as Record<string, unknown>,
      trigger: { options: ["pressure", "flow"], value: "pressure" } as Record<string, unknown>,
    } as Record<string, Record<string, unknown>>,
    machine: {
      id: "m",
      initial: "inhale",
      states: {
        inhale: {
          meta: { kind: "inhale", command: { kind: "pressure", target: "PEEP + 10", rise: "0" } },
          after: { Ti: { target: "exhale" } } as Record<string, unknown>,
          on: { SCAN: [{ target: "exhale", guard: { type: "formula", params: { expr: "paw > 40" } } }] } as Record<string, unknown>,
        },
        exhale: {
          meta: { kind: "exhale", command: { kind: "release" } },
          after: { Te: { target: "inhale" } } as Record<string, unknown>,
        },
      } as Record<string, Record<string, unknown>>,
    },
  };
}

function issuesOf(def: Def | Record<string, unknown>): SequenceIssue[] {
  const r = tryCompile(def);
  if (r.ok) throw new Error("expected the definition to be rejected");
  return r.issues;
}

describe("compile() rejects invalid definitions, naming the place and the problem", () => {
  it("accepts the minimal definition", () => {
    const c = compile(minimal());
    expect(c.stepNames).toEqual(["inhale", "exhale"]);
    expect(c.defaults.Te).toBeCloseTo(3, 12);
    expect(c.settingOrder.indexOf("Te")).toBeGreaterThan(c.settingOrder.indexOf("RR"));
  });

  it("unknown target step", () => {
    const d = minimal();
    d.machine.states.exhale.after = { Te: { target: "inhail" } };
    const [i] = issuesOf(d);
    expect(i.path).toBe("machine.states.exhale.after.Te[0].target");
    expect(i.message).toMatch(/unknown target step "inhail".*inhale, exhale/);
  });

  it("unknown initial step", () => {
    const d = minimal();
    d.machine.initial = "start";
    expect(issuesOf(d)[0]).toMatchObject({ path: "machine.initial", message: expect.stringMatching(/"start" does not exist/) });
  });

  it("unknown names in formulas (guards, timers, commands, monitors)", () => {
    const d = minimal();
    d.machine.states.inhale.on = { SCAN: [{ target: "exhale", guard: { type: "formula", params: { expr: "pressure > Plimit" } } }] };
    d.machine.states.inhale.after = { Tinsp: { target: "exhale" } };
    (d.machine.states.inhale.meta as Record<string, unknown>).command = { kind: "flow", flow: "Vt / Ti" };
    const issues = issuesOf(d);
    const text = issues.map((i) => `${i.path}: ${i.message}`).join("\n");
    expect(text).toMatch(/on\.SCAN\[0\]\.guard\.params\.expr: .*unknown name "pressure"/);
    expect(text).toMatch(/unknown name "Plimit"/);
    expect(text).toMatch(/after\.Tinsp: .*unknown name "Tinsp"/);
    expect(text).toMatch(/meta\.command\.flow: .*unknown name "Vt"/);
  });

  it("bad setting bounds and values outside bounds", () => {
    const d = minimal();
    d.settings.PEEP = { unit: "cmH2O", value: 5, min: 10, max: 2 };
    d.settings.Ti = { unit: "s", value: 9, min: 0.2, max: 5 };
    const issues = issuesOf(d);
    expect(issues.find((i) => i.path === "settings.PEEP.min")?.message).toMatch(/min 10 is above max 2/);
    expect(issues.find((i) => i.path === "settings.Ti.value")?.message).toMatch(/Ti: its default 9 s is above its maximum 5 s/);
  });

  it("a derived value outside its bounds names the inputs", () => {
    const c = compile(minimal());
    expect(() => c.resolveSettings({ RR: 30, Ti: 2 })).toThrow(/Te: derived value 60 \/ RR - Ti = 0 s is below its minimum 0\.1 s \(with RR = 30, Ti = 2\)/);
    expect(() => c.resolveSettings({ Te: 2 })).toThrow(/Te is derived/);
    expect(() => c.resolveSettings({ Nope: 2 })).toThrow(/unknown setting "Nope"/);
    expect(() => c.resolveSettings({ trigger: "neural" })).toThrow(/"neural" is not one of its options \(pressure, flow\)/);
    expect(c.resolveSettings({ RR: 20 }).Te).toBeCloseTo(2, 12);
  });

  it("formula syntax errors", () => {
    const d = minimal();
    d.machine.states.inhale.on = { SCAN: [{ target: "exhale", guard: { type: "formula", params: { expr: "paw > (40" } } }] };
    expect(issuesOf(d)[0].message).toMatch(/syntax error in "paw > \(40"/);
  });

  it("derived settings in a cycle are reported with the cycle", () => {
    const d = minimal();
    d.settings.Ti = { unit: "s", formula: "60 / RR - Te" };
    const msg = issuesOf(d).map((i) => i.message).join("\n");
    expect(msg).toMatch(/cycle: (Ti → Te → Ti|Te → Ti → Te)/);
  });

  it("a derived setting cannot read a signal; a choice compared with an unknown option is caught", () => {
    const d = minimal();
    d.settings.X = { formula: "paw * 2" };
    d.machine.states.exhale.on = { SCAN: [{ target: "inhale", guard: { type: "formula", params: { expr: 'trigger == "presure"' } } }] };
    const text = issuesOf(d).map((i) => i.message).join("\n");
    expect(text).toMatch(/uses the signal "paw"/);
    expect(text).toMatch(/"presure" .* not an option .*pressure, flow/);
  });

  it("schema violations keep zod's path", () => {
    const d = minimal();
    (d.machine.states.inhale.meta as Record<string, unknown>).kind = "breathe";
    expect(issuesOf(d)[0].path).toBe("machine.states.inhale.meta.kind");
  });

  it("SequenceError lists every issue in its message", () => {
    const d = minimal();
    d.machine.initial = "x";
    d.machine.states.exhale.after = { Te: { target: "y" } };
    try {
      compile(d);
      throw new Error("not rejected");
    } catch (e) {
      expect(e).toBeInstanceOf(SequenceError);
      expect((e as SequenceError).issues.length).toBe(2);
      expect((e as Error).message).toMatch(/2 problems/);
    }
  });
});

describe("restricted formulas", () => {
  it("cannot reach import, createUnit, evaluate, parse, compile, simplify, derivative", () => {
    for (const expr of ['import({}, {})', 'createUnit("x")', 'evaluate("1+1")', 'parse("1")', 'compile("1")', 'simplify("x")', 'derivative("x^2", "x")']) {
      expect(() => compileFormula(expr)).toThrow(/not allowed/);
    }
    expect(() => restrictedMath.evaluate("1 + 1")).toThrow(/not available/);
    expect(() => restrictedMath.parse("1")).toThrow(/not available/);
  });

  it("rejects assignment, function definitions, indexing and units", () => {
    expect(() => compileFormula("PEEP = 5")).toThrow(/assignment/);
    expect(() => compileFormula("f(x) = x")).toThrow(/function definition/);
    expect(() => compileFormula("a[1]")).toThrow(/indexing/);
    expect(() => compileFormula("5 cmH2O")).toThrow(/implicit multiplication/);
  });

  it("compares choice settings with strings (mathjs's == on strings would convert them to numbers)", () => {
    const f = compileFormula('trigger == "pressure" and paw < PEEP - 2');
    expect(f.evaluate({ trigger: "pressure", paw: 2, PEEP: 5 })).toBe(true);
    expect(f.evaluate({ trigger: "flow", paw: 2, PEEP: 5 })).toBe(false);
    const slots = new Float64Array([internString("pressure"), 2, 5]);
    const fast = f.bind({ index: new Map([["trigger", 0], ["paw", 1], ["PEEP", 2]]) }, slots);
    expect(fast()).toBe(1);
    slots[0] = internString("flow");
    expect(fast()).toBe(0);
    expect(compileFormula('trigger != "flow"').evaluate({ trigger: "pressure" })).toBe(true);
  });

  it("lists the names a formula uses", () => {
    expect(formulaSymbols("max(0, 60 / RR - tBreath) + pi")).toEqual(["RR", "tBreath"]);
  });

  it("the fast closure agrees with mathjs evaluation (property)", () => {
    const exprs = [
      "a + b * c - a / (b + 10)",
      "a > b and (c <= 2 or not (a == b))",
      "a > b ? max(a, c) : min(b, c, 3)",
      "abs(a - b) ^ 2 + sqrt(abs(c)) - exp(-abs(a)) + (a mod 3)",
      "-a + floor(b) - ceil(c) + round(a) + sign(b)",
      "a xor b",
    ].map(compileFormula);
    const layout = { index: new Map([["a", 0], ["b", 1], ["c", 2]]) };
    fc.assert(
      fc.property(fc.double({ min: -50, max: 50, noNaN: true }), fc.double({ min: -50, max: 50, noNaN: true }), fc.integer({ min: -5, max: 5 }), (a, b, c) => {
        const slots = new Float64Array([a, b, c]);
        for (const f of exprs) {
          const ref = f.evaluate({ a, b, c });
          const want = typeof ref === "boolean" ? (ref ? 1 : 0) : (ref as number);
          const got = f.bind(layout, slots)();
          if (Number.isNaN(want)) expect(Number.isNaN(got)).toBe(true);
          else expect(got).toBeCloseTo(want, 9);
        }
      }),
      { numRuns: 300, seed: 3 },
    );
  });
});

describe("the compiled XState machine", () => {
  it("runs timers in ms from setting names and formulas in s, with guards and entry actions", () => {
    const c = compile(minimal());
    const entered: Array<[string, number]> = [];
    const clock = new ScanClock();
    const runtime = c.createRuntime(c.resolveSettings({ RR: 20 }), { onEnter: (s) => entered.push([s, clock.now()]) });
    const actor = createActor(c.machine, { input: { runtime }, clock });
    actor.start();
    for (let ms = 10; ms <= 6000; ms += 10) clock.advanceTo(ms, 10);
    expect(entered).toEqual([
      ["inhale", 0],
      ["exhale", 1000],
      ["inhale", 3000],
      ["exhale", 4000],
      ["inhale", 6000],
    ]);
    // The guard reads the runtime's slots: a high pressure ends the inhale on the next SCAN.
    runtime.slots[runtime.signal.paw] = 45;
    actor.send({ type: "SCAN" });
    expect(entered.at(-1)?.[0]).toBe("exhale");
  });

  it("every template compiles and its machine starts in its initial step", () => {
    for (const id of ["pressure-control", "volume-control", "assist-volume", "assist-pressure", "pressure-support"]) {
      const c = compile(getTemplate(id)!.definition);
      const seen: string[] = [];
      const actor = createActor(c.machine, { input: { runtime: c.createRuntime(undefined, { onEnter: (s) => seen.push(s) }) }, clock: new ScanClock() });
      actor.start();
      expect(seen).toEqual([c.definition.machine.initial]);
      actor.stop();
    }
  });
});
