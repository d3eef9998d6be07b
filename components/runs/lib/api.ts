/**
 * The Runs API as this UI reads it (contract: team notes, "Runs API"; runs-server implements it).
 * Shapes only, plus small fetch helpers; no server code is imported here.
 */
import type { Alarm, Breath, StepInterval, Summary } from "@/lib/sim/types";

export type RunStatus = "queued" | "running" | "done" | "failed" | "cancelled";

export interface RunDetail {
  id: string;
  status: RunStatus;
  /** Fraction simulated, 0..1. */
  progress: number;
  error: string | null;
  durationS: number;
  seed: number | null;
  rig: string | null;
  createdAt: string;
  wallMs: number | null;
  revision: { id: string; number: number; sequenceId: string; sequenceName: string; projectId: string };
  /** null when the case has since been deleted. */
  case: { id: string; name: string } | null;
  summary: Summary | null;
  breaths: Breath[] | null;
  alarms: Alarm[] | null;
  stepNames: string[] | null;
  steps: StepInterval[] | null;
  /** Whether the caller may start or cancel runs (absent: assume yes; the server checks either way). */
  canRun?: boolean;
}

export const SIGNALS = ["paw", "flow", "volume", "pmus"] as const;
export type SignalKey = (typeof SIGNALS)[number] | "arm";

export interface WaveformWindow {
  from: number;
  to: number;
  points: number;
  /** Seconds, ascending. */
  t: number[];
  signals: Partial<Record<SignalKey, number[]>>;
  steps: StepInterval[];
}

export interface WaveformRequest {
  from: number;
  to: number;
  points: number;
  signals: readonly SignalKey[];
}

export function caseName(run: Pick<RunDetail, "case">): string {
  return run.case ? run.case.name : "a deleted case";
}

export function isFinished(status: RunStatus): boolean {
  return status === "done" || status === "failed" || status === "cancelled";
}

export function runUrl(runId: string): string {
  return `/api/runs/${encodeURIComponent(runId)}`;
}

export function waveformCsvUrl(runId: string): string {
  return `${runUrl(runId)}/waveform.csv`;
}

/** Window bounds are sent in ms precision so that equal windows share one cache entry. */
export function waveformUrl(runId: string, req: WaveformRequest): string {
  const params = new URLSearchParams({
    from: roundMs(req.from).toString(),
    to: roundMs(req.to).toString(),
    points: Math.max(2, Math.round(req.points)).toString(),
    signals: req.signals.join(","),
  });
  return `${runUrl(runId)}/waveform?${params.toString()}`;
}

export function roundMs(seconds: number): number {
  return Math.round(seconds * 1000) / 1000;
}

export class ApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
  ) {
    super(message);
    this.name = "ApiError";
  }
}

function errorMessage(body: unknown, status: number): string {
  if (typeof body === "object" && body !== null && "error" in body) {
    const error = (body as { error: unknown }).error;
    if (typeof error === "string" && error.length > 0) return error;
  }
  return `The server answered ${status}`;
}

export async function fetchJson<T>(url: string, init?: RequestInit): Promise<T> {
  const response = await fetch(url, { headers: { accept: "application/json" }, ...init });
  const body: unknown = await response.json().catch(() => null);
  if (!response.ok) throw new ApiError(errorMessage(body, response.status), response.status);
  return body as T;
}

export function fetchRun(runId: string, signal?: AbortSignal): Promise<RunDetail> {
  return fetchJson<RunDetail>(runUrl(runId), { signal });
}

export function fetchWaveform(runId: string, req: WaveformRequest, signal?: AbortSignal): Promise<WaveformWindow> {
  return fetchJson<WaveformWindow>(waveformUrl(runId, req), { signal });
}

export function cancelRun(runId: string): Promise<{ status: RunStatus }> {
  return fetchJson<{ status: RunStatus }>(`${runUrl(runId)}/cancel`, { method: "POST" });
}
