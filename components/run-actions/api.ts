/** Shapes of the runs API as the launcher and lists read them, and the calls they make. Client-safe. */
import type { Summary } from "@/lib/sim/types";
import type { CreateRunInput, RunStatusValue } from "@/lib/validation/runs";
import { apiFetch } from "@/components/ui/api-client";

export interface RunListEntry {
  id: string;
  status: RunStatusValue;
  createdAt: string;
  durationS: number;
  rig: "project" | "ideal";
  error: string | null;
  case: { id: string; name: string } | null;
  revision: { id: string; number: number; sequenceId: string; sequenceName: string };
  summary: Summary | null;
}

export interface RunProgressView {
  id: string;
  status: RunStatusValue;
  progress: number;
  error: string | null;
}

export interface CaseOption {
  id: string;
  name: string;
  seeded: boolean;
}

export const isFinished = (s: RunStatusValue) => s === "done" || s === "failed" || s === "cancelled";

export function listRuns(filter: { revisionId?: string; caseId?: string }): Promise<{ runs: RunListEntry[] }> {
  const params = new URLSearchParams();
  if (filter.revisionId) params.set("revisionId", filter.revisionId);
  if (filter.caseId) params.set("caseId", filter.caseId);
  return apiFetch(`/api/runs?${params.toString()}`);
}

export function startRun(body: CreateRunInput): Promise<{ id: string; status: RunStatusValue }> {
  return apiFetch("/api/runs", { body: { ...body, wait: false } });
}

export function getRunProgress(id: string): Promise<RunProgressView> {
  return apiFetch(`/api/runs/${id}`);
}

export function cancelRun(id: string): Promise<{ status: RunStatusValue }> {
  return apiFetch(`/api/runs/${id}/cancel`, { method: "POST" });
}

export function listCaseOptions(): Promise<{ cases: CaseOption[] }> {
  return apiFetch("/api/cases");
}
