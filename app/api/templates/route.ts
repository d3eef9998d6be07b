import { route } from "@/lib/api/handler";
import { TEMPLATES } from "@/machines/templates";

export const dynamic = "force-dynamic";

/** Built-in templates are product data, the same for every project; any signed-in user may read them. */
export const GET = route({}, async () => ({
  templates: TEMPLATES.map((t) => ({ id: t.id, title: t.title, description: t.description, definition: t.definition })),
}));
