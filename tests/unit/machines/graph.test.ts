import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  completeLayout,
  definitionToGraph,
  edgeId,
  getTransition,
  graphToDefinition,
  layoutFromNodes,
  type TransitionEdgeData,
} from "@/machines/graph";
import {
  FORMAT_ID,
  SEQUENCE_EVENTS,
  sequenceDefinition,
  type SequenceDefinition,
  type StateConfig,
  type Transition,
} from "@/machines/schema";

/** A small assist sequence written the way engineers write them: single objects and arrays mixed. */
const assist: SequenceDefinition = sequenceDefinition.parse({
  format: FORMAT_ID,
  name: "Assist volume",
  settings: {
    Vt: { unit: "mL", value: 450, min: 100, max: 1000 },
    Ti: { unit: "s", value: 1 },
    Te: { unit: "s", value: 2 },
    PEEP: { unit: "cmH2O", value: 5 },
    Pmax: { unit: "cmH2O", value: 40 },
  },
  machine: {
    id: "assist",
    initial: "standby",
    states: {
      standby: { meta: { kind: "safe", command: { kind: "release" } }, on: { START: { target: "inhale" } } },
      inhale: {
        meta: { kind: "inhale", command: { kind: "flow", flow: "Vt / Ti * 60 / 1000" } },
        after: { Ti: { target: "exhale" } },
        on: {
          SCAN: [
            { target: "exhale", guard: { type: "formula", params: { expr: "paw > Pmax" } }, meta: { label: "limit" } },
            { target: "exhale", guard: { type: "formula", params: { expr: "vol >= Vt" } } },
          ],
          STOP: { target: "standby" },
        },
      },
      exhale: {
        meta: { kind: "exhale", command: { kind: "release" } },
        after: { Te: [{ target: "inhale", meta: { cause: "timer" } }] },
        on: {
          SCAN: [{ target: "inhale", guard: { type: "formula", params: { expr: "paw < PEEP - 2" } }, meta: { cause: "patient" } }],
          STOP: [],
        },
      },
      orphan: { meta: { kind: "custom", command: { kind: "hold" } }, after: {}, on: {} },
    },
  },
});

describe("definitionToGraph", () => {
  it("makes one node per step and one edge per transition", () => {
    const g = definitionToGraph(assist, null);
    expect(g.nodes.map((n) => n.id)).toEqual(["standby", "inhale", "exhale", "orphan"]);
    expect(g.edges).toHaveLength(7);
    expect(g.nodes.find((n) => n.id === "standby")?.data.initial).toBe(true);
  });

  it("labels triggers and numbers SCAN priorities", () => {
    const g = definitionToGraph(assist, null);
    const scan = g.edges.filter((e) => e.data?.ref.step === "inhale" && e.data.ref.key === "SCAN");
    expect(scan.map((e) => e.data?.priority)).toEqual([1, 2]);
    expect(scan[0].data?.trigger).toEqual({ type: "condition", expr: "paw > Pmax" });
    const timer = g.edges.find((e) => e.data?.ref.group === "after" && e.data.ref.step === "inhale");
    expect(timer?.data?.trigger).toEqual({ type: "timer", key: "Ti" });
    expect(timer?.data?.priority).toBeNull();
    const start = g.edges.find((e) => e.data?.ref.key === "START");
    expect(start?.data?.trigger).toEqual({ type: "event", event: "START", expr: null });
  });

  it("counts parallel edges between the same two steps in either direction", () => {
    const g = definitionToGraph(assist, null);
    const between = g.edges.filter((e) => [e.source, e.target].sort().join() === "exhale,inhale");
    expect(between).toHaveLength(5);
    expect(new Set(between.map((e) => e.data?.parallelIndex))).toEqual(new Set([0, 1, 2, 3, 4]));
    expect(between.every((e) => e.data?.parallelCount === 5)).toBe(true);
  });

  it("uses stored positions and fills the gaps", () => {
    const g = definitionToGraph(assist, { nodes: { inhale: { x: 10, y: 20 } } });
    expect(g.nodes.find((n) => n.id === "inhale")?.position).toEqual({ x: 10, y: 20 });
    const layout = completeLayout(assist, { nodes: { inhale: { x: 10, y: 20 } } });
    expect(Object.keys(layout.nodes).sort()).toEqual(["exhale", "inhale", "orphan", "standby"]);
  });

  it("gives each edge an id that is unique and finds its transition again", () => {
    const g = definitionToGraph(assist, null);
    expect(new Set(g.edges.map((e) => e.id)).size).toBe(g.edges.length);
    for (const e of g.edges) {
      const data = e.data as TransitionEdgeData;
      expect(e.id).toBe(edgeId(data.ref));
      expect(getTransition(assist, data.ref)).toEqual(data.transition);
    }
  });
});

