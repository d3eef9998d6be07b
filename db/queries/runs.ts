/**
 * Runs: the revision a caller may run, the run rows, and what the run page reads.
 *
 * Access: a run is visible exactly when its revision's project is (admins see every project; anyone
 * else through a project_members row). The condition sits in the WHERE clause, so a run or revision
 * the caller may not see is simply not found (404). Effective role as elsewhere: a per-project role on
 * the membership row replaces the account's role; admins are admins everywhere.
 */
import "server-only";
import { and, desc, eq, inArray, lt, sql, type SQL } from "drizzle-orm";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import { z } from "zod";
import type { Db } from "@/db";
import { patientCases, projectMembers, revisions, rigProfiles, runs, sequences } from "@/db/schema";
import { isRole, type Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/types";
import type { Alarm, Breath, Patient, Rig, StepInterval, Summary } from "@/lib/sim/types";
import type { RunRigValue, RunStatusValue } from "@/lib/validation/runs";

function visibleProject(user: SessionUser, projectIdColumn: AnyPgColumn): SQL {
  if (user.role === "admin") return sql`true`;
  return sql`exists (select 1 from ${projectMembers} where ${projectMembers.projectId} = ${projectIdColumn} and ${projectMembers.userId} = ${user.id})`;
}

/** The caller's membership row (for the per-project role), joined beside the project. */
function membershipJoin(user: SessionUser) {
  return and(eq(projectMembers.projectId, sequences.projectId), eq(projectMembers.userId, user.id));
}

function effectiveRole(user: SessionUser, memberRole: unknown): Role {
  if (user.role === "admin") return "admin";
  return isRole(memberRole) ? memberRole : user.role;
}

export interface RunnableRevision {
  id: string;
  number: number;
  sequenceId: string;
  sequenceName: string;
  projectId: string;
  /** Stored definition, unvalidated (the run service parses it). */
  definition: unknown;
  role: Role;
}

/** A revision in a project the caller can see, with their role there; null otherwise. */
export async function findVisibleRevision(db: Db, user: SessionUser, revisionId: string): Promise<RunnableRevision | null> {
  const [row] = await db
    .select({
      id: revisions.id,
      number: revisions.number,
      sequenceId: revisions.sequenceId,
      sequenceName: sequences.name,
      projectId: sequences.projectId,
      definition: revisions.definition,
      memberRole: projectMembers.role,
    })
    .from(revisions)
    .innerJoin(sequences, eq(sequences.id, revisions.sequenceId))
    .leftJoin(projectMembers, membershipJoin(user))
    .where(and(eq(revisions.id, revisionId), visibleProject(user, sequences.projectId)))
    .limit(1);
  if (!row) return null;
  const { memberRole, ...rest } = row;
  return { ...rest, role: effectiveRole(user, memberRole) };
}

/** The project's stored rig body (unvalidated), or null when it uses the default rig. */
export async function findProjectRigBody(db: Db, projectId: string): Promise<unknown> {
  const [row] = await db
    .select({ body: rigProfiles.body })
    .from(rigProfiles)
    .where(eq(rigProfiles.projectId, projectId))
    .limit(1);
  return row ? row.body : null;
}

export interface NewRun {
  revisionId: string;
  caseId: string;
  durationS: number;
  rig: RunRigValue;
  seed: number;
  createdBy: string;
  status: RunStatusValue;
  /** The patient body handed to the engine, kept so a later edit of the case cannot rewrite the run. */
  patient: Patient;
  /** The rig handed to the engine; null for the "ideal" circuit or when no rig could be resolved. */
  rigBody: Rig | null;
}

export async function insertRun(db: Db, run: NewRun): Promise<{ id: string; createdAt: Date }> {
  const [row] = await db.insert(runs).values(run).returning({ id: runs.id, createdAt: runs.createdAt });
  return row;
}

/** What is stored in `runs.steps`: the step names (index = waveform step code) and the intervals. */
export const storedSteps = z.object({
  names: z.array(z.string()),
  intervals: z.array(z.object({ step: z.string(), from: z.number(), to: z.number() })),
});
export type StoredSteps = z.infer<typeof storedSteps>;

export interface FinishedRun {
  summary: Summary;
  breaths: Breath[];
  alarms: Alarm[];
  steps: StoredSteps;
  waveform: Uint8Array;
  wallMs: number;
}

/**
 * The waveform blob crosses the driver as base64 text, decoded/encoded by Postgres itself: PGlite's
 * bytea parameter and result paths go through hex in JavaScript, measured here at ~35 ms to write and
 * ~100 ms to read a 10-minute run's 1.7 MB blob, against ~8 ms and ~5 ms as base64. Same column, same bytes.
 */
function blobToBase64(bytes: Uint8Array): string {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString("base64");
}

export async function completeRun(db: Db, id: string, result: FinishedRun): Promise<void> {
  await db
    .update(runs)
    .set({
      status: "done",
      summary: result.summary,
      breaths: result.breaths,
      alarms: result.alarms,
      steps: result.steps,
      waveform: sql`decode(${blobToBase64(result.waveform)}, 'base64')`,
      wallMs: result.wallMs,
      error: null,
      finishedAt: sql`now()`,
    })
    .where(eq(runs.id, id));
}

export async function failRun(
  db: Db,
  id: string,
  status: Extract<RunStatusValue, "failed" | "cancelled">,
  error: string,
  wallMs: number | null,
): Promise<void> {
  await db.update(runs).set({ status, error, wallMs, finishedAt: sql`now()` }).where(eq(runs.id, id));
}

/**
 * Runs left queued/running by an earlier process (a crash or restart mid-run) are failed with a note,
 * so they are shown as failed rather than spinning forever. Only rows created before this process
 * started are touched: this process's own live runs are never swept.
 */
export async function failOrphanedRun(db: Db, id: string, processStartedAt: Date): Promise<boolean> {
  const rows = await db
    .update(runs)
    .set({
      status: "failed",
      error: "The server stopped before this run finished. Start it again.",
      finishedAt: sql`now()`,
    })
    .where(and(eq(runs.id, id), inArray(runs.status, ["queued", "running"]), lt(runs.createdAt, processStartedAt)))
    .returning({ id: runs.id });
  return rows.length > 0;
}

/** Everything the run page shows except the waveform blob. */
export interface RunRecord {
  id: string;
  status: RunStatusValue;
  error: string | null;
  durationS: number;
  seed: number;
  rig: RunRigValue;
  createdAt: Date;
  finishedAt: Date | null;
  wallMs: number | null;
  createdBy: string | null;
  summary: unknown;
  breaths: unknown;
  alarms: unknown;
  steps: unknown;
  /** Stored copies of the inputs as simulated (unvalidated; lib/runs/snapshot.ts parses them). */
  patient: unknown;
  rigBody: unknown;
  revision: { id: string; number: number; sequenceId: string; sequenceName: string; projectId: string };
  /** The case as it is now (body unvalidated), to tell whether it still matches what was simulated. */
  case: { id: string; name: string; updatedAt: Date; body: unknown } | null;
  /** The caller's effective role in the run's project. */
  role: Role;
}

export async function findVisibleRun(db: Db, user: SessionUser, id: string): Promise<RunRecord | null> {
  const [row] = await db
    .select({
      id: runs.id,
      status: runs.status,
      error: runs.error,
      durationS: runs.durationS,
      seed: runs.seed,
      rig: runs.rig,
      createdAt: runs.createdAt,
      finishedAt: runs.finishedAt,
      wallMs: runs.wallMs,
      createdBy: runs.createdBy,
      summary: runs.summary,
      breaths: runs.breaths,
      alarms: runs.alarms,
      steps: runs.steps,
      patient: runs.patient,
      rigBody: runs.rigBody,
      revisionId: revisions.id,
      revisionNumber: revisions.number,
      sequenceId: sequences.id,
      sequenceName: sequences.name,
      projectId: sequences.projectId,
      caseId: patientCases.id,
      caseName: patientCases.name,
      caseUpdatedAt: patientCases.updatedAt,
      caseBody: patientCases.body,
      memberRole: projectMembers.role,
    })
    .from(runs)
    .innerJoin(revisions, eq(revisions.id, runs.revisionId))
    .innerJoin(sequences, eq(sequences.id, revisions.sequenceId))
    .leftJoin(patientCases, eq(patientCases.id, runs.caseId))
    .leftJoin(projectMembers, membershipJoin(user))
    .where(and(eq(runs.id, id), visibleProject(user, sequences.projectId)))
    .limit(1);
  if (!row) return null;
  return {
    id: row.id,
    status: row.status,
    error: row.error,
    durationS: row.durationS,
    seed: row.seed,
    rig: row.rig,
    createdAt: row.createdAt,
    finishedAt: row.finishedAt,
    wallMs: row.wallMs,
    createdBy: row.createdBy,
    summary: row.summary,
    breaths: row.breaths,
    alarms: row.alarms,
    steps: row.steps,
    patient: row.patient,
    rigBody: row.rigBody,
    revision: {
      id: row.revisionId,
      number: row.revisionNumber,
      sequenceId: row.sequenceId,
      sequenceName: row.sequenceName,
      projectId: row.projectId,
    },
    case:
      row.caseId && row.caseName !== null && row.caseUpdatedAt
        ? { id: row.caseId, name: row.caseName, updatedAt: row.caseUpdatedAt, body: row.caseBody }
        : null,
    role: effectiveRole(user, row.memberRole),
  };
}

/** The stored waveform blob of a run (call after findVisibleRun has authorized the caller). */
export async function findRunWaveform(db: Db, id: string): Promise<Uint8Array | null> {
  const [row] = await db
    .select({ base64: sql<string | null>`encode(${runs.waveform}, 'base64')` })
    .from(runs)
    .where(eq(runs.id, id))
    .limit(1);
  if (!row || row.base64 === null) return null;
  // Postgres wraps base64 lines at 76 characters; Node's decoder skips the newlines.
  const buf = Buffer.from(row.base64, "base64");
  return new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
}

export interface RunListItem {
  id: string;
  status: RunStatusValue;
  createdAt: Date;
  durationS: number;
  rig: RunRigValue;
  error: string | null;
  case: { id: string; name: string } | null;
  revision: { id: string; number: number; sequenceId: string; sequenceName: string };
  summary: unknown;
}

export async function listVisibleRuns(
  db: Db,
  user: SessionUser,
  filter: { revisionId?: string; caseId?: string; projectId?: string; limit: number },
): Promise<RunListItem[]> {
  const conditions: SQL[] = [visibleProject(user, sequences.projectId)];
  if (filter.revisionId) conditions.push(eq(runs.revisionId, filter.revisionId));
  if (filter.caseId) conditions.push(eq(runs.caseId, filter.caseId));
  if (filter.projectId) conditions.push(eq(sequences.projectId, filter.projectId));
  const rows = await db
    .select({
      id: runs.id,
      status: runs.status,
      createdAt: runs.createdAt,
      durationS: runs.durationS,
      rig: runs.rig,
      error: runs.error,
      summary: runs.summary,
      caseId: patientCases.id,
      caseName: patientCases.name,
      revisionId: revisions.id,
      revisionNumber: revisions.number,
      sequenceId: sequences.id,
      sequenceName: sequences.name,
    })
    .from(runs)
    .innerJoin(revisions, eq(revisions.id, runs.revisionId))
    .innerJoin(sequences, eq(sequences.id, revisions.sequenceId))
    .leftJoin(patientCases, eq(patientCases.id, runs.caseId))
    .where(and(...conditions))
    .orderBy(desc(runs.createdAt))
    .limit(filter.limit);
  return rows.map((r) => ({
    id: r.id,
    status: r.status,
    createdAt: r.createdAt,
    durationS: r.durationS,
    rig: r.rig,
    error: r.error,
    summary: r.summary,
    case: r.caseId && r.caseName !== null ? { id: r.caseId, name: r.caseName } : null,
    revision: { id: r.revisionId, number: r.revisionNumber, sequenceId: r.sequenceId, sequenceName: r.sequenceName },
  }));
}

export type { StepInterval };
