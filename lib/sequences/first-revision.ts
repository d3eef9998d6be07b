/**
 * Revision 1 of a new sequence: a template's definition (renamed to the sequence) or the blank one,
 * laid out with the designer's auto-layout so the canvas opens tidy.
 *
 * Not run through the save checks: a blank sequence is meant to start incomplete, and templates are
 * checked by their own tests. The format is still enforced (parse) so no row holds an invalid body.
 */
import { sequenceDefinition, type SequenceDefinition, type SequenceLayout } from "@/machines/schema";
import { hashDefinition } from "@/machines/hash";
import { autoLayout } from "@/machines/layout";
import { getTemplate } from "@/machines/templates";
import { badRequest } from "@/lib/errors";
import type { FirstRevision } from "@/db/queries/sequences";
import { blankDefinition, BLANK_LAYOUT } from "./blank-definition";

export async function layoutFor(definition: SequenceDefinition): Promise<SequenceLayout> {
  try {
    return await autoLayout(definition);
  } catch (err) {
    // Layout is cosmetic: the editor places steps without positions itself.
    console.warn("[sequences] auto-layout failed; storing no positions", err);
    return { nodes: {} };
  }
}

export async function firstRevision(name: string, templateId: string | undefined): Promise<FirstRevision> {
  if (templateId === undefined) {
    const definition = sequenceDefinition.parse(blankDefinition(name));
    return {
      definition,
      layout: structuredClone(BLANK_LAYOUT) as SequenceLayout,
      hash: hashDefinition(definition),
      message: "Blank sequence",
    };
  }
  const template = getTemplate(templateId);
  if (!template) throw badRequest("There is no template with that id.", { template: ["unknown template"] });
  const definition = sequenceDefinition.parse({ ...structuredClone(template.definition), name });
  return {
    definition,
    layout: await layoutFor(definition),
    hash: hashDefinition(definition),
    message: `Created from the ${template.title} template`,
  };
}
