"use client";
/**
 * A formula input that checks itself as you type: the first blocking problem (syntax, unknown name)
 * comes from the form's resolver so it is the same text that stops the edit from applying; a unit
 * mismatch is shown as advice; and the field says what the formula computes.
 */
import { useId, useMemo, useRef } from "react";
import type { Setting } from "@/machines/schema";
import { checkFormula, PLACE_UNITS, type FormulaPlace } from "./formula-check";
import { NamesList } from "./names-list";

export interface FormulaFieldProps {
  label: string;
  value: string;
  onChange: (value: string) => void;
  onBlur?: () => void;
  error?: string;
  place: FormulaPlace;
  settings: Readonly<Record<string, Setting>>;
  disabled?: boolean;
  placeholder?: string;
  testId?: string;
}

export function FormulaField(props: FormulaFieldProps) {
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const check = useMemo(() => checkFormula(props.value, props.settings, props.place), [props.value, props.settings, props.place]);
  const unit = typeof props.place === "object" ? props.place.unit : PLACE_UNITS[props.place];
  const advisory = props.error ? null : check.advisory[0];

  const insert = (name: string) => {
    const el = input.current;
    const at = el?.selectionStart ?? props.value.length;
    const end = el?.selectionEnd ?? at;
    const next = props.value.slice(0, at) + name + props.value.slice(end);
    props.onChange(next);
    requestAnimationFrame(() => {
      el?.focus();
      el?.setSelectionRange(at + name.length, at + name.length);
    });
  };

  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="flex items-baseline justify-between text-xs font-medium text-ink-700">
        <span>{props.label}</span>
        {unit ? <span className="font-normal text-ink-500">{unit === "true/false" ? "condition" : `result in ${unit}`}</span> : null}
      </label>
      <input
        id={id}
        ref={input}
        value={props.value}
        onChange={(e) => props.onChange(e.target.value)}
        onBlur={props.onBlur}
        disabled={props.disabled}
        placeholder={props.placeholder}
        spellCheck={false}
        autoComplete="off"
        aria-invalid={props.error ? true : undefined}
        aria-describedby={`${id}-msg`}
        data-testid={props.testId}
        className={`rounded border px-2 py-1 font-mono text-sm outline-none focus:ring-2 focus:ring-glass-300 disabled:bg-ink-100 ${
          props.error ? "border-red-600" : advisory ? "border-amber-500" : "border-ink-300"
        }`}
      />
      <p id={`${id}-msg`} role={props.error ? "alert" : undefined} className="min-h-4 text-[11px] leading-snug">
        {props.error ? (
          <span className="text-red-700">{props.error}</span>
        ) : advisory ? (
          <span className="text-amber-800">{advisory.message}</span>
        ) : check.gives ? (
          <span className="text-ink-500">gives {check.gives}</span>
        ) : null}
      </p>
      {props.disabled ? null : <NamesList settings={props.settings} onPick={insert} />}
    </div>
  );
}
