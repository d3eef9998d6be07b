import type { Metadata } from "next";
import { notFound, redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { canManageUsers } from "@/lib/auth/roles";
import { getDb } from "@/db";
import { listUsers } from "@/db/users";
import { UsersAdmin } from "@/components/admin/users-admin";

export const metadata: Metadata = { title: "Users" };

export default async function UsersPage() {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  if (!canManageUsers(user.role)) notFound();
  const users = await listUsers(await getDb());
  return (
    <main className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">Users</h1>
        <p className="mt-1 text-sm text-ink-500">Accounts, their roles, and who may still sign in.</p>
      </div>
      <UsersAdmin initialUsers={users} currentUserId={user.id} />
    </main>
  );
}
