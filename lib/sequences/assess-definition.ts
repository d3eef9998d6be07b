/**
 * What the server thinks of a definition before it may become a revision: the format (zod), the
 * engine's compile, the static checks, and the content hash. Pure (no I/O), so the save handler,
 * the seed and an import all judge a definition the same way.
 *
 * Errors block a save (422); warnings are returned with the new revision.
 */
import type { z } from "zod";
import { sequenceDefinition, type SequenceDefinition } from "@/machines/schema";
import { compile, SequenceError } from "@/machines/compile";
import { runStaticChecks, type Problem } from "@/machines/checks";
import { hashDefinition } from "@/machines/hash";

export type Assessment =
  | { ok: true; definition: SequenceDefinition; hash: string; warnings: Problem[] }
  | { ok: false; problems: Problem[] };

/** A format violation as a problem, pointing at the path the designer can select. */
function formatProblems(error: z.ZodError): Problem[] {
  return error.issues.map((issue) => {
    const path = issue.path.map(String);
    return {
      id: "format",
      severity: "error",
      message: path.length ? `${path.join(".")}: ${issue.message}` : issue.message,
      target: targetForPath(path),
    } satisfies Problem;
  });
}

/** machine.states.<step>… points at that step; anything else at the sequence as a whole. */
function targetForPath(path: string[]): Problem["target"] {
  if (path[0] === "machine" && path[1] === "states" && path[2]) return stepTarget(path[2]);
  if (path[0] === "settings" && path[1]) return settingTarget(path[1]);
  return sequenceTarget();
}

export function assessDefinition(raw: unknown): Assessment {
  const parsed = sequenceDefinition.safeParse(raw);
  if (!parsed.success) return { ok: false, problems: formatProblems(parsed.error) };
  const definition = parsed.data;

  try {
    compile(definition);
  } catch (err) {
    if (err instanceof SequenceError) return { ok: false, problems: err.problems };
    throw err;
  }

  const found = runStaticChecks(definition);
  const errors = found.filter((p) => p.severity === "error");
  if (errors.length > 0) return { ok: false, problems: found };
  return { ok: true, definition, hash: hashDefinition(definition), warnings: found };
}
