/**
 * Revisions: immutable saved versions of a sequence. Rows are only ever inserted; numbers run 1, 2, 3…
 * per sequence, handed out inside one short transaction (the unique index on (sequence_id, number)
 * backs it up if two writers ever race past the check).
 *
 * Callers have already decided the user may see the sequence (db/queries/sequences-access.ts).
 */
import "server-only";
import { and, desc, eq, max, sql } from "drizzle-orm";
import type { Db } from "@/db";
import { auditLog, revisions, sequences, users } from "@/db/schema";
import { sequenceDefinition, sequenceLayout, type SequenceDefinition, type SequenceLayout } from "@/machines/schema";
import type { RevisionDetail, RevisionSummary } from "@/lib/sequences/types";

export type { RevisionDetail, RevisionSummary };

/** Shown when the author's account was deleted (author_id set null). */
const FORMER_USER = "former user";

const summaryColumns = {
  id: revisions.id,
  number: revisions.number,
  message: revisions.message,
  hash: revisions.hash,
  createdAt: revisions.createdAt,
  authorId: revisions.authorId,
  authorName: users.name,
};

type SummaryRow = {
  id: string;
  number: number;
  message: string;
  hash: string;
  createdAt: Date;
  authorId: string | null;
  authorName: string | null;
};

function toSummary(row: SummaryRow): RevisionSummary {
  return {
    id: row.id,
    number: row.number,
    message: row.message,
    hash: row.hash,
    createdAt: row.createdAt.toISOString(),
    author: { id: row.authorId, name: row.authorName ?? FORMER_USER },
  };
}

/** Newest first. */
export async function listRevisions(db: Db, sequenceId: string): Promise<RevisionSummary[]> {
  const rows = await db
    .select(summaryColumns)
    .from(revisions)
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(eq(revisions.sequenceId, sequenceId))
    .orderBy(desc(revisions.number));
  return rows.map(toSummary);
}

export class StoredDefinitionError extends Error {
  constructor(revisionId: string, cause: unknown) {
    super(`revision ${revisionId} holds a definition that no longer parses`, { cause });
    this.name = "StoredDefinitionError";
  }
}

/**
 * One revision with its body. JSON columns are validated on read too: a stored definition that the
 * current schema rejects is a server fault to log, not something to hand to the designer.
 */
export async function getRevision(db: Db, sequenceId: string, number: number): Promise<RevisionDetail | null> {
  const rows = await db
    .select({ ...summaryColumns, definition: revisions.definition, layout: revisions.layout })
    .from(revisions)
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.sequenceId, sequenceId), eq(revisions.number, number)))
    .limit(1);
  const row = rows[0];
  if (!row) return null;
  const definition = sequenceDefinition.safeParse(row.definition);
  if (!definition.success) throw new StoredDefinitionError(row.id, definition.error);
  const layout = sequenceLayout.safeParse(row.layout);
  return {
    ...toSummary(row),
    definition: definition.data,
    // A layout is only positions: a broken one is redrawn by auto-layout rather than failing the read.
    layout: layout.success ? layout.data : { nodes: {} },
  };
}

export async function latestRevisionNumber(db: Db, sequenceId: string): Promise<number | null> {
  const rows = await db
    .select({ latest: max(revisions.number) })
    .from(revisions)
    .where(eq(revisions.sequenceId, sequenceId));
  return rows[0]?.latest ?? null;
}

export interface NewRevision {
  sequenceId: string;
  /** The revision the author started from; must still be the latest. 0 = the sequence has none. */
  baseRevision: number;
  authorId: string;
  message: string;
  definition: SequenceDefinition;
  layout: SequenceLayout;
  hash: string;
}

export type InsertRevisionResult =
  | { kind: "created"; id: string; number: number; createdAt: string }
  | { kind: "stale"; latestRevision: number };

/**
 * Append a revision if `baseRevision` is still the latest. Everything inside is one short transaction
 * with no outside awaits (PGlite is a single session): lock the sequence row so concurrent savers on
 * a PostgreSQL server queue up, compare, insert, touch the sequence, write the audit entry.
 */
export async function insertRevision(db: Db, input: NewRevision): Promise<InsertRevisionResult> {
  return db.transaction(async (tx) => {
    await tx.execute(sql`select 1 from ${sequences} where ${sequences.id} = ${input.sequenceId} for update`);
    const [{ latest }] = await tx
      .select({ latest: max(revisions.number) })
      .from(revisions)
      .where(eq(revisions.sequenceId, input.sequenceId));
    const latestNumber = latest ?? 0;
    if (latestNumber !== input.baseRevision) return { kind: "stale", latestRevision: latestNumber };

    const number = latestNumber + 1;
    const [row] = await tx
      .insert(revisions)
      .values({
        sequenceId: input.sequenceId,
        number,
        authorId: input.authorId,
        message: input.message,
        definition: input.definition,
        layout: input.layout,
        hash: input.hash,
      })
      .returning({ id: revisions.id, createdAt: revisions.createdAt });
    await tx.update(sequences).set({ updatedAt: row.createdAt }).where(eq(sequences.id, input.sequenceId));
    await tx.insert(auditLog).values({
      actorId: input.authorId,
      action: "sequence.save",
      targetType: "sequence",
      targetId: input.sequenceId,
      details: { revision: number, revisionId: row.id, hash: input.hash, message: input.message },
    });
    return { kind: "created", id: row.id, number, createdAt: row.createdAt.toISOString() };
  });
}
