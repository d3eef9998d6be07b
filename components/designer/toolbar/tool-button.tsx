"use client";
import type { ButtonHTMLAttributes } from "react";

/** A toolbar button that names its keyboard shortcut in its tooltip. */
export function ToolButton({ shortcut, title, className, ...rest }: ButtonHTMLAttributes<HTMLButtonElement> & { shortcut?: string }) {
  return (
    <button
      type="button"
      title={shortcut ? `${title} (${shortcut})` : title}
      aria-keyshortcuts={shortcut?.replace(/Ctrl/g, "Control")}
      className={`rounded border border-ink-300 bg-surface px-2 py-0.5 text-xs text-ink-800 hover:bg-ink-50 disabled:cursor-not-allowed disabled:opacity-40 ${className ?? ""}`}
      {...rest}
    />
  );
}
