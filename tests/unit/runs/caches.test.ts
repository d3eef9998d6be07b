import { describe, expect, it } from "vitest";
import { WaveformCache } from "@/lib/runs/waveform-cache";
import { RunReadCache } from "@/lib/runs/read-cache";
import type { RunRecord } from "@/db/queries/runs";
import { syntheticWaveforms } from "@/tests/unit/waveform/fixtures";

describe("WaveformCache", () => {
  it("evicts the least recently used runs past its byte budget", () => {
    const one = syntheticWaveforms(1).w; // 1001 samples × 30 bytes
    const cache = new WaveformCache(1001 * 30 * 2);
    cache.set("a", one);
    cache.set("b", syntheticWaveforms(1).w);
    expect(cache.get("a")).toBe(one); // a is now the most recent
    cache.set("c", syntheticWaveforms(1).w);
    expect(cache.get("b")).toBeUndefined();
    expect(cache.get("a")).toBe(one);
    expect(cache.get("c")).toBeDefined();
    expect(cache.bytes).toBe(1001 * 30 * 2);
  });

  it("does not keep a run larger than the whole budget", () => {
    const cache = new WaveformCache(100);
    cache.set("big", syntheticWaveforms(1).w);
    expect(cache.get("big")).toBeUndefined();
  });
});

describe("RunReadCache", () => {
  const record = (status: RunRecord["status"]) => ({ id: "r1", status }) as RunRecord;

  it("keeps a finished run per user and role for its TTL only", () => {
    const cache = new RunReadCache(2000);
    cache.set("u1", "engineer", record("done"), 1000);
    expect(cache.get("u1", "engineer", "r1", 2999)?.status).toBe("done");
    expect(cache.get("u1", "engineer", "r1", 3000)).toBeUndefined();
    expect(cache.get("u2", "engineer", "r1", 1500)).toBeUndefined();
    expect(cache.get("u1", "viewer", "r1", 1500)).toBeUndefined();
  });

  it("never keeps a run that is still going", () => {
    const cache = new RunReadCache(2000);
    cache.set("u1", "engineer", record("running"), 1000);
    cache.set("u1", "engineer", record("queued"), 1000);
    expect(cache.get("u1", "engineer", "r1", 1001)).toBeUndefined();
  });
});
