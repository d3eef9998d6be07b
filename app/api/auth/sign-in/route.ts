import { route } from "@/lib/api/handler";
import { ApiError, tooManyRequests } from "@/lib/errors";
import { signInSchema } from "@/lib/validation/auth";
import { findUserByEmail } from "@/db/users";
import { accountKey, clearFailures, ipKey, lockedForSeconds, recordFailure, THROTTLE } from "@/db/throttle";
import { dummyPasswordHash, verifyPassword } from "@/lib/auth/password";
import { luciaFor } from "@/lib/auth/lucia";

const BAD_CREDENTIALS = "Email or password is incorrect.";

export const POST = route({ auth: "public", body: signInSchema }, async ({ db, body, ip, headers, audit }) => {
  const keys = [accountKey(body.email), ipKey(ip)];
  const waitS = await lockedForSeconds(db, keys);
  if (waitS > 0) {
    const minutes = Math.max(1, Math.ceil(waitS / 60));
    throw tooManyRequests(
      `Too many failed sign-in attempts. Try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`,
      waitS,
    );
  }

  const user = await findUserByEmail(db, body.email);
  // Verify against a dummy hash for unknown emails so the response time does not reveal accounts.
  const passwordOk = await verifyPassword(user?.passwordHash ?? (await dummyPasswordHash()), body.password);
  if (!user || !passwordOk) {
    await recordFailure(db, keys[0], THROTTLE.accountLimit);
    await recordFailure(db, keys[1], THROTTLE.ipLimit);
    await audit({ action: "auth.sign-in-failed", targetType: "user", targetId: user?.id ?? null, details: { ip } });
    throw new ApiError(401, BAD_CREDENTIALS);
  }
  if (!user.active) throw new ApiError(401, "This account has been deactivated. Ask an administrator.");

  await clearFailures(db, keys[0]);
  const lucia = luciaFor(db);
  const session = await lucia.createSession(user.id, {});
  headers.append("Set-Cookie", lucia.createSessionCookie(session.id).serialize());
  await audit({ action: "auth.sign-in", targetType: "user", targetId: user.id, details: { ip } });
  return { id: user.id, email: user.email, name: user.name, role: user.role };
});
