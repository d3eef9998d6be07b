/**
 * Runs benchmark (issue 5 §7). Prints figures; exits non-zero only if the harness itself fails.
 *
 *   npm run bench:runs                 # BENCH_LOAD_S=10 by default (autocannon duration per load test)
 *   BENCH_URL=http://127.0.0.1:3000 npm run bench:runs   # against a running `next start` instead
 *     (signs in as engineer@demo.test, creates a pressure-control sequence; loopback URLs only)
 *
 * 1. POST /api/runs for a 60 s run, end to end over HTTP (wait: true → 201 after the result is stored).
 * 2. GET /api/runs/:id/waveform for a 10-minute run: cold (blob read from the database and inflated)
 *    and warm (decoded waveforms cached).
 * 3. autocannon on loopback (127.0.0.1 only), 50 connections, bounded duration: GET run summary, and
 *    GET waveform window. p50/p95/p99 from every response time, plus errors / non-2xx / timeouts.
 *
 * The route handlers are served by a plain node:http server in a child process (the app's own handlers,
 * wrapper, session check and database — not `next start`, which would need a production build). The
 * child runs with the react-server condition so `server-only` modules load, on a copy of the test
 * database template, and uses the same simulation worker pool as the app.
 *
 * Targets: POST 60 s run p95 < 150 ms; waveform window < 30 ms; summary GET p99 < 50 ms; 0 errors.
 */
import { fork, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import http from "node:http";
import { createRequire } from "node:module";
import os from "node:os";
import path from "node:path";

const ROLE = process.env.TIDEWRIGHT_BENCH_ROLE;
const HOST = "127.0.0.1";

interface ServerInfo {
  port: number;
  /** false against an external server: no cache-drop hook, so the cold window is not measured. */
  benchHooks: boolean;
  cookie: string;
  revisionId: string;
  caseId: string;
}

type Ready = { type: "ready"; info: ServerInfo };

// ---------------------------------------------------------------- server (child process)

async function serve(): Promise<void> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "tidewright-bench-db-"));
  const { ensureTemplate } = await import("@/tests/fixtures/db-template");
  const { dir: template } = await ensureTemplate();
  fs.cpSync(template, dir, { recursive: true });
  const { openDatabase, installDatabase, closeDb } = await import("@/db");
  const handle = await openDatabase({ dataDir: dir, noLock: true });
  installDatabase(handle);
  const db = handle.db;

  const { seedPatientCases, isoCaseName } = await import("@/db/seed-cases");
  await seedPatientCases(db);
  const { eq, and, inArray } = await import("drizzle-orm");
  const { patientCases, revisions, sequences, users, projects } = await import("@/db/schema");
  const { getTemplate } = await import("@/machines/templates");
  const { luciaFor } = await import("@/lib/auth/lucia");
  const { DEMO_SCENARIO } = await import("@/db/seed");

  const [engineer] = await db.select().from(users).where(eq(users.email, "engineer@demo.test")).limit(1);
  const [project] = await db.select().from(projects).where(eq(projects.name, DEMO_SCENARIO.programme)).limit(1);
  const [isoCase] = await db
    .select()
    .from(patientCases)
    .where(and(eq(patientCases.seeded, true), inArray(patientCases.name, [isoCaseName(1)])))
    .limit(1);
  const definition = getTemplate("pressure-control")?.definition;
  if (!engineer || !project || !isoCase || !definition) throw new Error("bench setup: demo data missing");
  const [seq] = await db.insert(sequences).values({ projectId: project.id, name: "Bench pressure control" }).returning();
  const [rev] = await db
    .insert(revisions)
    .values({ sequenceId: seq.id, number: 1, definition, layout: {}, hash: "bench", message: "bench" })
    .returning();
  const lucia = luciaFor(db);
  const session = await lucia.createSession(engineer.id, {});

  const runsRoute = await import("@/app/api/runs/route");
  const runRoute = await import("@/app/api/runs/[id]/route");
  const windowRoute = await import("@/app/api/runs/[id]/waveform/route");
  const { waveformCache } = await import("@/lib/runs/waveform-cache");
  const { warmSimulationPool, simulationPool } = await import("@/lib/runs/pool");
  warmSimulationPool();

  type Handler = (req: Request, args: { params: Promise<Record<string, string>> }) => Promise<Response>;
  const routes: Array<{ method: string; pattern: RegExp; handler: Handler }> = [
    { method: "POST", pattern: /^\/api\/runs$/, handler: runsRoute.POST },
    { method: "GET", pattern: /^\/api\/runs$/, handler: runsRoute.GET },
    { method: "GET", pattern: /^\/api\/runs\/(?<id>[^/]+)$/, handler: runRoute.GET },
    { method: "GET", pattern: /^\/api\/runs\/(?<id>[^/]+)\/waveform$/, handler: windowRoute.GET },
  ];

  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", `http://${req.headers.host ?? HOST}`);
    if (url.pathname.startsWith("/__bench/drop-cache/")) {
      waveformCache().delete(url.pathname.split("/").pop() ?? "");
      res.writeHead(204).end();
      return;
    }
    const route = routes.find((r) => r.method === req.method && r.pattern.test(url.pathname));
    if (!route) {
      res.writeHead(404).end();
      return;
    }
    const params = (url.pathname.match(route.pattern)?.groups ?? {}) as Record<string, string>;
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
      const body = chunks.length > 0 ? Buffer.concat(chunks) : undefined;
      const request = new Request(url, { method: req.method, headers, body });
      route
        .handler(request, { params: Promise.resolve(params) })
        .then(async (response) => {
          const out = Buffer.from(await response.arrayBuffer());
          const h: Record<string, string> = {};
          response.headers.forEach((v, k) => (h[k] = v));
          h["content-length"] = String(out.length);
          res.writeHead(response.status, h).end(out);
        })
        .catch((err: unknown) => {
          console.error(err);
          res.writeHead(500).end();
        });
    });
  });
  server.keepAliveTimeout = 60_000;
  await new Promise<void>((resolve) => server.listen(0, HOST, resolve));
  const address = server.address();
  if (!address || typeof address === "string") throw new Error("no port");
  // Give the pool a moment to have its workers up before the first timed request.
  for (let i = 0; i < 200 && simulationPool().mode === "idle"; i++) await new Promise((r) => setTimeout(r, 10));

  const ready: Ready = {
    type: "ready",
    info: { port: address.port, benchHooks: true, cookie: `${lucia.sessionCookieName}=${session.id}`, revisionId: rev.id, caseId: isoCase.id },
  };
  process.send?.(ready);
  process.on("message", (m: unknown) => {
    if (m === "stop") {
      server.close();
      void simulationPool()
        .shutdown()
        .then(() => closeDb())
        .finally(() => {
          fs.rmSync(dir, { recursive: true, force: true });
          process.exit(0);
        });
    }
  });
}

