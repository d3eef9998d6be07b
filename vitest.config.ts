import { defineConfig } from "vitest/config";
import path from "node:path";

const alias = {
  "@": path.resolve(__dirname),
  // `server-only` throws outside a React Server Component bundle; tests call server modules directly.
  "server-only": path.resolve(__dirname, "tests/fixtures/server-only.ts"),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: "node",
          environment: "node",
          include: ["tests/unit/**/*.test.ts"],
          globalSetup: ["tests/fixtures/global-setup.ts"],
          testTimeout: 30000,
          hookTimeout: 60000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "components",
          environment: "jsdom",
          include: ["tests/components/**/*.test.tsx"],
          setupFiles: ["tests/fixtures/jsdom-setup.ts"],
        },
      },
    ],
  },
});
