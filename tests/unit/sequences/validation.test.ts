/** Payload schemas of the sequences and rig endpoints. */
import { describe, expect, it } from "vitest";
import {
  createSequenceBody,
  patchSequenceBody,
  revisionNumberParam,
  saveRevisionBody,
} from "@/lib/validation/sequences";
import { putRigBody } from "@/lib/validation/rig";
import { rigSchema } from "@/lib/sim/types";
import { DEFAULT_RIG } from "@/lib/sim/default-rig";

describe("createSequenceBody", () => {
  it("trims the name and accepts an optional template id", () => {
    expect(createSequenceBody.parse({ name: "  Assist  ", template: "assist-volume" })).toEqual({
      name: "Assist",
      template: "assist-volume",
    });
  });
  it.each([{}, { name: "" }, { name: "   " }, { name: "x".repeat(121) }, { name: "ok", template: "../etc" }, { name: "ok", extra: 1 }])(
    "rejects %j",
    (body) => {
      expect(createSequenceBody.safeParse(body).success).toBe(false);
    },
  );
});

describe("patchSequenceBody", () => {
  it("accepts a rename, archive and unarchive", () => {
    expect(patchSequenceBody.safeParse({ name: "New" }).success).toBe(true);
    expect(patchSequenceBody.safeParse({ status: "archived" }).success).toBe(true);
    expect(patchSequenceBody.safeParse({ status: "draft" }).success).toBe(true);
  });
  it("refuses review states (they have their own flow) and an empty change", () => {
    for (const status of ["in_review", "approved", "released"]) {
      expect(patchSequenceBody.safeParse({ status }).success).toBe(false);
    }
    expect(patchSequenceBody.safeParse({}).success).toBe(false);
  });
});

describe("saveRevisionBody", () => {
  it("needs an object definition and a whole, non-negative base revision", () => {
    const ok = saveRevisionBody.parse({ definition: {}, baseRevision: 3 });
    expect(ok).toEqual({ definition: {}, layout: { nodes: {} }, message: "", baseRevision: 3 });
    expect(saveRevisionBody.safeParse({ definition: [], baseRevision: 1 }).success).toBe(false);
    expect(saveRevisionBody.safeParse({ definition: {}, baseRevision: -1 }).success).toBe(false);
    expect(saveRevisionBody.safeParse({ definition: {}, baseRevision: "1" }).success).toBe(false);
    expect(saveRevisionBody.safeParse({ definition: {} }).success).toBe(false);
    expect(saveRevisionBody.safeParse({ definition: {}, baseRevision: 1, message: "m".repeat(501) }).success).toBe(false);
  });
});

describe("revisionNumberParam", () => {
  it("reads a path segment as a revision number from 1", () => {
    expect(revisionNumberParam.parse("4")).toBe(4);
    for (const bad of ["0", "-1", "1.5", "abc", ""]) expect(revisionNumberParam.safeParse(bad).success).toBe(false);
  });
});

describe("putRigBody", () => {
  it("accepts the default rig and refuses a bag table with one point", () => {
    const rig = rigSchema.parse(DEFAULT_RIG);
    expect(putRigBody.safeParse({ rig }).success).toBe(true);
    expect(putRigBody.safeParse({ rig: { ...rig, bagCalibration: [{ angleDeg: 0, volumeMl: 0 }] } }).success).toBe(false);
  });
});
