import { route } from "@/lib/api/handler";
import { readRig, writeRig } from "@/lib/sequences/project-rig";
import { projectParams } from "@/lib/validation/sequences";
import { putRigBody } from "@/lib/validation/rig";

export const dynamic = "force-dynamic";

export const GET = route({ params: projectParams }, async ({ db, user, params }) => readRig(db, user, params.id));

export const PUT = route(
  { params: projectParams, body: putRigBody },
  async ({ db, user, params, body }) => writeRig(db, user, params.id, body.rig),
);
