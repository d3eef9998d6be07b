import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // PGlite ships WASM + data files and argon2 a native binary: keep both out of the bundle.
  serverExternalPackages: ["@electric-sql/pglite", "@node-rs/argon2"],
  poweredByHeader: false,
  // `npm test` type-checks the whole project first; the e2e build skips repeating it.
  typescript: { ignoreBuildErrors: process.env.TIDEWRIGHT_SKIP_BUILD_TYPECHECK === "1" },
};

export default nextConfig;
