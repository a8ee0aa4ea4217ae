import path from "node:path";
import { defineConfig } from "vitest/config";

// End-to-end: playwright-core drives Debian's Chromium against a production build that the
// global setup builds and starts (with its own database, mail catcher and port).
export default defineConfig({
  resolve: {
    alias: {
      "@": path.resolve(import.meta.dirname, "src"),
      "server-only": path.resolve(import.meta.dirname, "tests/support/empty.ts"),
    },
  },
  test: {
    include: ["tests/e2e/**/*.test.ts"],
    globalSetup: ["tests/e2e/global-setup.ts"],
    environment: "node",
    testTimeout: 90_000,
    hookTimeout: 120_000,
    fileParallelism: false,
    pool: "forks",
  },
});
