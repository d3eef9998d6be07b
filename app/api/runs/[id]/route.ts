import { route } from "@/lib/api/handler";
import { getRunViewJson } from "@/lib/runs/service";
import { runIdParams } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

// The body comes pre-serialised: a finished run's JSON is reused while the read cache holds the run.
export const GET = route({ params: runIdParams }, async ({ db, user, params }) =>
  new Response(await getRunViewJson(db, user, params.id), { headers: { "Content-Type": "application/json" } }),
);