// ---------------------------------------------------------------- driver

interface Stats {
  n: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
  mean: number;
}

function stats(samples: number[]): Stats {
  const s = [...samples].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1))];
  return { n: s.length, p50: q(50), p95: q(95), p99: q(99), max: s[s.length - 1], mean: s.reduce((a, b) => a + b, 0) / s.length };
}

const ms = (x: number) => `${x.toFixed(1)} ms`;
function line(label: string, s: Stats, target?: string) {
  console.log(
    `${label.padEnd(44)} n=${String(s.n).padStart(6)}  p50 ${ms(s.p50).padStart(9)}  p95 ${ms(s.p95).padStart(9)}  p99 ${ms(s.p99).padStart(9)}  max ${ms(s.max).padStart(9)}${target ? `   target ${target}` : ""}`,
  );
}

const agent = new http.Agent({ keepAlive: true, maxSockets: 1 });

function request(info: ServerInfo, method: string, pathName: string, body?: unknown): Promise<{ status: number; text: string; ms: number }> {
  return new Promise((resolve, reject) => {
    const payload = body === undefined ? undefined : JSON.stringify(body);
    const started = performance.now();
    const req = http.request(
      {
        host: HOST,
        port: info.port,
        path: pathName,
        method,
        agent,
        headers: {
          cookie: info.cookie,
          host: `${HOST}:${info.port}`,
          origin: `http://${HOST}:${info.port}`,
          ...(payload ? { "content-type": "application/json", "content-length": Buffer.byteLength(payload) } : {}),
        },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString("utf8"), ms: performance.now() - started }));
      },
    );
    req.on("error", reject);
    if (payload) req.write(payload);
    req.end();
  });
}

