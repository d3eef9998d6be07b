import Link from "next/link";
import { buttonClasses } from "@/components/ui/button";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-6 py-20 text-center">
      <p className="font-mono text-sm text-ink-500">404</p>
      <h1 className="mt-2 text-2xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-ink-600">The page does not exist, or you do not have access to it.</p>
      <Link href="/projects" className={buttonClasses("secondary", "md", "mt-6")}>
        Back to projects
      </Link>
    </main>
  );
}
