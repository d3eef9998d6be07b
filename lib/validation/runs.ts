/**
 * Payloads of the runs API (/api/runs/**). Shared by the run launcher (client) and the handlers.
 * Pure zod: no drizzle, no Node APIs.
 */
import { z } from "zod";

/** Mirrors RUN_STATUSES / RUN_RIGS in db/schema.ts; client code must not import the drizzle schema. */
export const RUN_STATUSES = ["queued", "running", "done", "failed", "cancelled"] as const;
export type RunStatusValue = (typeof RUN_STATUSES)[number];
export const RUN_RIGS = ["project", "ideal"] as const;
export type RunRigValue = (typeof RUN_RIGS)[number];

/** Simulated duration bounds, s (issue 5: 400 outside 1–600 s). */
export const MIN_DURATION_S = 1;
export const MAX_DURATION_S = 600;

const uuid = (what: string) => z.uuid({ error: `${what} is not a valid id` });

export const createRunBody = z
  .object({
    revisionId: uuid("revisionId"),
    caseId: uuid("caseId"),
    duration: z
      .number({ error: "duration must be a number of seconds" })
      .min(MIN_DURATION_S, `duration must be at least ${MIN_DURATION_S} s`)
      .max(MAX_DURATION_S, `duration must be at most ${MAX_DURATION_S} s`),
    rig: z.enum(RUN_RIGS, { error: 'rig must be "project" or "ideal"' }).default("project"),
    seed: z
      .number({ error: "seed must be a whole number" })
      .int("seed must be a whole number")
      .min(0, "seed cannot be negative")
      .max(2_147_483_647, "seed is too large")
      .default(1),
    /** true (default): answer 201 when the run has finished; false: answer 202 at once and poll. */
    wait: z.boolean({ error: "wait must be true or false" }).default(true),
  })
  .strict();
export type CreateRunBody = z.infer<typeof createRunBody>;
export type CreateRunInput = z.input<typeof createRunBody>;

export const runIdParams = z.object({ id: z.uuid() });

export const listRunsQuery = z
  .object({
    revisionId: uuid("revisionId").optional(),
    caseId: uuid("caseId").optional(),
    limit: z.coerce.number().int().min(1).max(500).default(100),
  })
  .strict()
  .refine((q) => q.revisionId !== undefined || q.caseId !== undefined, {
    message: "give revisionId or caseId",
  });
export type ListRunsQuery = z.infer<typeof listRunsQuery>;

export const WAVEFORM_SIGNALS = ["paw", "flow", "volume", "pmus", "arm"] as const;
export type WaveformSignal = (typeof WAVEFORM_SIGNALS)[number];
export const DEFAULT_SIGNALS: readonly WaveformSignal[] = ["paw", "flow", "volume", "pmus"];

/** Display units of each signal (contract: cmH2O, L/min, mL, cmH2O, deg). */
export const SIGNAL_UNITS: Record<WaveformSignal, string> = {
  paw: "cmH2O",
  flow: "L/min",
  volume: "mL",
  pmus: "cmH2O",
  arm: "deg",
};

export const MAX_WINDOW_POINTS = 20_000;
export const DEFAULT_WINDOW_POINTS = 2_000;

const seconds = (what: string) =>
  z.coerce.number({ error: `${what} must be a number of seconds` }).min(0, `${what} cannot be negative`);

export const waveformQuery = z
  .object({
    from: seconds("from").optional(),
    to: seconds("to").optional(),
    points: z.coerce
      .number({ error: "points must be a whole number" })
      .int("points must be a whole number")
      .min(2, "points must be at least 2")
      .max(MAX_WINDOW_POINTS, `points must be at most ${MAX_WINDOW_POINTS}`)
      .default(DEFAULT_WINDOW_POINTS),
    signals: z
      .string()
      .optional()
      .transform((s, ctx): WaveformSignal[] => {
        if (s === undefined || s.trim() === "") return [...DEFAULT_SIGNALS];
        const names = [...new Set(s.split(",").map((x) => x.trim()).filter(Boolean))];
        const bad = names.filter((n) => !(WAVEFORM_SIGNALS as readonly string[]).includes(n));
        if (bad.length > 0) {
          ctx.addIssue({ code: "custom", message: `unknown signal ${bad.join(", ")}; use ${WAVEFORM_SIGNALS.join(", ")}` });
          return z.NEVER;
        }
        return names as WaveformSignal[];
      }),
  })
  .strict()
  .refine((q) => q.from === undefined || q.to === undefined || q.to > q.from, {
    message: "to must be after from",
    path: ["to"],
  });
export type WaveformQuery = z.infer<typeof waveformQuery>;

/** Status words shown to people. */
export const RUN_STATUS_LABELS: Record<RunStatusValue, string> = {
  queued: "Queued",
  running: "Running",
  done: "Done",
  failed: "Failed",
  cancelled: "Cancelled",
};
