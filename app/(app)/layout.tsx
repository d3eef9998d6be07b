import type { ReactNode } from "react";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { getDb } from "@/db";
import { listVisibleProjects } from "@/db/projects";
import { Header } from "@/components/shell/header";

/** Every signed-in page: the session is checked here (proxy.ts only redirects on a missing cookie). */
export default async function AppLayout({ children }: { children: ReactNode }) {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  const projects = await listVisibleProjects(await getDb(), user);
  return (
    <>
      <Header user={user} projects={projects.map((p) => ({ id: p.id, name: p.name }))} />
      {/* Wide: the canvas and the stacked charts use the room; forms and lists size themselves. */}
      <div className="mx-auto max-w-[96rem] px-4 py-8 sm:px-6">{children}</div>
    </>
  );
}
