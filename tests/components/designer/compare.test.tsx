import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen } from "@testing-library/react";
import { diffDefinitions } from "@/machines/diff";
import { edgeId } from "@/machines/graph";
import { DiffList } from "@/components/designer/compare/diff-list";
import { diffDecorations } from "@/components/designer/compare/diff-decorations";
import { addStep } from "@/components/designer/model/step-ops";
import { connectSteps, updateTransition } from "@/components/designer/model/transition-ops";
import { putSetting } from "@/components/designer/model/setting-ops";
import { assistDoc } from "./fixtures";

/** Revision 2 as the browser spec makes it: a hold step after inhale, on a timer, and PEEP 8. */
function revisionTwo() {
  const one = assistDoc();
  const added = addStep(one, "hold", { x: 0, y: 0 });
  const connected = connectSteps(added.doc.definition, added.name, "expire");
  const timed = updateTransition(connected.def, connected.ref, { trigger: { type: "timer", key: "0.3" }, target: "expire" });
  const def = putSetting(timed.def, "PEEP", { ...timed.def.settings.PEEP, value: 8 });
  return { one: one.definition, two: def, hold: added.name, ref: timed.ref };
}

describe("revision compare", () => {
  it("lists added steps and transitions and changed settings", () => {
    const { one, two, hold } = revisionTwo();
    const onPick = vi.fn();
    render(<DiffList diff={diffDefinitions(one, two)} onPick={onPick} />);
    const items = screen.getAllByTestId("diff-item");
    expect(items.map((i) => i.dataset.diff)).toEqual(["added", "added", "changed"]);
    expect(items[0]).toHaveTextContent(hold);
    expect(items[1]).toHaveTextContent(`${hold} → expire (timer 0.3)`);
    expect(items[2]).toHaveTextContent("PEEP: 5 cmH2O ⇒ 8 cmH2O");
    fireEvent.click(items[0]);
    expect(onPick).toHaveBeenCalledWith({ kind: "step", step: hold });
  });

  it("marks each side's canvas: additions on the newer, removals on the older", () => {
    const { one, two, hold, ref } = revisionTwo();
    const forward = diffDecorations(diffDefinitions(one, two));
    expect(forward.b.stepDiff).toEqual({ [hold]: "added" });
    expect(forward.b.edgeDiff).toEqual({ [edgeId(ref)]: "added" });
    expect(forward.a.stepDiff).toEqual({});
    const backward = diffDecorations(diffDefinitions(two, one));
    expect(backward.a.stepDiff).toEqual({ [hold]: "removed" });
    expect(backward.a.edgeDiff).toEqual({ [edgeId(ref)]: "removed" });
  });

  it("says so when nothing differs", () => {
    const { one } = revisionTwo();
    render(<DiffList diff={diffDefinitions(one, one)} onPick={vi.fn()} />);
    expect(screen.getByTestId("diff-identical")).toBeInTheDocument();
  });
});
