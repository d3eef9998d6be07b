import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { env } from "@/lib/env";
import { DEMO_PASSWORD, DEMO_SCENARIO } from "@/db/seed";
import { LogoMark } from "@/components/shell/logo";
import { SignInForm } from "@/components/auth/sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

/** Only same-site paths: an open redirect would let a link send a fresh session elsewhere. */
function safeNext(next: string | string[] | undefined): string {
  const value = Array.isArray(next) ? next[0] : next;
  return value && value.startsWith("/") && !value.startsWith("//") && !value.startsWith("/\\") ? value : "/projects";
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const next = safeNext((await searchParams).next);
  if (await currentUser()) redirect(next);
  const demo = env().TIDEWRIGHT_DEMO !== "0";
  return (
    <main className="mx-auto flex max-w-md flex-col px-6 py-14">
      <div className="flex items-center gap-3">
        <LogoMark size={40} />
        <div>
          <h1 className="text-2xl font-semibold tracking-tight">Tidewright</h1>
          <p className="text-sm text-ink-500">Breath-cycle sequences, drafted, simulated and signed off.</p>
        </div>
      </div>
      <div className="mt-8 rounded-[var(--radius-card)] border border-line bg-surface p-6 shadow-[var(--shadow-card)]">
        <h2 className="mb-4 text-lg font-semibold">Sign in</h2>
        <SignInForm next={next} />
      </div>
      {demo && (
        <section aria-label="Demo accounts" className="mt-6 text-sm text-ink-600">
          <p>
            Local demo accounts, password <code className="rounded bg-ink-100 px-1">{DEMO_PASSWORD}</code>:
          </p>
          <ul className="mt-1 grid grid-cols-2 gap-x-4 font-mono text-xs">
            {DEMO_SCENARIO.accounts.map((a) => (
              <li key={a.email}>{a.email}</li>
            ))}
          </ul>
        </section>
      )}
    </main>
  );
}
