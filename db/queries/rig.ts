/**
 * The project's rig profile: one row per project, body validated with the engine's rigSchema on
 * write (the handler) and on read (here). A project without a row uses DEFAULT_RIG.
 */
import "server-only";
import { eq, sql } from "drizzle-orm";
import type { Db } from "@/db";
import { auditLog, rigProfiles } from "@/db/schema";
import { rigSchema, type Rig } from "@/lib/sim/types";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";

export interface ProjectRig {
  rig: Rig;
  /** null while the project still uses the default profile. */
  updatedAt: string | null;
  updatedBy: string | null;
}

function defaultRig(): Rig {
  return rigSchema.parse(DEFAULT_RIG);
}

export async function getProjectRig(db: Db, projectId: string): Promise<ProjectRig> {
  const rows = await db
    .select({ body: rigProfiles.body, updatedAt: rigProfiles.updatedAt, updatedBy: rigProfiles.updatedBy })
    .from(rigProfiles)
    .where(eq(rigProfiles.projectId, projectId))
    .limit(1);
  const row = rows[0];
  if (!row) return { rig: defaultRig(), updatedAt: null, updatedBy: null };
  const parsed = rigSchema.safeParse(row.body);
  if (!parsed.success) {
    // Stored before a schema change tightened a bound: log it and show the defaults rather than fail
    // the page; the next save replaces the row with a valid profile.
    console.error(`[rig] stored profile of project ${projectId} no longer parses`, parsed.error.issues);
    return { rig: defaultRig(), updatedAt: row.updatedAt.toISOString(), updatedBy: row.updatedBy };
  }
  return { rig: parsed.data, updatedAt: row.updatedAt.toISOString(), updatedBy: row.updatedBy };
}

/** Insert or replace the project's profile and record who changed it. */
export async function saveProjectRig(db: Db, projectId: string, actorId: string, rig: Rig): Promise<ProjectRig> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(rigProfiles)
      .values({ projectId, body: rig, updatedBy: actorId })
      .onConflictDoUpdate({
        target: rigProfiles.projectId,
        set: { body: rig, updatedBy: actorId, updatedAt: sql`now()` },
      })
      .returning({ updatedAt: rigProfiles.updatedAt });
    await tx.insert(auditLog).values({
      actorId,
      action: "rig.update",
      targetType: "project",
      targetId: projectId,
      details: { name: rig.name, scanPeriodS: rig.scanPeriodS, calibrationPoints: rig.bagCalibration.length },
    });
    return { rig, updatedAt: row.updatedAt.toISOString(), updatedBy: actorId };
  });
}
