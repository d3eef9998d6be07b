import type { ReactNode } from "react";
import { cn } from "./cn";

export type BadgeTone = "neutral" | "glass" | "ember" | "danger";

const TONES: Record<BadgeTone, string> = {
  neutral: "bg-ink-100 text-ink-700",
  glass: "bg-glass-100 text-glass-800",
  ember: "bg-ember-100 text-ember-700",
  danger: "bg-danger-100 text-danger-700",
};

export function Badge({ tone = "neutral", className, children }: { tone?: BadgeTone; className?: string; children: ReactNode }) {
  return (
    <span className={cn("inline-flex items-center rounded-full px-2 py-0.5 text-xs font-medium", TONES[tone], className)}>
      {children}
    </span>
  );
}
