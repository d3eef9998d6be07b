/**
 * Reference patient cases every installation gets, each with its source written on it.
 * Each source is tagged: published, derived, memory (recalled, not checked against the document) or common practice.
 *
 * Registered as a base seed step (db/seed.ts `baseSeedSteps`): idempotent, matched by name among the
 * seeded rows, so running it twice adds nothing.
 */
import "server-only";
import { and, eq } from "drizzle-orm";
import type { Db } from "./index";
import { patientCases } from "./schema";
import { patientSchema, type PatientInput } from "@/lib/sim/types";
import type { SeedStep } from "./seed";

/** 1 hPa = 100 Pa; 1 cmH2O = 98.0665 Pa (conventional) → 1 hPa = 1.019716 cmH2O (derived). */
export const CMH2O_PER_HPA = 100 / 98.0665;

const round4 = (x: number) => Math.round(x * 1e4) / 1e4;
/** mL/hPa → mL/cmH2O: a cmH2O is a smaller step than a hPa, so the same lung takes fewer mL per step. */
export const complianceFromHpa = (mlPerHpa: number) => round4(mlPerHpa / CMH2O_PER_HPA);
/** hPa/(L/s) → cmH2O/(L/s). */
export const resistanceFromHpa = (hpaPerLps: number) => round4(hpaPerLps * CMH2O_PER_HPA);
export const pressureFromHpa = (hpa: number) => round4(hpa * CMH2O_PER_HPA);

/**
 * ISO 80601-2-12:2020 Table 201.105, adult rows, as transcribed in public sources (not read from the standard itself),
 * in the table's own units: VT mL (nominal), C mL/hPa, R hPa/(L/s), f /min, Ti s, ΔP hPa above PEEP, PEEP hPa.
 */
export const ISO_80601_2_12_TABLE_201_105 = [
  { row: 1, vt: 500, c: 50, r: 5, f: 20, ti: 1, dp: 10, peep: 5 },
  { row: 2, vt: 500, c: 50, r: 20, f: 12, ti: 1, dp: 15, peep: 10 },
  { row: 3, vt: 500, c: 20, r: 5, f: 20, ti: 1, dp: 25, peep: 5 },
  { row: 4, vt: 500, c: 20, r: 20, f: 20, ti: 1, dp: 25, peep: 10 },
  { row: 5, vt: 300, c: 20, r: 20, f: 20, ti: 1, dp: 15, peep: 5 },
  { row: 6, vt: 300, c: 20, r: 50, f: 12, ti: 1, dp: 25, peep: 10 },
  { row: 7, vt: 300, c: 10, r: 50, f: 20, ti: 1, dp: 30, peep: 5 },
  { row: 8, vt: 200, c: 10, r: 10, f: 20, ti: 1, dp: 25, peep: 10 },
] as const;

export interface SeedCase {
  name: string;
  description: string;
  source: string;
  patient: PatientInput;
}

export const isoCaseName = (row: number) => `ISO 80601-2-12 test lung, row ${row}`;

const ISO_SOURCE = (row: number) =>
  `ISO 80601-2-12:2020 Table 201.105, row ${row} (transcribed from public sources, not read from the standard itself); ` +
  `hPa converted to cmH2O at 1 hPa = 1.019716 cmH2O (derived).`;

const passive = { shape: "none", amplitudeCmH2O: 0, ratePerMin: 15, effortTimeS: 0.8, onsetS: 1, variability: 0 } as const;
const noLeak = { kind: "none", coefficient: 0 } as const;

export const ISO_CASES: SeedCase[] = ISO_80601_2_12_TABLE_201_105.map((r) => ({
  name: isoCaseName(r.row),
  description:
    `Passive adult test lung for pressure-controlled ventilation. Table values: C ${r.c} mL/hPa, R ${r.r} hPa/(L/s); ` +
    `suggested settings f ${r.f} /min, Ti ${r.ti} s, ΔP ${r.dp} hPa above PEEP, PEEP ${r.peep} hPa (nominal VT ${r.vt} mL). ` +
    `In cmH2O: C ${complianceFromHpa(r.c)} mL/cmH2O, R ${resistanceFromHpa(r.r)} cmH2O/(L/s), ` +
    `ΔP ${pressureFromHpa(r.dp)} cmH2O, PEEP ${pressureFromHpa(r.peep)} cmH2O. ` +
    `The nominal VT is ≈ C·ΔP; the single-compartment model gives C·ΔP·(1 − e^(−Ti/τ)), τ = R·C.`,
  source: ISO_SOURCE(r.row),
  patient: {
    complianceMlPerCmH2O: complianceFromHpa(r.c),
    resistanceCmH2OPerLps: resistanceFromHpa(r.r),
    e2CmH2OPerL2: 0,
    effort: passive,
    leak: noLeak,
  },
}));

