import { defineConfig } from "vitest/config";
import react from "@vitejs/plugin-react";

// Two projects: pure/server code runs in node, React components in jsdom.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: "node",
          environment: "node",
          include: ["tests/unit/**/*.test.ts", "tests/api/**/*.test.ts", "tests/cli/**/*.test.ts", "tests/security/**/*.test.ts", "tests/faults/**/*.test.ts"],
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
      {
        plugins: [react()],
        test: {
          name: "components",
          environment: "jsdom",
          // rendering charts in jsdom is slow on a busy 2-core machine
          testTimeout: 30_000,
          include: ["tests/components/**/*.test.tsx"],
          // the msw server that stands in for the API (tests/components/testServer.ts)
          setupFiles: ["tests/components/setup.ts"],
          deps: { optimizer: { client: { include: ["react-router", "react-router/dom"] } } },
        },
      },
    ],
  },
});
