import { route } from "@/lib/api/handler";
import { luciaFor } from "@/lib/auth/lucia";
import { invalidateSession } from "@/lib/auth/session";

/** Always 204: signing out twice, or without a session, is not an error. */
export const POST = route({ auth: "optional" }, async ({ db, session, user, headers, audit }) => {
  const lucia = luciaFor(db);
  if (session) {
    await invalidateSession(db, session.id);
    await audit({ action: "auth.sign-out", targetType: "user", targetId: user?.id ?? null });
  }
  headers.delete("Set-Cookie");
  headers.append("Set-Cookie", lucia.createBlankSessionCookie().serialize());
  return undefined;
});
