// Hand-run timing of the save service and handler (not a test; vitest ignores it): 50 saves each on a
// copy of the test template. Run: npx tsx --conditions=react-server tests/unit/sequences/save-timing.manual.ts
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { openDatabase, installDatabase } from "@/db";
import { eq } from "drizzle-orm";
import { projects, users } from "@/db/schema";
import { createSequence } from "@/lib/sequences/create-sequence";
import { saveRevision } from "@/lib/sequences/save-revision";
import { assessDefinition } from "@/lib/sequences/assess-definition";
import { getRevision } from "@/db/queries/revisions";
import { luciaFor } from "@/lib/auth/lucia";
import { POST as saveRoute } from "@/app/api/sequences/[id]/revisions/route";

async function main() {
const root = ".tmp/pg-template";
const template = fs.readdirSync(root).filter((d) => fs.existsSync(path.join(root, d, "PG_VERSION"))).map((d) => path.join(root, d))
  .sort((a, b) => fs.statSync(b).mtimeMs - fs.statSync(a).mtimeMs)[0];
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "save-timing-"));
fs.cpSync(template, dir, { recursive: true });
const handle = await openDatabase({ dataDir: dir, noLock: true });
installDatabase(handle);
const db = handle.db;
const [u] = await db.select().from(users).where(eq(users.email, "engineer@demo.test"));
const [p] = await db.select().from(projects).limit(1);
const team = { projectId: p.id };
const user = { id: u.id, email: u.email, name: u.name, role: u.role };
const stats = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * s.length))];
  return `mean ${(xs.reduce((a, b) => a + b, 0) / xs.length).toFixed(2)} ms, median ${q(0.5).toFixed(2)}, p95 ${q(0.95).toFixed(2)}, max ${s[s.length - 1].toFixed(2)}, min ${s[0].toFixed(2)}`;
};
for (const template of ["volume-control", "assist-volume"]) {
  const { id } = await createSequence(db, user, team.projectId, { name: `timing ${template}`, template });
  const rev1 = await getRevision(db, id, 1);
  if (!rev1) throw new Error("no rev 1");
  const total: number[] = [];
  const assess: number[] = [];
  for (let i = 0; i < 50; i++) {
    const definition = { ...rev1.definition, description: `timing run ${i}` };
    const a0 = performance.now();
    assessDefinition(definition);
    assess.push(performance.now() - a0);
    const t0 = performance.now();
    const out = await saveRevision(db, user, id, { definition, layout: rev1.layout, message: `save ${i}`, baseRevision: i + 1 });
    total.push(performance.now() - t0);
    if (out.kind !== "created") throw new Error(`save ${i}: ${out.kind}`);
  }
  console.log(`${template} (${Object.keys(rev1.definition.machine.states).length} steps), 50 saves:`);
  console.log(`  saveRevision (service, whole): ${stats(total)}`);
  console.log(`  of which assess (zod+checks+compile+hash, measured separately): ${stats(assess)}`);
}
const session = await luciaFor(db).createSession(user.id, {});
const cookie = `${luciaFor(db).sessionCookieName}=${session.id}`;
{
  const { id } = await createSequence(db, user, team.projectId, { name: "timing http", template: "assist-volume" });
  const rev1 = await getRevision(db, id, 1);
  if (!rev1) throw new Error("no rev 1");
  const total: number[] = [];
  for (let i = 0; i < 50; i++) {
    const body = JSON.stringify({ definition: { ...rev1.definition, description: `http ${i}` }, layout: rev1.layout, message: `http ${i}`, baseRevision: i + 1 });
    const req = new Request(`http://localhost:3000/api/sequences/${id}/revisions`, {
      method: "POST",
      headers: { host: "localhost:3000", origin: "http://localhost:3000", cookie, "content-type": "application/json" },
      body,
    });
    const t0 = performance.now();
    const res = await saveRoute(req, { params: Promise.resolve({ id }) });
    total.push(performance.now() - t0);
    if (res.status !== 201) throw new Error(`http save ${i}: ${res.status} ${await res.text()}`);
  }
  console.log(`assist-volume via the route handler (parse + session + save + JSON), 50 saves:`);
  console.log(`  ${stats(total)}`);
}
await handle.close();
fs.rmSync(dir, { recursive: true, force: true });
}
main().catch((e) => { console.error(e); process.exit(1); });
