import { route } from "@/lib/api/handler";
import { cancelRun } from "@/lib/runs/service";
import { runIdParams } from "@/lib/validation/runs";

export const dynamic = "force-dynamic";

/** 200 `{ status }`: "cancelled" when it stopped, or the run's final status if it had already ended. */
export const POST = route({ params: runIdParams }, async ({ db, user, params, audit }) => {
  const result = await cancelRun(db, user, params.id);
  if (result.status === "cancelled") await audit({ action: "run.cancel", targetType: "run", targetId: params.id });
  return result;
});
