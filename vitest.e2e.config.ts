import { defineConfig } from "vitest/config";

// Browser journeys: playwright-core drives Debian's Chromium against a server started by the tests.
export default defineConfig({
  test: {
    name: "e2e",
    environment: "node",
    include: ["tests/e2e/**/*.e2e.ts"],
    testTimeout: 120_000,
    hookTimeout: 180_000,
    fileParallelism: false,
    passWithNoTests: true,
  },
});
