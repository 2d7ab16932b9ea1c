// `npm run test:e2e`: the browser journeys (tests/e2e/*.e2e.ts) in Debian's Chromium against the built app
// (`npm run build`), started once per run on a fresh temporary database seeded with the demo network, its mail
// going to the local mail service (the database's mailbox, as the Outbox shows it).
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { defineConfig } from "@playwright/test";
import { SEED_TODAY } from "./tests/e2e/support/seed";
import { freePort } from "./tests/helpers/freePort";

// The runner loads this file again in each worker; the workers inherit these variables from the runner, so
// all of them talk to the one server (on a port free a moment before it starts) and read its one database.
// The folder is made by the seeding command (the CLI creates a database's folder), so listing the tests leaves
// nothing behind.
process.env.QB_E2E_DIR ??= path.join(os.tmpdir(), `qb-e2e-${process.pid}-${randomBytes(4).toString("hex")}`);
process.env.QB_E2E_PORT ??= String(await freePort());
const databaseFile = path.join(process.env.QB_E2E_DIR, "quarterbeat.sqlite");
process.env.QB_E2E_DB = databaseFile;
const baseURL = `http://127.0.0.1:${process.env.QB_E2E_PORT}`;

const root = path.dirname(fileURLToPath(import.meta.url));
const missing = ["dist/server/main.js", "dist/server/cli.js", "dist/client/index.html"].filter((file) => !fs.existsSync(path.join(root, file)));
if (missing.length > 0) throw new Error(`The browser journeys run the built app, but ${missing.join(", ")} is missing: run \`npm run build\` first.`);

export default defineConfig({
  testDir: "tests/e2e",
  testMatch: "*.e2e.ts",
  // one journey at a time: they share one server and database, and the machine has two cores
  workers: 1,
  fullyParallel: false,
  forbidOnly: true,
  /** A whole journey: a dozen pages, each waited for, with an accessibility scan on most of them. */
  timeout: 300_000,
  outputDir: "test-results/e2e",
  reporter: [["list"], ["html", { outputFolder: "test-results/e2e-report", open: "never" }]],
  globalTeardown: "./tests/e2e/support/teardown.ts",
  use: {
    baseURL,
    browserName: "chromium",
    headless: true,
    launchOptions: {
      executablePath: "/usr/bin/chromium",
      // the background services that reach out to the network switched off
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--disable-quic",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    },
    viewport: { width: 1360, height: 900 },
    acceptDownloads: true,
    locale: "en-GB",
    timezoneId: "UTC",
    // a missing element fails the step with its name well before the journey's own time limit
    actionTimeout: 30_000,
    navigationTimeout: 30_000,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
  },
  webServer: {
    // the built CLI seeds the demo network into the empty file, then the built server serves it; without
    // SMTP_URL the server starts the local mail service
    command: `node dist/server/cli.js demo seed --today ${SEED_TODAY} && node dist/server/main.js`,
    url: `${baseURL}/api/health`,
    env: {
      NODE_ENV: "test",
      QUARTERBEAT_DB: databaseFile,
      PORT: process.env.QB_E2E_PORT,
      SESSION_SECRET: "e2e-session-secret-of-enough-length",
      SMTP_URL: "",
      BACKUP_DIR: "off",
    },
    reuseExistingServer: false,
    // seeding the demo network takes about half a minute on a quiet machine
    timeout: 240_000,
    stdout: "ignore",
    stderr: "pipe",
    gracefulShutdown: { signal: "SIGTERM", timeout: 10_000 },
  },
});
