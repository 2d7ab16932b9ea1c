// `npm start`: build the client if needed, open and migrate the database, seed the demo network when empty
// (not in production), start the local mail service when no SMTP_URL is set, then serve app and API.
// Compiled by `npm run build` into dist/server/main.js, which `NODE_ENV=production npm start` runs.
import fs from "node:fs";
import path from "node:path";
import { loadConfig } from "./config";
import { openDatabase } from "./db/client";
import { createApp } from "./app";
import { startLocalMailService } from "./mail/localService";
import { createLogger } from "./logging/logger";
import { createMailer } from "./mail/mailer";
import { alertCoordinators, type BackupProblem } from "./ops/backupAlert";
import { recordBackup } from "./ops/backupLog";
import { startBackupSchedule } from "./ops/backupSchedule";
import { holdServerLock } from "./ops/serverLock";
import { AppError } from "./errors";
import { projectRoot } from "./projectRoot";
import { demoAccountsPresent, isEmpty, seedDemo } from "./seed/seedDemo";

const root = projectRoot;
const clientDir = path.join(root, "dist/client");

async function ensureClientBuilt(production: boolean) {
  if (fs.existsSync(path.join(clientDir, "index.html"))) return;
  // production runs without development tools: the client comes from `npm run build`
  if (production)
    throw new AppError("build_missing", 500, `The web client is not built (${clientDir} has no index.html).`, undefined, "Run `npm run build` first.");
  console.log("Building the web client (first start only)…");
  const { build } = await import("vite");
  await build({ root, logLevel: "warn" });
}

async function main() {
  const config = loadConfig();
  // `quarterbeat restore` reads this lock and refuses to replace the file while this server runs
  const releaseLock = holdServerLock(config.dbFile);
  const production = config.nodeEnv === "production";
  await ensureClientBuilt(production);
  const db = openDatabase(config.dbFile);
  if (isEmpty(db) && production) {
    console.log("Empty database: add the first coordinator with `node dist/server/cli.js users add EMAIL --name NAME --role coordinator`.");
  } else if (isEmpty(db)) {
    console.log("Empty database: seeding the invented demo network (about half a minute)…");
    await seedDemo(db);
  }
  const demoAccounts = demoAccountsPresent(db);
  // Without SMTP_URL, mail goes to a local SMTP server whose messages land in the outbox, never out.
  const localMail = config.smtpUrl ? null : await startLocalMailService(db);
  const logger = createLogger(config);
  const app = createApp(db, localMail ? { ...config, smtpUrl: localMail.url } : config, { clientDir, logger, localMail: localMail !== null });
  const { dir: backupDir, hourUtc, keep } = config.backups;
  const alertMailer = createMailer(localMail?.url ?? config.smtpUrl);
  const onProblem = (problem: BackupProblem) => alertCoordinators(db, alertMailer, logger, problem);
  const backups = backupDir
    ? startBackupSchedule({ dbFile: config.dbFile, dir: backupDir, hourUtc, keep, logger, onProblem, record: (entry) => recordBackup(db, entry) })
    : null;
  const server = app.listen(config.port, () => {
    const address = server.address();
    const port = typeof address === "object" && address ? address.port : config.port;
    console.log(`Quarterbeat is running at http://localhost:${port}  (database: ${config.dbFile})`);
    if (backupDir) console.log(`Verified backups daily at ${String(hourUtc).padStart(2, "0")}:00 UTC into ${backupDir}.`);
    if (localMail) {
      console.log(`Local mail service on 127.0.0.1:${localMail.port} (no SMTP_URL set): e-mail is kept in the Outbox, not delivered.`);
    }
    if (demoAccounts.length > 0) {
      console.log("Demo sign-ins (demo data only, never for a real network):");
      for (const account of demoAccounts) console.log(`  ${account.role.padEnd(13)} ${account.email}  ${account.password}`);
    }
  });
  const stop = () =>
    server.close(async () => {
      backups?.stop();
      await backups?.idle();
      await localMail?.close();
      db.$client.close();
      releaseLock();
      process.exit(0);
    });
  process.on("SIGINT", stop);
  process.on("SIGTERM", stop);
}

main().catch((err) => {
  console.error(`quarterbeat: could not start: ${err instanceof Error ? err.message : String(err)}`);
  if (err instanceof AppError && err.hint) console.error(`  → ${err.hint}`);
  process.exit(1);
});
