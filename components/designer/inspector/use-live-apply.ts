"use client";
/**
 * Apply a form's values to the document whenever they are valid, as the engineer types — there is
 * no "apply" button to forget. Invalid states stay in the form only, with their errors showing.
 */
import { useEffect, useRef } from "react";
import type { FieldValues, UseFormWatch } from "react-hook-form";
import type { z } from "zod";

export function useLiveApply<T extends FieldValues, S extends z.ZodType>(
  watch: UseFormWatch<T>,
  schema: S,
  apply: (values: z.output<S>) => void,
  /** Adjust the values before validating (e.g. leave out a field applied on blur instead). */
  prepare: (values: Partial<T>) => unknown = (v) => v,
) {
  // The latest schema and callback without resubscribing the watcher on every render.
  const latest = useRef({ schema, apply, prepare });
  useEffect(() => {
    latest.current = { schema, apply, prepare };
  });
  useEffect(() => {
    const sub = watch((values) => {
      const parsed = latest.current.schema.safeParse(latest.current.prepare(values as Partial<T>));
      if (parsed.success) latest.current.apply(parsed.data);
    });
    return () => sub.unsubscribe();
  }, [watch]);
}
