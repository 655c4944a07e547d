import { defineConfig } from "vitest/config";
import path from "node:path";

// Unit tests are pure; API tests talk to the private PostgreSQL cluster (a database per worker,
// see tests/api/setup). Playwright specs in tests/e2e are never collected here. The fault tests
// in tests/slow (kill, restart, fill a disk) run only with `scripts/test --slow` (LF_SLOW_TESTS=1).
const apiSetup = { environment: "node" as const, globalSetup: ["tests/api/global-setup.ts"], setupFiles: ["tests/api/worker-setup.ts"] };
export default defineConfig({
  resolve: { alias: { "@shared": path.resolve("shared"), "@": path.resolve("src") } },
  test: {
    projects: [
      // Unit tests that run ffmpeg, python3 or the CLI wait for a child process: 30 s, not vitest's
      // 5 s, so a busy shared machine slows them without failing them (timeouts catch hangs).
      { extends: true, test: { name: "unit", include: ["tests/unit/**/*.test.ts", "tests/unit/**/*.test.tsx"], environment: "node", testTimeout: 30_000 } },
      { extends: true, test: { name: "api", include: ["tests/api/**/*.test.ts"], ...apiSetup, testTimeout: 60_000, hookTimeout: 60_000 } },
      ...(process.env.LF_SLOW_TESTS === "1"
        ? [{ extends: true as const, test: { name: "slow", include: ["tests/slow/**/*.test.ts"], ...apiSetup, testTimeout: 180_000, hookTimeout: 120_000 } }]
        : []),
    ],
  },
});
