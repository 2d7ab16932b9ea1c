// Dashboard load during an import, on loopback only: 20 signed-in users read GET /api/insight/overview over
// 20 connections for a fixed time while the CLI imports a generated attempts file into the same database.
// The baseline is the same load in the same run with no import; the figures that matter are the ratios.
// Afterwards every row of the import must be in the database.
//
// Run: npm run bench -- load
//   QB_LOAD_SECONDS=15      duration of each phase (baseline, then under import)
//   QB_LOAD_ROWS=200000     attempt rows in the imported file
//   QB_LOAD_DB=<file>       an already seeded demo database to copy (default: seed a fresh one)
//   QB_LOAD_BASELINE=0      skip the baseline phase
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import type { Server } from "node:http";
import type { AddressInfo } from "node:net";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { createRequire } from "node:module";
import { createApp } from "../server/app";
import { loadConfig } from "../server/config";
import { openDatabase } from "../server/db/client";
import { DEMO_SCENARIO } from "../server/demo/scenario";
import { createUser } from "../server/users/service";

/** The part of autocannon's API used here (the package ships no types). */
interface LoadResult {
  requests: { total: number; average: number };
  non2xx: number;
  errors: number;
  timeouts: number;
}
interface LoadRun extends PromiseLike<LoadResult> {
  on(event: "response", listener: (client: unknown, status: number, bytes: number, responseTime: number) => void): void;
}
type Autocannon = (options: {
  url: string;
  connections: number;
  duration: number;
  timeout: number;
  requests: { method: "GET"; path: string; headers: Record<string, string> }[];
}) => LoadRun;
const autocannon = createRequire(import.meta.url)("autocannon") as Autocannon;

const SECONDS = Math.max(1, Number(process.env.QB_LOAD_SECONDS ?? 15));
const ROWS = Math.max(1000, Number(process.env.QB_LOAD_ROWS ?? 200_000));
const USERS = 20;
const CONNECTIONS = 20;
/** A hard stop for the whole run, whatever happens. */
const MAX_RUN_MS = 20 * 60 * 1000;
const DEMO_TODAY = "2026-09-30";
const CLASS_DATE = "2026-09-15";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const serving = process.argv[2] === "--serve";
const work = serving ? "" : fs.mkdtempSync(path.join(os.tmpdir(), "qb-load-bench-"));
const cli = (db: string, args: string[]) =>
  spawnSync(process.execPath, ["--import", "tsx", "cli/main.ts", "--db", db, ...args], { cwd: root, encoding: "utf8", env: { ...process.env, QUARTERBEAT_DB: "" } });

const watchdog = setTimeout(() => {
  console.error(`load bench: still running after ${MAX_RUN_MS / 60000} min; stopping.`);
  process.exit(2);
}, MAX_RUN_MS);
watchdog.unref();

function step(text: string) {
  console.log(`· ${text}`);
}

// ---------- database: a copy of a seeded demo network ----------

function prepareDatabase(): string {
  const copy = path.join(work, "load.sqlite");
  let source = process.env.QB_LOAD_DB;
  if (!source) {
    source = path.join(work, "seed.sqlite");
    step(`seeding the demo network (today ${DEMO_TODAY}) …`);
    const seeded = cli(source, ["demo", "seed", "--today", DEMO_TODAY]);
    if (seeded.status !== 0) throw new Error(`demo seed failed:\n${seeded.stderr}`);
  }
  const backup = cli(source, ["backup", copy]);
  if (backup.status !== 0) throw new Error(`backup of ${source} failed:\n${backup.stderr}`);
  return copy;
}

/** A class at one of the demo sites, then `ROWS` attempts in it, as CSV files for the CLI. */
function writeImportFiles(dbFile: string): { classes: string; attempts: string } {
  const db = openDatabase(dbFile, { migrate: false });
  const owner = db.$client
    .prepare("SELECT i.code AS instructor, s.code AS site FROM instructors i JOIN sites s ON s.id = i.site_id WHERE i.active = 1 ORDER BY i.code LIMIT 1")
    .get() as { instructor: string; site: string };
  db.$client.close();
  const classes = path.join(work, "load-classes.csv");
  fs.writeFileSync(classes, `class_id,date,site,instructor,course,learners,passed,manikins\nLOAD-C1,${CLASS_DATE},${owner.site},${owner.instructor},adult,24,20,\n`);
  const attempts = path.join(work, "load-attempts.csv");
  const fd = fs.openSync(attempts, "w");
  let chunk =
    "attempt_id,class_id,learner,manikin,profile,feedback,started_at,duration_s,compressions,rate_cpm,depth_mm,depth_ok_pct,too_shallow_pct,too_deep_pct,rate_ok_pct,too_slow_pct,too_fast_pct,recoil_ok_pct,hands_on_pct,longest_pause_s,instructor_result\n";
  for (let i = 0; i < ROWS; i++) {
    const depthOk = 60 + (i % 40);
    chunk += `LOAD-${i},LOAD-C1,L-${i % 24},LOAD-MK1,adult,${i % 2 ? "live" : "hidden"},${CLASS_DATE}T10:00:00Z,120,230,112,54,${depthOk},${100 - depthOk},0,80,12,8,90,85,4,\n`;
    if (chunk.length > 1 << 20) {
      fs.writeSync(fd, chunk);
      chunk = "";
    }
  }
  fs.writeSync(fd, chunk);
  fs.closeSync(fd);
  return { classes, attempts };
}

