import type { Role } from "./roles";

/** The signed-in user as handlers and pages see it (never carries the password hash). */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
  role: Role;
}
