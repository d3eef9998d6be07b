/** The editor's document edits (pure): steps, transitions, clipboard, history, problems targets, import. */
import { describe, expect, it } from "vitest";
import { getTransition } from "@/machines/graph";
import { sequenceDefinition } from "@/machines/schema";
import { addStep, deleteSteps, renameStep } from "@/components/designer/model/step-ops";
import { connectSteps, deleteTransitions, moveTransition, updateTransition } from "@/components/designer/model/transition-ops";
import { copySteps, pasteSteps } from "@/components/designer/model/clipboard";
import { historyReducer, initHistory } from "@/components/designer/model/history";
import { refOfTarget, selectionOfTarget } from "@/components/designer/model/problems";
import { parseDefinitionFile, definitionFileText } from "@/components/designer/model/import-export";
import { assistDoc, assistVolume } from "./fixtures";

describe("step edits", () => {
  it("adds a step with a unique name, a default command and a position", () => {
    const { doc, name } = addStep(assistDoc(), "hold", { x: 10.4, y: 20.6 });
    expect(name).toBe("hold2");
    expect(doc.definition.machine.states.hold2.meta).toEqual({ kind: "hold", command: { kind: "hold" }, alarms: [] });
    expect(doc.layout.nodes.hold2).toEqual({ x: 10, y: 21 });
    expect(sequenceDefinition.safeParse(doc.definition).success).toBe(true);
  });

  it("renames a step and every transition into it, the initial marker and the layout", () => {
    const doc = renameStep(assistDoc(), "inhale", "deliver");
    const def = doc.definition;
    expect(def.machine.initial).toBe("deliver");
    expect(def.machine.states.inhale).toBeUndefined();
    expect(JSON.stringify(def)).not.toContain('"target":"inhale"');
    expect(doc.layout.nodes.deliver).toBeDefined();
    expect(() => renameStep(assistDoc(), "inhale", "hold")).toThrow(/already exists/);
  });

  it("deletes steps with the transitions into them", () => {
    const doc = deleteSteps(assistDoc(), ["hold"]);
    expect(doc.definition.machine.states.hold).toBeUndefined();
    expect(JSON.stringify(doc.definition)).not.toContain('"target":"hold"');
    expect(doc.layout.nodes.hold).toBeUndefined();
    expect(sequenceDefinition.safeParse(doc.definition).success).toBe(true);
  });

  it("moves the initial step when it is deleted", () => {
    const doc = deleteSteps(assistDoc(), ["inhale"]);
    expect(doc.definition.machine.initial).toBe("hold");
  });
});

describe("transition edits", () => {
  it("connects two steps with a SCAN condition appended last", () => {
    const def = assistVolume();
    const { def: next, ref } = connectSteps(def, "hold", "standby");
    expect(ref.group).toBe("on");
    expect(ref.key).toBe("SCAN");
    expect(getTransition(next, ref)?.target).toBe("standby");
    expect(getTransition(next, ref)?.guard?.params.expr).toBe("tStep >= 1");
  });

  it("turns a condition into a timer, moving it to `after`", () => {
    const { def, ref } = connectSteps(assistVolume(), "hold", "standby");
    const { def: next, ref: moved } = updateTransition(def, ref, { trigger: { type: "timer", key: "pause" }, target: "standby" });
    expect(moved).toMatchObject({ step: "hold", group: "after", key: "pause" });
    expect(getTransition(next, moved)).toEqual({ target: "standby" });
    expect(getTransition(next, ref)).toBeUndefined();
  });

  it("reorders SCAN exits (priority)", () => {
    const { def } = connectSteps(assistVolume(), "expire", "standby");
    const last = { step: "expire", group: "on" as const, key: "SCAN", index: 1 };
    const { def: next, ref } = moveTransition(def, last, -1);
    expect(ref.index).toBe(0);
    expect(getTransition(next, ref)?.target).toBe("standby");
  });

  it("deletes several transitions of one list without hitting the wrong one", () => {
    let def = assistVolume();
    def = connectSteps(def, "expire", "hold").def;
    def = connectSteps(def, "expire", "standby").def;
    const scan = (i: number) => ({ step: "expire", group: "on" as const, key: "SCAN", index: i });
    const next = deleteTransitions(def, [scan(0), scan(2)]);
    expect(getTransition(next, scan(0))?.target).toBe("hold");
    expect(getTransition(next, scan(1))).toBeUndefined();
  });
});