// ---------- server (a process of its own, so the load generator does not share its event loop) ----------

async function serve(dbFile: string) {
  const db = openDatabase(dbFile, { migrate: false });
  const config = loadConfig({ NODE_ENV: "test", SESSION_SECRET: "load-bench-secret-0123456789" });
  const app = createApp(db, config, { clientDir: null, signInLimit: { windowMs: 60_000, limit: 1000 } });
  const server: Server = app.listen(0, "127.0.0.1");
  await new Promise((resolve) => server.once("listening", resolve));
  console.log(`listening ${(server.address() as AddressInfo).port}`);
  // stops with its parent: on a signal, or when the parent's pipe closes
  const stop = () => server.close(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.stdin.on("end", stop);
  process.stdin.resume();
}

async function startServer(dbFile: string) {
  const child = spawn(process.execPath, ["--import", "tsx", fileURLToPath(import.meta.url), "--serve", dbFile], {
    cwd: root,
    stdio: ["pipe", "pipe", "inherit"],
  });
  const port = await new Promise<number>((resolve, reject) => {
    let out = "";
    child.stdout.on("data", (d: Buffer) => {
      out += d.toString();
      const match = /listening (\d+)/.exec(out);
      if (match) resolve(Number(match[1]));
    });
    child.on("exit", (code) => reject(new Error(`the server stopped (exit ${code})`)));
  });
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
    });
  return { base: `http://127.0.0.1:${port}`, stop };
}

/** Session cookies of `USERS` sign-ins, spread over the demo accounts that may read the overview. */
async function signInUsers(base: string, emails: string[]): Promise<string[]> {
  const cookies: string[] = [];
  for (let i = 0; i < USERS; i++) {
    const jar = new Map<string, string>();
    const keep = (res: Response) => {
      for (const line of res.headers.getSetCookie()) {
        const [pair] = line.split(";");
        jar.set(pair.slice(0, pair.indexOf("=")), pair.slice(pair.indexOf("=") + 1));
      }
    };
    const header = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
    const first = await fetch(`${base}/api/auth/csrf`);
    keep(first);
    const { csrfToken } = (await first.json()) as { csrfToken: string };
    const login = await fetch(`${base}/api/auth/login`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-csrf-token": csrfToken, cookie: header() },
      body: JSON.stringify({ email: emails[i % emails.length], password: DEMO_SCENARIO.demoPassword }),
    });
    if (login.status !== 200) throw new Error(`sign-in of ${emails[i % emails.length]} failed: ${login.status} ${await login.text()}`);
    keep(login);
    cookies.push(header());
  }
  return cookies;
}

/**
 * `USERS` accounts that may read the overview: the demo's own, then an account for each instructor without
 * one, then quality leads, all with the demo password (in this copy only).
 */
async function readers(db: ReturnType<typeof openDatabase>): Promise<string[]> {
  const sqlite = db.$client;
  const emails = () => sqlite.prepare("SELECT email FROM users WHERE active = 1 AND role IN ('coordinator', 'quality_lead', 'instructor') ORDER BY id").pluck().all() as string[];
  const free = sqlite
    .prepare("SELECT id FROM instructors WHERE active = 1 AND id NOT IN (SELECT instructor_id FROM users WHERE instructor_id IS NOT NULL) ORDER BY id")
    .pluck()
    .all() as number[];
  for (let n = 1; emails().length < USERS; n++) {
    const instructorId = free.shift() ?? null;
    await createUser(db, {
      email: `load-reader-${n}@bench.example`,
      displayName: `Load reader ${n}`,
      role: instructorId === null ? "quality_lead" : "instructor",
      instructorId,
      password: DEMO_SCENARIO.demoPassword,
    });
  }
  return emails().slice(0, USERS);
}

// ---------- load ----------

