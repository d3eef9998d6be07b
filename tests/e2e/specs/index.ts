/**
 * The spec registry: add your spec file here. Each exports `tests: E2ETest[]` (see ../harness.ts).
 * Run one file with `npm run test:e2e -- --grep <text>` (matches test names).
 */
import type { E2ETest } from "../harness";
import { tests as auth } from "./auth.spec";
import { tests as designer } from "./designer.spec";
import { tests as runs } from "./runs.spec";

export const specs: { file: string; tests: E2ETest[] }[] = [
  { file: "auth.spec.ts", tests: auth },
  { file: "designer.spec.ts", tests: designer },
  { file: "runs.spec.ts", tests: runs },
];
