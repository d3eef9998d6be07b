/**
 * The one database client of the process.
 *
 * - PGlite (embedded Postgres) in TIDEWRIGHT_DATA_DIR by default; DATABASE_URL=postgres://… selects a
 *   PostgreSQL server through node-postgres. Same schema, same migrations.
 * - Opened lazily on the first `getDb()` call — never at import, so `next build` never touches it.
 * - One instance per process, kept on globalThis because Next may bundle this module into several chunks.
 * - A PID lock beside the PGlite data dir (db/lock.ts); closed on SIGINT/SIGTERM.
 * - On open: migrations applied (db/migrate.ts), then the demo seeded into an empty database unless
 *   TIDEWRIGHT_DEMO=0 (db/seed.ts).
 */
import "server-only";
import fs from "node:fs";
import path from "node:path";
import type { PgDatabase, PgQueryResultHKT } from "drizzle-orm/pg-core";
import type { PgliteDatabase } from "drizzle-orm/pglite";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import { env } from "@/lib/env";
import * as schema from "./schema";
import { acquireDataDirLock } from "./lock";

export type Schema = typeof schema;
/** What query modules take: works the same on PGlite and node-postgres. */
export type Db = PgDatabase<PgQueryResultHKT, Schema>;

export type DbHandle =
  | { kind: "pglite"; db: Db; driverDb: PgliteDatabase<Schema>; location: string; close: () => Promise<void> }
  | { kind: "postgres"; db: Db; driverDb: NodePgDatabase<Schema>; location: string; close: () => Promise<void> };

export interface OpenOptions {
  /** PGlite data directory; ignored when `databaseUrl` is given. */
  dataDir?: string;
  databaseUrl?: string;
  /** Skip the PID lock (only for a throwaway copy that no other process can know about). */
  noLock?: boolean;
}

/** Open a client without migrating or seeding. Most code wants `getDb()` instead. */
export async function openDatabase(options: OpenOptions): Promise<DbHandle> {
  if (options.databaseUrl) {
    const { Pool } = await import("pg");
    const { drizzle } = await import("drizzle-orm/node-postgres");
    const pool = new Pool({ connectionString: options.databaseUrl, max: 10 });
    const driverDb = drizzle(pool, { schema });
    const location = options.databaseUrl.replace(/\/\/[^@/]*@/, "//***@");
    return { kind: "postgres", db: driverDb as unknown as Db, driverDb, location, close: () => pool.end() };
  }
  // turbopackIgnore: the data dir is chosen at run time and must not be traced into the build output.
  const dataDir = path.resolve(/*turbopackIgnore: true*/ options.dataDir ?? "./data/pglite");
  fs.mkdirSync(path.dirname(dataDir), { recursive: true });
  const release = options.noLock ? () => {} : acquireDataDirLock(dataDir);
  // Next's own SIGINT/SIGTERM handlers may exit before our async close runs: drop the lock on any exit.
  process.once("exit", release);
  try {
    const { PGlite } = await import("@electric-sql/pglite");
    const { drizzle } = await import("drizzle-orm/pglite");
    const client = await PGlite.create(dataDir);
    const driverDb = drizzle(client, { schema });
    let closed = false;
    const close = async () => {
      if (closed) return;
      closed = true;
      try {
        await client.close();
      } finally {
        release();
      }
    };
    return { kind: "pglite", db: driverDb as unknown as Db, driverDb, location: dataDir, close };
  } catch (err) {
    release();
    throw err;
  }
}

interface ProcessDbState {
  promise?: Promise<DbHandle>;
  handle?: DbHandle;
  signalsHooked?: boolean;
}

const STATE_KEY = Symbol.for("tidewright.db");
function state(): ProcessDbState {
  const g = globalThis as unknown as Record<symbol, ProcessDbState | undefined>;
  g[STATE_KEY] ??= {};
  return g[STATE_KEY];
}

async function startDatabase(): Promise<DbHandle> {
  const started = Date.now();
  const config = env();
  const handle = await openDatabase({ dataDir: config.TIDEWRIGHT_DATA_DIR, databaseUrl: config.DATABASE_URL });
  try {
    const { migrateDatabase } = await import("./migrate");
    await migrateDatabase(handle);
    const { seedIfEmpty } = await import("./seed");
    await seedIfEmpty(handle.db, { demo: config.TIDEWRIGHT_DEMO !== "0" });
  } catch (err) {
    await handle.close().catch(() => {});
    throw err;
  }
  hookSignals();
  console.info(`[db] ${handle.kind} ready at ${handle.location} in ${Date.now() - started} ms`);
  return handle;
}

/** The process's database, opened (and migrated, and seeded) on first use. */
export async function getDb(): Promise<Db> {
  const s = state();
  if (s.handle) return s.handle.db;
  s.promise ??= startDatabase().then(
    (handle) => {
      s.handle = handle;
      return handle;
    },
    (err: unknown) => {
      s.promise = undefined; // let the next request retry (e.g. after the other process exits)
      throw err;
    },
  );
  return (await s.promise).db;
}

/** Install an already opened (and migrated) handle as the process's database. For tests and tools. */
export function installDatabase(handle: DbHandle): void {
  const s = state();
  s.handle = handle;
  s.promise = Promise.resolve(handle);
}

/** Close the process's database if open. Safe to call twice. */
export async function closeDb(): Promise<void> {
  const s = state();
  const handle = s.handle ?? (s.promise ? await s.promise.catch(() => undefined) : undefined);
  s.handle = undefined;
  s.promise = undefined;
  if (handle) await handle.close();
}

function hookSignals(): void {
  const s = state();
  if (s.signalsHooked) return;
  s.signalsHooked = true;
  for (const signal of ["SIGINT", "SIGTERM"] as const) {
    process.once(signal, () => {
      const code = signal === "SIGINT" ? 130 : 143;
      // Give the embedded Postgres a moment to checkpoint, but never hang the shutdown.
      const timer = setTimeout(() => process.exit(code), 3000);
      closeDb()
        .catch((err: unknown) => console.error("[db] close failed", err))
        .finally(() => {
          clearTimeout(timer);
          process.exit(code);
        });
    });
  }
}

export { schema };
