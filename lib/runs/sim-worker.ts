/**
 * Simulation worker thread. Started by lib/runs/pool.ts with
 * `new Worker(new URL("./sim-worker.ts", import.meta.url))`: under `next start`/`next dev` Turbopack
 * bundles this file as its own worker entry; under Vitest and tsx it is loaded as TypeScript through
 * tsx's CommonJS hook. Must not import server-only modules.
 */
import { parentPort } from "node:worker_threads";
import { executeJob } from "./execute";
import { RunControl, transferablesOf, type FromWorker, type ToWorker } from "./protocol";

const port = parentPort;
if (port) {
  port.on("message", (message: ToWorker) => {
    if (message.type !== "run") return;
    const outcome = executeJob(message.job, new RunControl(message.control));
    let reply: FromWorker;
    if (outcome.ok) {
      reply = { type: "done", jobId: message.jobId, output: outcome.output };
      port.postMessage(reply, transferablesOf(outcome.output));
    } else {
      reply = { type: "failed", jobId: message.jobId, reason: outcome.reason, error: outcome.error };
      port.postMessage(reply);
    }
  });
  const ready: FromWorker = { type: "ready" };
  port.postMessage(ready);
}
