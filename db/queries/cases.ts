/**
 * Patient cases: one library for the whole team, readable by every signed-in user. Bodies are the
 * engine's `patientSchema` (lib/sim/types.ts), validated on write (the handler) and on read (here).
 */
import "server-only";
import { asc, desc, eq, sql } from "drizzle-orm";
import type { Db } from "@/db";
import { auditLog, patientCases } from "@/db/schema";
import { patientSchema, type Patient } from "@/lib/sim/types";
import type { CreateCaseBody, PatchCaseBody } from "@/lib/validation/cases";

export interface PatientCaseView {
  id: string;
  name: string;
  description: string;
  source: string;
  seeded: boolean;
  /** null when the stored body no longer parses (logged); such a case cannot be run until edited. */
  patient: Patient | null;
  createdAt: string;
  updatedAt: string;
}

type Row = typeof patientCases.$inferSelect;

export function parseCaseBody(row: Pick<Row, "id" | "body">): Patient | null {
  const parsed = patientSchema.safeParse(row.body);
  if (parsed.success) return parsed.data;
  console.error(`[cases] stored body of case ${row.id} does not parse`, parsed.error.issues);
  return null;
}

function toView(row: Row): PatientCaseView {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    source: row.source,
    seeded: row.seeded,
    patient: parseCaseBody(row),
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** Seeded reference cases first (in seeding order), then the team's own, newest first. */
export async function listCases(db: Db): Promise<PatientCaseView[]> {
  const rows = await db
    .select()
    .from(patientCases)
    .orderBy(desc(patientCases.seeded), sql`case when ${patientCases.seeded} then ${patientCases.createdAt} end asc`, desc(patientCases.createdAt), asc(patientCases.name));
  return rows.map(toView);
}

export async function getCase(db: Db, id: string): Promise<PatientCaseView | null> {
  const [row] = await db.select().from(patientCases).where(eq(patientCases.id, id)).limit(1);
  return row ? toView(row) : null;
}

export async function createCase(db: Db, actorId: string, body: CreateCaseBody): Promise<PatientCaseView> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(patientCases)
      .values({ name: body.name, description: body.description, source: body.source, body: body.patient, createdBy: actorId })
      .returning();
    await tx.insert(auditLog).values({ actorId, action: "case.create", targetType: "patient_case", targetId: row.id, details: { name: row.name } });
    return toView(row);
  });
}

/** Returns null when the case does not exist. */
export async function updateCase(db: Db, actorId: string, id: string, patch: PatchCaseBody): Promise<PatientCaseView | null> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(patientCases)
      .set({
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        ...(patch.description !== undefined ? { description: patch.description } : {}),
        ...(patch.source !== undefined ? { source: patch.source } : {}),
        ...(patch.patient !== undefined ? { body: patch.patient } : {}),
        updatedAt: sql`now()`,
      })
      .where(eq(patientCases.id, id))
      .returning();
    if (!row) return null;
    await tx.insert(auditLog).values({
      actorId,
      action: "case.update",
      targetType: "patient_case",
      targetId: id,
      details: { fields: Object.keys(patch).filter((k) => patch[k as keyof PatchCaseBody] !== undefined) },
    });
    return toView(row);
  });
}

/** Raw row for the run service (it needs the body and the seeded flag). */
export async function findCaseRow(db: Db, id: string): Promise<Row | null> {
  const [row] = await db.select().from(patientCases).where(eq(patientCases.id, id)).limit(1);
  return row ?? null;
}
