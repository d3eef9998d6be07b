/** Every built-in template must save: no static check may report an error on it. */
import { describe, expect, it } from "vitest";
import { runStaticChecks } from "@/machines/checks";
import { TEMPLATES } from "@/machines/templates";

describe("built-in templates", () => {
  it("exist", () => {
    expect(TEMPLATES.length).toBeGreaterThanOrEqual(5);
  });
  for (const template of TEMPLATES) {
    it(`${template.id} passes all checks without errors`, () => {
      const errors = runStaticChecks(template.definition).filter((p) => p.severity === "error");
      expect(errors).toEqual([]);
    });
  }
});
