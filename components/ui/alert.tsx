import type { ReactNode } from "react";
import { cn } from "./cn";

export type AlertTone = "error" | "info" | "success";

const TONES: Record<AlertTone, string> = {
  error: "border-danger-600/30 bg-danger-100 text-danger-700",
  info: "border-glass-600/30 bg-glass-50 text-glass-800",
  success: "border-glass-600/30 bg-glass-100 text-glass-800",
};

/** A message box. Errors are announced to screen readers (role="alert"). */
export function Alert({ tone = "info", title, children, className }: { tone?: AlertTone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === "error" ? "alert" : "status"} className={cn("rounded-md border px-3 py-2 text-sm", TONES[tone], className)}>
      {title && <p className="font-semibold">{title}</p>}
      {children}
    </div>
  );
}
