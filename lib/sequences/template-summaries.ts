/** Template id, title and description for pickers: the definitions stay on the server. */
import { TEMPLATES } from "@/machines/templates";
import type { TemplateSummary } from "./types";

export function templateSummaries(): TemplateSummary[] {
  return TEMPLATES.map((t) => ({ id: t.id, title: t.title, description: t.description }));
}
