/**
 * The simulation pool: runs in a worker thread under Vitest (TypeScript entry through tsx), cancels a
 * queued or running job, stops at the wall-time budget, falls back to the server thread when told to.
 */
import { afterAll, describe, expect, it } from "vitest";
import { SimulationPool } from "@/lib/runs/pool";
import type { SimJob } from "@/lib/runs/protocol";
import { decodeWaveforms } from "@/lib/waveform/codec";
import { templateDefinition } from "./fixtures";

const job = (durationS: number, wallBudgetMs = 60_000): SimJob => ({
  definition: templateDefinition("pressure-control"),
  patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5 },
  rig: "ideal",
  durationS,
  seed: 1,
  wallBudgetMs,
});

const pools: SimulationPool[] = [];
const pool = (size: number) => {
  const p = new SimulationPool(size);
  pools.push(p);
  return p;
};
afterAll(async () => {
  await Promise.all(pools.map((p) => p.shutdown()));
});

describe("SimulationPool", () => {
  it("is idle until used, then runs jobs in a worker thread", async () => {
    const p = pool(1);
    expect(p.mode).toBe("idle");
    const h = p.submit(job(2));
    expect(p.mode).toBe("workers");
    const outcome = await h.done;
    expect(outcome.ok).toBe(true);
    if (!outcome.ok) return;
    expect(h.state()).toBe("settled");
    expect(h.progress()).toBe(1);
    expect(outcome.output.summary.breaths).toBeGreaterThan(0);
    // The compressed blob and the transferred raw arrays describe the same samples.
    expect(decodeWaveforms(outcome.output.waveform).t.length).toBe(outcome.output.raw.t.length);
  });

  it("cancels a running job and a queued one; the worker stays usable", async () => {
    const p = pool(1);
    const long = p.submit(job(600));
    const queued = p.submit(job(600));
    expect(queued.state()).toBe("queued");
    queued.cancel();
    expect(await queued.done).toEqual({ ok: false, reason: "cancelled", error: "Cancelled." });
    await new Promise((r) => setTimeout(r, 50));
    long.cancel();
    const outcome = await long.done;
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.reason).toBe("cancelled");
    expect((await p.submit(job(1)).done).ok).toBe(true);
  });

  it("stops a run that goes past its wall-time budget", async () => {
    const p = pool(1);
    const outcome = await p.submit(job(600, 1)).done;
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.reason).toBe("budget");
  });

  it("with no workers configured, runs jobs in the server thread", async () => {
    const p = pool(0);
    const outcome = await p.submit(job(1)).done;
    expect(p.mode).toBe("inline");
    expect(outcome.ok).toBe(true);
  });
});
