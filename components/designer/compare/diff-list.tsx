"use client";
/**
 * The differences between two revisions, in words: steps, transitions, settings, monitors and the
 * sequence's own fields. Each entry can be picked to highlight it on both canvases.
 */
import type { DefinitionDiff, TransitionRef as DiffTransition, TransitionChange } from "@/machines/diff";
import type { Setting, Transition } from "@/machines/schema";
import { CANVAS_COLOURS } from "../canvas/kind-style";

export type DiffPick = { kind: "step"; step: string } | { kind: "transition"; a: DiffTransition["at"] | null; b: DiffTransition["at"] | null } | { kind: "setting"; name: string };

function viaText(t: { via: string; key?: string }): string {
  return t.via === "after" ? `timer ${t.key ?? ""}` : t.via === "SCAN" ? "condition" : t.via;
}

function guardText(t: Transition): string {
  return t.guard?.params.expr ?? "always";
}

function settingValue(s: Setting): string {
  if (s.formula) return `= ${s.formula}`;
  return `${String(s.value ?? "–")}${s.unit ? ` ${s.unit}` : ""}`;
}

function Badge({ kind }: { kind: "added" | "removed" | "changed" }) {
  return (
    <span className="mr-2 rounded px-1 text-[10px] font-bold uppercase text-white" style={{ background: CANVAS_COLOURS[kind] }}>
      {kind}
    </span>
  );
}

function Item({ kind, children, onPick }: { kind: "added" | "removed" | "changed"; children: React.ReactNode; onPick?: () => void }) {
  return (
    <li>
      <button type="button" onClick={onPick} disabled={!onPick} className="w-full rounded px-2 py-0.5 text-left text-sm hover:bg-ink-50 disabled:cursor-default" data-testid="diff-item" data-diff={kind}>
        <Badge kind={kind} />
        {children}
      </button>
    </li>
  );
}

export function DiffList({ diff, onPick }: { diff: DefinitionDiff; onPick: (p: DiffPick) => void }) {
  if (diff.identical) return <p className="text-sm text-ink-600" data-testid="diff-identical">The two revisions define the same sequence.</p>;
  const transition = (t: DiffTransition, side: "a" | "b") => (
    <span className="font-mono text-xs">
      {t.step} → {t.target} ({viaText(t)}{t.via === "after" ? "" : `: ${guardText(t.transition)}`})
      <span className="sr-only">{side === "a" ? " in the older revision" : " in the newer revision"}</span>
    </span>
  );
  const change = (t: TransitionChange) => (
    <span className="font-mono text-xs">
      {t.step} → {t.target} ({viaText(t)}): {t.fields.join(", ")}
      {t.fields.includes("guard") ? ` — ${guardText(t.from)} ⇒ ${guardText(t.to)}` : ""}
    </span>
  );
  const m = diff.meta;
  return (
    <div className="flex flex-col gap-3" data-testid="diff-list">
      <Group title="Steps">
        {diff.steps.added.map((s) => (
          <Item key={`+${s}`} kind="added" onPick={() => onPick({ kind: "step", step: s })}>
            <span className="font-mono">{s}</span>
          </Item>
        ))}
        {diff.steps.removed.map((s) => (
          <Item key={`-${s}`} kind="removed" onPick={() => onPick({ kind: "step", step: s })}>
            <span className="font-mono">{s}</span>
          </Item>
        ))}
        {diff.steps.changed.map((c) => (
          <Item key={`~${c.step}`} kind="changed" onPick={() => onPick({ kind: "step", step: c.step })}>
            <span className="font-mono">{c.step}</span>: {c.fields.join(", ")}
          </Item>
        ))}
      </Group>
      <Group title="Transitions">
        {diff.transitions.added.map((t) => (
          <Item key={`+${t.id}`} kind="added" onPick={() => onPick({ kind: "transition", a: null, b: t.at })}>
            {transition(t, "b")}
          </Item>
        ))}
        {diff.transitions.removed.map((t) => (
          <Item key={`-${t.id}`} kind="removed" onPick={() => onPick({ kind: "transition", a: t.at, b: null })}>
            {transition(t, "a")}
          </Item>
        ))}
        {diff.transitions.changed.map((t) => (
          <Item key={`~${t.id}`} kind="changed" onPick={() => onPick({ kind: "transition", a: t.atA, b: t.atB })}>
            {change(t)}
          </Item>
        ))}
      </Group>
      <Group title="Settings">
        {diff.settings.added.map((s) => (
          <Item key={`+${s}`} kind="added">
            <span className="font-mono">{s}</span>
          </Item>
        ))}
        {diff.settings.removed.map((s) => (
          <Item key={`-${s}`} kind="removed">
            <span className="font-mono">{s}</span>
          </Item>
        ))}
        {diff.settings.changed.map((c) => (
          <Item key={`~${c.name}`} kind="changed">
            <span className="font-mono">{c.name}</span>: {settingValue(c.from)} ⇒ {settingValue(c.to)}
            <span className="ml-1 text-xs text-ink-500">({c.fields.join(", ")})</span>
          </Item>
        ))}
      </Group>
      <Group title="Monitors">
        {diff.monitors.added.map((x) => (
          <Item key={`+${x.index}`} kind="added">
            <span className="font-mono text-xs">{x.monitor.when}</span> → {x.monitor.alarm.message}
          </Item>
        ))}
        {diff.monitors.removed.map((x) => (
          <Item key={`-${x.index}`} kind="removed">
            <span className="font-mono text-xs">{x.monitor.when}</span> → {x.monitor.alarm.message}
          </Item>
        ))}
        {diff.monitors.changed.map((x) => (
          <Item key={`~${x.fromIndex}`} kind="changed">
            <span className="font-mono text-xs">
              {x.from.when} ⇒ {x.to.when}
            </span>
          </Item>
        ))}
      </Group>
      <Group title="Sequence">
        {m.initial ? (
          <Item kind="changed">
            entry step: <span className="font-mono">{m.initial.from}</span> ⇒ <span className="font-mono">{m.initial.to}</span>
          </Item>
        ) : null}
        {m.name ? <Item kind="changed">name: {m.name.from} ⇒ {m.name.to}</Item> : null}
        {m.description ? <Item kind="changed">description changed</Item> : null}
        {m.machineId ? <Item kind="changed">machine id: {m.machineId.from} ⇒ {m.machineId.to}</Item> : null}
      </Group>
    </div>
  );
}

function Group({ title, children }: { title: string; children: React.ReactNode }) {
  const items = (Array.isArray(children) ? children.flat() : [children]).filter(Boolean);
  if (items.length === 0) return null;
  return (
    <section>
      <h3 className="mb-1 text-xs font-semibold uppercase tracking-wide text-ink-600">{title}</h3>
      <ul className="flex flex-col">{children}</ul>
    </section>
  );
}
