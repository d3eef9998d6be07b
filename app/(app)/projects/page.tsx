import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { canCreateProject } from "@/lib/auth/roles";
import { getDb } from "@/db";
import { listVisibleProjects } from "@/db/projects";
import { buttonClasses } from "@/components/ui/button";
import { ProjectList } from "@/components/projects/project-list";

export const metadata: Metadata = { title: "Projects" };

export default async function ProjectsPage() {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const projects = await listVisibleProjects(await getDb(), user);
  return (
    <main>
      <div className="mb-6 flex items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-semibold tracking-tight">Projects</h1>
          <p className="mt-1 text-sm text-ink-500">
            Each project is one ventilator build programme: its rig profile, its sequences and their runs.
          </p>
        </div>
        {canCreateProject(user.role) && (
          <Link href="/projects/new" className={buttonClasses("primary")} data-testid="new-project">
            New project
          </Link>
        )}
      </div>
      <ProjectList initialProjects={projects} />
    </main>
  );
}
