// Dashboard load during an import, on loopback only: 20 signed-in users open the pages they use most — the
// overview, the error breakdown, the instructors' comparison (coordinators, quality leads) or My standing
// (instructors), and the attempt list — over 20 connections for a fixed time while the CLI imports a
// generated attempts file into the same database. The baseline is the same load in the same run with no
// import; the figures that matter are the ratios. Afterwards every row of the import must be in the database.
//
// Printed for each phase (baseline, under import):
//   - requests, req/s and response-time p50/p95/p99 (ms);
//   - non-2xx answers, request errors (autocannon's `errors`, which include its `timeouts`), timeouts and
//     connection resets (request errors with ECONNRESET);
//   - the server's event-loop delay p50/p99/max (ms): perf_hooks.monitorEventLoopDelay in the server process
//     at a 10 ms resolution, shown beyond that 10 ms sampling interval, i.e. how long the loop was blocked.
// Before the load, each route is asked alone on a quiet server, first just after a data change (uncached, as
// after every import), then cached, with the event loop's longest block during that first answer: which
// request path holds the loop, and how long. The whole quarter's CSV export is asked there too. Under the
// load itself the 20 connections send without pause, so the loop always has requests waiting and its delay
// also counts requests answered one after another in one turn, not only one request's block.
// Goals (the product's): the loop never blocks more than 100 ms; 0 errors, 0 resets, 0 non-2xx.
//
// Run: npm run bench -- load
//   QB_LOAD_SECONDS=15      duration of each phase (baseline, then under import)
//   QB_LOAD_ROWS=200000     attempt rows in the imported file
//   QB_LOAD_DB=<file>       an already seeded database to copy (default: seed a fresh demo one), e.g. a
//                           generated large network (tests/fixtures/insight/generateNetwork.ts)
//   QB_LOAD_QUARTER=2026-Q3 the quarter the pages ask for and the import's class falls in (a large network's
//                           newest quarter)
//   QB_LOAD_BASELINE=0      skip the baseline phase
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import type { Server } from "node:http";
import type { AddressInfo } from "node:net";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { createRequire } from "node:module";
import { monitorEventLoopDelay } from "node:perf_hooks";
import { createInterface } from "node:readline";
import { createApp } from "../server/app";
import { loadConfig } from "../server/config";
import { openDatabase } from "../server/db/client";
import { DEMO_SCENARIO } from "../server/demo/scenario";
import { createUser } from "../server/users/service";
import { quarterDates } from "../shared/period";
import { ATTEMPTS_COLUMNS } from "../server/demo/importFiles";

