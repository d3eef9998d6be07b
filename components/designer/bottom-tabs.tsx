"use client";
/** Settings table and problems panel under the editor, as two tabs (keyboard: arrow keys switch). */
import type { ReactNode } from "react";

export type BottomTab = "problems" | "settings";

export interface BottomTabsProps {
  tab: BottomTab;
  onTab: (t: BottomTab) => void;
  problemCount: number;
  errorCount: number;
  settingCount: number;
  problems: ReactNode;
  settings: ReactNode;
}

export function BottomTabs(p: BottomTabsProps) {
  const tabs: Array<{ id: BottomTab; label: string }> = [
    { id: "problems", label: `Problems (${p.problemCount})` },
    { id: "settings", label: `Settings (${p.settingCount})` },
  ];
  return (
    <section className="rounded border border-ink-300 bg-surface">
      <div
        role="tablist"
        aria-label="Sequence details"
        className="flex gap-1 border-b border-ink-200 px-2 pt-1"
        onKeyDown={(e) => {
          if (e.key === "ArrowRight" || e.key === "ArrowLeft") p.onTab(p.tab === "problems" ? "settings" : "problems");
        }}
      >
        {tabs.map((t) => (
          <button
            key={t.id}
            type="button"
            role="tab"
            id={`tab-${t.id}`}
            aria-selected={p.tab === t.id}
            aria-controls={`panel-${t.id}`}
            tabIndex={p.tab === t.id ? 0 : -1}
            onClick={() => p.onTab(t.id)}
            data-testid={`tab-${t.id}`}
            className={`-mb-px rounded-t border px-3 py-1 text-xs ${
              p.tab === t.id ? "border-ink-200 border-b-white bg-surface font-semibold" : "border-transparent text-ink-600"
            } ${t.id === "problems" && p.errorCount > 0 ? "text-red-800" : ""}`}
          >
            {t.label}
          </button>
        ))}
      </div>
      <div role="tabpanel" id={`panel-${p.tab}`} aria-labelledby={`tab-${p.tab}`} className="p-3">
        {p.tab === "problems" ? p.problems : p.settings}
      </div>
    </section>
  );
}
