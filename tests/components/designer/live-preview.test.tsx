import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { act, fireEvent, render, screen } from "@testing-library/react";
import type { LiveSimulation, SimOptions, SimResult } from "@/lib/sim/types";
import type { SequenceEvent } from "@/machines/schema";
import { LivePreview } from "@/components/designer/live-preview";
import { DEFAULT_RIG_FOR_TESTS } from "./rig";
import { assistVolume } from "./fixtures";

// uPlot needs a canvas context jsdom does not have; the trace is checked in the browser suite.
vi.mock("uplot", () => ({
  default: class {
    scales = { x: { min: 0 } };
    batch(f: () => void) {
      f();
    }
    setData() {}
    setScale() {}
    setSize() {}
    destroy() {}
  },
}));

/** A fake engine: inhale for 1 s, expire for 2 s, scan 10 ms; START/STOP recorded. */
class FakeSim implements LiveSimulation {
  time = 0;
  events: SequenceEvent[] = [];
  private pending: { t: number[]; paw: number[]; flow: number[]; volume: number[]; step: string[] } = { t: [], paw: [], flow: [], volume: [], step: [] };
  get activeStep() {
    return this.time % 3 < 1 ? "inhale" : "expire";
  }
  advance(seconds: number) {
    const end = this.time + seconds;
    while (this.time + 0.01 <= end + 1e-9) this.stepScan();
  }
  stepScan() {
    this.time = Math.round((this.time + 0.01) * 1000) / 1000;
    this.pending.t.push(this.time);
    this.pending.paw.push(10);
    this.pending.flow.push(20);
    this.pending.volume.push(0);
    this.pending.step.push(this.activeStep);
  }
  send(e: SequenceEvent) {
    this.events.push(e);
  }
  drain() {
    const out = this.pending;
    this.pending = { t: [], paw: [], flow: [], volume: [], step: [] };
    return out;
  }
  result(): SimResult {
    throw new Error("not used");
  }
}

let frames = new Map<number, FrameRequestCallback>();
let nextId = 1;
let clock = 0;
beforeEach(() => {
  frames = new Map();
  clock = 0;
  vi.spyOn(performance, "now").mockImplementation(() => clock);
  vi.stubGlobal("requestAnimationFrame", (cb: FrameRequestCallback) => {
    frames.set(nextId, cb);
    return nextId++;
  });
  vi.stubGlobal("cancelAnimationFrame", (id: number) => frames.delete(id));
});
afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

/** Run `n` animation frames 1/60 s apart. */
function runFrames(n: number) {
  for (let i = 0; i < n; i++) {
    clock += 1000 / 60;
    const due = [...frames.values()];
    frames.clear();
    act(() => due.forEach((f) => f(clock)));
  }
}

describe("live preview", () => {
  it("runs the definition and reports the active step as it changes", async () => {
    const sims: FakeSim[] = [];
    const create = vi.fn((_o: SimOptions) => {
      const s = new FakeSim();
      sims.push(s);
      return s;
    });
    const steps: Array<string | null> = [];
    render(<LivePreview definition={assistVolume()} rig={DEFAULT_RIG_FOR_TESTS} createSimulation={create} onActiveStep={(s) => steps.push(s)} />);
    await act(async () => {
      await new Promise((r) => setTimeout(r, 5));
    });
    expect(create).toHaveBeenCalledTimes(1);
    expect(create.mock.calls[0][0].rig).toBe(DEFAULT_RIG_FOR_TESTS);
    expect(steps).toEqual(["inhale"]);

    fireEvent.click(screen.getByTestId("preview-play"));
    expect(screen.getByTestId("live-preview")).toHaveAttribute("data-state", "running");
    runFrames(90); // 1.5 s at 1×
    expect(sims[0].time).toBeGreaterThan(1.4);
    expect(steps).toEqual(["inhale", "expire"]);

    fireEvent.click(screen.getByTestId("preview-speed-5"));
    runFrames(60); // 1 s at 5×
    expect(sims[0].time).toBeGreaterThan(6);
    expect(steps.slice(0, 4)).toEqual(["inhale", "expire", "inhale", "expire"]);
    expect(screen.getByTestId("preview-stats").dataset.fps).toBe("60.0");
  });

  it("pauses, steps exactly one scan and delivers operator events", async () => {
    let sim: FakeSim | null = null;
    const create = () => (sim = new FakeSim());
    render(<LivePreview definition={assistVolume()} rig={DEFAULT_RIG_FOR_TESTS} createSimulation={create} />);
    await act(async () => {
      await new Promise((r) => setTimeout(r, 5));
    });
    fireEvent.click(screen.getByTestId("preview-step"));
    fireEvent.click(screen.getByTestId("preview-step"));
    expect((sim as FakeSim | null)?.time).toBeCloseTo(0.02, 6);
    expect(screen.getByTestId("preview-time")).toHaveTextContent("0.02");
    fireEvent.click(screen.getByTestId("preview-event-STOP"));
    expect((sim as FakeSim | null)?.events).toEqual(["STOP"]);
  });

  it("says why it cannot run a definition the engine refuses", async () => {
    const create = () => {
      throw new Error("step inhale: unknown setting Tx");
    };
    render(<LivePreview definition={assistVolume()} rig={DEFAULT_RIG_FOR_TESTS} createSimulation={create} />);
    expect(await screen.findByTestId("preview-error")).toHaveTextContent("unknown setting Tx");
    expect(screen.getByTestId("preview-play")).toBeDisabled();
  });
});
