import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { canCreateProject, ROLE_LABELS } from "@/lib/auth/roles";
import { Alert } from "@/components/ui/alert";
import { Card, CardBody, CardHeader } from "@/components/ui/card";
import { NewProjectForm } from "@/components/projects/new-project-form";

export const metadata: Metadata = { title: "New project" };

export default async function NewProjectPage() {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!canCreateProject(user.role)) {
    return (
      <main className="max-w-xl">
        <Alert tone="info" title="Projects are created by engineers and admins">
          Your role ({ROLE_LABELS[user.role]}) can read the projects you belong to but not create new ones.
        </Alert>
      </main>
    );
  }
  return (
    <main className="max-w-xl">
      <Card>
        <CardHeader
          title="New project"
          description="One ventilator build programme. You become its first member and can add the rig profile and sequences next."
        />
        <CardBody>
          <NewProjectForm />
        </CardBody>
      </Card>
    </main>
  );
}
