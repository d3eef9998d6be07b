import { z } from "zod";
import { ROLES, type Role } from "@/lib/auth/roles";
import { email, newPassword } from "./auth";

export const role = z.enum(ROLES, { error: "Choose a role: admin, engineer, clinician or viewer." });

export const createUserSchema = z.object({
  email,
  name: z.string({ error: "Enter a name." }).trim().min(1, "Enter a name.").max(120, "Keep the name under 120 characters."),
  role,
  password: newPassword,
});
export type CreateUserInput = z.input<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    role: role.optional(),
    active: z.boolean({ error: "active must be true or false." }).optional(),
  })
  .refine((v) => v.role !== undefined || v.active !== undefined, { error: "Change the role or the active flag." });
export type UpdateUserInput = z.input<typeof updateUserSchema>;

export const userParams = z.object({ id: z.uuid({ error: "Not a user id." }) });

/** What the API shows of a user (never the hash). */
export interface UserSummary {
  id: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  createdAt: string;
}
