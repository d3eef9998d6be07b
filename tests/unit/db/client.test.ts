import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { inject } from "vitest";
import { count, sql } from "drizzle-orm";
import { openDatabase } from "@/db";
import { DataDirLockedError } from "@/db/lock";
import { projectMembers, projects, users } from "@/db/schema";
import { openTestDb } from "@/tests/fixtures/test-db";
import { parseEnv } from "@/lib/env";

const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "tidewright-client-"));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

describe("database client", () => {
  it("opens a copy of the template quickly, with the demo team seeded", async () => {
    const t = await openTestDb();
    try {
      console.info(`[test-db] PGlite copy + open: ${t.openMs.toFixed(0)} ms`);
      expect(t.openMs).toBeLessThan(5000);
      const [{ n }] = await t.db.select({ n: count() }).from(users);
      expect(n).toBe(4);
      const [{ p }] = await t.db.select({ p: count() }).from(projects);
      expect(p).toBe(1);
      const [{ m }] = await t.db.select({ m: count() }).from(projectMembers);
      expect(m).toBe(4);
      const roles = Object.values(t.team.users).map((u) => u.role).sort();
      expect(roles).toEqual(["admin", "clinician", "engineer", "viewer"]);
    } finally {
      await t.close();
    }
  });

  it("refuses to open a data dir whose lock a live other process holds", async () => {
    const dir = path.join(tmp, "copy");
    fs.cpSync(inject("pgTemplateDir"), dir, { recursive: true });
    const first = await openDatabase({ dataDir: dir });
    try {
      // Pretend the lock belongs to a live process that is not us (PID 1 always exists).
      fs.writeFileSync(`${dir}.lock`, "1\n");
      await expect(openDatabase({ dataDir: dir })).rejects.toBeInstanceOf(DataDirLockedError);
      fs.writeFileSync(`${dir}.lock`, `${process.pid}\n`);
      const result = await first.db.execute(sql`select 1 as one`);
      expect(result).toBeTruthy();
    } finally {
      await first.close();
    }
    expect(fs.existsSync(`${dir}.lock`)).toBe(false);
  });
});

describe("environment", () => {
  it("defaults the data dir and demo flag", () => {
    const e = parseEnv({});
    expect(e.TIDEWRIGHT_DATA_DIR).toBe("./data/pglite");
    expect(e.TIDEWRIGHT_DEMO).toBe("1");
    expect(e.PORT).toBe(3000);
  });

  it("fails fast naming the bad variable", () => {
    expect(() => parseEnv({ DATABASE_URL: "mysql://x" })).toThrow(/DATABASE_URL: must start with postgres/);
    expect(() => parseEnv({ TIDEWRIGHT_DEMO: "yes" })).toThrow(/TIDEWRIGHT_DEMO/);
  });
});
