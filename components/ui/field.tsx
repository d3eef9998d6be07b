import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from "react";
import { cn } from "./cn";

const CONTROL =
  "block w-full rounded-md border border-line bg-surface px-3 text-sm text-ink-900 placeholder:text-ink-400 " +
  "focus:border-glass-600 focus:outline-none focus:ring-2 focus:ring-glass-200 disabled:bg-ink-50 " +
  "aria-[invalid=true]:border-danger-600 aria-[invalid=true]:ring-danger-100";

export interface FieldProps {
  label: string;
  /** Error messages for this field (from zod on the client or `fields` from the API). */
  errors?: string[] | string;
  hint?: ReactNode;
  className?: string;
  children: (control: { id: string; "aria-invalid": boolean; "aria-describedby"?: string }) => ReactNode;
}

/** Label + control + hint + error, wired for screen readers. */
export function Field({ label, errors, hint, className, children }: FieldProps) {
  const id = useId();
  const list = typeof errors === "string" ? [errors] : (errors ?? []);
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = list.length ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(" ") || undefined;
  return (
    <div className={cn("space-y-1.5", className)}>
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        {label}
      </label>
      {children({ id, "aria-invalid": list.length > 0, "aria-describedby": describedBy })}
      {hint && (
        <p id={hintId} className="text-xs text-ink-500">
          {hint}
        </p>
      )}
      {errorId && (
        <p id={errorId} className="text-xs font-medium text-danger-700" role="alert">
          {list.join(" ")}
        </p>
      )}
    </div>
  );
}

export function Input({ className, ...rest }: InputHTMLAttributes<HTMLInputElement>) {
  return <input className={cn(CONTROL, "h-10", className)} {...rest} />;
}

export function Textarea({ className, ...rest }: TextareaHTMLAttributes<HTMLTextAreaElement>) {
  return <textarea className={cn(CONTROL, "py-2", className)} {...rest} />;
}

export function Select({ className, ...rest }: SelectHTMLAttributes<HTMLSelectElement>) {
  return <select className={cn(CONTROL, "h-10 pr-8", className)} {...rest} />;
}
