import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { spawn } from "node:child_process";
import { afterEach, describe, expect, it } from "vitest";
import { acquireDataDirLock, DataDirLockedError, lockPathFor } from "@/db/lock";

const dirs: string[] = [];
function tempDataDir(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "tidewright-lock-"));
  dirs.push(dir);
  return path.join(dir, "pglite");
}
afterEach(() => {
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});

describe("data dir lock", () => {
  it("writes our PID and removes the lock on release", () => {
    const dataDir = tempDataDir();
    const release = acquireDataDirLock(dataDir);
    expect(fs.readFileSync(lockPathFor(dataDir), "utf8").trim()).toBe(String(process.pid));
    release();
    expect(fs.existsSync(lockPathFor(dataDir))).toBe(false);
  });

  it("refuses with a clear message while another live process holds it", async () => {
    const dataDir = tempDataDir();
    const child = spawn(process.execPath, ["-e", "setTimeout(() => {}, 30000)"], { stdio: "ignore" });
    try {
      fs.writeFileSync(lockPathFor(dataDir), `${child.pid}\n`);
      let caught: unknown;
      try {
        acquireDataDirLock(dataDir);
      } catch (err) {
        caught = err;
      }
      expect(caught).toBeInstanceOf(DataDirLockedError);
      expect((caught as Error).message).toContain(`in use by another process (PID ${child.pid}`);
      expect((caught as Error).message).toContain("TIDEWRIGHT_DATA_DIR");
    } finally {
      child.kill("SIGKILL");
    }
  });

  it("takes over a stale lock whose PID is dead and clears a stale postmaster.pid", async () => {
    const dataDir = tempDataDir();
    const child = spawn(process.execPath, ["-e", ""], { stdio: "ignore" });
    await new Promise((resolve) => child.on("exit", resolve));
    fs.mkdirSync(dataDir, { recursive: true });
    fs.writeFileSync(lockPathFor(dataDir), `${child.pid}\n`);
    fs.writeFileSync(path.join(dataDir, "postmaster.pid"), "-42\n/tmp/pglite/base\n");
    const release = acquireDataDirLock(dataDir);
    expect(fs.readFileSync(lockPathFor(dataDir), "utf8").trim()).toBe(String(process.pid));
    expect(fs.existsSync(path.join(dataDir, "postmaster.pid"))).toBe(false);
    release();
  });
});
