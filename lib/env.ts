/**
 * Environment, parsed with zod on first use (never at import, so `next build` does not need it).
 * A bad value fails fast with a message naming the variable.
 */
import { z } from "zod";

const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  /** PGlite data directory (embedded database). Ignored when DATABASE_URL is set. */
  TIDEWRIGHT_DATA_DIR: z.string().min(1).default("./data/pglite"),
  /** postgres://… selects a PostgreSQL server through node-postgres instead of PGlite. */
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, "must start with postgres:// or postgresql://")
    .optional(),
  /** "0" disables seeding the demo team into an empty database. */
  TIDEWRIGHT_DEMO: z.enum(["0", "1"], { error: 'must be "0" or "1"' }).default("1"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
});

export type Env = z.infer<typeof envSchema>;

let cached: Env | undefined;

export function parseEnv(source: Record<string, string | undefined>): Env {
  // Treat empty strings as unset: `DATABASE_URL= npm start` should mean "no server".
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ""));
  const result = envSchema.safeParse(cleaned);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid environment configuration:\n${lines.join("\n")}`);
  }
  return result.data;
}

export function env(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}

/** For tests that change process.env between cases. */
export function resetEnvCache(): void {
  cached = undefined;
}