/** Our own adult examples, values picked from the published (respiratory care texts) and recalled ranges named on each. */
export const EXAMPLE_CASES: SeedCase[] = [
  {
    name: "Adult, normal lungs (passive)",
    description: "Sedated intubated adult with healthy lungs, no spontaneous effort. C 50 mL/cmH2O, R 5 cmH2O/(L/s), τ 0.25 s.",
    source:
      "Our example. Compliance about 40–50 mL/cmH2O and resistance about 1–8 cmH2O/(L/s) for intubated adults with " +
      "normal lungs (published, respiratory care texts).",
    patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5, effort: passive, leak: noLeak },
  },
  {
    name: "Adult, low compliance (ARDS-like)",
    description: "Stiff lungs, passive. C 25 mL/cmH2O, R 10 cmH2O/(L/s), τ 0.25 s: the same pressure moves half the volume.",
    source: "Our example. ARDS compliance about 20–40 mL/cmH2O (memory).",
    patient: { complianceMlPerCmH2O: 25, resistanceCmH2OPerLps: 10, effort: passive, leak: noLeak },
  },
  {
    name: "Adult, high resistance (obstructive)",
    description:
      "Obstructed airways, passive. C 50 mL/cmH2O, R 25 cmH2O/(L/s), τ 1.25 s: slow to fill and to empty; watch for " +
      "incomplete exhalation at high rates.",
    source: "Our example. Obstructive disease resistance about 15–30 cmH2O/(L/s) (memory).",
    patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 25, effort: passive, leak: noLeak },
  },
  {
    name: "Adult, weak spontaneous effort",
    description:
      "Normal lungs with quiet breathing: half-sine efforts of 3 cmH2O peak, 14 /min, 0.8 s long. A sensitive trigger is needed.",
    source:
      "Our example. Peak muscle pressure a few to ~15 cmH2O for quiet to laboured breathing (memory); half-sine effort " +
      "shape commonly used in simulation (common practice); lungs as 'normal lungs' (published ranges).",
    patient: {
      complianceMlPerCmH2O: 50,
      resistanceCmH2OPerLps: 5,
      effort: { shape: "half-sine", amplitudeCmH2O: 3, ratePerMin: 14, effortTimeS: 0.8, onsetS: 1, variability: 0 },
      leak: noLeak,
    },
  },
  {
    name: "Adult, strong spontaneous effort",
    description:
      "Laboured breathing: parabolic-rise / exponential-relaxation efforts of 12 cmH2O peak, 24 /min, 0.9 s long, on normal-to-stiff lungs.",
    source:
      "Our example. Peak muscle pressure up to ~15 cmH2O for laboured breathing (memory); parabolic rise with exponential " +
      "relaxation after Albanese et al., Am J Physiol Heart Circ Physiol 2016;310:H899 (formula from memory).",
    patient: {
      complianceMlPerCmH2O: 40,
      resistanceCmH2OPerLps: 8,
      effort: { shape: "parabolic-exp", amplitudeCmH2O: 12, ratePerMin: 24, effortTimeS: 0.9, onsetS: 1, variability: 0 },
      leak: noLeak,
    },
  },
  {
    name: "Adult, irregular efforts",
    description:
      "Moderate efforts (6 cmH2O, about 18 /min) with ±30 % breath-to-breath variability in interval and strength: " +
      "exercises ineffective efforts, double triggering and the backup rate.",
    source:
      "Our example. Effort strength within the few-to-~15 cmH2O range (memory); the variability is a chosen test value " +
      "(common practice, no single source).",
    patient: {
      complianceMlPerCmH2O: 45,
      resistanceCmH2OPerLps: 6,
      effort: { shape: "half-sine", amplitudeCmH2O: 6, ratePerMin: 18, effortTimeS: 0.8, onsetS: 1, variability: 0.3 },
      leak: noLeak,
    },
  },
  {
    name: "Adult, mask leak",
    description:
      "Normal lungs, passive, with an orifice leak of 15 L/min at 10 cmH2O (flow ∝ √pressure): delivered and exhaled " +
      "volumes part, and a pressure trigger may auto-trigger.",
    source:
      "Our example. Lungs as 'normal lungs' (published ranges); the leak size is a moderate mask leak " +
      "chosen as a test value (common practice, no single source).",
    patient: { complianceMlPerCmH2O: 50, resistanceCmH2OPerLps: 5, effort: passive, leak: { kind: "orifice", coefficient: 15 } },
  },
];

export const SEED_CASES: SeedCase[] = [...ISO_CASES, ...EXAMPLE_CASES];

/** Insert each seed case that is not there yet (by name among seeded rows). Returns how many were added. */
export async function seedPatientCases(db: Db): Promise<number> {
  let added = 0;
  for (const c of SEED_CASES) {
    const [existing] = await db
      .select({ id: patientCases.id })
      .from(patientCases)
      .where(and(eq(patientCases.name, c.name), eq(patientCases.seeded, true)))
      .limit(1);
    if (existing) continue;
    await db.insert(patientCases).values({
      name: c.name,
      description: c.description,
      source: c.source,
      // Stored fully parsed (defaults filled in) so reads never depend on defaults changing later.
      body: patientSchema.parse(c.patient),
      seeded: true,
    });
    added++;
  }
  return added;
}

export const seedPatientCasesStep: SeedStep = {
  name: "patient cases (ISO 80601-2-12 test lungs and adult examples)",
  run: async ({ db }) => {
    await seedPatientCases(db);
  },
};