describe("copy and paste", () => {
  it("pastes copies with fresh names, internal transitions following them", () => {
    const doc = assistDoc();
    const clip = copySteps(doc, ["inhale", "hold"]);
    if (!clip) throw new Error("nothing copied");
    const { doc: next, names } = pasteSteps(doc, clip);
    expect(names).toEqual(["inhale2", "hold2"]);
    const after = next.definition.machine.states.inhale2.after?.Ti;
    const targets = (Array.isArray(after) ? after : [after]).map((t) => t?.target);
    expect(targets).toContain("hold2");
    expect(targets).toContain("expire");
    expect(next.layout.nodes.inhale2.x).toBe(doc.layout.nodes.inhale.x + 40);
  });
});

describe("history", () => {
  it("undoes and redoes whole documents, merging bursts of one group", () => {
    const a = assistDoc();
    const b = addStep(a, "hold", { x: 0, y: 0 }).doc;
    const c = addStep(b, "exhale", { x: 0, y: 0 }).doc;
    let h = initHistory(a);
    h = historyReducer(h, { type: "apply", doc: b, group: "g", at: 1000 });
    h = historyReducer(h, { type: "apply", doc: c, group: "g", at: 1500 });
    expect(h.past).toEqual([a]);
    h = historyReducer(h, { type: "undo" });
    expect(h.present).toBe(a);
    h = historyReducer(h, { type: "redo" });
    expect(h.present).toBe(c);
  });

  it("keeps the inspector's form when the edit came from the inspector", () => {
    const a = assistDoc();
    const b = addStep(a, "hold", { x: 0, y: 0 }).doc;
    const h0 = initHistory(a);
    expect(historyReducer(h0, { type: "apply", doc: b, origin: "inspector" }).epoch).toBe(h0.epoch);
    expect(historyReducer(h0, { type: "apply", doc: b }).epoch).toBe(h0.epoch + 1);
  });
});

describe("problem targets", () => {
  it("maps a checks transition target to a canvas transition", () => {
    expect(refOfTarget({ type: "transition", step: "inhale", via: "after", key: "Ti", index: 1 })).toEqual({ step: "inhale", group: "after", key: "Ti", index: 1 });
    expect(refOfTarget({ type: "transition", step: "expire", via: "SCAN", index: 0 })).toEqual({ step: "expire", group: "on", key: "SCAN", index: 0 });
    expect(selectionOfTarget({ type: "setting", setting: "PEEP" })).toEqual({ steps: [], transitions: [], setting: "PEEP" });
  });
});

describe("import", () => {
  it("accepts an exported file and runs the static checks on it", () => {
    const r = parseDefinitionFile(definitionFileText(assistVolume()));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.definition).toEqual(assistVolume());
  });

  it("explains a file that is not JSON or breaks the format", () => {
    const bad = parseDefinitionFile("{ nope");
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.errors[0]).toMatch(/not JSON/);
    const def = assistVolume() as unknown as { machine: { states: { inhale: { meta: { kind: string } } } } };
    def.machine.states.inhale.meta.kind = "breathe";
    const wrong = parseDefinitionFile(JSON.stringify(def));
    expect(wrong.ok).toBe(false);
    if (!wrong.ok) expect(wrong.errors.join("\n")).toMatch(/machine\.states\.inhale\.meta\.kind/);
  });
});
