/**
 * Where the preview gets its engine: lib/sim/simulate.ts, which runs unchanged in the browser.
 * Kept behind this one module so tests and a build without the engine can swap it.
 */
import { createSimulation as engineCreateSimulation } from "@/lib/sim/simulate";
import type { LiveSimulation, SimOptions } from "@/lib/sim/types";

export type CreateSimulation = (options: SimOptions) => LiveSimulation;

export const createSimulation: CreateSimulation | null = engineCreateSimulation;
