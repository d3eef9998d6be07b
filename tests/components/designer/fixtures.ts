/** Shared definitions for the designer's component tests: the built-in assist-volume template. */
import { getTemplate } from "@/machines/templates";
import type { SequenceDefinition } from "@/machines/schema";
import { completeLayout } from "@/machines/graph";
import type { EditorDoc } from "@/components/designer/model/doc";

export function assistVolume(): SequenceDefinition {
  const t = getTemplate("assist-volume");
  if (!t) throw new Error("assist-volume template missing");
  return t.definition;
}

export function assistDoc(): EditorDoc {
  const definition = assistVolume();
  return { definition, layout: completeLayout(definition, null) };
}
