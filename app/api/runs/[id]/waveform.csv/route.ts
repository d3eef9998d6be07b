import { route } from "@/lib/api/handler";
import { getWaveformCsv } from "@/lib/runs/service";
import { runIdParams } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

/** Full-resolution CSV, one row per stored sample, header naming columns and units. */
export const GET = route({ params: runIdParams }, async ({ db, user, params }) => getWaveformCsv(db, user, params.id));