/** The part of autocannon's API used here (the package ships no types). */
interface LoadResult {
  requests: { total: number; average: number };
  non2xx: number;
  errors: number;
  timeouts: number;
}
interface LoadRun extends PromiseLike<LoadResult> {
  on(event: "response", listener: (client: unknown, status: number, bytes: number, responseTime: number) => void): void;
  on(event: "reqError", listener: (error: Error & { code?: string }) => void): void;
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
const QUARTER = process.env.QB_LOAD_QUARTER ?? "2026-Q3";
/** The server's event-loop delay is sampled this often; a delay beyond it is time the loop was blocked. */
const LOOP_RESOLUTION_MS = 10;
/** What each role opens, as the pages ask for it (the period is written into the URL). */
const PAGES = {
  overview: `/api/insight/overview?quarter=${QUARTER}`,
  errors: `/api/insight/errors?quarter=${QUARTER}`,
  instructors: `/api/insight/instructors?quarter=${QUARTER}`,
  standing: `/api/insight/standing?quarter=${QUARTER}`,
  attempts: `/api/attempts?quarter=${QUARTER}&page=1&pageSize=50`,
};
/** Asked alone before the load, not part of it: the whole quarter's attempts as one CSV file. */
const EXPORT = `/api/attempts.csv?quarter=${QUARTER}`;
type Role = "coordinator" | "quality_lead" | "instructor";
const pagesOf = (role: Role): string[] =>
  role === "instructor" ? [PAGES.overview, PAGES.standing, PAGES.attempts] : [PAGES.overview, PAGES.errors, PAGES.instructors, PAGES.attempts];
/** The imported class's date: the 15th of the quarter's first month. */
const CLASS_DATE = `${quarterDates(QUARTER).first.slice(0, 8)}15`;

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const serving = process.argv[2] === "--serve";
const work = serving ? "" : fs.mkdtempSync(path.join(os.tmpdir(), "qb-load-bench-"));
const cli = (db: string, args: string[]) =>
  spawnSync(process.execPath, ["--import", "tsx", "cli/main.ts", "--db", db, ...args], {
    cwd: root,
    encoding: "utf8",
    env: { ...process.env, QUARTERBEAT_DB: "" },
  });

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
  fs.writeFileSync(
    classes,
    `class_id,date,site,instructor,course,learners,passed,manikins\nLOAD-C1,${CLASS_DATE},${owner.site},${owner.instructor},adult,24,20,\n`,
  );
  const attempts = path.join(work, "load-attempts.csv");
  const fd = fs.openSync(attempts, "w");
  let chunk = `${ATTEMPTS_COLUMNS.join(",")}\n`;
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
  const loop = monitorEventLoopDelay({ resolution: LOOP_RESOLUTION_MS });
  loop.enable();
  console.log(`listening ${(server.address() as AddressInfo).port}`);
  // the parent marks the start of a phase ("reset") and asks for its event-loop delay ("loop")
  const ms = (ns: number) => Math.max(0, ns / 1e6 - LOOP_RESOLUTION_MS);
  createInterface({ input: process.stdin }).on("line", (command) => {
    if (command === "reset") {
      loop.reset();
      console.log("reset ok");
    } else if (command === "loop") {
      const figures = loop.count === 0 ? { p50: 0, p99: 0, max: 0 } : { p50: ms(loop.percentile(50)), p99: ms(loop.percentile(99)), max: ms(loop.max) };
      console.log(`loop ${JSON.stringify(figures)}`);
    }
  });
  // stops with its parent: on a signal, or when the parent's pipe closes
  const stop = () => server.close(() => process.exit(0));
  process.on("SIGTERM", stop);
  process.stdin.on("end", stop);
}

interface LoopDelay {
  p50: number;
  p99: number;
  max: number;
}

async function startServer(dbFile: string) {
  const child = spawn(process.execPath, ["--import", "tsx", fileURLToPath(import.meta.url), "--serve", dbFile], {
    cwd: root,
    stdio: ["pipe", "pipe", "inherit"],
  });
  const lines = createInterface({ input: child.stdout });
  const waiting: { prefix: string; resolve: (rest: string) => void }[] = [];
  lines.on("line", (line) => {
    const index = waiting.findIndex((w) => line.startsWith(`${w.prefix} `));
    if (index < 0) return;
    const [found] = waiting.splice(index, 1);
    found.resolve(line.slice(found.prefix.length + 1));
  });
  const next = (prefix: string) => new Promise<string>((resolve) => waiting.push({ prefix, resolve }));
  const port = await new Promise<number>((resolve, reject) => {
    void next("listening").then((rest) => resolve(Number(rest)));
    child.on("exit", (code) => reject(new Error(`the server stopped (exit ${code})`)));
  });
  /** Starts a fresh measurement of the server's event-loop delay. */
  const resetLoop = async () => {
    const answered = next("reset");
    child.stdin.write("reset\n");
    await answered;
  };
  /** The event-loop delay since the last reset. */
  const loopDelay = async (): Promise<LoopDelay> => {
    const answered = next("loop");
    child.stdin.write("loop\n");
    return JSON.parse(await answered) as LoopDelay;
  };
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
    });
  return { base: `http://127.0.0.1:${port}`, stop, resetLoop, loopDelay };
}

interface Reader {
  email: string;
  role: Role;
}

