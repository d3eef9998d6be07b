"use client";
/** Small labelled inputs for the inspector (the app's components/ui did not exist when this was written). */
import { forwardRef, useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from "react";

const inputClass =
  "rounded border border-ink-300 px-2 py-1 text-sm outline-none focus:ring-2 focus:ring-glass-300 disabled:bg-ink-100 aria-[invalid=true]:border-red-600";

interface FieldShellProps {
  label: string;
  hint?: string;
  error?: string;
  id: string;
  children: ReactNode;
}

function FieldShell({ label, hint, error, id, children }: FieldShellProps) {
  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="flex items-baseline justify-between text-xs font-medium text-ink-700">
        <span>{label}</span>
        {hint ? <span className="font-normal text-ink-500">{hint}</span> : null}
      </label>
      {children}
      {error ? (
        <p role="alert" id={`${id}-err`} className="text-[11px] text-red-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}

type TextFieldProps = InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; error?: string };

export const TextField = forwardRef<HTMLInputElement, TextFieldProps>(function TextField({ label, hint, error, ...rest }, ref) {
  const id = useId();
  return (
    <FieldShell label={label} hint={hint} error={error} id={id}>
      <input
        id={id}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? `${id}-err` : undefined}
        className={inputClass}
        {...rest}
      />
    </FieldShell>
  );
});

type SelectFieldProps = SelectHTMLAttributes<HTMLSelectElement> & {
  label: string;
  hint?: string;
  error?: string;
  options: ReadonlyArray<{ value: string; label: string }>;
};

export const SelectField = forwardRef<HTMLSelectElement, SelectFieldProps>(function SelectField(
  { label, hint, error, options, ...rest },
  ref,
) {
  const id = useId();
  return (
    <FieldShell label={label} hint={hint} error={error} id={id}>
      <select id={id} ref={ref} aria-invalid={error ? true : undefined} className={inputClass} {...rest}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </FieldShell>
  );
});

export function Section({ title, children, actions }: { title: string; children: ReactNode; actions?: ReactNode }) {
  return (
    <section className="flex flex-col gap-2 border-t border-ink-200 pt-3">
      <div className="flex items-center justify-between">
        <h3 className="text-xs font-semibold uppercase tracking-wide text-ink-600">{title}</h3>
        {actions}
      </div>
      {children}
    </section>
  );
}

export function SmallButton(props: React.ButtonHTMLAttributes<HTMLButtonElement> & { tone?: "plain" | "danger" }) {
  const { tone = "plain", className, ...rest } = props;
  const toneClass =
    tone === "danger" ? "border-red-300 text-red-800 hover:bg-red-50" : "border-ink-300 text-ink-800 hover:bg-ink-50";
  return (
    <button
      type="button"
      className={`rounded border px-2 py-0.5 text-xs disabled:cursor-not-allowed disabled:opacity-50 ${toneClass} ${className ?? ""}`}
      {...rest}
    />
  );
}
