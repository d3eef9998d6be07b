/** The built-in sequence templates, usable from the CLI and from the designer. */
import { sequenceDefinition, type SequenceDefinition, type SequenceDefinitionInput } from "../schema";
import { assistPressure } from "./assist-pressure";
import { assistVolume } from "./assist-volume";
import { pressureControl } from "./pressure-control";
import { pressureSupport } from "./pressure-support";
import { volumeControl } from "./volume-control";

export interface Template {
  id: string;
  title: string;
  description: string;
  definition: SequenceDefinition;
}

function template(id: string, input: SequenceDefinitionInput): Template {
  const definition = sequenceDefinition.parse(input);
  return { id, title: definition.name, description: definition.description ?? "", definition };
}

export const TEMPLATES: readonly Template[] = [
  template("pressure-control", pressureControl),
  template("volume-control", volumeControl),
  template("assist-volume", assistVolume),
  template("assist-pressure", assistPressure),
  template("pressure-support", pressureSupport),
];

export const TEMPLATE_IDS = TEMPLATES.map((t) => t.id);

/** The template with this id, or undefined. Returns a deep copy: callers may edit it. */
export function getTemplate(id: string): Template | undefined {
  const t = TEMPLATES.find((x) => x.id === id);
  return t ? { ...t, definition: structuredClone(t.definition) } : undefined;
}
