/**
 * A plain list of what changed between two revisions (machines/diff.ts), shown above the side-by-side
 * canvases: readable without the canvas, and printable for a review note.
 */
import type { DefinitionDiff } from "@/machines/diff";

function Group({ title, items }: { title: string; items: string[] }) {
  if (items.length === 0) return null;
  return (
    <div>
      <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-500">{title}</h3>
      <ul className="mt-1 space-y-0.5 text-sm text-ink-800">
        {items.map((item, i) => (
          <li key={i}>{item}</li>
        ))}
      </ul>
    </div>
  );
}

function transitionLabel(t: { step: string; via: string; key?: string; target: string }): string {
  return `${t.step} → ${t.target} (${t.via === "after" ? `after ${t.key ?? ""}` : t.via})`;
}

export function DiffSummary({ diff }: { diff: DefinitionDiff }) {
  if (diff.identical) return <p className="text-sm text-ink-600">The two definitions are identical (same hash).</p>;
  const meta = Object.entries(diff.meta).map(([field, change]) => `${field}: ${String(change?.from ?? "—")} → ${String(change?.to ?? "—")}`);
  return (
    <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3" data-testid="diff-summary">
      <Group
        title="Steps"
        items={[
          ...diff.steps.added.map((s) => `+ ${s}`),
          ...diff.steps.removed.map((s) => `− ${s}`),
          ...diff.steps.changed.map((c) => `~ ${c.step}: ${c.fields.join(", ")}`),
        ]}
      />
      <Group
        title="Transitions"
        items={[
          ...diff.transitions.added.map((t) => `+ ${transitionLabel(t)}`),
          ...diff.transitions.removed.map((t) => `− ${transitionLabel(t)}`),
          ...diff.transitions.changed.map((t) => `~ ${transitionLabel(t)}: ${t.fields.join(", ")}`),
        ]}
      />
      <Group
        title="Settings"
        items={[
          ...diff.settings.added.map((s) => `+ ${s}`),
          ...diff.settings.removed.map((s) => `− ${s}`),
          ...diff.settings.changed.map(
            (c) =>
              `~ ${c.name}: ${c.fields
                .map((f) => `${String(f)} ${JSON.stringify(c.from[f] ?? null)} → ${JSON.stringify(c.to[f] ?? null)}`)
                .join("; ")}`,
          ),
        ]}
      />
      <Group
        title="Monitors"
        items={[
          ...diff.monitors.added.map((m) => `+ ${m.monitor.alarm.kind}`),
          ...diff.monitors.removed.map((m) => `− ${m.monitor.alarm.kind}`),
          ...diff.monitors.changed.map((m) => `~ ${m.to.alarm.kind}`),
        ]}
      />
      <Group title="Sequence" items={meta} />
    </div>
  );
}
