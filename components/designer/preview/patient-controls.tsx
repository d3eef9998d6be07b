"use client";
/** The preview's patient: lung mechanics and breathing effort, as sliders with units. */
import { useId } from "react";

export interface PreviewPatient {
  complianceMlPerCmH2O: number;
  resistanceCmH2OPerLps: number;
  effortCmH2O: number;
  effortRatePerMin: number;
}

/** A healthy-ish adult lung (C 50 mL/cmH2O, R 10 cmH2O/(L/s)), not breathing on its own. */
export const DEFAULT_PATIENT: PreviewPatient = {
  complianceMlPerCmH2O: 50,
  resistanceCmH2OPerLps: 10,
  effortCmH2O: 0,
  effortRatePerMin: 15,
};

const SLIDERS: Array<{ key: keyof PreviewPatient; label: string; unit: string; min: number; max: number; step: number }> = [
  { key: "complianceMlPerCmH2O", label: "Compliance", unit: "mL/cmH2O", min: 5, max: 150, step: 1 },
  { key: "resistanceCmH2OPerLps", label: "Resistance", unit: "cmH2O/(L/s)", min: 2, max: 50, step: 1 },
  { key: "effortCmH2O", label: "Effort strength", unit: "cmH2O", min: 0, max: 15, step: 0.5 },
  { key: "effortRatePerMin", label: "Effort rate", unit: "/min", min: 4, max: 40, step: 1 },
];

export function PatientControls({ patient, onChange }: { patient: PreviewPatient; onChange: (p: PreviewPatient) => void }) {
  const id = useId();
  return (
    <fieldset className="grid grid-cols-2 gap-x-4 gap-y-1 lg:grid-cols-4" data-testid="preview-patient">
      <legend className="sr-only">Preview patient</legend>
      {SLIDERS.map((s) => (
        <div key={s.key} className="flex flex-col">
          <label htmlFor={`${id}-${s.key}`} className="flex justify-between text-[11px] text-ink-700">
            <span>{s.label}</span>
            <span className="font-mono">
              {patient[s.key]} {s.unit}
            </span>
          </label>
          <input
            id={`${id}-${s.key}`}
            type="range"
            min={s.min}
            max={s.max}
            step={s.step}
            value={patient[s.key]}
            aria-valuetext={`${patient[s.key]} ${s.unit}`}
            onChange={(e) => onChange({ ...patient, [s.key]: e.target.valueAsNumber })}
            disabled={s.key === "effortRatePerMin" && patient.effortCmH2O === 0}
            data-testid={`patient-${s.key}`}
            className="accent-glass-600"
          />
        </div>
      ))}
    </fieldset>
  );
}

/** The engine's patient shape for the sliders' values (no effort when its strength is 0). */
export function toEnginePatient(p: PreviewPatient) {
  return {
    complianceMlPerCmH2O: p.complianceMlPerCmH2O,
    resistanceCmH2OPerLps: p.resistanceCmH2OPerLps,
    effort:
      p.effortCmH2O > 0
        ? { shape: "half-sine" as const, amplitudeCmH2O: p.effortCmH2O, ratePerMin: p.effortRatePerMin, effortTimeS: 0.8, onsetS: 1, variability: 0 }
        : { shape: "none" as const, amplitudeCmH2O: 0, ratePerMin: 15, effortTimeS: 0.8, onsetS: 1, variability: 0 },
  };
}