interface AutocannonResult {
  errors: number;
  timeouts: number;
  non2xx: number;
  requests: { total: number; average: number };
}
interface AutocannonInstance {
  on(event: "response", fn: (client: unknown, statusCode: number, resBytes: number, responseTime: number) => void): void;
}
type Autocannon = (
  opts: { url: string; connections: number; duration: number; headers: Record<string, string> },
  cb: (err: Error | null, result: AutocannonResult) => void,
) => AutocannonInstance;

async function load(info: ServerInfo, label: string, pathName: string, durationS: number, target: string) {
  const autocannon = createRequire(__filename)("autocannon") as Autocannon;
  const times: number[] = [];
  const result = await new Promise<AutocannonResult>((resolve, reject) => {
    const instance = autocannon(
      { url: `http://${HOST}:${info.port}${pathName}`, connections: 50, duration: durationS, headers: { cookie: info.cookie } },
      (err, res) => (err ? reject(err) : resolve(res)),
    );
    instance.on("response", (_c, _status, _bytes, responseTime) => times.push(responseTime));
  });
  line(`${label} (50 conns, ${durationS} s)`, stats(times), target);
  console.log(
    `${"".padEnd(44)} ${result.requests.total} requests, ${result.requests.average.toFixed(0)} req/s; errors ${result.errors}, timeouts ${result.timeouts}, non-2xx ${result.non2xx}`,
  );
  return result.errors + result.timeouts + result.non2xx;
}

/** Sign in and make a revision on a running app (BENCH_URL), through its public API only. */
async function externalServer(base: string): Promise<ServerInfo> {
  const url = new URL(base);
  if (url.hostname !== HOST) throw new Error(`BENCH_URL must be on ${HOST} (loopback only)`);
  const origin = url.origin;
  const json = async (res: Response) => (await res.json()) as Record<string, unknown>;
  const signIn = await fetch(`${origin}/api/auth/sign-in`, {
    method: "POST",
    headers: { "content-type": "application/json", origin },
    body: JSON.stringify({ email: "engineer@demo.test", password: "tidewright-demo" }),
  });
  if (!signIn.ok) throw new Error(`sign-in: ${signIn.status}`);
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  const get = async (p: string) => json(await fetch(`${origin}${p}`, { headers: { cookie } }));
  const projectsBody = (await get("/api/projects")) as { projects: Array<{ id: string }> };
  const seq = await json(
    await fetch(`${origin}/api/projects/${projectsBody.projects[0].id}/sequences`, {
      method: "POST",
      headers: { "content-type": "application/json", origin, cookie },
      body: JSON.stringify({ name: `Bench ${Date.now()}`, template: "pressure-control" }),
    }),
  );
  const revs = (await get(`/api/sequences/${String(seq.id)}/revisions`)) as { revisions: Array<{ id: string }> };
  const cases = (await get("/api/cases")) as { cases: Array<{ id: string; name: string }> };
  const iso = cases.cases.find((c) => c.name === "ISO 80601-2-12 test lung, row 1") ?? cases.cases[0];
  return { port: Number(url.port || 80), benchHooks: false, cookie, revisionId: revs.revisions[0].id, caseId: iso.id };
}

async function drive(): Promise<void> {
  const loadS = Number(process.env.BENCH_LOAD_S ?? "10");
  if (process.env.BENCH_URL) {
    const info = await externalServer(process.env.BENCH_URL);
    await measure(info, loadS, `external server ${process.env.BENCH_URL}`);
    agent.destroy();
    return;
  }
  const child: ChildProcess = fork(__filename, [], {
    env: { ...process.env, TIDEWRIGHT_BENCH_ROLE: "server", NODE_ENV: "production" },
    execArgv: ["--conditions=react-server", "--import", "tsx"],
    stdio: ["ignore", "inherit", "inherit", "ipc"],
  });
  const info = await new Promise<ServerInfo>((resolve, reject) => {
    child.once("message", (m: Ready) => resolve(m.info));
    child.once("exit", (code) => reject(new Error(`bench server exited (${code})`)));
  });
  try {
    await measure(info, loadS, "route handlers on node:http (child process)");
  } finally {
    child.send("stop");
    await new Promise((r) => child.once("exit", r));
    agent.destroy();
  }
}

