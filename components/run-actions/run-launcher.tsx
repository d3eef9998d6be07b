"use client";
/**
 * The "run" action of a saved revision: pick one or more patient cases, a duration and the rig, start
 * the runs (POST /api/runs with wait: false), follow their progress, cancel if needed, then open the
 * result — the run page for one case, the compare page for two, the list for more.
 */
import { useEffect, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { MAX_DURATION_S, MIN_DURATION_S, RUN_STATUS_LABELS, type RunRigValue, type RunStatusValue } from "@/lib/validation/runs";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import { cancelRun, getRunProgress, isFinished, listCaseOptions, startRun, type CaseOption } from "./api";
import { runListQueryKey } from "./run-list";

export interface RunLauncherProps {
  revisionId: string;
  /** Cases to offer; fetched from /api/cases when omitted. */
  cases?: CaseOption[];
  defaultDurationS?: number;
  /** Open the result when every run has ended (default true). */
  navigate?: boolean;
}

interface Tracked {
  id: string;
  caseName: string;
  status: RunStatusValue;
  progress: number;
  error: string | null;
}

const POLL_MS = 400;

export function RunLauncher({ revisionId, cases: givenCases, defaultDurationS = 30, navigate = true }: RunLauncherProps) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const casesQuery = useQuery({
    queryKey: ["cases", "options"],
    queryFn: async () => (await listCaseOptions()).cases,
    enabled: givenCases === undefined,
  });
  const cases = givenCases ?? casesQuery.data ?? [];
  const [selected, setSelected] = useState<string[]>([]);
  const [duration, setDuration] = useState(defaultDurationS);
  const [rig, setRig] = useState<RunRigValue>("project");
  const [tracked, setTracked] = useState<Tracked[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [starting, setStarting] = useState(false);
  const navigated = useRef(false);

  const active = tracked.some((r) => !isFinished(r.status));
  const durationValid = Number.isFinite(duration) && duration >= MIN_DURATION_S && duration <= MAX_DURATION_S;

  // Poll the runs still going.
  useEffect(() => {
    if (!active) return;
    const timer = setInterval(() => {
      void Promise.all(
        tracked.map(async (r) => {
          if (isFinished(r.status)) return r;
          try {
            const p = await getRunProgress(r.id);
            return { ...r, status: p.status, progress: p.progress, error: p.error };
          } catch {
            return r;
          }
        }),
      ).then(setTracked);
    }, POLL_MS);
    return () => clearInterval(timer);
  }, [active, tracked]);

  // When everything has ended, open the result.
  useEffect(() => {
    if (tracked.length === 0 || active || navigated.current) return;
    void queryClient.invalidateQueries({ queryKey: runListQueryKey({ revisionId }) });
    if (!navigate) return;
    const done = tracked.filter((r) => r.status === "done");
    navigated.current = true;
    if (tracked.length === 1) router.push(`/runs/${tracked[0].id}`);
    else if (done.length === 2 && tracked.length === 2) router.push(`/runs/compare?a=${done[0].id}&b=${done[1].id}`);
  }, [active, tracked, navigate, router, queryClient, revisionId]);

  const start = async () => {
    setError(null);
    setStarting(true);
    navigated.current = false;
    const started: Tracked[] = [];
    try {
      for (const caseId of selected) {
        const res = await startRun({ revisionId, caseId, duration, rig });
        const name = cases.find((c) => c.id === caseId)?.name ?? "case";
        started.push({ id: res.id, caseName: name, status: res.status, progress: 0, error: null });
      }
    } catch (err) {
      setError(err instanceof Error ? err.message : "Could not start the run.");
    } finally {
      setTracked(started);
      setStarting(false);
    }
  };

  const cancelAll = async () => {
    const results = await Promise.all(
      tracked.map(async (r) => (isFinished(r.status) ? r : { ...r, status: (await cancelRun(r.id).catch(() => ({ status: r.status }))).status })),
    );
    setTracked(results);
  };

  const toggle = (id: string) => setSelected((s) => (s.includes(id) ? s.filter((x) => x !== id) : [...s, id]));

  return (
    <div className="space-y-4" data-testid="run-launcher">
      {error && <Alert tone="error">{error}</Alert>}
      {casesQuery.error && <Alert tone="error">{casesQuery.error.message}</Alert>}
      <fieldset disabled={active || starting}>
        <legend className="mb-2 text-sm font-semibold text-ink-900">Patient cases</legend>
        <ul className="grid max-h-64 gap-1 overflow-y-auto sm:grid-cols-2" aria-label="Patient cases to run">
          {cases.map((c) => (
            <li key={c.id}>
              <label className="flex items-center gap-2 text-sm">
                <input type="checkbox" checked={selected.includes(c.id)} onChange={() => toggle(c.id)} />
                {c.name}
              </label>
            </li>
          ))}
        </ul>
        <div className="mt-4 grid gap-4 sm:grid-cols-2">
          <Field
            label="Duration (s)"
            errors={durationValid ? undefined : `between ${MIN_DURATION_S} and ${MAX_DURATION_S} s`}
          >
            {(a) => (
              <Input
                {...a}
                type="number"
                min={MIN_DURATION_S}
                max={MAX_DURATION_S}
                step="any"
                value={Number.isFinite(duration) ? duration : ""}
                onChange={(e) => setDuration(e.target.valueAsNumber)}
              />
            )}
          </Field>
          <Field label="Rig" hint="The project's rig profile, or an ideal circuit (no compliance, leak or driver limits).">
            {(a) => (
              <Select {...a} value={rig} onChange={(e) => setRig(e.target.value === "ideal" ? "ideal" : "project")}>
                <option value="project">Project rig profile</option>
                <option value="ideal">Ideal circuit</option>
              </Select>
            )}
          </Field>
        </div>
      </fieldset>
      <div className="flex gap-2">
        <Button onClick={() => void start()} disabled={selected.length === 0 || !durationValid || active} busy={starting} busyLabel="Starting…">
          Run {selected.length > 1 ? `${selected.length} cases` : ""}
        </Button>
        {active && (
          <Button variant="danger" onClick={() => void cancelAll()}>
            Cancel
          </Button>
        )}
      </div>
      {tracked.length > 0 && (
        <ul className="space-y-2" aria-label="Runs started" data-testid="launched-runs">
          {tracked.map((r) => (
            <li key={r.id} className="text-sm">
              <div className="flex items-center justify-between gap-2">
                <a href={`/runs/${r.id}`} className="text-glass-800 hover:underline">
                  {r.caseName}
                </a>
                <span className="text-xs text-ink-600" data-testid="launched-status">
                  {RUN_STATUS_LABELS[r.status]}
                  {!isFinished(r.status) ? ` · ${Math.round(r.progress * 100)} %` : ""}
                </span>
              </div>
              <progress className="h-1.5 w-full" max={1} value={r.status === "done" ? 1 : r.progress} aria-label={`Progress of ${r.caseName}`} />
              {r.error && <p className="text-xs text-danger-700">{r.error}</p>}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