/** Session cookies of `USERS` sign-ins, spread over the demo accounts that may read the overview. */
async function signInUsers(base: string, accounts: Reader[]): Promise<{ cookie: string; role: Role }[]> {
  const emails = accounts.map((a) => a.email);
  const cookies: { cookie: string; role: Role }[] = [];
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
    cookies.push({ cookie: header(), role: accounts[i % accounts.length].role });
  }
  return cookies;
}

/** The mix of readers the demo network has: one coordinator, seven quality leads, the rest instructors. */
const MIX: Record<Role, number> = { coordinator: 1, quality_lead: 7, instructor: USERS - 8 };

/**
 * `USERS` accounts that may read the overview, in the demo's mix: the database's own first, then new accounts
 * (an instructor's for each instructor without one) until each role has its share, all with the demo password
 * (in this copy only). A generated network without users gets the same mix as the demo.
 */
async function readers(db: ReturnType<typeof openDatabase>): Promise<Reader[]> {
  const sqlite = db.$client;
  const accounts = () =>
    sqlite.prepare("SELECT email, role FROM users WHERE active = 1 AND role IN ('coordinator', 'quality_lead', 'instructor') ORDER BY id").all() as Reader[];
  const free = sqlite
    .prepare("SELECT id FROM instructors WHERE active = 1 AND id NOT IN (SELECT instructor_id FROM users WHERE instructor_id IS NOT NULL) ORDER BY id")
    .pluck()
    .all() as number[];
  const chosen: Reader[] = [];
  let n = 0;
  for (const role of Object.keys(MIX) as Role[]) {
    const own = accounts().filter((a) => a.role === role);
    while (own.length < MIX[role] && (role !== "instructor" || free.length > 0)) {
      n++;
      const email = `load-reader-${n}@bench.example`;
      await createUser(db, {
        email,
        displayName: `Load reader ${n}`,
        role,
        instructorId: role === "instructor" ? free.shift()! : null,
        password: DEMO_SCENARIO.demoPassword,
      });
      own.push({ email, role });
    }
    chosen.push(...own.slice(0, MIX[role]));
  }
  return chosen;
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
  resets: number;
  loop: LoopDelay;
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

type BenchServer = Awaited<ReturnType<typeof startServer>>;

async function load(label: string, server: BenchServer, users: { cookie: string; role: Role }[]): Promise<Figures> {
  const times: number[] = [];
  let resets = 0;
  await server.resetLoop();
  const instance = autocannon({
    url: server.base,
    connections: CONNECTIONS,
    duration: SECONDS,
    timeout: 30,
    // each connection goes round every user's pages in turn
    requests: users.flatMap(({ cookie, role }) => pagesOf(role).map((path) => ({ method: "GET" as const, path, headers: { cookie } }))),
  });
  instance.on("response", (_client, _status, _bytes, responseTime) => times.push(responseTime));
  instance.on("reqError", (error) => {
    if (error.code === "ECONNRESET") resets++;
  });
  const result = await instance;
  const loop = await server.loopDelay();
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
    resets,
    loop,
  };
}

interface RouteAlone {
  path: string;
  status: number;
  firstMs: number;
  cachedMs: number;
  loopMaxMs: number;
}

/** Each route asked alone, first uncached and then cached, with the loop's longest block during the first. */
async function routesAlone(server: BenchServer, users: { cookie: string; role: Role }[]): Promise<RouteAlone[]> {
  const coordinator = users.find((u) => u.role === "coordinator") ?? users[0];
  const instructor = users.find((u) => u.role === "instructor");
  const asks: { path: string; cookie: string }[] = [
    ...[PAGES.overview, PAGES.errors, PAGES.instructors, PAGES.attempts, EXPORT].map((path) => ({ path, cookie: coordinator.cookie })),
    ...(instructor ? [{ path: PAGES.standing, cookie: instructor.cookie }] : []),
  ];
  const timed = async (path: string, cookie: string) => {
    const started = performance.now();
    const res = await fetch(`${server.base}${path}`, { headers: { cookie } });
    await res.arrayBuffer();
    return { status: res.status, ms: performance.now() - started };
  };
  const rows: RouteAlone[] = [];
  for (const { path, cookie } of asks) {
    await server.resetLoop();
    const first = await timed(path, cookie);
    const loop = await server.loopDelay();
    const again: number[] = [];
    for (let i = 0; i < 3; i++) again.push((await timed(path, cookie)).ms);
    again.sort((a, b) => a - b);
    rows.push({ path, status: first.status, firstMs: first.ms, cachedMs: again[1], loopMaxMs: loop.max });
  }
  return rows;
}

