/** Revision diff: steps, transitions, settings, monitors and metadata. */
import { describe, expect, it } from "vitest";
import { diffDefinitions } from "@/machines/diff";
import { FORMAT_ID, sequenceDefinition, type SequenceDefinition, type SequenceDefinitionInput } from "@/machines/schema";

const g = (expr: string) => ({ type: "formula" as const, params: { expr } });

const input = (): SequenceDefinitionInput => ({
  format: FORMAT_ID,
  name: "Diff fixture",
  settings: { Ti: { unit: "s", value: 1 }, Pmax: { unit: "cmH2O", value: 35 }, Vmax: { unit: "mL", value: 900 } },
  monitors: [{ when: "paw > 45", alarm: { kind: "high", message: "High pressure" } }],
  machine: {
    id: "d",
    initial: "inhale",
    states: {
      inhale: {
        meta: { kind: "inhale", command: { kind: "flow", flow: "30" } },
        after: { Ti: { target: "exhale" } },
        on: {
          SCAN: [
            { target: "safe", guard: g("paw > Pmax") },
            { target: "exhale", guard: g("vol > Vmax") },
            { target: "exhale", guard: g("flow < 1") },
          ],
        },
      },
      exhale: { meta: { kind: "exhale", command: { kind: "release" } }, after: { "2": { target: "inhale" } } },
      safe: { meta: { kind: "safe", command: { kind: "release" } }, on: { RESET: { target: "exhale" } } },
    },
  },
});

type Edit = (d: SequenceDefinitionInput) => void;
const make = (edit: Edit = () => {}): SequenceDefinition => {
  const d = input();
  edit(d);
  return sequenceDefinition.parse(d);
};
const scanOf = (d: SequenceDefinitionInput) => d.machine.states.inhale.on!.SCAN as Array<{ target: string; guard?: ReturnType<typeof g> }>;

describe("diffDefinitions", () => {
  it("finds nothing between equal definitions", () => {
    const diff = diffDefinitions(make(), make());
    expect(diff.identical).toBe(true);
    expect(diff.transitions).toEqual({ added: [], removed: [], changed: [] });
  });

  it("lists added, removed and changed steps with the changed fields", () => {
    const diff = diffDefinitions(
      make(),
      make((d) => {
        d.machine.states.hold = { meta: { kind: "hold", command: { kind: "hold" } }, after: { "0.3": { target: "exhale" } } };
        d.machine.states.exhale.meta.label = "Expiration";
        d.machine.states.exhale.meta.command = { kind: "hold" };
        delete d.machine.states.safe;
        d.machine.states.inhale.on = { SCAN: scanOf(d).slice(1) };
      }),
    );
    expect(diff.identical).toBe(false);
    expect(diff.steps).toEqual({ added: ["hold"], removed: ["safe"], changed: [{ step: "exhale", fields: ["command", "label"] }] });
    expect(diff.transitions.added.map((t) => t.id)).toEqual(["hold|after|0.3|exhale#0"]);
    expect(diff.transitions.removed.map((t) => t.id).sort()).toEqual(["inhale|SCAN||safe#0", "safe|RESET||exhale#0"]);
  });

  it("reports a changed condition as a change, with both canvas addresses", () => {
    const diff = diffDefinitions(make(), make((d) => (scanOf(d)[1].guard = g("vol >= Vmax"))));
    expect(diff.transitions.changed).toEqual([
      expect.objectContaining({
        step: "inhale",
        via: "SCAN",
        target: "exhale",
        fields: ["guard"],
        atA: { step: "inhale", via: "SCAN", index: 1 },
        atB: { step: "inhale", via: "SCAN", index: 1 },
      }),
    ]);
    expect(diff.steps.changed).toEqual([]);
  });

  it("reports a retargeted exit as removed and added", () => {
    const diff = diffDefinitions(make(), make((d) => (scanOf(d)[0].target = "exhale")));
    expect(diff.transitions.removed.map((t) => t.id)).toEqual(["inhale|SCAN||safe#0"]);
    expect(diff.transitions.added).toHaveLength(1);
    expect(diff.transitions.added[0]).toMatchObject({ step: "inhale", via: "SCAN", target: "exhale" });
  });

  it("reports reordering as a priority change, but not the shift after a removal", () => {
    const swapped = diffDefinitions(make(), make((d) => scanOf(d).reverse()));
    // Twins (two exits to exhale) pair by content, so only priorities change.
    // [safe, vol, flow] → [flow, vol, safe]: the middle exit keeps its rank.
    expect(swapped.transitions.changed.map((c) => [c.to.guard?.params.expr, c.fields])).toEqual([
      ["paw > Pmax", ["priority"]],
      ["flow < 1", ["priority"]],
    ]);
    expect(swapped.transitions.added).toEqual([]);
    const shifted = diffDefinitions(make(), make((d) => (d.machine.states.inhale.on = { SCAN: scanOf(d).slice(1) })));
    expect(shifted.transitions.changed).toEqual([]);
  });

  it("keys timer exits by their delay", () => {
    const diff = diffDefinitions(make(), make((d) => (d.machine.states.exhale.after = { "2.5": { target: "inhale" } })));
    expect(diff.transitions.removed).toMatchObject([{ via: "after", key: "2", at: { step: "exhale", via: "after", key: "2", index: 0 } }]);
    expect(diff.transitions.added).toMatchObject([{ via: "after", key: "2.5" }]);
  });

  it("reports transition meta changes", () => {
    const diff = diffDefinitions(make(), make((d) => (d.machine.states.exhale.after = { "2": { target: "inhale", meta: { label: "next" } } })));
    expect(diff.transitions.changed.map((c) => c.fields)).toEqual([["meta"]]);
  });

  it("lists settings added, removed and changed with from and to", () => {
    const diff = diffDefinitions(
      make(),
      make((d) => {
        d.settings.Ti = { unit: "s", value: 1.2, max: 3 };
        delete d.settings.Vmax;
        d.settings.PEEP = { unit: "cmH2O", value: 5 };
        scanOf(d).splice(1, 1);
      }),
    );
    expect(diff.settings.added).toEqual(["PEEP"]);
    expect(diff.settings.removed).toEqual(["Vmax"]);
    expect(diff.settings.changed).toEqual([
      { name: "Ti", fields: ["max", "value"], from: { unit: "s", value: 1 }, to: { unit: "s", value: 1.2, max: 3 } },
    ]);
  });

  it("matches monitors by content, then by alarm kind", () => {
    const diff = diffDefinitions(
      make(),
      make((d) => {
        d.monitors = [
          { when: "tBreath > 20", alarm: { kind: "apnea", message: "No breath" } },
          { when: "paw > 50", alarm: { kind: "high", message: "High pressure" } },
        ];
      }),
    );
    expect(diff.monitors.changed).toMatchObject([{ fromIndex: 0, toIndex: 1, to: { when: "paw > 50" } }]);
    expect(diff.monitors.added).toMatchObject([{ index: 0, monitor: { alarm: { kind: "apnea" } } }]);
    expect(diff.monitors.removed).toEqual([]);
  });

  it("reports name, description and initial step changes", () => {
    const diff = diffDefinitions(
      make(),
      make((d) => {
        d.name = "Renamed";
        d.description = "Now described";
        d.machine.initial = "exhale";
      }),
    );
    expect(diff.meta).toEqual({
      name: { from: "Diff fixture", to: "Renamed" },
      description: { from: undefined, to: "Now described" },
      initial: { from: "inhale", to: "exhale" },
    });
  });
});
