/**
 * Payload of `PUT /api/projects/:id/rig`. The rig itself is the engine's contract (lib/sim/types.ts);
 * the form and the handler both validate with it so a profile the engine cannot run is never stored.
 */
import { z } from "zod";
import { rigSchema } from "@/lib/sim/types";

export const putRigBody = z.object({ rig: rigSchema }).strict();
export type PutRigBody = z.infer<typeof putRigBody>;
