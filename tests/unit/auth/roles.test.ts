import { describe, expect, it } from "vitest";
import { can, canCreateProject, canEdit, canManageUsers, canRunSimulations, canSign, PERMISSIONS, ROLES } from "@/lib/auth/roles";

// PRODUCT.md "Who uses it": admin everything; engineer drafts, rig, runs, bench logs, submits;
// clinician reviews, cases, comments, approves, signs, runs; viewer reads only.
describe("roles", () => {
  it("lets admin do everything", () => {
    for (const p of Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]) expect(can("admin", p)).toBe(true);
  });

  it("lets viewer only read", () => {
    const allowed = (Object.keys(PERMISSIONS) as (keyof typeof PERMISSIONS)[]).filter((p) => can("viewer", p));
    expect(allowed.sort()).toEqual(["exports:download", "read"]);
  });

  it("splits engineer and clinician work as the brief says", () => {
    expect(canEdit("engineer")).toBe(true);
    expect(canEdit("clinician")).toBe(false);
    expect(canSign("clinician")).toBe(true);
    expect(canSign("engineer")).toBe(false);
    expect(can("clinician", "cases:edit")).toBe(true);
    // The patient case library is open to engineers too (issue 5 §1); viewers only read it.
    expect(can("engineer", "cases:edit")).toBe(true);
    expect(can("viewer", "cases:edit")).toBe(false);
    expect(canRunSimulations("clinician")).toBe(true);
    expect(canCreateProject("clinician")).toBe(false);
    expect(ROLES.filter(canManageUsers)).toEqual(["admin"]);
  });
});
