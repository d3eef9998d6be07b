/**
 * Static checks on a sequence definition, run on every save and live in the designer's problems
 * panel. Errors block a save: the definition cannot run as written (unknown names, unit mismatches,
 * zero-time loops, impossible values, dead-end steps). Warnings are design concerns the engineer and
 * reviewer should see (unreachable steps, no pressure limit, no backup timer, dead or shadowing exits).
 */
import type { SequenceDefinition } from "@/machines/schema";
import { buildContext, type CheckContext } from "@/machines/checks/context";
import type { Problem } from "@/machines/checks/types";
import { checkUnknownTargets } from "@/machines/checks/unknown-target";
import { checkUnreachableSteps } from "@/machines/checks/unreachable-step";
import { checkNoExit } from "@/machines/checks/no-exit";
import { checkInhalePressureLimit } from "@/machines/checks/pressure-limit";
import { checkBackupTimer } from "@/machines/checks/backup-timer";
import { checkFormulaSyntax } from "@/machines/checks/formula-syntax";
import { checkFormulaNames } from "@/machines/checks/formula-names";
import { checkUnitMismatch } from "@/machines/checks/unit-mismatch";
import { checkUnitlessSettings } from "@/machines/checks/unitless-setting";
import { checkExitNeverTrue } from "@/machines/checks/exit-never-true";
import { checkExitAlwaysTrue } from "@/machines/checks/exit-always-true";
import { checkZeroTimeCycles } from "@/machines/checks/zero-time-cycle";
import { checkDelays } from "@/machines/checks/delays";
import { checkSettingValues } from "@/machines/checks/setting-values";
import { checkSettingFormulas } from "@/machines/checks/setting-formulas";
import { checkSettingNames } from "@/machines/checks/setting-names";

export type { Problem, ProblemTarget, Severity, TransitionVia } from "@/machines/checks/types";

/** In the order the problems panel lists them: structure first, then formulas, then behaviour. */
const CHECKS: ReadonlyArray<(ctx: CheckContext) => Problem[]> = [
  checkUnknownTargets,
  checkNoExit,
  checkUnreachableSteps,
  checkFormulaSyntax,
  checkFormulaNames,
  checkUnitMismatch,
  checkUnitlessSettings,
  checkSettingNames,
  checkSettingFormulas,
  checkSettingValues,
  checkDelays,
  checkZeroTimeCycles,
  checkExitNeverTrue,
  checkExitAlwaysTrue,
  checkInhalePressureLimit,
  checkBackupTimer,
];

export function runStaticChecks(definition: SequenceDefinition): Problem[] {
  const ctx = buildContext(definition);
  return CHECKS.flatMap((check) => check(ctx));
}

/** True when any problem blocks saving. */
export function hasBlockingProblems(problems: readonly Problem[]): boolean {
  return problems.some((p) => p.severity === "error");
}
