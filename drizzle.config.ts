import { defineConfig } from "drizzle-kit";

// drizzle-kit only generates SQL from db/schema.ts here; it never connects to a database.
// Migrations are applied from code at start-up (db/migrate.ts), never with `drizzle-kit migrate`,
// and drizzle-kit must never be pointed at a live PGlite data dir (PGlite has no cross-process lock).
export default defineConfig({
  dialect: "postgresql",
  schema: "./db/schema.ts",
  out: "./db/migrations",
});
