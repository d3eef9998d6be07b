/** The built-in templates: each compiles, is clean, and behaves as issue 3 describes. */
import { describe, expect, it } from "vitest";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { simulate } from "@/lib/sim/simulate";
import { compile } from "@/machines/compile";
import type { SequenceDefinition, Transition } from "@/machines/schema";
import { TEMPLATES, getTemplate } from "@/machines/templates";

const list = (t: Transition | Transition[] | undefined): Transition[] => (t === undefined ? [] : Array.isArray(t) ? t : [t]);

function targets(def: SequenceDefinition, step: string): string[] {
  const s = def.machine.states[step];
  const out: Transition[] = [];
  for (const v of Object.values(s.after ?? {})) out.push(...list(v));
  for (const v of Object.values(s.on ?? {})) out.push(...list(v));
  return out.map((t) => t.target);
}

function reachable(def: SequenceDefinition): Set<string> {
  const seen = new Set([def.machine.initial]);
  const todo = [def.machine.initial];
  while (todo.length) {
    for (const t of targets(def, todo.pop() as string)) {
      if (!seen.has(t)) {
        seen.add(t);
        todo.push(t);
      }
    }
  }
  return seen;
}

const SETTINGS: Record<string, string[]> = {
  "pressure-control": ["PEEP", "Pinsp", "RR", "Ti", "rise"],
  "volume-control": ["PEEP", "Vt", "RR", "Ti", "pause"],
  "assist-volume": ["PEEP", "Vt", "RR", "Ti", "pause", "trigger", "sensitivity"],
  "assist-pressure": ["PEEP", "Pinsp", "RR", "Ti", "rise", "trigger", "sensitivity"],
  "pressure-support": ["PEEP", "PS", "cycle", "apnea", "trigger", "sensitivity"],
};

describe("templates", () => {
  it("are the five of issue 3, found by id", () => {
    expect(TEMPLATES.map((t) => t.id)).toEqual(Object.keys(SETTINGS));
    expect(getTemplate("pressure-support")?.title).toBe("Pressure support");
    expect(getTemplate("nope")).toBeUndefined();
    // getTemplate returns a copy: editing it leaves the built-in alone.
    getTemplate("pressure-control")!.definition.settings.PEEP.value = 99;
    expect(getTemplate("pressure-control")!.definition.settings.PEEP.value).toBe(5);
  });

  for (const t of TEMPLATES) {
    describe(t.id, () => {
      const def = t.definition;
      it("compiles and carries the settings the issue names, plus a high-pressure limit", () => {
        const c = compile(def);
        for (const s of [...SETTINGS[t.id], "Plimit"]) expect(Object.keys(def.settings)).toContain(s);
        expect(c.defaults.Plimit).toBe(38);
        if (def.settings.trigger) expect(def.settings.trigger.options).toEqual(["pressure", "flow"]);
        if (def.settings.cycle) expect(def.settings.cycle.value).toBe(25);
      });

      it("is clean: no unreachable steps, wait-for-trigger steps have a backup timer, inhale steps a pressure-limit exit", () => {
        expect([...reachable(def)].sort()).toEqual(Object.keys(def.machine.states).sort());
        for (const [name, s] of Object.entries(def.machine.states)) {
          if (s.meta.kind === "wait-for-trigger") {
            expect(Object.keys(s.after ?? {}).length, `${name} backup timer`).toBeGreaterThan(0);
            expect(list(s.on?.SCAN).some((x) => x.guard?.params.expr.includes("sensitivity")), `${name} trigger`).toBe(true);
          }
          if (s.meta.kind === "inhale") {
            const exit = list(s.on?.SCAN).find((x) => x.guard?.params.expr === "paw > Plimit");
            expect(exit, `${name} pressure-limit exit`).toBeDefined();
            const safe = def.machine.states[exit!.target];
            expect(safe.meta.kind).toBe("safe");
            expect(safe.meta.command.kind).toBe("release");
            expect(safe.meta.alarms.map((a) => a.kind)).toContain("high-pressure");
            // ... and the safe step resumes ventilation.
            expect(Object.keys(safe.after ?? {}).length).toBeGreaterThan(0);
          }
        }
      });

      it("watches for low pressure / disconnection and apnea", () => {
        const kinds = def.monitors.map((m) => m.alarm.kind);
        expect(kinds).toContain("low-pressure");
        expect(kinds).toContain("apnea");
      });

      it("ventilates a normal adult on the default rig without alarms, within MHRA RMVS v1 limits", () => {
        const r = simulate({
          definition: def,
          patient: {
            complianceMlPerCmH2O: 50,
            resistanceCmH2OPerLps: 5,
            effort: { shape: "half-sine", amplitudeCmH2O: 5, ratePerMin: 16, effortTimeS: 0.8, onsetS: 1.5 },
          },
          rig: DEFAULT_RIG,
          durationS: 30,
        });
        expect(r.breaths.length).toBeGreaterThanOrEqual(6);
        expect(r.alarms).toEqual([]);
        let peak = 0;
        for (const p of r.waveforms.paw) peak = Math.max(peak, p);
        expect(peak).toBeLessThan(40); // RMVS v1: never more than 40 cmH2O
        if (def.settings.trigger) expect(r.breaths.filter((b) => b.trigger === "patient").length).toBeGreaterThan(3);
      });

      it("raises a low-pressure alarm on a disconnection (a huge leak)", () => {
        const r = simulate({
          definition: def,
          patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5, leak: { kind: "orifice", coefficient: 200 } },
          rig: DEFAULT_RIG,
          durationS: 30,
        });
        expect(r.alarms.some((a) => a.kind === "low-pressure")).toBe(true);
      });
    });
  }

  it("assist modes give a mandatory breath 60/RR after the last breath when no trigger comes", () => {
    for (const id of ["assist-volume", "assist-pressure"]) {
      const r = simulate({ definition: getTemplate(id)!.definition, settings: { RR: 12 }, patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 }, rig: "ideal", durationS: 22 });
      expect(r.breaths.map((b) => b.start)).toEqual([0, 5, 10, 15, 20]);
      expect(r.breaths.every((b) => b.trigger === "timer")).toBe(true);
    }
  });

  it("volume-control's expiratory time is 60/RR − Ti − pause", () => {
    const r = simulate({ definition: getTemplate("volume-control")!.definition, settings: { RR: 15, Ti: 1, pause: 0.5 }, patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 }, rig: "ideal", durationS: 12 });
    for (const b of r.breaths) {
      expect(b.ti).toBeCloseTo(1.5, 9);
      expect(b.te).toBeCloseTo(2.5, 9);
    }
  });
});
