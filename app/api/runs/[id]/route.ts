import { route } from "@/lib/api/handler";
import { getRunView } from "@/lib/runs/service";
import { runIdParams } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

export const GET = route({ params: runIdParams }, async ({ db, user, params }) => getRunView(db, user, params.id));
