/**
 * Start-up seeding of an empty database (no users yet).
 *
 * 1. `baseSeedSteps` — product reference data that every installation gets (e.g. the standard patient
 *    cases). They run whenever the users table is empty, so they must be idempotent.
 * 2. When TIDEWRIGHT_DEMO is not "0": `seedDemoTeam()` (an invented build programme, four accounts,
 *    one project), then `demoSeedSteps` in order, each given the team it can attach data to.
 *
 * To add seed data, write `export const seedX: SeedStep = { name, run }` in your own module
 * (e.g. db/seeds/patient-cases.ts) and add one line to the list below.
 */
import "server-only";
import { count } from "drizzle-orm";
import type { Db } from "./index";
import { auditLog, projectMembers, projects, users } from "./schema";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/auth/roles";
import { seedPatientCasesStep } from "./seed-cases";
import { seedDemoSequences } from "./seed-sequences";

export const DEMO_PASSWORD = "tidewright-demo";

export interface DemoAccount {
  id: string;
  email: string;
  name: string;
  role: Role;
}

export interface DemoTeam {
  projectId: string;
  users: Record<Role, DemoAccount>;
}

export interface SeedContext {
  db: Db;
  /** Present for demo steps; null for base steps. */
  team: DemoTeam | null;
}

export interface SeedStep {
  /** Shown in the start-up log. */
  name: string;
  run: (ctx: SeedContext) => Promise<void>;
}

/** Reference data for every installation (idempotent). */
export const baseSeedSteps: SeedStep[] = [seedPatientCasesStep];

/** Demo data that hangs off the demo team (sequences, rig profile, runs …), in order. */
export const demoSeedSteps: SeedStep[] = [seedDemoSequences];

/** The invented scenario. No real people, organisations or devices. */
export const DEMO_SCENARIO = {
  programme: "Lowtide bag-compressor build",
  device: "Marram MK-1",
  description:
    "Demo programme (invented): the Gullhaven makerspace team's Marram MK-1, a self-inflating bag squeezed " +
    "by a stepper-driven arm on a microcontroller. Volume-targeted breaths with a patient trigger and a backup rate.",
  accounts: [
    { role: "admin", email: "admin@demo.test", name: "Ada Admin (demo)" },
    { role: "engineer", email: "engineer@demo.test", name: "Eli Engineer (demo)" },
    { role: "clinician", email: "clinician@demo.test", name: "Cleo Clinician (demo)" },
    { role: "viewer", email: "viewer@demo.test", name: "Vik Viewer (demo)" },
  ] satisfies { role: Role; email: string; name: string }[],
} as const;

export async function seedDemoTeam(db: Db): Promise<DemoTeam> {
  // Hash outside the transaction: PGlite is one session, keep transactions free of slow non-DB work.
  const hashed = await Promise.all(
    DEMO_SCENARIO.accounts.map(async (a) => ({ ...a, passwordHash: await hashPassword(DEMO_PASSWORD) })),
  );
  return db.transaction(async (tx) => {
    const rows = await tx
      .insert(users)
      .values(hashed.map((a) => ({ email: a.email, name: a.name, role: a.role, passwordHash: a.passwordHash })))
      .returning();
    const byRole = Object.fromEntries(
      rows.map((r) => [r.role, { id: r.id, email: r.email, name: r.name, role: r.role }]),
    ) as Record<Role, DemoAccount>;
    const [project] = await tx
      .insert(projects)
      .values({ name: DEMO_SCENARIO.programme, description: DEMO_SCENARIO.description, createdBy: byRole.engineer.id })
      .returning();
    await tx.insert(projectMembers).values(rows.map((r) => ({ projectId: project.id, userId: r.id })));
    await tx.insert(auditLog).values({
      actorId: byRole.engineer.id,
      action: "project.create",
      targetType: "project",
      targetId: project.id,
      details: { name: project.name, seeded: true },
    });
    return { projectId: project.id, users: byRole };
  });
}

async function runSteps(steps: SeedStep[], ctx: SeedContext): Promise<void> {
  for (const step of steps) {
    const started = Date.now();
    await step.run(ctx);
    console.info(`[seed] ${step.name} (${Date.now() - started} ms)`);
  }
}

/** Everything a fresh database gets. Returns the demo team when it was seeded. */
export async function seedDatabase(db: Db, options: { demo: boolean }): Promise<DemoTeam | null> {
  await runSteps(baseSeedSteps, { db, team: null });
  if (!options.demo) return null;
  const team = await seedDemoTeam(db);
  console.info(`[seed] demo team: ${DEMO_SCENARIO.accounts.map((a) => a.email).join(", ")}`);
  await runSteps(demoSeedSteps, { db, team });
  return team;
}

/** Called at every start-up (db/index.ts); does nothing once the database has users. */
export async function seedIfEmpty(db: Db, options: { demo: boolean }): Promise<DemoTeam | null> {
  const [{ n }] = await db.select({ n: count() }).from(users);
  if (n > 0) return null;
  return seedDatabase(db, options);
}
