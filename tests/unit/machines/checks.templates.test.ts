/** Every built-in template must save: no static check may report an error on it. */
import { describe, expect, it } from "vitest";
import { runStaticChecks } from "@/machines/checks";
import { DELAY_CAN_BE_NEGATIVE } from "@/machines/checks/delays";
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

    it(`${template.id}: no timer can go negative over the settings' allowed ranges`, () => {
      const negative = runStaticChecks(template.definition).filter((p) => p.id === DELAY_CAN_BE_NEGATIVE);
      expect(negative).toEqual([]);
    });

    it(`${template.id}: the rate is bounded to MHRA RMVS v1 "rate 10–30 /min" and admits the ISO 80601-2-12 bench rows`, () => {
      const { RR, Ti } = template.definition.settings;
      expect([RR.min, RR.max]).toEqual([10, 30]);
      // ISO 80601-2-12:2020 Table 201.105 (transcribed): f 12 or 20 /min with Ti 1 s; the CLI tests set these.
      for (const f of [12, 20]) {
        expect(f).toBeGreaterThanOrEqual(RR.min!);
        expect(f).toBeLessThanOrEqual(RR.max!);
      }
      expect(Ti.min!).toBeLessThanOrEqual(1);
      expect(Ti.max!).toBeGreaterThanOrEqual(1);
    });
  }
});
