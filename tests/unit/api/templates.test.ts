/** GET /api/templates: the built-in templates for any signed-in user; each is a valid definition. */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { GET as templatesRoute } from "@/app/api/templates/route";
import { sequenceDefinition } from "@/machines/schema";
import { TEMPLATES } from "@/machines/templates";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
});
afterAll(async () => {
  await t.close();
});

interface Body {
  templates: Array<{ id: string; title: string; description: string; definition: unknown }>;
}

describe("GET /api/templates", () => {
  it.each(["engineer", "viewer"] as const)("lists every template for a %s", async (role) => {
    const res = await t.call<Body>(templatesRoute, { as: role });
    expect(res.status).toBe(200);
    expect(res.body.templates.map((x) => x.id)).toEqual(TEMPLATES.map((x) => x.id));
    expect(res.body.templates.map((x) => x.id)).toEqual(expect.arrayContaining(["volume-control", "assist-volume"]));
    for (const template of res.body.templates) {
      expect(template.title.length).toBeGreaterThan(0);
      expect(sequenceDefinition.safeParse(template.definition).success).toBe(true);
    }
  });

  it("answers 401 without a session", async () => {
    expect((await t.call(templatesRoute)).status).toBe(401);
  });
});
