/**
 * Sequences of a project: the list, create (with revision 1), rename/archive, duplicate.
 * Reads carry the project-membership condition in their WHERE (sequences-access.ts); writes are
 * called after the handler has loaded the project or sequence through that same condition.
 */
import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { Db } from "@/db";
import { auditLog, revisions, sequences, users, type SequenceStatus } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/types";
import type { SequenceDefinition, SequenceLayout } from "@/machines/schema";
import type { SequenceListItem } from "@/lib/sequences/types";
import { visibleProjectCondition } from "./sequences-access";

export type { SequenceListItem };

const latest = alias(revisions, "latest");

/** All sequences of a project the user can see (archived included: the page filters), latest first. */
export async function listSequences(db: Db, user: SessionUser, projectId: string): Promise<SequenceListItem[]> {
  const rows = await db
    .select({
      id: sequences.id,
      name: sequences.name,
      status: sequences.status,
      updatedAt: sequences.updatedAt,
      revNumber: latest.number,
      revHash: latest.hash,
      revCreatedAt: latest.createdAt,
      revMessage: latest.message,
      revAuthorId: latest.authorId,
      revAuthorName: users.name,
    })
    .from(sequences)
    .leftJoin(
      latest,
      and(
        eq(latest.sequenceId, sequences.id),
        eq(
          latest.number,
          sql`(select max(${revisions.number}) from ${revisions} where ${revisions.sequenceId} = ${sequences.id})`,
        ),
      ),
    )
    .leftJoin(users, eq(users.id, latest.authorId))
    .where(and(eq(sequences.projectId, projectId), visibleProjectCondition(user, sequences.projectId)))
    .orderBy(desc(sequences.updatedAt), sequences.name);
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    status: r.status,
    updatedAt: r.updatedAt.toISOString(),
    latestRevision:
      r.revNumber === null || r.revHash === null || r.revCreatedAt === null
        ? null
        : {
            number: r.revNumber,
            hash: r.revHash,
            createdAt: r.revCreatedAt.toISOString(),
            message: r.revMessage ?? "",
            author: { id: r.revAuthorId, name: r.revAuthorName ?? "former user" },
          },
  }));
}

export interface FirstRevision {
  definition: SequenceDefinition;
  layout: SequenceLayout;
  hash: string;
  message: string;
}

export interface NewSequence {
  projectId: string;
  name: string;
  actorId: string;
  first: FirstRevision;
  /** Audit details (template id, duplicated-from). */
  origin: Record<string, unknown>;
}

/** Insert a sequence and its revision 1 together: a sequence never exists without a revision. */
export async function createSequenceWithRevision(db: Db, input: NewSequence): Promise<{ id: string }> {
  return db.transaction(async (tx) => {
    const [sequence] = await tx
      .insert(sequences)
      .values({ projectId: input.projectId, name: input.name, createdBy: input.actorId })
      .returning({ id: sequences.id });
    await tx.insert(revisions).values({
      sequenceId: sequence.id,
      number: 1,
      authorId: input.actorId,
      message: input.first.message,
      definition: input.first.definition,
      layout: input.first.layout,
      hash: input.first.hash,
    });
    await tx.insert(auditLog).values({
      actorId: input.actorId,
      action: "sequence.create",
      targetType: "sequence",
      targetId: sequence.id,
      details: { projectId: input.projectId, name: input.name, hash: input.first.hash, ...input.origin },
    });
    return { id: sequence.id };
  });
}

export interface SequenceChange {
  name?: string;
  status?: SequenceStatus;
}

/** Rename and/or archive; one audit entry per kind of change so the log reads as what happened. */
export async function updateSequence(
  db: Db,
  sequenceId: string,
  actorId: string,
  before: { name: string; status: SequenceStatus },
  change: SequenceChange,
): Promise<{ updatedAt: string }> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(sequences)
      .set({ ...change, updatedAt: sql`now()` })
      .where(eq(sequences.id, sequenceId))
      .returning({ updatedAt: sequences.updatedAt });
    if (change.name !== undefined && change.name !== before.name) {
      await tx.insert(auditLog).values({
        actorId,
        action: "sequence.rename",
        targetType: "sequence",
        targetId: sequenceId,
        details: { from: before.name, to: change.name },
      });
    }
    if (change.status !== undefined && change.status !== before.status) {
      await tx.insert(auditLog).values({
        actorId,
        action: change.status === "archived" ? "sequence.archive" : "sequence.unarchive",
        targetType: "sequence",
        targetId: sequenceId,
        details: { from: before.status, to: change.status },
      });
    }
    return { updatedAt: row.updatedAt.toISOString() };
  });
}