function countRoles(users: { role: Role }[]): string {
  const counts = new Map<Role, number>();
  for (const { role } of users) counts.set(role, (counts.get(role) ?? 0) + 1);
  return [...counts].map(([role, n]) => `${n} ${role}`).join(", ");
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
  console.log(
    `Load: ${USERS} users, ${CONNECTIONS} connections, each user's pages in turn (${Object.keys(PAGES).join(", ")}), ${SECONDS} s per phase; import of ${ROWS.toLocaleString("en")} attempt rows`,
  );
  const dbFile = prepareDatabase();
  const files = writeImportFiles(dbFile);

  const db = openDatabase(dbFile, { migrate: false });
  const accounts = await readers(db);
  db.$client.close();

  const server = await startServer(dbFile);
  const { base, stop } = server;
  try {
    const users = await signInUsers(base, accounts);
    step(`signed in ${users.length} users (${accounts.length} accounts: ${countRoles(users)}); server on ${base}`);

    step("each route alone on a quiet server: once to load its code, then after a data change …");
    await routesAlone(server, users);
    // the class of the imported attempts, imported now: a data change, so every answer is computed afresh
    const classes = cli(dbFile, ["import", "classes", files.classes]);
    if (classes.status !== 0) throw new Error(`class import failed:\n${classes.stdout}${classes.stderr}`);
    const alone = await routesAlone(server, users);
    console.log("\n| route (alone) | status | first ms | cached ms | loop blocked ms (first) |");
    console.log("|---|---:|---:|---:|---:|");
    for (const r of alone) console.log(`| ${r.path} | ${r.status} | ${r.firstMs.toFixed(1)} | ${r.cachedMs.toFixed(1)} | ${r.loopMaxMs.toFixed(0)} |`);
    console.log("");

    const phases: Figures[] = [];
    if (process.env.QB_LOAD_BASELINE !== "0") {
      step("baseline: load without an import …");
      phases.push(await load("no import (baseline)", server, users));
    }
    step("load while the CLI imports …");
    const importing = importInBackground(dbFile, files.attempts);
    phases.push(await load("during the import", server, users));
    const importWasRunning = importing.child.exitCode === null;
    const imported = await importing.done;

    console.log("\n| phase | requests | req/s | p50 ms | p95 ms | p99 ms | non-2xx | errors | timeouts | resets | loop p50 ms | loop p99 ms | loop max ms |");
    console.log("|---|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|---:|");
    for (const f of phases) {
      console.log(
        `| ${f.label} | ${f.requests} | ${f.perSecond.toFixed(0)} | ${f.p50.toFixed(1)} | ${f.p95.toFixed(1)} | ${f.p99.toFixed(1)} | ${f.non2xx} | ${f.errors} | ${f.timeouts} | ${f.resets} | ` +
          `${f.loop.p50.toFixed(0)} | ${f.loop.p99.toFixed(0)} | ${f.loop.max.toFixed(0)} |`,
      );
    }
    console.log(`(event-loop delay beyond the ${LOOP_RESOLUTION_MS} ms sampling interval, in the server process; goal: max ≤ 100 ms)`);
    if (phases.length === 2) {
      const [base0, during] = phases;
      console.log(
        `\nratios during / baseline: req/s ${(during.perSecond / base0.perSecond).toFixed(2)} · p95 ${(during.p95 / base0.p95).toFixed(2)} · p99 ${(during.p99 / base0.p99).toFixed(2)}`,
      );
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
    const failed =
      imported.code !== 0 || present !== ROWS || phases.some((f) => f.errors > 0 || f.non2xx > 0 || f.resets > 0) || alone.some((r) => r.status !== 200);
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