describe("graphToDefinition", () => {
  it("is the identity after definitionToGraph, keeping single objects, arrays and empty keys", () => {
    const back = graphToDefinition(assist, definitionToGraph(assist, null));
    expect(back).toEqual(assist);
    expect(JSON.stringify(back)).toBe(JSON.stringify(assist));
  });

  it("follows a retargeted edge and a moved initial marker", () => {
    const g = definitionToGraph(assist, null);
    g.edges = g.edges.map((e) => (e.id === edgeId({ step: "standby", group: "on", key: "START", index: 0 }) ? { ...e, target: "exhale" } : e));
    g.nodes = g.nodes.map((n) => ({ ...n, data: { ...n.data, initial: n.id === "inhale" } }));
    const back = graphToDefinition(assist, g);
    expect(back.machine.initial).toBe("inhale");
    expect(back.machine.states.standby.on?.START).toEqual({ target: "exhale" });
  });

  it("round-trips layouts through node positions", () => {
    const layout = { nodes: { standby: { x: 0, y: 0 }, inhale: { x: 300, y: 0 }, exhale: { x: 600, y: 40 }, orphan: { x: 0, y: 200 } } };
    expect(layoutFromNodes(definitionToGraph(assist, layout).nodes)).toEqual(layout);
  });

  it("is the identity for arbitrary valid definitions", () => {
    const names = ["s0", "s1", "s2", "s3", "s4"];
    const transitionArb = (targets: string[]) =>
      fc.record(
        {
          target: fc.constantFrom(...targets),
          guard: fc.constantFrom("paw > 30", "vol >= Vt", "tStep > 1").map((expr) => ({ type: "formula" as const, params: { expr } })),
          meta: fc.record({ label: fc.string({ maxLength: 8 }) }, { requiredKeys: [] }),
        },
        { requiredKeys: ["target"] },
      ) as fc.Arbitrary<Transition>;
    const listArb = (targets: string[]) =>
      fc.oneof(transitionArb(targets), fc.array(transitionArb(targets), { maxLength: 3 }));
    const eventKeys = ["SCAN", ...SEQUENCE_EVENTS] as const;
    const defArb = fc.integer({ min: 1, max: names.length }).chain((n) => {
      const steps = names.slice(0, n);
      const stateArb: fc.Arbitrary<StateConfig> = fc.record(
        {
          meta: fc.constant({ kind: "custom" as const, command: { kind: "hold" as const }, alarms: [] }),
          after: fc.dictionary(fc.constantFrom("Ti", "Te", "0.5", "Ti + 0.2"), listArb(steps), { maxKeys: 2 }),
          on: fc.dictionary(fc.constantFrom(...eventKeys), listArb(steps), { maxKeys: 3 }) as fc.Arbitrary<StateConfig["on"]>,
        },
        { requiredKeys: ["meta"] },
      );
      return fc.tuple(fc.tuple(...steps.map(() => stateArb)), fc.constantFrom(...steps)).map(([states, initial]) => {
        const def: SequenceDefinition = {
          format: FORMAT_ID,
          name: "generated",
          settings: {},
          monitors: [],
          machine: { id: "g", initial, states: Object.fromEntries(steps.map((s, i) => [s, states[i]])) },
        };
        return def;
      });
    });
    fc.assert(
      fc.property(defArb, (def) => {
        expect(sequenceDefinition.safeParse(def).success).toBe(true);
        expect(graphToDefinition(def, definitionToGraph(def, null))).toEqual(def);
      }),
      { numRuns: 300 },
    );
  });
});

describe("autoLayout (machines/layout.ts)", () => {
  it("places every step, the initial one on top, without overlaps", async () => {
    const { autoLayout } = await import("@/machines/layout");
    const { STEP_NODE_SIZE } = await import("@/machines/graph");
    const layout = await autoLayout(assist);
    const entries = Object.entries(layout.nodes);
    expect(entries.map(([k]) => k).sort()).toEqual(["exhale", "inhale", "orphan", "standby"]);
    const minY = Math.min(...entries.map(([, p]) => p.y));
    expect(layout.nodes.standby.y).toBe(minY);
    expect(layout.nodes.inhale.y).toBeLessThan(layout.nodes.exhale.y);
    for (const [a, pa] of entries)
      for (const [b, pb] of entries) {
        if (a >= b) continue;
        const apart = Math.abs(pa.x - pb.x) >= STEP_NODE_SIZE.width || Math.abs(pa.y - pb.y) >= STEP_NODE_SIZE.height;
        expect(apart, `${a} and ${b} overlap`).toBe(true);
      }
  });
});
