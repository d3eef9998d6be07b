import { z } from "zod";

export const email = z
  .string({ error: "Enter an email address." })
  .trim()
  .toLowerCase()
  .max(254, "That email address is too long.")
  .pipe(z.email({ error: "Enter a valid email address." }));

export const signInSchema = z.object({
  email,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(1024, "That password is too long."),
});
export type SignInInput = z.infer<typeof signInSchema>;

/** Rules for new passwords (admin-created accounts). */
export const newPassword = z
  .string({ error: "Enter a password." })
  .min(12, "Use at least 12 characters.")
  .max(256, "Use at most 256 characters.");
