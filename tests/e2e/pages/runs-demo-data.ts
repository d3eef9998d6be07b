import type { Page } from "playwright-core";

/**
 * Looks up the seeded demo data the run specs need (through the app's own API, signed in as the page's
 * user) and starts runs directly when a spec is not about the launcher.
 */
export const DEMO_PROJECT = "Lowtide bag-compressor build";
export const TRIGGERED_SEQUENCE = "MK-1 assisted volume (patient trigger)";
export const TIMED_SEQUENCE = "MK-1 timed volume control";
export const EFFORT_CASE = "Adult, weak spontaneous effort";

interface Answer<T> {
  status: number;
  body: T;
}

export class RunsDemoData {
  constructor(private readonly page: Page) {}

  private async api<T>(path: string, init?: { method: string; body: unknown }): Promise<Answer<T>> {
    return this.page.evaluate(
      async ({ path, init }) => {
        const res = await fetch(path, {
          method: init?.method ?? "GET",
          headers: init ? { "content-type": "application/json" } : undefined,
          body: init ? JSON.stringify(init.body) : undefined,
        });
        return { status: res.status, body: (await res.json().catch(() => null)) as T };
      },
      { path, init },
    );
  }

  private async ok<T>(path: string, init?: { method: string; body: unknown }): Promise<T> {
    const answer = await this.api<T>(path, init);
    if (answer.status >= 300) throw new Error(`${init?.method ?? "GET"} ${path} answered ${answer.status}: ${JSON.stringify(answer.body)}`);
    return answer.body;
  }

  /** The id of the latest revision of a demo sequence. */
  async latestRevisionId(sequenceName: string): Promise<string> {
    const { projects } = await this.ok<{ projects: { id: string; name: string }[] }>("/api/projects");
    const project = projects.find((p) => p.name === DEMO_PROJECT);
    if (!project) throw new Error(`demo project "${DEMO_PROJECT}" not found`);
    const { sequences } = await this.ok<{ sequences: { id: string; name: string }[] }>(`/api/projects/${project.id}/sequences`);
    const sequence = sequences.find((s) => s.name === sequenceName);
    if (!sequence) throw new Error(`demo sequence "${sequenceName}" not found`);
    const { revisions } = await this.ok<{ revisions: { id: string; number: number }[] }>(`/api/sequences/${sequence.id}/revisions`);
    if (revisions.length === 0) throw new Error(`"${sequenceName}" has no revision`);
    return revisions[0].id;
  }

  async caseId(name: string): Promise<string> {
    const { cases } = await this.ok<{ cases: { id: string; name: string }[] }>("/api/cases");
    const found = cases.find((c) => c.name === name);
    if (!found) throw new Error(`seeded case "${name}" not found`);
    return found.id;
  }

  /** POST /api/runs and wait for the result; returns the run id. */
  async run(sequenceName: string, caseName: string, duration: number): Promise<string> {
    const [revisionId, caseId] = await Promise.all([this.latestRevisionId(sequenceName), this.caseId(caseName)]);
    const { id } = await this.ok<{ id: string }>("/api/runs", {
      method: "POST",
      body: { revisionId, caseId, duration, wait: true },
    });
    return id;
  }
}
