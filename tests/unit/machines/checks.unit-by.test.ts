/**
 * Settings whose unit follows a choice (`unitBy`): the trigger sensitivity is cmH2O below PEEP for a
 * pressure trigger and L/min for a flow trigger, as the product spec asks. Inside a `? :` branch (or
 * after `and`) that settles the choice, the setting has that option's unit; elsewhere, the unit at the
 * choice's saved value.
 */
import { describe, expect, it } from "vitest";
import { runStaticChecks, type Problem } from "@/machines/checks";
import { canonicalJson } from "@/machines/hash";
import {
  FORMAT_ID,
  effectiveUnit,
  sequenceDefinition,
  type SequenceDefinition,
  type SequenceDefinitionInput,
} from "@/machines/schema";
import { TRIGGER_GUARD } from "@/machines/templates/common";
import { TEMPLATES } from "@/machines/templates";

type Settings = SequenceDefinitionInput["settings"];

const UNIT_BY = { setting: "trigger", units: { pressure: "cmH2O", flow: "L/min" } };

/** A triggered sequence whose wait step exits on `guard`; `edit` changes the settings. */
function fixture(guard: string, edit: (s: Settings) => void = () => {}): SequenceDefinition {
  const settings: Settings = {
    PEEP: { unit: "cmH2O", value: 5, min: 0, max: 20 },
    Pmax: { unit: "cmH2O", value: 35, min: 10, max: 60 },
    Ti: { unit: "s", value: 1, min: 0.3, max: 2 },
    trigger: { options: ["pressure", "flow"], value: "pressure" },
    sensitivity: { unit: "", unitBy: structuredClone(UNIT_BY), value: 2, min: 0.2, max: 20 },
  };
  edit(settings);
  return sequenceDefinition.parse({
    format: FORMAT_ID,
    name: "unitBy fixture",
    settings,
    monitors: [],
    machine: {
      id: "fixture",
      initial: "inhale",
      states: {
        inhale: {
          meta: { kind: "inhale", command: { kind: "pressure", target: "PEEP + 10" } },
          after: { Ti: { target: "wait" } },
          on: { SCAN: [{ target: "limit", guard: { type: "formula", params: { expr: "paw > Pmax" } } }] },
        },
        wait: {
          meta: { kind: "wait-for-trigger", command: { kind: "release" } },
          on: { SCAN: [{ target: "inhale", guard: { type: "formula", params: { expr: guard } } }] },
          after: { "3": { target: "inhale" } },
        },
        limit: { meta: { kind: "safe", command: { kind: "release" } }, after: { "0.5": { target: "wait" } } },
      },
    },
  } satisfies SequenceDefinitionInput);
}

const unitProblems = (d: SequenceDefinition): Problem[] =>
  runStaticChecks(d).filter((p) => ["unit-mismatch", "unitless-setting", "setting-unit-by-invalid", "setting-unit-unknown"].includes(p.id));
const ids = (d: SequenceDefinition, id: string): Problem[] => runStaticChecks(d).filter((p) => p.id === id);

