import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { POST as signIn } from "@/app/api/auth/sign-in/route";
import { DEMO_PASSWORD } from "@/db/seed";
import { THROTTLE } from "@/db/throttle";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

const attempt = (email: string, password: string, ip: string) =>
  t.call<{ error: string }>(signIn, { body: { email, password }, headers: { "x-forwarded-for": ip } });

describe("sign-in throttling", () => {
  it("locks an account after repeated failures, even for the right password, with a clear 429", async () => {
    for (let i = 0; i < THROTTLE.accountLimit; i++) {
      expect((await attempt("viewer@demo.test", "wrong", `10.0.0.${i}`)).status).toBe(401);
    }
    const locked = await attempt("viewer@demo.test", DEMO_PASSWORD, "10.0.1.1");
    expect(locked.status).toBe(429);
    expect(locked.body.error).toMatch(/^Too many failed sign-in attempts\. Try again in \d+ minutes?\.$/);
    expect(Number(locked.headers.get("retry-after"))).toBeGreaterThan(60);
    // Other accounts are not affected.
    expect((await attempt("engineer@demo.test", DEMO_PASSWORD, "10.0.1.1")).status).toBe(200);
  });

  it("locks a client address after repeated failures across accounts", async () => {
    const ip = "192.0.2.77";
    for (let i = 0; i < THROTTLE.ipLimit; i++) {
      expect((await attempt(`someone-${i}@demo.test`, "wrong", ip)).status).toBe(401);
    }
    expect((await attempt("clinician@demo.test", DEMO_PASSWORD, ip)).status).toBe(429);
    expect((await attempt("clinician@demo.test", DEMO_PASSWORD, "192.0.2.78")).status).toBe(200);
  });

  it("clears an account's count on success", async () => {
    for (let i = 0; i < THROTTLE.accountLimit - 1; i++) await attempt("admin@demo.test", "wrong", "198.51.100.1");
    expect((await attempt("admin@demo.test", DEMO_PASSWORD, "198.51.100.2")).status).toBe(200);
    for (let i = 0; i < THROTTLE.accountLimit - 1; i++) {
      expect((await attempt("admin@demo.test", "wrong", "198.51.100.3")).status).toBe(401);
    }
  });
});
