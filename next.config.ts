import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // PGlite ships WASM + data files and argon2 a native binary: keep both out of the bundle.
  serverExternalPackages: ["@electric-sql/pglite", "@node-rs/argon2"],
  poweredByHeader: false,
};

export default nextConfig;
