/**
 * The editor's calls to the sequences API (contract in the team notes): save a revision, load one.
 * Every answer becomes a typed outcome the editor can show; nothing here throws on an HTTP status.
 */
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import type { Problem } from "@/machines/checks";

export type SaveOutcome =
  | { kind: "saved"; number: number; hash: string; warnings: Problem[] }
  | { kind: "stale"; error: string; latestRevision: number }
  | { kind: "invalid"; error: string; problems: Problem[] }
  | { kind: "refused"; status: number; error: string };

export interface SaveRequest {
  definition: SequenceDefinition;
  layout: SequenceLayout;
  message: string;
  baseRevision: number;
}

async function readJson(res: Response): Promise<Record<string, unknown>> {
  try {
    const body: unknown = await res.json();
    return body && typeof body === "object" ? (body as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}

function errorText(body: Record<string, unknown>, fallback: string): string {
  return typeof body.error === "string" && body.error ? body.error : fallback;
}

export async function saveRevision(sequenceId: string, req: SaveRequest, fetchImpl: typeof fetch = fetch): Promise<SaveOutcome> {
  let res: Response;
  try {
    res = await fetchImpl(`/api/sequences/${encodeURIComponent(sequenceId)}/revisions`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(req),
    });
  } catch {
    return { kind: "refused", status: 0, error: "The server could not be reached. Your edits are still here; try again." };
  }
  const body = await readJson(res);
  switch (res.status) {
    case 201:
      return {
        kind: "saved",
        number: Number(body.number),
        hash: String(body.hash ?? ""),
        warnings: Array.isArray(body.problems) ? (body.problems as Problem[]) : [],
      };
    case 409: {
      const latest = Number(body.latestRevision);
      // An archived sequence answers 409 too, but with the same revision: nothing to reload then.
      if (Number.isFinite(latest) && latest !== req.baseRevision) {
        return { kind: "stale", error: errorText(body, "Someone saved a newer revision."), latestRevision: latest };
      }
      return { kind: "refused", status: 409, error: errorText(body, "The server refused the save.") };
    }
    case 422:
      return {
        kind: "invalid",
        error: errorText(body, "The sequence has blocking problems."),
        problems: Array.isArray(body.problems) ? (body.problems as Problem[]) : [],
      };
    case 403:
      return { kind: "refused", status: 403, error: errorText(body, "You may read this sequence but not save it.") };
    default:
      return { kind: "refused", status: res.status, error: errorText(body, `The save failed (HTTP ${res.status}).`) };
  }
}

export interface LoadedRevision {
  number: number;
  definition: SequenceDefinition;
  layout: SequenceLayout | null;
  hash: string;
}

export async function loadRevision(sequenceId: string, n: number, fetchImpl: typeof fetch = fetch): Promise<LoadedRevision> {
  const res = await fetchImpl(`/api/sequences/${encodeURIComponent(sequenceId)}/revisions/${n}`);
  const body = await readJson(res);
  if (!res.ok) throw new Error(errorText(body, `Revision ${n} could not be loaded (HTTP ${res.status}).`));
  return {
    number: Number(body.number),
    definition: body.definition as SequenceDefinition,
    layout: (body.layout as SequenceLayout | null) ?? null,
    hash: String(body.hash ?? ""),
  };
}
