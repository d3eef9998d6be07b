/** Shared test data for the run UI: breaths, summaries and runs shaped like the Runs API answers. */
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { render } from "@testing-library/react";
import type { ReactElement } from "react";
import { vi } from "vitest";
import type { Alarm, Breath, Summary } from "@/lib/sim/types";
import type { RunDetail, WaveformWindow } from "@/components/runs/lib/api";

export function makeBreath(overrides: Partial<Breath> = {}): Breath {
  return {
    index: 1,
    start: 0,
    trigger: "timer",
    effortOnset: null,
    latencyMs: null,
    pip: 20,
    pplat: 18,
    peep: 5,
    vti: 500,
    vte: 495,
    ti: 1,
    te: 2,
    ie: 2,
    peakFlow: 40,
    reliefVolume: 0,
    flags: [],
    ...overrides,
  };
}

/** Three breaths at 0, 3 and 6 s; the second patient-triggered with a 60 ms latency. */
export const BREATHS: Breath[] = [
  makeBreath({ index: 1, start: 0, pip: 21.5, vti: 480 }),
  makeBreath({
    index: 2,
    start: 3,
    trigger: "patient",
    effortOnset: 2.94,
    latencyMs: 60,
    pip: 19.25,
    vti: 530,
    flags: ["double-trigger"],
  }),
  makeBreath({ index: 3, start: 6, trigger: "operator", pip: 24, pplat: null, vti: 455, ie: null }),
];

export const ALARMS: Alarm[] = [
  { t: 4.5, kind: "high-pressure", message: "Airway pressure above 40 cmH2O", priority: "high" },
  { t: 1.25, kind: "low-volume", message: "Vte below 300 mL", priority: "medium" },
];

export function makeSummary(overrides: Partial<Summary> = {}): Summary {
  return {
    breaths: 3,
    pip: 21.6,
    pplat: 18,
    peep: 5.1,
    vti: 488,
    vte: 480,
    rr: 20,
    ie: 2,
    minuteVolume: 9.76,
    peakFlow: 40,
    triggerLatencyMs: { mean: 60, p95: 60, max: 60, n: 1 },
    asynchronyIndex: 12.5,
    ineffectiveEfforts: 0,
    doubleTriggers: 1,
    autoTriggers: 0,
    shortCycles: 0,
    prolongedCycles: 0,
    efforts: 2,
    ...overrides,
  };
}

export function makeRun(overrides: Partial<RunDetail> = {}): RunDetail {
  return {
    id: "run-a",
    status: "done",
    progress: 1,
    error: null,
    durationS: 9,
    seed: 1,
    rig: "ideal",
    createdAt: "2025-01-01T10:00:00.000Z",
    wallMs: 42,
    revision: { id: "rev-1", number: 3, sequenceId: "seq-1", sequenceName: "Assisted volume", projectId: "p-1" },
    case: { id: "case-1", name: "Normal lungs" },
    summary: makeSummary(),
    breaths: BREATHS,
    alarms: ALARMS,
    stepNames: ["inhale", "exhale", "wait"],
    steps: [
      { step: "inhale", from: 0, to: 1 },
      { step: "exhale", from: 1, to: 2.5 },
      { step: "wait", from: 2.5, to: 3 },
    ],
    ...overrides,
  };
}

/** A waveform window answer: a small triangle-ish loop over [from, to]. */
export function makeWaveform(from: number, to: number, points = 20): WaveformWindow {
  const t: number[] = [];
  const paw: number[] = [];
  const flow: number[] = [];
  const volume: number[] = [];
  const pmus: number[] = [];
  for (let i = 0; i < points; i += 1) {
    const x = from + ((to - from) * i) / (points - 1);
    t.push(x);
    const phase = Math.sin((Math.PI * i) / (points - 1));
    paw.push(5 + 15 * phase);
    volume.push(500 * phase);
    flow.push(i < points / 2 ? 40 : -40);
    pmus.push(0);
  }
  return { from, to, points, t, signals: { paw, flow, volume, pmus }, steps: [] };
}

export type FetchRoute = (url: URL, init?: RequestInit) => { status?: number; body: unknown } | undefined;

/** Replaces global fetch with a router over relative URLs; unknown URLs answer 404. */
export function mockFetch(route: FetchRoute) {
  const fn = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const raw = typeof input === "string" ? input : input instanceof URL ? input.href : input.url;
    const url = new URL(raw, "http://localhost");
    const answer = route(url, init) ?? { status: 404, body: { error: "not found" } };
    return new Response(JSON.stringify(answer.body), {
      status: answer.status ?? 200,
      headers: { "content-type": "application/json" },
    });
  });
  vi.stubGlobal("fetch", fn);
  return fn;
}

export function renderWithQuery(ui: ReactElement) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false, gcTime: Infinity } } });
  return { client, ...render(<QueryClientProvider client={client}>{ui}</QueryClientProvider>) };
}