describe("unitBy: the unit of a setting follows a choice", () => {
  it("the templates' trigger condition passes with no unit warning", () => {
    expect(unitProblems(fixture(TRIGGER_GUARD))).toEqual([]);
  });

  for (const t of TEMPLATES) {
    it(`${t.id} raises no unitless-setting or unit-mismatch`, () => {
      expect(unitProblems(t.definition)).toEqual([]);
    });
  }

  it("the else-branch of `!=`, and the right of `and`, settle the choice too", () => {
    expect(unitProblems(fixture('tStep >= 0.05 and (trigger != "pressure" ? flow >= sensitivity : paw <= PEEP - sensitivity)'))).toEqual([]);
    expect(unitProblems(fixture('("flow" == trigger) ? flow >= sensitivity : paw <= PEEP - sensitivity'))).toEqual([]);
    expect(unitProblems(fixture('trigger == "flow" and flow >= sensitivity'))).toEqual([]);
    expect(unitProblems(fixture('trigger == "pressure" or flow >= sensitivity'))).toEqual([]);
  });

  it("the branches are checked the right way round: a pressure use in the flow branch is flagged", () => {
    const mismatch = ids(fixture('trigger == "pressure" ? flow >= sensitivity : paw <= PEEP - sensitivity'), "unit-mismatch");
    expect(mismatch.length).toBeGreaterThan(0);
    expect(mismatch[0].message).toMatch(/compares a flow with a pressure|subtract a pressure and a flow/);
  });

  it("a formula using sensitivity as a time is still flagged, in a branch and outside one", () => {
    const inBranch = ids(fixture('trigger == "flow" ? tStep >= sensitivity : paw <= PEEP - sensitivity'), "unit-mismatch");
    expect(inBranch.map((p) => p.message)).toEqual([expect.stringMatching(/compares a time with a flow/)]);
    const outside = ids(fixture("tStep >= sensitivity"), "unit-mismatch");
    expect(outside.map((p) => p.message)).toEqual([expect.stringMatching(/compares a time with a pressure/)]);
    // ... and as a timer, which must be a time.
    const timer = fixture("tStep > 0.05 and paw < PEEP - sensitivity");
    timer.machine.states.wait.after = { sensitivity: { target: "inhale" } };
    expect(ids(timer, "unit-mismatch").map((p) => p.message)).toEqual([expect.stringMatching(/gives a pressure, but a time is expected/)]);
  });

  it("outside a settling branch the unit is the one at the choice's saved value", () => {
    expect(unitProblems(fixture("tStep > 0.05 and paw <= PEEP - sensitivity"))).toEqual([]);
    const asFlow = fixture("tStep > 0.05 and paw <= PEEP - sensitivity", (s) => {
      s.trigger.value = "flow";
    });
    expect(ids(asFlow, "unit-mismatch")).toHaveLength(1);
  });

  it("an option unitBy does not list falls back to the setting's own unit", () => {
    const d = fixture('trigger == "pressure" ? paw <= PEEP - sensitivity : flow >= sensitivity', (s) => {
      s.sensitivity.unitBy = { setting: "trigger", units: { pressure: "cmH2O" } };
    });
    // The flow branch uses the bare unit "", so it is a unit-less stand-in there, and only there.
    expect(ids(d, "unitless-setting").map((p) => p.message)).toEqual([expect.stringMatching(/sensitivity has no unit but is used as a flow,/)]);
  });

  describe("setting-unit-by-invalid", () => {
    it("names a setting that does not exist", () => {
      const d = fixture(TRIGGER_GUARD, (s) => {
        s.sensitivity.unitBy = { setting: "triggr", units: { pressure: "cmH2O", flow: "L/min" } };
      });
      expect(ids(d, "setting-unit-by-invalid")).toEqual([
        {
          id: "setting-unit-by-invalid",
          severity: "error",
          message: "Setting sensitivity takes its unit from triggr, which is not a setting of this sequence.",
          target: { type: "setting", setting: "sensitivity" },
        },
      ]);
    });

    it("names a setting that is not a choice", () => {
      const d = fixture(TRIGGER_GUARD, (s) => {
        s.sensitivity.unitBy = { setting: "Ti", units: { pressure: "cmH2O", flow: "L/min" } };
      });
      expect(ids(d, "setting-unit-by-invalid").map((p) => [p.severity, p.message])).toEqual([
        ["error", expect.stringMatching(/takes its unit from Ti, which is not a choice setting/)],
      ]);
    });

    it("lists a unit for an option the choice does not have", () => {
      const d = fixture(TRIGGER_GUARD, (s) => {
        s.sensitivity.unitBy = { setting: "trigger", units: { pressure: "cmH2O", flow: "L/min", neural: "uV" } };
      });
      expect(ids(d, "setting-unit-by-invalid").map((p) => p.message)).toEqual([
        'Setting sensitivity lists a unit for "neural", which is not a choice of trigger ("pressure", "flow").',
      ]);
      expect(ids(d, "setting-unit-unknown").map((p) => p.severity)).toEqual(["warning"]);
    });

    it("is a strict part of the schema", () => {
      const bad = { unit: "", value: 2, unitBy: { setting: "trigger", units: {}, extra: 1 } };
      expect(() => fixture(TRIGGER_GUARD, (s) => Object.assign(s, { sensitivity: bad }))).toThrow();
    });
  });

  it("effectiveUnit follows the saved choice, or a run's own value of it", () => {
    const d = fixture(TRIGGER_GUARD);
    expect(effectiveUnit(d.settings.sensitivity, d.settings)).toBe("cmH2O");
    expect(effectiveUnit(d.settings.sensitivity, d.settings, { trigger: "flow" })).toBe("L/min");
    expect(effectiveUnit(d.settings.PEEP, d.settings)).toBe("cmH2O");
  });

  it("leaves definitions without unitBy as they were: the parsed form (and so the hash) gains no field", () => {
    const d = fixture(TRIGGER_GUARD, (s) => {
      delete s.sensitivity.unitBy;
    });
    expect(Object.keys(d.settings.sensitivity)).not.toContain("unitBy");
    expect(canonicalJson(d)).not.toContain(`"unitBy":`);
  });
});
