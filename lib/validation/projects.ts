import { z } from "zod";
import type { Role } from "@/lib/auth/roles";

export const projectId = z.uuid({ error: "Not a project id." });

export const createProjectSchema = z.object({
  name: z
    .string({ error: "Give the project a name." })
    .trim()
    .min(1, "Give the project a name.")
    .max(120, "Keep the name under 120 characters."),
  description: z
    .string({ error: "The description must be text." })
    .trim()
    .max(2000, "Keep the description under 2000 characters.")
    .default(""),
});
export type CreateProjectInput = z.input<typeof createProjectSchema>;
export type CreateProject = z.output<typeof createProjectSchema>;

export const projectParams = z.object({ id: projectId });

/** Response shapes (what GET /api/projects and /api/projects/:id answer). */
export interface ProjectSummary {
  id: string;
  name: string;
  description: string;
  createdAt: string;
  createdBy: string | null;
  memberCount: number;
}

export interface ProjectMember {
  id: string;
  name: string;
  email: string;
  role: Role;
}

export interface ProjectDetail extends ProjectSummary {
  /** The caller's effective role in this project. */
  yourRole: Role;
  members: ProjectMember[];
}
