import { route } from "@/lib/api/handler";
import { conflict, notFound } from "@/lib/errors";
import { updateUserSchema, userParams } from "@/lib/validation/users";
import { findUserById, toUserSummary, updateUser } from "@/db/users";

export const PATCH = route(
  { allow: "users:manage", params: userParams, body: updateUserSchema },
  async ({ db, user, params, body, audit }) => {
    const target = await findUserById(db, params.id);
    if (!target) throw notFound("User");
    // An admin cannot lock themselves out; another admin has to do it.
    if (target.id === user.id && (body.active === false || (body.role && body.role !== "admin"))) {
      throw conflict("You cannot remove your own admin role or deactivate your own account.");
    }
    const updated = await updateUser(db, params.id, body);
    if (!updated) throw notFound("User");
    await audit({
      action: "user.update",
      targetType: "user",
      targetId: updated.id,
      details: { from: { role: target.role, active: target.active }, to: body },
    });
    return toUserSummary(updated);
  },
);
