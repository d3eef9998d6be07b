/**
 * Browser suite runner (`npm run test:e2e`).
 *
 * 1. finds Chromium (CHROMIUM_PATH or /usr/bin/chromium)
 * 2. builds the app (`next build`; E2E_SKIP_BUILD=1 reuses the last build)
 * 3. starts `next start` on a free port, in its own process group, with its own TIDEWRIGHT_DATA_DIR
 *    in a temp dir (so the demo is seeded fresh and no developer database is touched)
 * 4. polls /api/health, runs every test of specs/index.ts in a fresh browser context
 * 5. kills the server's process group, prints "N passed, N failed", exits non-zero on any failure.
 *
 * Options: `--grep <text>` runs only tests whose name contains the text; E2E_KEEP=1 keeps the temp dir.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type BrowserContext } from "playwright-core";
import { specs } from "./specs";

const ROOT = path.resolve(__dirname, "..", "..");
const ARTIFACTS = path.join(ROOT, "tests", "e2e", "artifacts");
const NEXT_BIN = path.join(ROOT, "node_modules", "next", "dist", "bin", "next");
const RUN_LOCK = path.join(ROOT, ".tmp", "e2e.lock");
const CHROMIUM_ARGS = ["--no-sandbox", "--disable-dev-shm-usage", "--disable-background-networking", "--disable-component-update"];

const log = (msg: string) => process.stdout.write(`${msg}\n`);
const since = (t: number) => `${((Date.now() - t) / 1000).toFixed(1)} s`;

function findChromium(): string {
  const candidate = process.env.CHROMIUM_PATH || "/usr/bin/chromium";
  if (!fs.existsSync(candidate)) {
    throw new Error(
      `Chromium not found at ${candidate}. Install it with: apt-get install -y chromium ` +
        `(or set CHROMIUM_PATH to a Chromium/Chrome binary).`,
    );
  }
  return candidate;
}

function grepArg(): string | undefined {
  const i = process.argv.indexOf("--grep");
  return i >= 0 ? process.argv[i + 1] : undefined;
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}

/** One browser suite at a time per checkout: two would rebuild .next under each other. */
async function takeRunLock(): Promise<() => void> {
  fs.mkdirSync(path.dirname(RUN_LOCK), { recursive: true });
  const deadline = Date.now() + 15 * 60_000;
  let announced = false;
  for (;;) {
    try {
      fs.writeFileSync(RUN_LOCK, `${process.pid}\n`, { flag: "wx" });
      return () => fs.rmSync(RUN_LOCK, { force: true });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
      const holder = Number.parseInt(fs.readFileSync(RUN_LOCK, "utf8"), 10);
      if (!isAlive(holder)) {
        fs.rmSync(RUN_LOCK, { force: true });
        continue;
      }
      if (Date.now() > deadline) throw new Error(`Another browser suite (PID ${holder}) has held ${RUN_LOCK} for 15 min.`);
      if (!announced) log(`waiting for another browser suite to finish (PID ${holder}) …`);
      announced = true;
      await new Promise((r) => setTimeout(r, 2000));
    }
  }
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv): Promise<{ code: number; output: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { cwd: ROOT, env, stdio: ["ignore", "pipe", "pipe"] });
    let output = "";
    child.stdout.on("data", (d: Buffer) => (output += d.toString()));
    child.stderr.on("data", (d: Buffer) => (output += d.toString()));
    child.on("error", reject);
    child.on("exit", (code) => resolve({ code: code ?? 1, output }));
  });
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on("error", reject);
    server.listen(0, () => {
      const address = server.address();
      const port = typeof address === "object" && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

async function waitForHealth(baseUrl: string, server: ChildProcess, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`the app exited with code ${server.exitCode} before it was ready`);
    try {
      const res = await fetch(`${baseUrl}/api/health`, { signal: AbortSignal.timeout(15_000) });
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the app did not answer /api/health within ${timeoutMs / 1000} s`);
}

async function stopGroup(child: ChildProcess): Promise<void> {
  if (child.pid === undefined || child.exitCode !== null) return;
  const exited = new Promise<void>((r) => child.once("exit", () => r()));
  try {
    process.kill(-child.pid, "SIGTERM");
  } catch {
    return;
  }
  const timeout = new Promise<"timeout">((r) => setTimeout(() => r("timeout"), 8000));
  if ((await Promise.race([exited, timeout])) === "timeout") {
    try {
      process.kill(-child.pid, "SIGKILL");
    } catch {
      // already gone
    }
  }
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 80);

async function main(): Promise<number> {
  const started = Date.now();
  const executablePath = findChromium();
  const grep = grepArg();
  const all = specs.flatMap((s) => s.tests.map((t) => ({ file: s.file, test: t })));
  const selected = grep ? all.filter((x) => x.test.name.includes(grep)) : all;
  if (selected.length === 0) throw new Error(grep ? `no e2e test name contains "${grep}"` : "no e2e tests registered");

  const releaseLock = await takeRunLock();
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "tidewright-e2e-"));
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    TIDEWRIGHT_DATA_DIR: path.join(tmp, "pglite"),
    TIDEWRIGHT_DEMO: "1",
    TIDEWRIGHT_SKIP_BUILD_TYPECHECK: "1",
  };
  delete env.DATABASE_URL;

  let server: ChildProcess | undefined;
  let browser: Browser | undefined;
  const onSignal = () => {
    if (server?.pid) {
      try {
        process.kill(-server.pid, "SIGKILL");
      } catch {
        // gone
      }
    }
    releaseLock();
    process.exit(130);
  };
  process.once("SIGINT", onSignal);
  process.once("SIGTERM", onSignal);

  let passed = 0;
  let failed = 0;
  try {
    if (process.env.E2E_SKIP_BUILD === "1" && fs.existsSync(path.join(ROOT, ".next", "BUILD_ID"))) {
      log("reusing the last build (E2E_SKIP_BUILD=1)");
    } else {
      const t = Date.now();
      log("building the app (next build) …");
      const build = await run(process.execPath, [NEXT_BIN, "build"], env);
      if (build.code !== 0) {
        log(build.output.split("\n").slice(-60).join("\n"));
        throw new Error("next build failed");
      }
      log(`built in ${since(t)}`);
    }

    const port = await freePort();
    const baseUrl = `http://localhost:${port}`;
    const serverLog = path.join(tmp, "server.log");
    const out = fs.openSync(serverLog, "a");
    const t = Date.now();
    server = spawn(process.execPath, [NEXT_BIN, "start", "-p", String(port)], {
      cwd: ROOT,
      env: { ...env, PORT: String(port) },
      detached: true, // own process group: killed as a whole at the end
      stdio: ["ignore", out, out],
    });
    try {
      await waitForHealth(baseUrl, server, 120_000);
    } catch (err) {
      log(fs.readFileSync(serverLog, "utf8").split("\n").slice(-40).join("\n"));
      throw err;
    }
    log(`app ready at ${baseUrl} in ${since(t)} (data dir ${env.TIDEWRIGHT_DATA_DIR})`);

    browser = await chromium.launch({ executablePath, args: CHROMIUM_ARGS, headless: true });
    const opened: BrowserContext[] = [];
    const newContext = async () => {
      const c = await browser!.newContext({ baseURL: baseUrl, viewport: { width: 1280, height: 900 } });
      c.setDefaultTimeout(15_000);
      opened.push(c);
      return c;
    };

    for (const { file, test } of selected) {
      const t0 = Date.now();
      const context = await newContext();
      const page = await context.newPage();
      try {
        await test.run({ baseUrl, browser, context, page, newContext });
        passed++;
        log(`  ✓ ${test.name} (${since(t0)})`);
      } catch (err) {
        failed++;
        log(`  ✗ ${test.name} [${file}]`);
        log(`      ${(err instanceof Error ? (err.stack ?? err.message) : String(err)).split("\n").join("\n      ")}`);
        try {
          fs.mkdirSync(ARTIFACTS, { recursive: true });
          const shot = path.join(ARTIFACTS, `${slug(test.name)}.png`);
          await page.screenshot({ path: shot, fullPage: true });
          log(`      screenshot: ${path.relative(ROOT, shot)}`);
        } catch {
          // the page may be gone
        }
      } finally {
        for (const c of opened.splice(0)) await c.close().catch(() => {});
      }
    }
  } catch (err) {
    failed++;
    log(`  ✗ suite setup: ${err instanceof Error ? err.message : String(err)}`);
  } finally {
    await browser?.close().catch(() => {});
    if (server) await stopGroup(server);
    if (process.env.E2E_KEEP === "1") log(`kept ${tmp}`);
    else fs.rmSync(tmp, { recursive: true, force: true });
    releaseLock();
  }
  log(`browser suite finished in ${since(started)}`);
  log(`${passed} passed, ${failed} failed`);
  return failed === 0 ? 0 : 1;
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    log(`  ✗ ${err instanceof Error ? err.message : String(err)}`);
    log("0 passed, 1 failed");
    process.exit(1);
  },
);
