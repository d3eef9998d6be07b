import { route } from "@/lib/api/handler";
import { getWaveformWindow } from "@/lib/runs/service";
import { runIdParams, waveformQuery } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

/** `?from=&to=&points=&signals=` → the window, min–max downsampled to ≤ points, and its step intervals. */
export const GET = route({ params: runIdParams, query: waveformQuery }, async ({ db, user, params, query }) =>
  getWaveformWindow(db, user, params.id, query),
);
