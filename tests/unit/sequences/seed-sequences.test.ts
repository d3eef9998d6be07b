/**
 * The demo sequences: at least one timed-only and one patient-triggered sequence, several revisions
 * each, numbered 1…n in time order, every revision one the save handler would accept.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { asc, eq, inArray } from "drizzle-orm";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { revisions, sequences } from "@/db/schema";
import { DEMO_SEQUENCES, seedDemoSequences } from "@/db/seed-sequences";
import { assessDefinition } from "@/lib/sequences/assess-definition";
import { hashDefinition } from "@/machines/hash";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
  // The template may already hold them (once the step is in db/seed.ts); start from a clean slate.
  await t.db.delete(sequences).where(inArray(sequences.name, DEMO_SEQUENCES.map((s) => s.name)));
  await seedDemoSequences.run({ db: t.db, team: t.team });
});
afterAll(async () => {
  await t.close();
});

async function seeded(name: string) {
  const [sequence] = await t.db.select().from(sequences).where(eq(sequences.name, name));
  const revs = await t.db.select().from(revisions).where(eq(revisions.sequenceId, sequence.id)).orderBy(asc(revisions.number));
  return { sequence, revs };
}

describe("seedDemoSequences", () => {
  it("seeds every demo sequence into the demo project with its revisions", async () => {
    for (const spec of DEMO_SEQUENCES) {
      const { sequence, revs } = await seeded(spec.name);
      expect(sequence).toMatchObject({ projectId: t.team.projectId, status: spec.status });
      expect(revs.map((r) => r.number)).toEqual(spec.revisions.map((_, i) => i + 1));
      expect(revs.map((r) => r.message)).toEqual(spec.revisions.map((r) => r.message));
      for (let i = 1; i < revs.length; i++) expect(revs[i].createdAt > revs[i - 1].createdAt).toBe(true);
      expect(sequence.updatedAt).toEqual(revs[revs.length - 1].createdAt);
      for (const rev of revs) {
        const assessed = assessDefinition(rev.definition);
        expect(assessed.ok).toBe(true);
        expect(rev.hash).toBe(hashDefinition(assessed.ok ? assessed.definition : (rev.definition as never)));
      }
      expect(new Set(revs.map((r) => r.hash)).size).toBe(revs.length);
    }
  });

  it("ships a timed-only sequence and a patient-triggered one, each with a few revisions", async () => {
    const kinds = await Promise.all(
      DEMO_SEQUENCES.filter((s) => s.status !== "archived").map(async (spec) => {
        const { revs } = await seeded(spec.name);
        const def = assessDefinition(revs[revs.length - 1].definition);
        if (!def.ok) throw new Error("invalid");
        const stepKinds = Object.values(def.definition.machine.states).map((s) => s.meta.kind);
        return { triggered: stepKinds.includes("wait-for-trigger"), revisions: revs.length };
      }),
    );
    expect(kinds.some((k) => k.triggered && k.revisions >= 3)).toBe(true);
    expect(kinds.some((k) => !k.triggered && k.revisions >= 3)).toBe(true);
  });
});
