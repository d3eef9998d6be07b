import { sql } from "drizzle-orm";
import { route } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

/** 200 when the database answers; 503 (from the wrapper) when it cannot be opened. */
export const GET = route({ auth: "public" }, async ({ db }) => {
  const started = performance.now();
  await db.execute(sql`select 1`);
  return { ok: true, dbMs: Math.round((performance.now() - started) * 10) / 10 };
});
