import { route } from "@/lib/api/handler";
import { conflict } from "@/lib/errors";
import { createUserSchema } from "@/lib/validation/users";
import { createUser, findUserByEmail, listUsers, toUserSummary } from "@/db/users";

export const dynamic = "force-dynamic";

export const GET = route({ allow: "users:manage" }, async ({ db }) => ({ users: await listUsers(db) }));

export const POST = route(
  { allow: "users:manage", body: createUserSchema, status: 201 },
  async ({ db, body, audit }) => {
    if (await findUserByEmail(db, body.email)) {
      throw conflict("An account with that email already exists.", { email: ["An account with that email already exists."] });
    }
    const user = await createUser(db, body);
    await audit({ action: "user.create", targetType: "user", targetId: user.id, details: { email: user.email, role: user.role } });
    return toUserSummary(user);
  },
);
