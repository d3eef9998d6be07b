import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { projectParams } from "@/lib/validation/projects";
import { getDb } from "@/db";
import { getProjectDetail } from "@/db/projects";
import { auditFor } from "@/db/audit";
import { Badge } from "@/components/ui/badge";
import { ProjectSection } from "@/components/projects/project-section";
import { EmptyState } from "@/components/ui/empty-state";
import { listSequences } from "@/db/queries/sequences";
import { listVisibleRuns } from "@/db/queries/runs";
import { getProjectRig } from "@/db/queries/rig";
import { ProjectSequences } from "@/components/projects/project-sequences";
import { ProjectRuns } from "@/components/projects/project-runs";
import { ProjectRig } from "@/components/projects/project-rig";

export const metadata: Metadata = { title: "Project" };

/**
 * The project's home. Each later feature adds one <ProjectSection> (and one entry in SECTIONS):
 * sequences, rig profile, runs and reviews. Sections are plain anchors: no tabs, everything readable
 * top to bottom.
 */
const SECTIONS = [
  { id: "sequences", title: "Sequences" },
  { id: "rig", title: "Rig profile" },
  { id: "runs", title: "Runs" },
  { id: "members", title: "Members" },
  { id: "activity", title: "Activity" },
] as const;

export default async function ProjectPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const parsed = projectParams.safeParse(await params);
  if (!parsed.success) notFound();
  const db = await getDb();
  const project = await getProjectDetail(db, user, parsed.data.id);
  if (!project) notFound();
  const activity = await auditFor(db, "project", project.id, 20);
  const [sequenceList, recentRuns, rig] = await Promise.all([
    listSequences(db, user, project.id),
    listVisibleRuns(db, user, { projectId: project.id, limit: 10 }),
    getProjectRig(db, project.id),
  ]);

  return (
    <main className="grid gap-8 lg:grid-cols-[12rem_1fr]">
      <nav aria-label="Project sections" className="lg:sticky lg:top-6 lg:self-start">
        <Link href="/projects" className="text-xs text-ink-500 hover:text-ink-800">
          ← All projects
        </Link>
        <ul className="mt-3 space-y-1 text-sm">
          {SECTIONS.map((s) => (
            <li key={s.id}>
              <a href={`#${s.id}`} className="block rounded px-2 py-1 text-ink-700 hover:bg-ink-100">
                {s.title}
              </a>
            </li>
          ))}
        </ul>
      </nav>

      <div className="min-w-0 space-y-6">
        <header>
          <div className="flex flex-wrap items-center gap-3">
            <h1 className="text-2xl font-semibold tracking-tight" data-testid="project-name">
              {project.name}
            </h1>
            <Badge tone="glass">Your role: {ROLE_LABELS[project.yourRole]}</Badge>
          </div>
          {project.description && <p className="mt-2 max-w-3xl text-ink-600">{project.description}</p>}
        </header>

        <ProjectSection
          id="sequences"
          title="Sequences"
          description="Breath-cycle statecharts and their revisions."
          actions={
            <Link href={`/projects/${project.id}/sequences`} className="text-sm text-glass-800 underline">
              All sequences
            </Link>
          }
        >
          <ProjectSequences projectId={project.id} sequences={sequenceList} />
        </ProjectSection>

        <ProjectSection id="rig" title="Rig profile" description="Actuator, bag calibration, circuit, valves, sensor and scan period.">
          <ProjectRig projectId={project.id} rig={rig.rig} isDefault={rig.updatedAt === null} />
        </ProjectSection>

        <ProjectSection
          id="runs"
          title="Runs"
          description="Simulations of revisions against patient cases."
          actions={
            <Link href="/cases" className="text-sm text-glass-800 underline">
              Patient cases
            </Link>
          }
        >
          <ProjectRuns runs={recentRuns} />
        </ProjectSection>

        <ProjectSection id="members" title="Members" description={`${project.members.length} people on this programme.`}>
          <table className="w-full text-sm">
            <thead className="text-left text-xs uppercase tracking-wide text-ink-500">
              <tr>
                <th className="py-1.5 font-medium">Name</th>
                <th className="py-1.5 font-medium">Email</th>
                <th className="py-1.5 font-medium">Role</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-line">
              {project.members.map((m) => (
                <tr key={m.id}>
                  <td className="py-2">{m.name}</td>
                  <td className="py-2 font-mono text-xs text-ink-600">{m.email}</td>
                  <td className="py-2">{ROLE_LABELS[m.role]}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ProjectSection>

        <ProjectSection id="activity" title="Activity" description="Who did what, and when.">
          {activity.length === 0 ? (
            <EmptyState title="Nothing recorded yet" />
          ) : (
            <ul className="space-y-1 text-sm">
              {activity.map((a) => (
                <li key={a.id} className="flex gap-3">
                  <time className="font-mono text-xs text-ink-500" dateTime={a.at.toISOString()}>
                    {a.at.toISOString().replace("T", " ").slice(0, 16)}
                  </time>
                  <span>{a.action}</span>
                </li>
              ))}
            </ul>
          )}
        </ProjectSection>
      </div>
    </main>
  );
}
