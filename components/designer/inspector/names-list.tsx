"use client";
/** The names a formula may use — signals, settings, functions — each with its unit; click to insert. */
import { SIGNALS, type Setting, type SignalName } from "@/machines/schema";
import { KNOWN_FUNCTIONS } from "@/machines/formula-analysis";

interface NamesListProps {
  settings: Readonly<Record<string, Setting>>;
  onPick: (name: string) => void;
  disabled?: boolean;
}

export function NamesList({ settings, onPick, disabled }: NamesListProps) {
  const signalNames = Object.keys(SIGNALS) as SignalName[];
  return (
    <details className="mt-1 text-xs">
      <summary className="cursor-pointer text-ink-600 hover:text-ink-900">Names you can use</summary>
      <div className="mt-1 max-h-48 overflow-auto rounded border border-ink-200 bg-ink-50 p-2">
        <NameGroup title="Signals (read every scan)">
          {signalNames.map((n) => (
            <NameButton key={n} name={n} unit={SIGNALS[n].unit} hint={SIGNALS[n].description} onPick={onPick} disabled={disabled} />
          ))}
        </NameGroup>
        <NameGroup title="Settings">
          {Object.keys(settings).length === 0 ? <span className="text-ink-500">none yet — add them in the settings table</span> : null}
          {Object.entries(settings).map(([n, s]) => (
            <NameButton key={n} name={n} unit={s.unit} hint={s.label ?? s.description} onPick={onPick} disabled={disabled} />
          ))}
        </NameGroup>
        <NameGroup title="Functions">
          {KNOWN_FUNCTIONS.map((n) => (
            <NameButton key={n} name={n} call onPick={onPick} disabled={disabled} />
          ))}
        </NameGroup>
      </div>
    </details>
  );
}

function NameGroup({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="mb-1.5">
      <div className="mb-0.5 font-semibold text-ink-700">{title}</div>
      <div className="flex flex-wrap gap-1">{children}</div>
    </div>
  );
}

function NameButton(props: { name: string; unit?: string; hint?: string; call?: boolean; onPick: (n: string) => void; disabled?: boolean }) {
  const text = props.call ? `${props.name}()` : props.name;
  return (
    <button
      type="button"
      disabled={props.disabled}
      onClick={() => props.onPick(props.call ? `${props.name}(` : props.name)}
      title={props.hint}
      className="rounded border border-ink-300 bg-surface px-1 font-mono text-[11px] hover:border-ink-500 disabled:opacity-50"
    >
      {text}
      {props.unit ? <span className="ml-1 text-ink-500">[{props.unit}]</span> : null}
    </button>
  );
}
