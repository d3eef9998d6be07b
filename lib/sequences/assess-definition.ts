/**
 * What the server thinks of a definition before it may become a revision: the format (zod), the
 * engine's compile, the static checks, and the content hash. Pure (no I/O), so the save handler,
 * the seed and an import all judge a definition the same way.
 *
 * Errors block a save (422, only the errors are listed); warnings are returned with the new revision.
 */
import type { z } from "zod";
import { sequenceDefinition, type SequenceDefinition } from "@/machines/schema";
import { compile, SequenceError, type SequenceIssue } from "@/machines/compile";
import { runStaticChecks } from "@/machines/checks";
import type { Problem, ProblemTarget } from "@/machines/checks/types";
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

/** Point at the step, setting or monitor a format issue sits in, so the problems panel can select it. */
function targetForPath(path: string[]): ProblemTarget {
  if (path[0] === "machine" && path[1] === "states" && path[2]) {
    const field = path.slice(4).join(".");
    return path[3] === "meta" && field ? { type: "step", step: path[2], field } : { type: "step", step: path[2] };
  }
  if (path[0] === "settings" && path[1]) return { type: "setting", setting: path[1] };
  if (path[0] === "monitors" && path[1] !== undefined && /^\d+$/.test(path[1])) {
    return { type: "definition", monitor: Number(path[1]) };
  }
  return { type: "definition" };
}

/** `machine.states.inhale.after.Ti[0].target` → ["machine", "states", "inhale", "after", "Ti", "0", "target"]. */
function splitIssuePath(path: string): string[] {
  return path.split(/\.|\[(\d+)\]/).filter((part): part is string => part !== undefined && part !== "");
}

/** The engine's compile issues in the checks' problem shape, so the 422 body has one kind of entry. */
function compileProblems(issues: SequenceIssue[]): Problem[] {
  return issues.map((issue) => ({
    id: "compile",
    severity: "error",
    message: issue.path && issue.path !== "(definition)" ? `${issue.path}: ${issue.message}` : issue.message,
    target: targetForPath(splitIssuePath(issue.path)),
  }));
}

export function assessDefinition(raw: unknown): Assessment {
  const parsed = sequenceDefinition.safeParse(raw);
  if (!parsed.success) return { ok: false, problems: formatProblems(parsed.error) };
  const definition = parsed.data;

  const found = runStaticChecks(definition);
  const errors = found.filter((p) => p.severity === "error");
  try {
    compile(definition);
  } catch (err) {
    if (!(err instanceof SequenceError)) throw err;
    // The checks usually name the same fault with a stable id and a transition-level target, which
    // the problems panel can select; the engine's own words are the fallback when they see nothing.
    return { ok: false, problems: errors.length > 0 ? errors : compileProblems(err.issues) };
  }
  if (errors.length > 0) return { ok: false, problems: errors };
  return { ok: true, definition, hash: hashDefinition(definition), warnings: found };
}
