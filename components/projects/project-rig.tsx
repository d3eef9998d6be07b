/**
 * Project page: the rig profile in a few figures, with the link to edit or read it in full.
 */
import Link from "next/link";
import type { Rig } from "@/lib/sim/types";

export function ProjectRig({ projectId, rig, isDefault }: { projectId: string; rig: Rig; isDefault: boolean }) {
  const figures: [string, string][] = [
    ["Actuator", `${rig.actuator.stepsPerRev} steps/rev × ${rig.actuator.microstepping} µsteps, ratio ${rig.actuator.driveRatio}:1`],
    ["Arm travel", `${rig.actuator.armTravelDeg} deg`],
    ["PEEP valve", rig.peepValveCmH2O === null ? "follows the PEEP setting" : `${rig.peepValveCmH2O} cmH2O`],
    ["Relief valve", `${rig.reliefValveCmH2O} cmH2O`],
    ["Circuit compliance", `${rig.circuit.complianceMlPerCmH2O} mL/cmH2O`],
    ["Scan period", `${rig.scanPeriodS * 1000} ms`],
  ];
  return (
    <div className="space-y-3 text-sm">
      <p className="text-ink-600">
        {rig.name}
        {isDefault ? " (the default demo profile: not saved for this project yet)" : ""} ·{" "}
        <Link href={`/projects/${projectId}/rig`} className="text-glass-800 underline">
          Open the rig profile
        </Link>
      </p>
      <dl className="grid grid-cols-2 gap-x-6 gap-y-1 sm:grid-cols-3">
        {figures.map(([label, value]) => (
          <div key={label}>
            <dt className="text-xs text-ink-500">{label}</dt>
            <dd className="font-mono text-xs text-ink-800">{value}</dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
