import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listRoute, POST as createRoute } from "@/app/api/cases/route";
import { GET as getRoute, PATCH as patchRoute } from "@/app/api/cases/[id]/route";
import { ISO_CASES, SEED_CASES, complianceFromHpa, isoCaseName, pressureFromHpa, resistanceFromHpa, seedPatientCases } from "@/db/seed-cases";
import type { PatientCaseView } from "@/db/queries/cases";
import type { Role } from "@/lib/auth/roles";
import { openTestDb, type TestDb } from "@/tests/fixtures/test-db";
import { unique } from "@/tests/unit/runs/fixtures";

let t: TestDb;
beforeAll(async () => {
  t = await openTestDb();
  await seedPatientCases(t.db); // idempotent: the base seed step may already have added them
});
afterAll(async () => {
  await t.close();
});

const patient = { complianceMlPerCmH2O: 42, resistanceCmH2OPerLps: 7 };

describe("seeded case library", () => {
  it("has the eight ISO 80601-2-12 adult rows and our seven examples, each with its source", async () => {
    const res = await t.call<{ cases: PatientCaseView[] }>(listRoute, { as: "viewer" });
    expect(res.status).toBe(200);
    const seeded = res.body.cases.filter((c) => c.seeded);
    expect(seeded.map((c) => c.name)).toEqual(expect.arrayContaining(SEED_CASES.map((c) => c.name)));
    expect(seeded.length).toBe(15);
    for (const c of seeded) {
      expect(c.source.length).toBeGreaterThan(20);
      expect(c.patient).not.toBeNull();
    }
    for (const c of seeded.filter((x) => x.name.startsWith("ISO"))) {
      expect(c.source).toContain("ISO 80601-2-12:2020 Table 201.105");
      expect(c.source).toContain("transcribed");
    }
    for (const c of seeded.filter((x) => !x.name.startsWith("ISO"))) {
      expect(c.source).toMatch(/published|memory|common practice/);
    }
    // Seeding twice adds nothing.
    expect(await seedPatientCases(t.db)).toBe(0);
  });

  it("converts the ISO row 1 test lung from hPa: C 50 mL/hPa → 49.0333 mL/cmH2O, R 5 hPa/(L/s) → 5.0986 (1 hPa = 1.019716 cmH2O, derived)", async () => {
    expect(complianceFromHpa(50)).toBeCloseTo(50 / 1.019716, 3);
    expect(resistanceFromHpa(5)).toBeCloseTo(5 * 1.019716, 3);
    expect(pressureFromHpa(10)).toBeCloseTo(10.19716, 3);
    const row1 = ISO_CASES[0];
    expect(row1.name).toBe(isoCaseName(1));
    expect(row1.patient.complianceMlPerCmH2O).toBeCloseTo(49.0333, 3);
    expect(row1.patient.resistanceCmH2OPerLps).toBeCloseTo(5.0986, 3);
    // Row 7: C 10 mL/hPa, R 50 hPa/(L/s).
    expect(ISO_CASES[6].patient.complianceMlPerCmH2O).toBeCloseTo(9.8067, 3);
    expect(ISO_CASES[6].patient.resistanceCmH2OPerLps).toBeCloseTo(50.9858, 3);
  });
});

describe("GET /api/cases", () => {
  it("401 without a session", async () => {
    expect((await t.call(listRoute)).status).toBe(401);
  });
  it("every role reads", async () => {
    for (const role of ["admin", "engineer", "clinician", "viewer"] as Role[]) {
      expect((await t.call(listRoute, { as: role })).status).toBe(200);
    }
  });
});

