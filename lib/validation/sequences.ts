/**
 * Payloads of the sequences API (see /api/projects/:id/sequences and /api/sequences/**).
 * Shared by the create/rename forms and the handlers, so both reject the same input.
 *
 * The revision body keeps `definition` and `layout` loosely typed here on purpose: a definition that
 * parses as JSON but breaks the sequence format is a 422 with a list of problems the designer can show
 * (lib/sequences/save-revision.ts), not a 400 about the request's shape.
 */
import { z } from "zod";

export const sequenceName = z
  .string({ error: "name must be text" })
  .trim()
  .min(1, "give the sequence a name")
  .max(120, "keep the name to 120 characters");

export const templateId = z
  .string()
  .trim()
  .min(1)
  .max(60)
  .regex(/^[a-z0-9-]+$/, "unknown template");

export const createSequenceBody = z
  .object({
    name: sequenceName,
    template: templateId.optional(),
  })
  .strict();
export type CreateSequenceBody = z.infer<typeof createSequenceBody>;

/**
 * Mirrors SEQUENCE_STATUSES in db/schema.ts (a test keeps them equal): forms import this file,
 * and client code must not pull in the drizzle schema.
 */
export const SEQUENCE_STATUSES = ["draft", "in_review", "approved", "released", "archived"] as const;
export const sequenceStatus = z.enum(SEQUENCE_STATUSES);
export type SequenceStatusValue = z.infer<typeof sequenceStatus>;

/**
 * Status moves allowed through PATCH. Only archive/unarchive here: review, approval and release
 * are their own flows with sign-offs, so this endpoint must not be a back door into them.
 */
export const PATCHABLE_STATUSES = ["draft", "archived"] as const;

export const patchSequenceBody = z
  .object({
    name: sequenceName.optional(),
    status: z.enum(PATCHABLE_STATUSES, { error: "status can only be set to draft or archived here" }).optional(),
  })
  .strict()
  .refine((b) => b.name !== undefined || b.status !== undefined, { message: "nothing to change" });
export type PatchSequenceBody = z.infer<typeof patchSequenceBody>;

export const duplicateSequenceBody = z
  .object({ name: sequenceName.optional() })
  .strict();
export type DuplicateSequenceBody = z.infer<typeof duplicateSequenceBody>;

export const revisionMessage = z
  .string({ error: "message must be text" })
  .trim()
  .max(500, "keep the message to 500 characters");

export const saveRevisionBody = z
  .object({
    definition: z.record(z.string(), z.unknown(), { error: "definition must be a JSON object" }),
    layout: z.record(z.string(), z.unknown(), { error: "layout must be a JSON object" }).default({ nodes: {} }),
    message: revisionMessage.default(""),
    baseRevision: z
      .number({ error: "baseRevision must be a number" })
      .int("baseRevision must be a whole number")
      .min(0, "baseRevision cannot be negative"),
  })
  .strict();
export type SaveRevisionBody = z.infer<typeof saveRevisionBody>;

/** `/api/sequences/:id/revisions/:n` and `?rev=N`: revision numbers start at 1. */
export const revisionNumberParam = z.coerce
  .number({ error: "revision must be a number" })
  .int("revision must be a whole number")
  .min(1, "revisions start at 1")
  .max(1_000_000);

export const uuidParam = z.uuid({ error: "not found" });

export const sequenceParams = z.object({ id: uuidParam });
export const revisionParams = z.object({ id: uuidParam, n: revisionNumberParam });
export const projectParams = z.object({ id: uuidParam });
