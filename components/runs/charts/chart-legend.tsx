import type { TriggerSource } from "@/lib/sim/types";
import { stepToneIndex } from "../lib/steps";
import { TriggerGlyph, triggerTitle } from "../trigger-glyph";
import { DEFAULT_CHART_THEME } from "./chart-theme";

const TRIGGERS: TriggerSource[] = ["patient", "timer", "operator"];
const DASH: Record<TriggerSource, string | undefined> = { patient: undefined, timer: "5 4", operator: "6 3 1 3" };

/** Key to the chart marks: trigger glyphs and line styles, the latency bracket, and the step tones by name. */
export function ChartLegend({ stepNames }: { stepNames: readonly string[] }) {
  // Server and client render the same swatches; the canvas may pick up app tokens later.
  const theme = DEFAULT_CHART_THEME;
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-ink-600" data-testid="chart-legend">
      {TRIGGERS.map((trigger) => (
        <span key={trigger} className="inline-flex items-center gap-1">
          <TriggerGlyph trigger={trigger} />
          <svg width="18" height="8" aria-hidden="true">
            <line x1="0" y1="4" x2="18" y2="4" stroke="currentColor" strokeDasharray={DASH[trigger]} />
          </svg>
          {triggerTitle(trigger)}
        </span>
      ))}
      <span className="inline-flex items-center gap-1">
        <svg width="22" height="10" aria-hidden="true" style={{ color: `var(--color-accent, ${theme.accent})` }}>
          <path d="M1 1v8M1 5h20M21 1v8" stroke="currentColor" strokeWidth="1.5" fill="none" />
        </svg>
        Trigger latency (effort onset → inhale)
      </span>
      {stepNames.length > 0 ? <span className="text-ink-400">Steps:</span> : null}
      {stepNames.map((name) => (
        <span key={name} className="inline-flex items-center gap-1">
          <span
            className="inline-block h-3 w-4 rounded-sm border border-ink-300"
            style={{ background: theme.stepTones[stepToneIndex(stepNames, name, theme.stepTones.length)] }}
            aria-hidden="true"
          />
          {name}
        </span>
      ))}
    </div>
  );
}
