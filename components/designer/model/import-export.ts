/**
 * Raw definition files (the sequence format as JSON) for engineers who keep sequences in their own
 * version control. An import is validated like a save — the format's zod schema, then the static
 * checks — and a file that fails the schema changes nothing in the editor.
 */
import { sequenceDefinition, type SequenceDefinition } from "@/machines/schema";
import type { Problem } from "@/machines/checks";
import { liveProblems } from "./problems";

export type ImportResult =
  | { ok: true; definition: SequenceDefinition; problems: Problem[] }
  | { ok: false; errors: string[] };

function pathText(path: ReadonlyArray<PropertyKey>): string {
  return path.length === 0 ? "the file" : path.map((p) => (typeof p === "number" ? `[${p}]` : String(p))).join(".").replace(/\.\[/g, "[");
}

export function parseDefinitionFile(text: string): ImportResult {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    return { ok: false, errors: [`This is not JSON: ${err instanceof Error ? err.message : String(err)}`] };
  }
  const parsed = sequenceDefinition.safeParse(json);
  if (!parsed.success) {
    return { ok: false, errors: parsed.error.issues.slice(0, 20).map((i) => `${pathText(i.path)}: ${i.message}`) };
  }
  return { ok: true, definition: parsed.data, problems: liveProblems(parsed.data) };
}

export function definitionFileText(def: SequenceDefinition): string {
  return `${JSON.stringify(def, null, 2)}\n`;
}

export function definitionFileName(sequenceName: string, revision: number | null): string {
  const slug = sequenceName.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "sequence";
  return `${slug}${revision ? `-r${revision}` : ""}.tidewright.json`;
}
