/** The engine's default rig profile, parsed as the page hands it to the editor. */
import { DEFAULT_RIG } from "@/lib/sim/default-rig";
import { rigSchema, type Rig } from "@/lib/sim/types";

export const DEFAULT_RIG_FOR_TESTS: Rig = rigSchema.parse(DEFAULT_RIG);
