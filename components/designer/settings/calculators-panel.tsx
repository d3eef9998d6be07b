"use client";
/**
 * Helpers beside the settings: Ti/Te from RR and I:E, Vt from predicted body weight, and the step
 * pulse rate that delivers a flow on this project's rig. Each can write its result into a setting.
 */
import { useState } from "react";
import type { SequenceDefinition, Setting } from "@/machines/schema";
import type { Rig } from "@/lib/sim/types";
import { putSetting } from "../model/setting-ops";
import { pulseRateForFlow, tidalVolumeMl, timesFromRateAndIE } from "./calculators-adapter";

interface Props {
  definition: SequenceDefinition;
  rig: Rig;
  readOnly: boolean;
  onChange: (def: SequenceDefinition) => void;
}

const r3 = (x: number) => Number(x.toPrecision(3));

function NumberInput({ label, unit, value, onChange, step, testId }: { label: string; unit: string; value: number; onChange: (v: number) => void; step?: number; testId?: string }) {
  return (
    <label className="flex items-center gap-1 text-xs">
      <span className="w-24 text-ink-700">{label}</span>
      <input type="number" value={Number.isFinite(value) ? value : ""} step={step ?? "any"} onChange={(e) => onChange(e.target.valueAsNumber)} className="w-20 rounded border border-ink-300 px-1 py-0.5" data-testid={testId} />
      <span className="text-ink-500">{unit}</span>
    </label>
  );
}

/** Write a number into a plain-valued setting, if it exists and is not derived. */
function canWrite(def: SequenceDefinition, name: string): boolean {
  const s: Setting | undefined = def.settings[name];
  return Boolean(s && !s.formula && !s.options);
}

export function CalculatorsPanel({ definition, rig, readOnly, onChange }: Props) {
  const numeric = (name: string, fallback: number) => {
    const v = definition.settings[name]?.value;
    return typeof v === "number" ? v : fallback;
  };
  const [rr, setRr] = useState(() => numeric("RR", 15));
  const [ie, setIe] = useState(2);
  const [height, setHeight] = useState(170);
  const [sex, setSex] = useState<"male" | "female">("female");
  const [mlPerKg, setMlPerKg] = useState(6);
  const [flow, setFlow] = useState(30);

  const times = rr > 0 && ie > 0 ? timesFromRateAndIE(rr, ie) : null;
  const vt = height > 0 && mlPerKg > 0 ? tidalVolumeMl(height, sex, mlPerKg) : null;
  const pulse = flow > 0 ? pulseRateForFlow(rig, flow) : null;

  const write = (pairs: Array<[string, number]>) => {
    let def = definition;
    for (const [name, value] of pairs) if (canWrite(def, name)) def = putSetting(def, name, { ...def.settings[name], value: r3(value) });
    onChange(def);
  };

  return (
    <details className="rounded border border-ink-200 p-2" data-testid="calculators">
      <summary className="cursor-pointer text-xs font-semibold text-ink-700">Calculators</summary>
      <div className="mt-2 grid gap-4 md:grid-cols-3">
        <fieldset className="flex flex-col gap-1">
          <legend className="text-xs font-semibold">Ti and Te from rate and I:E</legend>
          <NumberInput label="Rate" unit="/min" value={rr} onChange={setRr} testId="calc-rr" />
          <NumberInput label="I:E = 1 :" unit="" value={ie} onChange={setIe} step={0.1} testId="calc-ie" />
          {times ? (
            <p className="text-xs" data-testid="calc-times">
              Ti = {r3(times.tiS)} s, Te = {r3(times.teS)} s (cycle {r3(times.periodS)} s)
            </p>
          ) : null}
          {times && !readOnly && (canWrite(definition, "Ti") || canWrite(definition, "Te") || canWrite(definition, "RR")) ? (
            <button type="button" className="self-start rounded border px-2 text-xs" onClick={() => write([["RR", rr], ["Ti", times.tiS], ["Te", times.teS]])}>
              Set RR, Ti, Te
            </button>
          ) : null}
        </fieldset>
        <fieldset className="flex flex-col gap-1">
          <legend className="text-xs font-semibold">Vt from predicted body weight</legend>
          <NumberInput label="Height" unit="cm" value={height} onChange={setHeight} testId="calc-height" />
          <label className="flex items-center gap-1 text-xs">
            <span className="w-24 text-ink-700">Sex</span>
            <select value={sex} onChange={(e) => setSex(e.target.value as "male" | "female")} className="rounded border border-ink-300 px-1 py-0.5">
              <option value="female">female</option>
              <option value="male">male</option>
            </select>
          </label>
          <NumberInput label="Volume per kg" unit="mL/kg" value={mlPerKg} onChange={setMlPerKg} testId="calc-mlkg" />
          {vt ? (
            <p className="text-xs" data-testid="calc-vt">
              PBW = {r3(vt.pbwKg)} kg, Vt = {Math.round(vt.vtMl)} mL
            </p>
          ) : null}
          {vt && !readOnly && canWrite(definition, "Vt") ? (
            <button type="button" className="self-start rounded border px-2 text-xs" onClick={() => write([["Vt", Math.round(vt.vtMl)]])}>
              Set Vt
            </button>
          ) : null}
        </fieldset>
        <fieldset className="flex flex-col gap-1">
          <legend className="text-xs font-semibold">Pulse rate for a flow on {rig.name}</legend>
          <NumberInput label="Flow" unit="L/min" value={flow} onChange={setFlow} testId="calc-flow" />
          {pulse ? (
            <p className={`text-xs ${pulse.withinLimit ? "" : "text-red-800"}`} data-testid="calc-pulse">
              {Math.round(pulse.pulseRateHz)} Hz ({r3(pulse.degPerS)} °/s at the arm)
              {pulse.withinLimit ? "" : ` — above the driver's ${rig.actuator.maxPulseRateHz} Hz limit`}
            </p>
          ) : null}
        </fieldset>
      </div>
    </details>
  );
}