describe("POST /api/cases", () => {
  it.each(["admin", "engineer", "clinician"] as Role[])("201 for %s, defaults filled in", async (role) => {
    const name = unique(`Case by ${role}`);
    const res = await t.call<PatientCaseView>(createRoute, { as: role, body: { name, source: "memory", patient } });
    expect(res.status).toBe(201);
    expect(res.body.name).toBe(name);
    expect(res.body.seeded).toBe(false);
    expect(res.body.patient?.effort.shape).toBe("none");
    expect(res.body.patient?.leak.kind).toBe("none");
    const got = await t.call<PatientCaseView>(getRoute, { as: "viewer", params: { id: res.body.id } });
    expect(got.status).toBe(200);
    expect(got.body.patient?.complianceMlPerCmH2O).toBe(42);
  });

  it("403 for a viewer, 401 anonymous", async () => {
    expect((await t.call(createRoute, { as: "viewer", body: { name: "x", patient } })).status).toBe(403);
    expect((await t.call(createRoute, { body: { name: "x", patient } })).status).toBe(401);
  });

  it("400 with field errors for bad lung values and unknown fields", async () => {
    const bad = await t.call<{ error: string; fields: Record<string, string[]> }>(createRoute, {
      as: "clinician",
      body: { name: "Bad", patient: { complianceMlPerCmH2O: -3, resistanceCmH2OPerLps: 5 } },
    });
    expect(bad.status).toBe(400);
    expect(bad.body.fields["patient.complianceMlPerCmH2O"]).toBeDefined();
    expect((await t.call(createRoute, { as: "clinician", body: { name: "", patient } })).status).toBe(400);
    expect((await t.call(createRoute, { as: "clinician", body: { name: "x", patient, extra: 1 } })).status).toBe(400);
    expect((await t.call(createRoute, { as: "clinician", body: "{not json" })).status).toBe(400);
  });

  it("403 for a cross-site request", async () => {
    const res = await t.call(createRoute, { as: "engineer", body: { name: "x", patient }, headers: { origin: "https://evil.example" } });
    expect(res.status).toBe(403);
  });
});

describe("PATCH /api/cases/:id", () => {
  it("200 for an editor; the change is stored", async () => {
    const created = await t.call<PatientCaseView>(createRoute, { as: "engineer", body: { name: unique("Editable"), patient } });
    const res = await t.call<PatientCaseView>(patchRoute, {
      as: "clinician",
      method: "PATCH",
      params: { id: created.body.id },
      body: { description: "now with effort", patient: { ...patient, effort: { shape: "half-sine", amplitudeCmH2O: 4 } } },
    });
    expect(res.status).toBe(200);
    expect(res.body.description).toBe("now with effort");
    expect(res.body.patient?.effort.amplitudeCmH2O).toBe(4);
    expect(new Date(res.body.updatedAt).getTime()).toBeGreaterThanOrEqual(new Date(created.body.updatedAt).getTime());
  });

  it("403 viewer, 404 unknown or malformed id, 400 empty patch", async () => {
    const created = await t.call<PatientCaseView>(createRoute, { as: "engineer", body: { name: unique("P"), patient } });
    const id = created.body.id;
    expect((await t.call(patchRoute, { as: "viewer", method: "PATCH", params: { id }, body: { name: "y" } })).status).toBe(403);
    expect((await t.call(patchRoute, { as: "admin", method: "PATCH", params: { id: "9b2f3f9c-1111-4222-8333-444455556666" }, body: { name: "y" } })).status).toBe(404);
    expect((await t.call(patchRoute, { as: "admin", method: "PATCH", params: { id: "nope" }, body: { name: "y" } })).status).toBe(404);
    expect((await t.call(patchRoute, { as: "admin", method: "PATCH", params: { id }, body: {} })).status).toBe(400);
    expect((await t.call(getRoute, { as: "viewer", params: { id: "9b2f3f9c-1111-4222-8333-444455556666" } })).status).toBe(404);
  });

  it("409 for a seeded reference case (its citation would no longer hold)", async () => {
    const list = await t.call<{ cases: PatientCaseView[] }>(listRoute, { as: "admin" });
    const iso = list.body.cases.find((c) => c.name === isoCaseName(1))!;
    const res = await t.call<{ error: string }>(patchRoute, { as: "admin", method: "PATCH", params: { id: iso.id }, body: { name: "renamed" } });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatch(/cannot be changed/);
  });
});
