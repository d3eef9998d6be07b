/** The save gate: format, compile and static checks decide; the hash is the canonical-definition hash. */
import { describe, expect, it } from "vitest";
import { assessDefinition } from "@/lib/sequences/assess-definition";
import { blankDefinition } from "@/lib/sequences/blank-definition";
import { hashDefinition } from "@/machines/hash";
import { timedCycle } from "./timed-definition";

describe("assessDefinition", () => {
  it("accepts a working cycle and hashes the parsed definition", () => {
    const result = assessDefinition(timedCycle());
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.hash).toBe(hashDefinition(timedCycle()));
    expect(result.warnings.every((p) => p.severity === "warning")).toBe(true);
    expect(result.definition.monitors).toEqual([]); // defaults filled in, as stored
  });

  it("reports a format violation as an error aimed at the step it sits in", () => {
    const def = timedCycle();
    (def.machine.states.exhale.meta as { kind: string }).kind = "breathe-out";
    const result = assessDefinition(def);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems).toHaveLength(1);
    expect(result.problems[0]).toMatchObject({ id: "format", severity: "error", target: { type: "step", step: "exhale" } });
  });

  it("reports only errors when checks block, with the checks' ids and transition targets", () => {
    const def = timedCycle();
    def.machine.states.inhale.after = { Ti: { target: "nowhere" } };
    const result = assessDefinition(def);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.problems.map((p) => p.id)).toContain("unknown-target");
    expect(result.problems.every((p) => p.severity === "error")).toBe(true);
    expect(result.problems.find((p) => p.id === "unknown-target")?.target).toMatchObject({
      type: "transition",
      step: "inhale",
      via: "after",
    });
  });

  it("blocks a formula naming something that does not exist", () => {
    const def = timedCycle();
    def.machine.states.inhale.meta.command = { kind: "pressure", target: "PEEP + Pfoo", rise: "0.1" };
    const result = assessDefinition(def);
    expect(result.ok).toBe(false);
  });

  it("lets the blank definition through with warnings only (it must be saveable unchanged)", () => {
    const result = assessDefinition(blankDefinition("New"));
    expect(result.ok).toBe(true);
  });

  it("rejects non-objects without throwing", () => {
    expect(assessDefinition(null).ok).toBe(false);
    expect(assessDefinition("x").ok).toBe(false);
  });
});
