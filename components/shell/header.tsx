import Link from "next/link";
import type { SessionUser } from "@/lib/auth/types";
import { canManageUsers, ROLE_LABELS } from "@/lib/auth/roles";
import { Badge } from "@/components/ui/badge";
import { Logo } from "./logo";
import { SignOutButton } from "./sign-out-button";

export interface HeaderProject {
  id: string;
  name: string;
}

/** The app shell's header: product, project navigation, the signed-in user and their role, sign-out. */
export function Header({ user, projects }: { user: SessionUser; projects: HeaderProject[] }) {
  return (
    <header className="border-b border-ink-800 bg-ink-900 text-ink-100">
      <div className="mx-auto flex h-14 max-w-[96rem] items-center gap-6 px-4 sm:px-6">
        <Link href="/projects" className="text-white" aria-label="Tidewright home">
          <Logo />
        </Link>
        <nav aria-label="Main" className="flex items-center gap-1 text-sm">
          <details className="group relative">
            <summary className="flex cursor-pointer list-none items-center gap-1 rounded-md px-3 py-1.5 hover:bg-ink-800">
              Projects
              <span aria-hidden className="text-ink-400 group-open:rotate-180">▾</span>
            </summary>
            <div className="absolute left-0 z-20 mt-1 w-72 rounded-md border border-line bg-surface py-1 text-ink-800 shadow-lg">
              {projects.length === 0 && <p className="px-3 py-2 text-ink-500">No projects yet.</p>}
              {projects.map((p) => (
                <Link key={p.id} href={`/projects/${p.id}`} className="block truncate px-3 py-2 hover:bg-glass-50">
                  {p.name}
                </Link>
              ))}
              <Link href="/projects" className="block border-t border-line px-3 py-2 text-glass-700 hover:bg-glass-50">
                All projects
              </Link>
            </div>
          </details>
          {canManageUsers(user.role) && (
            <Link href="/admin/users" className="rounded-md px-3 py-1.5 hover:bg-ink-800">
              Users
            </Link>
          )}
        </nav>
        <div className="ml-auto flex items-center gap-3 text-sm" data-testid="signed-in-user">
          <span className="hidden text-ink-200 sm:inline">{user.name}</span>
          <Badge tone="glass" className="bg-glass-200">
            <span data-testid="user-role">{ROLE_LABELS[user.role]}</span>
          </Badge>
          <div className="text-ink-100 [&_button]:text-ink-100 [&_button:hover]:bg-ink-800">
            <SignOutButton />
          </div>
        </div>
      </div>
    </header>
  );
}
