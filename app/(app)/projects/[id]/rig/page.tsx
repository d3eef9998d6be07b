import type { Metadata } from "next";
import Link from "next/link";
import { can } from "@/lib/auth/roles";
import { getProjectRig } from "@/db/queries/rig";
import { loadProjectPage } from "@/lib/sequences/page-data";
import { RigForm } from "@/components/sequences/rig-form";

export const metadata: Metadata = { title: "Rig profile" };

export default async function RigPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const { db, project, role } = await loadProjectPage(id);
  const { rig, updatedAt } = await getProjectRig(db, project.id);
  return (
    <main className="max-w-5xl">
      <nav aria-label="Breadcrumb" className="mb-2 text-xs text-ink-500">
        <Link href={`/projects/${project.id}`} className="hover:text-ink-800">
          {project.name}
        </Link>
      </nav>
      <h1 className="text-2xl font-semibold tracking-tight text-ink-900">Rig profile</h1>
      <p className="mb-6 mt-1 max-w-3xl text-sm text-ink-500">
        The hardware this project&apos;s sequences drive. The designer&apos;s live preview and every run on the
        project rig use it. Values are in the units shown.
      </p>
      <RigForm projectId={project.id} rig={rig} updatedAt={updatedAt} canEdit={can(role, "rig:edit")} />
    </main>
  );
}
