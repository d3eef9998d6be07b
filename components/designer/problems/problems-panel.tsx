"use client";
/**
 * The problems panel: errors (block a save) then warnings, each a sentence from the checks. Clicking
 * one — or Enter on it — selects the step, transition or setting it is about.
 */
import type { Problem } from "@/machines/checks";
import { countBySeverity } from "../model/problems";

export interface ProblemsPanelProps {
  problems: readonly Problem[];
  /** Problems the server reported on the last refused save, shown apart from the live ones. */
  serverProblems?: readonly Problem[];
  onPick: (problem: Problem) => void;
}

function whereText(p: Problem): string {
  const t = p.target;
  switch (t.type) {
    case "step":
      return `step ${t.step}`;
    case "transition":
      return `${t.step} → ${t.via === "after" ? `timer ${t.key ?? ""}` : t.via} #${t.index + 1}`;
    case "setting":
      return `setting ${t.setting}`;
    case "definition":
      return t.monitor !== undefined ? `monitor ${t.monitor + 1}` : "sequence";
  }
}

export function ProblemsPanel({ problems, serverProblems = [], onPick }: ProblemsPanelProps) {
  const sorted = [...problems].sort((a, b) => Number(a.severity === "warning") - Number(b.severity === "warning"));
  const { errors, warnings } = countBySeverity(problems);
  return (
    <div className="flex flex-col gap-2" data-testid="problems-panel">
      <p className="text-xs text-ink-600" aria-live="polite">
        {problems.length === 0
          ? "No problems found by the static checks."
          : `${errors} error${errors === 1 ? "" : "s"} (block saving), ${warnings} warning${warnings === 1 ? "" : "s"}.`}
      </p>
      {serverProblems.length > 0 ? (
        <div className="rounded border border-red-300 bg-red-50 p-2">
          <p className="mb-1 text-xs font-semibold text-red-900">The server refused the last save because of:</p>
          <ProblemList problems={serverProblems} onPick={onPick} testId="server-problems" />
        </div>
      ) : null}
      <ProblemList problems={sorted} onPick={onPick} testId="problem-list" />
    </div>
  );
}

function ProblemList({ problems, onPick, testId }: { problems: readonly Problem[]; onPick: (p: Problem) => void; testId: string }) {
  return (
    <ul className="flex flex-col gap-1" data-testid={testId}>
      {problems.map((p, i) => (
        <li key={`${p.id}-${i}`}>
          <button
            type="button"
            onClick={() => onPick(p)}
            className="flex w-full items-start gap-2 rounded border border-transparent px-2 py-1 text-left text-sm hover:border-ink-300 hover:bg-ink-50 focus:border-glass-400 focus:outline-none"
            data-testid="problem"
            data-problem-id={p.id}
            data-severity={p.severity}
          >
            <span
              className={`mt-0.5 shrink-0 rounded px-1 text-[10px] font-bold uppercase ${
                p.severity === "error" ? "bg-red-700 text-white" : "bg-amber-300 text-amber-950"
              }`}
            >
              {p.severity}
            </span>
            <span className="flex-1">{p.message}</span>
            <span className="shrink-0 font-mono text-[11px] text-ink-500">{whereText(p)}</span>
          </button>
        </li>
      ))}
    </ul>
  );
}
