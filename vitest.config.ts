import { defineConfig } from "vitest/config";
import path from "node:path";

// Unit tests are pure; API tests talk to the private PostgreSQL cluster (a database per worker,
// see tests/api/setup). Playwright specs in tests/e2e are never collected here.
export default defineConfig({
  resolve: { alias: { "@shared": path.resolve("shared"), "@": path.resolve("src") } },
  test: {
    projects: [
      { extends: true, test: { name: "unit", include: ["tests/unit/**/*.test.ts", "tests/unit/**/*.test.tsx"], environment: "node" } },
      {
        extends: true,
        test: {
          name: "api",
          include: ["tests/api/**/*.test.ts"],
          environment: "node",
          globalSetup: ["tests/api/global-setup.ts"],
          setupFiles: ["tests/api/worker-setup.ts"],
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
});
