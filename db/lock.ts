/**
 * A PID lock beside a PGlite data dir. PGlite has no cross-process lock of its own and two processes on
 * one data dir corrupt it (STACK.md), so a second process fails here with a message instead.
 */
import fs from "node:fs";
import path from "node:path";

export class DataDirLockedError extends Error {
  constructor(
    readonly lockPath: string,
    readonly pid: number,
  ) {
    super(
      `The database at ${path.dirname(lockPath)} is in use by another process (PID ${pid}, lock ${lockPath}). ` +
        `Stop that process, or point TIDEWRIGHT_DATA_DIR at another directory.`,
    );
    this.name = "DataDirLockedError";
  }
}

export function lockPathFor(dataDir: string): string {
  return `${path.resolve(/*turbopackIgnore: true*/ dataDir)}.lock`;
}

export function isProcessAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    // EPERM: the process exists but belongs to someone else.
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}

function readPid(file: string): number {
  try {
    return Number.parseInt(fs.readFileSync(file, "utf8").trim().split(/\s+/)[0] ?? "", 10);
  } catch {
    return Number.NaN;
  }
}

/** Take the lock for `dataDir` or throw DataDirLockedError. Returns a release function. */
export function acquireDataDirLock(dataDir: string): () => void {
  const lockPath = lockPathFor(dataDir);
  fs.mkdirSync(path.dirname(lockPath), { recursive: true });
  for (let attempt = 0; attempt < 3; attempt++) {
    try {
      fs.writeFileSync(lockPath, `${process.pid}\n`, { flag: "wx" });
      clearStalePostmasterPid(dataDir);
      let released = false;
      return () => {
        if (released) return;
        released = true;
        if (readPid(lockPath) === process.pid) fs.rmSync(lockPath, { force: true });
      };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
      const holder = readPid(lockPath);
      if (holder !== process.pid && isProcessAlive(holder)) throw new DataDirLockedError(lockPath, holder);
      // Stale (holder dead) or left by this very process (e.g. a dev-server module reload): take it over.
      fs.rmSync(lockPath, { force: true });
    }
  }
  throw new Error(`Could not take the database lock ${lockPath}`);
}

/**
 * After a kill -9 the embedded Postgres leaves postmaster.pid behind, which can block the next start.
 * We only get here holding our own lock, so no live process of ours is using the dir.
 */
function clearStalePostmasterPid(dataDir: string): void {
  const file = path.join(dataDir, "postmaster.pid");
  if (!fs.existsSync(file)) return;
  const pid = readPid(file);
  if (pid === process.pid) return;
  // Inside PGlite the recorded PID is the WASM process's (often small / not ours); the lock is the truth.
  fs.rmSync(file, { force: true });
}