interface Figures {
  label: string;
  requests: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  non2xx: number;
  errors: number;
  timeouts: number;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

async function load(label: string, base: string, cookies: string[]): Promise<Figures> {
  const times: number[] = [];
  const instance = autocannon({
    url: base,
    connections: CONNECTIONS,
    duration: SECONDS,
    timeout: 30,
    // each connection goes round the users' sessions in turn
    requests: cookies.map((cookie) => ({ method: "GET", path: "/api/insight/overview", headers: { cookie } })),
  });
  instance.on("response", (_client, _status, _bytes, responseTime) => times.push(responseTime));
  const result = await instance;
  times.sort((a, b) => a - b);
  return {
    label,
    requests: result.requests.total,
    perSecond: result.requests.average,
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    non2xx: result.non2xx,
    errors: result.errors,
    timeouts: result.timeouts,
  };
}

function importInBackground(dbFile: string, file: string) {
  const started = performance.now();
  const child = spawn(process.execPath, ["--import", "tsx", "cli/main.ts", "--db", dbFile, "import", "attempts", file, "--json"], {
    cwd: root,
    env: { ...process.env, QUARTERBEAT_DB: "" },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let stdout = "";
  let stderr = "";
  child.stdout.on("data", (d: Buffer) => (stdout += d.toString()));
  child.stderr.on("data", (d: Buffer) => (stderr += d.toString()));
  const done = new Promise<{ code: number | null; seconds: number; stdout: string; stderr: string }>((resolve) =>
    child.on("exit", (code) => resolve({ code, seconds: (performance.now() - started) / 1000, stdout, stderr })),
  );
  return { child, done };
}

// ---------- run ----------

async function main() {
  console.log(`Load: ${USERS} users, ${CONNECTIONS} connections, GET /api/insight/overview, ${SECONDS} s per phase; import of ${ROWS.toLocaleString("en")} attempt rows`);
  const dbFile = prepareDatabase();
  const files = writeImportFiles(dbFile);
  const classes = cli(dbFile, ["import", "classes", files.classes]);
  if (classes.status !== 0) throw new Error(`class import failed:\n${classes.stdout}${classes.stderr}`);

  const db = openDatabase(dbFile, { migrate: false });
  const emails = await readers(db);
  db.$client.close();

  const { base, stop } = await startServer(dbFile);
  try {
    const cookies = await signInUsers(base, emails);
    step(`signed in ${cookies.length} users (${emails.length} accounts); server on ${base}`);

    const phases: Figures[] = [];
    if (process.env.QB_LOAD_BASELINE !== "0") {
      step("baseline: load without an import …");
      phases.push(await load("no import (baseline)", base, cookies));
    }
    step("load while the CLI imports …");
    const importing = importInBackground(dbFile, files.attempts);
    phases.push(await load("during the import", base, cookies));
    const importWasRunning = importing.child.exitCode === null;
    const imported = await importing.done;

    console.log("\n| phase | requests | req/s | p50 ms | p95 ms | p99 ms | non-2xx | errors | timeouts |");
    console.log("|---|---:|---:|---:|---:|---:|---:|---:|---:|");
    for (const f of phases) {
      console.log(`| ${f.label} | ${f.requests} | ${f.perSecond.toFixed(0)} | ${f.p50.toFixed(1)} | ${f.p95.toFixed(1)} | ${f.p99.toFixed(1)} | ${f.non2xx} | ${f.errors} | ${f.timeouts} |`);
    }
    if (phases.length === 2) {
      const [base0, during] = phases;
      console.log(`\nratios during / baseline: req/s ${(during.perSecond / base0.perSecond).toFixed(2)} · p95 ${(during.p95 / base0.p95).toFixed(2)} · p99 ${(during.p99 / base0.p99).toFixed(2)}`);
    }

    const summary = imported.code === 0 ? JSON.parse(imported.stdout).files[0] : null;
    const check = openDatabase(dbFile, { migrate: false });
    const present = check.$client.prepare("SELECT count(*) FROM attempts WHERE class_id = 'LOAD-C1'").pluck().get() as number;
    check.$client.close();
    console.log(
      `\nimport: exit ${imported.code}, ${summary?.status ?? "failed"}, ${imported.seconds.toFixed(1)} s (${(ROWS / imported.seconds).toFixed(0)} rows/s), ` +
        `${importWasRunning ? "still running when the load phase ended" : "finished inside the load phase"}`,
    );
    console.log(`rows present afterwards: ${present} of ${ROWS} ${present === ROWS ? "(all)" : "(MISSING ROWS)"}`);
    const failed = imported.code !== 0 || present !== ROWS || phases.some((f) => f.errors > 0 || f.non2xx > 0);
    if (imported.code !== 0) console.log(imported.stderr);
    if (failed) process.exitCode = 1;
  } finally {
    await stop();
  }
}

if (serving) {
  await serve(process.argv[3]);
} else {
  try {
    await main();
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}
