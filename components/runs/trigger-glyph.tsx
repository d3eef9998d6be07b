import type { TriggerSource } from "@/lib/sim/types";

const TITLES: Record<TriggerSource, string> = {
  patient: "Patient-triggered",
  timer: "Timer (machine) breath",
  operator: "Operator-started breath",
};

/** The trigger-source glyph the charts draw at a breath start: ▲ patient, ○ timer, ■ operator. */
export function TriggerGlyph({ trigger, size = 10 }: { trigger: TriggerSource; size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 10 10" aria-hidden="true" className="inline-block shrink-0 align-[-1px]">
      {trigger === "patient" ? <path d="M5 0.5 L9.5 9.5 L0.5 9.5 Z" fill="currentColor" /> : null}
      {trigger === "timer" ? <circle cx="5" cy="5" r="3.8" fill="none" stroke="currentColor" strokeWidth="1.5" /> : null}
      {trigger === "operator" ? <rect x="1" y="1" width="8" height="8" fill="currentColor" /> : null}
    </svg>
  );
}

export function triggerTitle(trigger: TriggerSource): string {
  return TITLES[trigger];
}