async function measure(info: ServerInfo, loadS: number, what: string): Promise<void> {
  let failures = 0;
  {
    console.log(`Tidewright runs benchmark — Node ${process.version}, ${os.availableParallelism()} CPUs, load average ${os.loadavg()[0].toFixed(2)}; ${what} on ${HOST}:${info.port}\n`);
    const runBody = (duration: number) => ({ revisionId: info.revisionId, caseId: info.caseId, duration, rig: "project" });

    // 1. POST a 60 s run, end to end.
    for (let i = 0; i < 2; i++) await request(info, "POST", "/api/runs", runBody(60)); // warm-up (JIT, worker)
    const postTimes: number[] = [];
    let runId = "";
    let wallMs = 0;
    for (let i = 0; i < 20; i++) {
      const r = await request(info, "POST", "/api/runs", runBody(60));
      if (r.status !== 201) {
        failures++;
        console.error(`POST → ${r.status} ${r.text}`);
        continue;
      }
      postTimes.push(r.ms);
      runId = (JSON.parse(r.text) as { id: string }).id;
    }
    line("POST /api/runs, 60 s run (wait → 201)", stats(postTimes), "p95 < 150 ms");
    const view = JSON.parse((await request(info, "GET", `/api/runs/${runId}`)).text) as { wallMs: number; summary: { breaths: number; vti: number } };
    wallMs = view.wallMs;
    console.log(`${"".padEnd(44)} engine wall time of one 60 s run ${ms(wallMs)}; ${view.summary.breaths} breaths, Vti ${view.summary.vti.toFixed(1)} mL`);

    // 2. A 10-minute run and its waveform window.
    const long = await request(info, "POST", "/api/runs", runBody(600));
    if (long.status !== 201) throw new Error(`600 s run: ${long.status} ${long.text}`);
    const longId = (JSON.parse(long.text) as { id: string }).id;
    console.log(`${"POST /api/runs, 600 s run".padEnd(44)} ${ms(long.ms)} (one run)`);
    const windowPath = `/api/runs/${longId}/waveform?from=0&to=600&points=2000&signals=paw,flow,volume,pmus`;
    if (info.benchHooks) {
      const cold: number[] = [];
      for (let i = 0; i < 5; i++) {
        await request(info, "GET", `/__bench/drop-cache/${longId}`);
        const r = await request(info, "GET", windowPath);
        if (r.status !== 200) failures++;
        cold.push(r.ms);
      }
      line("GET waveform, 10-min run, whole, cold", stats(cold), "< 30 ms");
    }
    const warm: number[] = [];
    for (let i = 0; i < 50; i++) {
      const r = await request(info, "GET", windowPath);
      if (r.status !== 200) failures++;
      warm.push(r.ms);
    }
    line("GET waveform, 10-min run, whole, cached", stats(warm), "< 30 ms");
    const zoom: number[] = [];
    for (let i = 0; i < 50; i++) {
      const from = (i * 11) % 590;
      const r = await request(info, "GET", `/api/runs/${longId}/waveform?from=${from}&to=${from + 6}&points=1500`);
      if (r.status !== 200) failures++;
      zoom.push(r.ms);
    }
    line("GET waveform, 10-min run, 6 s zoom, cached", stats(zoom), "< 30 ms");

    // 3. Load on loopback.
    console.log("");
    failures += await load(info, "GET /api/runs/:id (summary)", `/api/runs/${runId}`, loadS, "p99 < 50 ms, 0 errors");
    failures += await load(info, "GET waveform window (60 s run, whole)", `/api/runs/${runId}/waveform?points=2000`, loadS, "0 errors");
    failures += await load(info, "GET waveform window (10-min run, 6 s)", `/api/runs/${longId}/waveform?from=300&to=306&points=1500`, loadS, "0 errors");
    console.log(`\n${failures === 0 ? "0 errors" : `${failures} errors / non-2xx`} in total.`);
  }
}

if (ROLE === "server") {
  serve().catch((err: unknown) => {
    console.error("[bench server]", err);
    process.exit(1);
  });
} else {
  drive().catch((err: unknown) => {
    console.error(err);
    process.exit(1);
  });
}
