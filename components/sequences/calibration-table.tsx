"use client";
/**
 * The bag calibration rows of the rig form (angle → displaced volume), with the plot beside them so a
 * mistyped point shows as a kink before it reaches a simulation. Like the other rig fields, a point may
 * be typed with units ("0.5 L", "0.2 rad"); the form's resolver converts it (rig-units.ts).
 */
import { useFieldArray, useWatch, type Control, type FieldErrors, type UseFormRegister } from "react-hook-form";
import type { Rig } from "@/lib/sim/types";
import { CalibrationPlot } from "./calibration-plot";
import type { RigFormValues } from "./rig-fields";
import { numberOf } from "./rig-units";

interface Props {
  control: Control<RigFormValues, unknown, Rig>;
  register: UseFormRegister<RigFormValues>;
  errors: FieldErrors<RigFormValues>;
}

const angleOf = (v: unknown): number => numberOf(v, "angle");
const volumeOf = (v: unknown): number => numberOf(v, "volume");

export function CalibrationTable({ control, register, errors }: Props) {
  const { fields, append, remove, insert } = useFieldArray({ control, name: "bagCalibration" });
  const points = useWatch({ control, name: "bagCalibration" }) ?? [];
  const tableError = errors.bagCalibration?.message ?? errors.bagCalibration?.root?.message;

  function addAfter(index: number) {
    // Rows may hold text with units while being typed: read them as numbers (NaN when unreadable).
    const here = points[index];
    const next = points[index + 1];
    if (!here) return append({ angleDeg: 0, volumeMl: 0 });
    const [a, v] = [angleOf(here.angleDeg), volumeOf(here.volumeMl)];
    if (!next) return append({ angleDeg: a + 10, volumeMl: v });
    // A new row between two points starts at their midpoint, so the curve keeps its shape.
    insert(index + 1, {
      angleDeg: (a + angleOf(next.angleDeg)) / 2,
      volumeMl: (v + volumeOf(next.volumeMl)) / 2,
    });
  }

  return (
    <section aria-labelledby="rig-calibration" className="flex flex-col gap-3">
      <div>
        <h2 id="rig-calibration" className="text-base font-semibold text-ink-900">
          Bag calibration
        </h2>
        <p className="text-sm text-ink-500">
          Volume the bag displaces at each arm angle, measured on the bench. Ascending angle, starting at 0 deg, 0 mL.
        </p>
      </div>
      <div className="flex flex-col gap-6 lg:flex-row lg:items-start">
        <table className="text-sm">
          <thead>
            <tr className="text-left text-ink-500">
              <th className="px-2 py-1 font-medium">#</th>
              <th className="px-2 py-1 font-medium">Arm angle (deg)</th>
              <th className="px-2 py-1 font-medium">Bag volume (mL)</th>
              <th className="px-2 py-1">
                <span className="sr-only">Row actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {fields.map((field, index) => {
              const rowErrors = errors.bagCalibration?.[index];
              return (
                <tr key={field.id} className="border-t border-line">
                  <td className="px-2 py-1 text-ink-400 tabular-nums">{index + 1}</td>
                  <td className="px-2 py-1">
                    <input
                      aria-label={`Angle of point ${index + 1}`}
                      type="text"
                      inputMode="decimal"
                      spellCheck={false}
                      aria-invalid={rowErrors?.angleDeg ? true : undefined}
                      className="w-24 h-8 rounded-md border border-line bg-surface px-2 font-mono text-sm tabular-nums text-ink-900 focus:border-glass-600 focus:outline-none focus:ring-2 focus:ring-glass-200 disabled:bg-ink-50 aria-[invalid=true]:border-danger-600"
                      {...register(`bagCalibration.${index}.angleDeg`)}
                    />
                    {rowErrors?.angleDeg?.message ? (
                      <div role="alert" className="text-xs text-danger-700">
                        {rowErrors.angleDeg.message}
                      </div>
                    ) : null}
                  </td>
                  <td className="px-2 py-1">
                    <input
                      aria-label={`Volume of point ${index + 1}`}
                      type="text"
                      inputMode="decimal"
                      spellCheck={false}
                      aria-invalid={rowErrors?.volumeMl ? true : undefined}
                      className="w-24 h-8 rounded-md border border-line bg-surface px-2 font-mono text-sm tabular-nums text-ink-900 focus:border-glass-600 focus:outline-none focus:ring-2 focus:ring-glass-200 disabled:bg-ink-50 aria-[invalid=true]:border-danger-600"
                      {...register(`bagCalibration.${index}.volumeMl`)}
                    />
                    {rowErrors?.volumeMl?.message ? (
                      <div role="alert" className="text-xs text-danger-700">
                        {rowErrors.volumeMl.message}
                      </div>
                    ) : null}
                  </td>
                  <td className="flex gap-1 px-2 py-1">
                    <button
                      type="button"
                      onClick={() => addAfter(index)}
                      className="rounded px-2 text-xs text-ink-600 hover:bg-ink-100"
                      aria-label={`Add a point after point ${index + 1}`}
                    >
                      + row
                    </button>
                    <button
                      type="button"
                      onClick={() => remove(index)}
                      disabled={fields.length <= 2}
                      className="rounded px-2 text-xs text-ink-600 hover:bg-ink-100 disabled:opacity-30"
                      aria-label={`Remove point ${index + 1}`}
                    >
                      remove
                    </button>
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <CalibrationPlot
          points={points.map((p) => ({ angleDeg: angleOf(p?.angleDeg), volumeMl: volumeOf(p?.volumeMl) }))}
        />
      </div>
      {tableError ? (
        <p role="alert" className="text-sm text-danger-700">
          {tableError}
        </p>
      ) : null}
    </section>
  );
}
