import { route } from "@/lib/api/handler";
import { getWaveformWindowJson } from "@/lib/runs/service";
import { runIdParams, waveformQuery } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

/**
 * `?from=&to=&points=&signals=` → the window, min–max downsampled to ≤ points, and its step intervals.
 * The body comes pre-serialised: a window of a finished run is reused across requests.
 */
export const GET = route({ params: runIdParams, query: waveformQuery }, async ({ db, user, params, query }) =>
  new Response(await getWaveformWindowJson(db, user, params.id, query), { headers: { "Content-Type": "application/json" } }),
);
