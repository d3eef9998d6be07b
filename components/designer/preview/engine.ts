/**
 * Where the preview gets its engine. lib/sim/simulate.ts (engine) exports `createSimulation`; until
 * it lands this is null and the preview says so instead of running.
 */
import type { LiveSimulation, SimOptions } from "@/lib/sim/types";

export type CreateSimulation = (options: SimOptions) => LiveSimulation;

export const createSimulation: CreateSimulation | null = null;
