/**
 * What a run simulated: the patient (lung mechanics, effort, leak) and the rig, from the copies stored
 * on the run when it started, so editing the case or the project rig afterwards never changes what this
 * page says was simulated. Plain markup without hooks: the run page renders it on the server.
 */
import type { Patient, Rig } from "@/lib/sim/types";
import type { RunRigValue } from "@/lib/validation/runs";

interface Figure {
  label: string;
  value: string;
  /** Empty for words ("half-sine", "none"); every number carries its unit. */
  unit: string;
}

function num(value: number, digits: number): string {
  return value.toFixed(digits);
}

const EFFORT_SHAPE_LABELS: Record<Patient["effort"]["shape"], string> = {
  none: "none (passive)",
  "half-sine": "half-sine",
  ramp: "ramp",
  "parabolic-exp": "parabolic–exponential",
};

/** The leak coefficient's unit depends on its law (lib/sim/types.ts leakSchema). */
function leakFigures(prefix: string, leak: Patient["leak"]): Figure[] {
  if (leak.kind === "none") return [{ label: prefix, value: "none", unit: "" }];
  return [
    { label: prefix, value: leak.kind, unit: "" },
    leak.kind === "orifice"
      ? { label: `${prefix} coefficient`, value: num(leak.coefficient, 1), unit: "L/min at 10 cmH2O" }
      : { label: `${prefix} coefficient`, value: num(leak.coefficient, 2), unit: "L/min per cmH2O" },
  ];
}

function lungFigures(p: Patient): Figure[] {
  return [
    { label: "Compliance", value: num(p.complianceMlPerCmH2O, 1), unit: "mL/cmH2O" },
    { label: "Resistance", value: num(p.resistanceCmH2OPerLps, 1), unit: "cmH2O/(L/s)" },
    { label: "Non-linear elastance E2", value: num(p.e2CmH2OPerL2, 1), unit: "cmH2O/L²" },
    ...leakFigures("Patient leak", p.leak),
  ];
}

function effortFigures(e: Patient["effort"]): Figure[] {
  const shape = { label: "Shape", value: EFFORT_SHAPE_LABELS[e.shape], unit: "" };
  // A passive patient's other effort figures are not used by the engine; listing them would mislead.
  if (e.shape === "none") return [shape];
  return [
    shape,
    { label: "Amplitude", value: num(e.amplitudeCmH2O, 1), unit: "cmH2O" },
    { label: "Rate", value: num(e.ratePerMin, 1), unit: "/min" },
    { label: "Effort time", value: num(e.effortTimeS, 2), unit: "s" },
    { label: "First onset", value: num(e.onsetS, 1), unit: "s" },
    { label: "Variability", value: num(e.variability * 100, 0), unit: "%" },
  ];
}

function rigFigures(r: Rig): Figure[] {
  const last = r.bagCalibration[r.bagCalibration.length - 1];
  return [
    { label: "Rig", value: r.name, unit: "" },
    { label: "Circuit compliance", value: num(r.circuit.complianceMlPerCmH2O, 1), unit: "mL/cmH2O" },
    { label: "Expiratory resistance", value: num(r.circuit.expiratoryResistanceCmH2OPerLps, 1), unit: "cmH2O/(L/s)" },
    { label: "Inlet valve cracking", value: num(r.circuit.inletCrackingCmH2O, 1), unit: "cmH2O" },
    { label: "Inlet valve resistance", value: num(r.circuit.inletResistanceCmH2OPerLps, 1), unit: "cmH2O/(L/s)" },
    ...leakFigures("Circuit leak", r.circuit.leak),
    r.peepValveCmH2O === null
      ? { label: "PEEP valve", value: "follows the PEEP setting", unit: "" }
      : { label: "PEEP valve", value: num(r.peepValveCmH2O, 2), unit: "cmH2O" },
    { label: "Relief valve opens at", value: num(r.reliefValveCmH2O, 1), unit: "cmH2O" },
    { label: "Relief valve resistance", value: num(r.reliefResistanceCmH2OPerLps, 1), unit: "cmH2O/(L/s)" },
    { label: "Arm travel", value: num(r.actuator.armTravelDeg, 0), unit: "deg" },
    { label: "Bag volume at full travel", value: num(last.volumeMl, 0), unit: "mL" },
    { label: "Arm return speed", value: num(r.actuator.returnSpeedDegPerS, 0), unit: "deg/s" },
    { label: "Maximum pulse rate", value: num(r.actuator.maxPulseRateHz, 0), unit: "Hz" },
    { label: "Pressure sensor lag", value: num(r.sensor.pressureLagS * 1000, 1), unit: "ms" },
    { label: "Flow sensor lag", value: num(r.sensor.flowLagS * 1000, 1), unit: "ms" },
    { label: "Pressure noise", value: num(r.sensor.pressureNoiseCmH2O, 2), unit: "cmH2O" },
    { label: "Flow noise", value: num(r.sensor.flowNoiseLpm, 2), unit: "L/min" },
    { label: "Controller scan period", value: num(r.scanPeriodS * 1000, 1), unit: "ms" },
  ];
}

function FigureList({ id, title, figures }: { id: string; title: string; figures: Figure[] }) {
  return (
    <div data-testid={`run-inputs-${id}`}>
      <h3 className="mb-1 text-[11px] font-medium uppercase tracking-wide text-ink-500">{title}</h3>
      <dl className="grid gap-y-1">
        {figures.map((f) => (
          <div key={f.label} className="flex items-baseline justify-between gap-2 border-b border-ink-100 py-0.5">
            <dt className="text-xs text-ink-600">{f.label}</dt>
            <dd className="text-right text-sm tabular-nums text-ink-900">
              {f.value}
              {f.unit ? <span className="ml-1 text-[11px] text-ink-500">{f.unit}</span> : null}
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}

export function RunInputs({ patient, rig, rigChoice }: { patient: Patient | null; rig: Rig | null; rigChoice: RunRigValue }) {
  return (
    <section
      aria-labelledby="run-inputs-heading"
      data-testid="run-inputs"
      className="rounded-[var(--radius-card)] border border-line bg-surface p-3 shadow-[var(--shadow-card)]"
    >
      <h2 id="run-inputs-heading" className="mb-2 text-sm font-semibold text-ink-800">
        Simulated with
      </h2>
      {patient ? (
        <div className="grid gap-4 md:grid-cols-3">
          <FigureList id="lung" title="Lung mechanics" figures={lungFigures(patient)} />
          <FigureList id="effort" title="Patient effort" figures={effortFigures(patient.effort)} />
          {rig ? (
            <FigureList id="rig" title="Rig" figures={rigFigures(rig)} />
          ) : (
            <div data-testid="run-inputs-rig">
              <h3 className="mb-1 text-[11px] font-medium uppercase tracking-wide text-ink-500">Rig</h3>
              <p className="text-xs text-ink-600">
                {rigChoice === "ideal"
                  ? "Ideal circuit: no circuit compliance or leak, negligible valve resistance, no relief valve, no sensor lag."
                  : "The rig of this run was not recorded."}
              </p>
            </div>
          )}
        </div>
      ) : (
        <p className="text-xs text-ink-600">
          This run was stored before its inputs were recorded: the case and rig shown elsewhere are their current values.
        </p>
      )}
    </section>
  );
}
