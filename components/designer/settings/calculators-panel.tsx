"use client";
/**
 * Helpers beside the settings (lib/calculators): Ti/Te from RR and I:E, Vt from predicted body weight,
 * and the step pulse rate that delivers a flow on this project's rig. Inputs take units ("67 in",
 * "0.5 L/s"); results can be written into the matching settings.
 */
import { useState } from "react";
import type { SequenceDefinition, Setting } from "@/machines/schema";
import type { Rig } from "@/lib/sim/types";
import { breathTiming, predictedBodyWeightKg, pulseRateForFlow, tidalVolumeMl, type Sex } from "@/lib/calculators";
import { putSetting } from "../model/setting-ops";

interface Props {
  definition: SequenceDefinition;
  rig: Rig;
  readOnly: boolean;
  onChange: (def: SequenceDefinition) => void;
}

const r3 = (x: number) => Number(x.toPrecision(3));

/** Run a calculator; its UnitError (or any error) becomes the message shown instead of a result. */
function attempt<T>(f: () => T): { ok: true; value: T } | { ok: false; error: string } {
  try {
    return { ok: true, value: f() };
  } catch (err) {
    return { ok: false, error: err instanceof Error ? err.message : String(err) };
  }
}

function TextInput({ label, hint, value, onChange, testId }: { label: string; hint: string; value: string; onChange: (v: string) => void; testId: string }) {
  return (
    <label className="flex items-center gap-1 text-xs">
      <span className="w-24 text-ink-700">{label}</span>
      <input value={value} onChange={(e) => onChange(e.target.value)} className="w-24 rounded border border-ink-300 px-1 py-0.5" data-testid={testId} spellCheck={false} />
      <span className="text-ink-500">{hint}</span>
    </label>
  );
}

function Result({ r, testId, children }: { r: { ok: boolean; error?: string }; testId: string; children: React.ReactNode }) {
  return (
    <p className={`text-xs ${r.ok ? "" : "text-danger-700"}`} data-testid={testId} role={r.ok ? undefined : "alert"}>
      {r.ok ? children : r.error}
    </p>
  );
}

/** A plain-valued setting (not derived, not a choice) the calculators may write into. */
function canWrite(def: SequenceDefinition, name: string): boolean {
  const s: Setting | undefined = def.settings[name];
  return Boolean(s && !s.formula && !s.options);
}

export function CalculatorsPanel({ definition, rig, readOnly, onChange }: Props) {
  const rrSetting = definition.settings.RR?.value;
  const [rr, setRr] = useState(typeof rrSetting === "number" ? String(rrSetting) : "15");
  const [ie, setIe] = useState("1:2");
  const [height, setHeight] = useState("170 cm");
  const [sex, setSex] = useState<Sex>("female");
  const [mlPerKg, setMlPerKg] = useState("6");
  const [flow, setFlow] = useState("30");

  const times = attempt(() => breathTiming(rr, ie));
  const vt = attempt(() => ({ pbwKg: predictedBodyWeightKg(sex, height), vtMl: tidalVolumeMl(sex, height, Number(mlPerKg)) }));
  const pulse = attempt(() => pulseRateForFlow(flow, rig));

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
          <TextInput label="Rate" hint="/min" value={rr} onChange={setRr} testId="calc-rr" />
          <TextInput label="I:E" hint="e.g. 1:2" value={ie} onChange={setIe} testId="calc-ie" />
          <Result r={times} testId="calc-times">
            {times.ok ? `Ti = ${r3(times.value.tiS)} s, Te = ${r3(times.value.teS)} s (cycle ${r3(times.value.periodS)} s)` : null}
          </Result>
          {times.ok && !readOnly && ["RR", "Ti", "Te"].some((n) => canWrite(definition, n)) ? (
            <button
              type="button"
              className="self-start rounded border px-2 text-xs"
              onClick={() => write([["RR", 60 / times.value.periodS], ["Ti", times.value.tiS], ["Te", times.value.teS]])}
            >
              Set RR, Ti, Te
            </button>
          ) : null}
        </fieldset>
        <fieldset className="flex flex-col gap-1">
          <legend className="text-xs font-semibold">Vt from predicted body weight</legend>
          <TextInput label="Height" hint="cm, in or ft" value={height} onChange={setHeight} testId="calc-height" />
          <label className="flex items-center gap-1 text-xs">
            <span className="w-24 text-ink-700">Sex</span>
            <select value={sex} onChange={(e) => setSex(e.target.value as Sex)} className="rounded border border-ink-300 px-1 py-0.5" data-testid="calc-sex">
              <option value="female">female</option>
              <option value="male">male</option>
            </select>
          </label>
          <TextInput label="Volume per kg" hint="mL/kg" value={mlPerKg} onChange={setMlPerKg} testId="calc-mlkg" />
          <Result r={vt} testId="calc-vt">
            {vt.ok ? `PBW = ${r3(vt.value.pbwKg)} kg, Vt = ${Math.round(vt.value.vtMl)} mL` : null}
          </Result>
          {vt.ok && !readOnly && canWrite(definition, "Vt") ? (
            <button type="button" className="self-start rounded border px-2 text-xs" onClick={() => write([["Vt", Math.round(vt.value.vtMl)]])}>
              Set Vt
            </button>
          ) : null}
        </fieldset>
        <fieldset className="flex flex-col gap-1">
          <legend className="text-xs font-semibold">Pulse rate for a flow on {rig.name}</legend>
          <TextInput label="Flow" hint="L/min" value={flow} onChange={setFlow} testId="calc-flow" />
          <Result r={pulse} testId="calc-pulse">
            {pulse.ok ? (
              <span className={pulse.value.exceedsMax ? "text-danger-700" : ""}>
                {Math.round(pulse.value.pulseRateHz)} Hz ({r3(pulse.value.armSpeedDegPerS)} °/s at the arm, bag {r3(pulse.value.slopeMlPerDeg)} mL/°)
                {pulse.value.exceedsMax ? ` — above the driver's ${pulse.value.maxPulseRateHz} Hz limit` : ""}
              </span>
            ) : null}
          </Result>
        </fieldset>
      </div>
    </details>
  );
}
