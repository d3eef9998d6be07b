/**
 * The browser suite's tiny test API. A spec file exports `tests: E2ETest[]`; specs/index.ts lists the
 * spec files; run.ts builds and starts the app, then runs every test in a fresh browser context.
 */
import assert from "node:assert/strict";
import type { Browser, BrowserContext, Page } from "playwright-core";

export interface E2EContext {
  /** e.g. http://localhost:41234 — the app under test, with its own data dir and the demo seeded. */
  baseUrl: string;
  browser: Browser;
  /** A fresh, isolated browser context (no cookies) for this test. Closed by the runner. */
  context: BrowserContext;
  /** A page in `context`, already created. */
  page: Page;
  /** Another isolated context, e.g. to act as a second user at the same time. Closed by the runner. */
  newContext(): Promise<BrowserContext>;
}

export interface E2ETest {
  name: string;
  run(ctx: E2EContext): Promise<void>;
}

/** Define a test: `test("sign-in shows the role", async ({ page }) => { … })`. */
export function test(name: string, run: E2ETest["run"]): E2ETest {
  return { name, run };
}

export { assert };

/** Wait until `fn` stops throwing (or time out with its last error): for UI that settles asynchronously. */
export async function eventually<T>(fn: () => Promise<T>, timeoutMs = 10_000, intervalMs = 100): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: unknown;
  while (Date.now() < deadline) {
    try {
      return await fn();
    } catch (err) {
      last = err;
      await new Promise((r) => setTimeout(r, intervalMs));
    }
  }
  throw last instanceof Error ? last : new Error(String(last));
}
