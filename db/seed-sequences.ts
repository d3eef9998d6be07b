/**
 * Demo sequences for the demo project: a timed-only volume-control sequence, a patient-triggered
 * assisted one, and an archived pressure-control draft, each with a short, plausible history.
 *
 * Every seeded revision goes through the same gate as a save (lib/sequences/assess-definition.ts):
 * a seed that the save handler would refuse fails loudly at start-up instead of shipping.
 * Timestamps are spread over the days before seeding so the history page reads like real work.
 */
import "server-only";
import type { Db } from "./index";
import type { SeedStep, DemoTeam } from "./seed";
import { auditLog, revisions, sequences, type SequenceStatus } from "./schema";
import { getTemplate } from "@/machines/templates";
import type { SequenceDefinition } from "@/machines/schema";
import { assessDefinition } from "@/lib/sequences/assess-definition";
import { layoutFor } from "@/lib/sequences/first-revision";

type Author = "engineer" | "admin";

interface SeedRevision {
  message: string;
  author: Author;
  /** Days before seeding. */
  daysAgo: number;
  /** Change from the previous revision's definition (the first revision starts from the template). */
  change: (def: SequenceDefinition) => void;
}

interface SeedSequence {
  name: string;
  template: string;
  status: SequenceStatus;
  revisions: SeedRevision[];
}

function setValue(def: SequenceDefinition, setting: string, value: number | string): void {
  const entry = def.settings[setting];
  if (!entry) throw new Error(`seed: template has no setting ${setting}`);
  entry.value = value;
}

const keep = () => {};

export const DEMO_SEQUENCES: SeedSequence[] = [
  {
    name: "MK-1 timed volume control",
    template: "volume-control",
    status: "draft",
    revisions: [
      { message: "Created from the Volume control template", author: "engineer", daysAgo: 9, change: keep },
      {
        message: "Shorter inspiratory pause (0.2 → 0.1 s): plateau still readable on the bench lung, longer expiration",
        author: "engineer",
        daysAgo: 7,
        change: (d) => setValue(d, "pause", 0.1),
      },
      {
        message: "High-pressure limit 38 → 35 cmH2O, as agreed at the clinical review call",
        author: "engineer",
        daysAgo: 5,
        change: (d) => setValue(d, "Plimit", 35),
      },
      {
        message: "Describe the bench set-up in the sequence notes",
        author: "admin",
        daysAgo: 4,
        change: (d) => {
          d.description =
            "Timed-only breaths for the Marram MK-1 bench: constant flow for Vt over Ti, a short pause for the " +
            "plateau reading, release through the PEEP valve. No patient trigger; the rate is fixed at RR.";
        },
      },
    ],
  },
  {
    name: "MK-1 assisted volume (patient trigger)",
    template: "assist-volume",
    status: "draft",
    revisions: [
      { message: "Created from the Assisted volume control template", author: "engineer", daysAgo: 6, change: keep },
      {
        message: "Trigger sensitivity 2 → 1.5 cmH2O: weak efforts were missed in the low-effort case",
        author: "engineer",
        daysAgo: 4,
        change: (d) => setValue(d, "sensitivity", 1.5),
      },
      {
        message: "Backup rate 15 → 12 /min so a patient breathing at 15–20 /min leads the timer",
        author: "engineer",
        daysAgo: 2,
        change: (d) => setValue(d, "RR", 12),
      },
    ],
  },
  {
    name: "Pressure control (first try, superseded)",
    template: "pressure-control",
    status: "archived",
    revisions: [
      { message: "Created from the Pressure control template", author: "engineer", daysAgo: 12, change: keep },
      {
        message: "Try a slower rise (0.1 → 0.2 s) against the stiff-lung case",
        author: "engineer",
        daysAgo: 11,
        change: (d) => setValue(d, "rise", 0.2),
      },
    ],
  },
];

const DAY_MS = 24 * 60 * 60 * 1000;

async function seedOne(db: Db, team: DemoTeam, spec: SeedSequence, now: number): Promise<void> {
  const template = getTemplate(spec.template);
  if (!template) throw new Error(`seed: unknown template ${spec.template}`);
  let definition: SequenceDefinition = { ...template.definition, name: spec.name };
  const rows: Array<typeof revisions.$inferInsert> = [];

  // All CPU work (checks, hashes, layout) before the transaction: PGlite is a single session.
  for (const [index, rev] of spec.revisions.entries()) {
    definition = structuredClone(definition);
    rev.change(definition);
    const assessed = assessDefinition(definition);
    if (!assessed.ok) {
      throw new Error(`seed: "${spec.name}" revision ${index + 1} would be refused: ${assessed.problems.map((p) => p.message).join("; ")}`);
    }
    definition = assessed.definition;
    rows.push({
      number: index + 1,
      sequenceId: "", // filled in once the sequence row exists
      authorId: team.users[rev.author].id,
      message: rev.message,
      definition,
      layout: await layoutFor(definition),
      hash: assessed.hash,
      createdAt: new Date(now - rev.daysAgo * DAY_MS),
    });
  }

  const createdAt = rows[0].createdAt as Date;
  const updatedAt = rows[rows.length - 1].createdAt as Date;
  await db.transaction(async (tx) => {
    const [sequence] = await tx
      .insert(sequences)
      .values({
        projectId: team.projectId,
        name: spec.name,
        status: spec.status,
        createdBy: team.users.engineer.id,
        createdAt,
        updatedAt,
      })
      .returning({ id: sequences.id });
    await tx.insert(revisions).values(rows.map((r) => ({ ...r, sequenceId: sequence.id })));
    await tx.insert(auditLog).values({
      actorId: team.users.engineer.id,
      action: "sequence.create",
      targetType: "sequence",
      targetId: sequence.id,
      at: createdAt,
      details: { projectId: team.projectId, name: spec.name, template: spec.template, seeded: true },
    });
  });
}

export const seedDemoSequences: SeedStep = {
  name: "demo sequences",
  run: async ({ db, team }) => {
    if (!team) return;
    const now = Date.now();
    for (const spec of DEMO_SEQUENCES) await seedOne(db, team, spec, now);
  },
};
