// Insight API under load: overview, instructors (funnel) and errors (Pareto) on an invented network of
// 1 million attempts (500 instructors, 8 quarters), against the same endpoints on a ~6,000-attempt network
// measured in the same run. Goal: p95 < 100 ms per endpoint at 1 million attempts, 10 connections.
//
// Two figures per endpoint and size:
// - cold: the full computation (answer cache off), timed over a few sequential requests; this is what the
//   first request after an import or a rescore costs;
// - under load: autocannon, 10 connections for QB_BENCH_DURATION seconds (default 15), with the answer cache
//   on as in production (answers are computed once per state of the database; any write clears them).
// The server runs in a child process on 127.0.0.1 (port 0), so the load generator never shares its thread.
//
// Run: npx tsx bench/insight.bench.ts
//   QB_BENCH_SCALE=0.1       shrink the large network (0.1 → about 100,000 attempts)
//   QB_BENCH_DURATION=3      seconds of load per endpoint
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import { createRequire } from "node:module";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { quantile } from "../shared/stats";

/** The part of autocannon's API used here (the package ships no type declarations). */
interface AutocannonInstance {
  on(event: "response", listener: (client: unknown, status: number, bytes: number, ms: number) => void): void;
}
type Autocannon = (
  options: { url: string; connections: number; duration: number; headers: Record<string, string> },
  done: (err: Error | null) => void,
) => AutocannonInstance;
const autocannon = createRequire(import.meta.url)("autocannon") as Autocannon;

const self = fileURLToPath(import.meta.url);
const PASSWORD = "bench-password-long-enough";
const EMAIL = "bench@bench.example";
const ENDPOINTS = [
  // the cheapest signed-in route: what sessions, sign-in and the HTTP stack cost on this machine
  { name: "floor: /api/me", path: "/api/me" },
  { name: "overview", path: "/api/insight/overview" },
  { name: "instructors (funnel)", path: "/api/insight/instructors" },
  { name: "errors (Pareto)", path: "/api/insight/errors" },
];
const COLD_RUNS = 3;
const GOAL_P95_MS = 100;

// ---- server role: open the database, start the app, print the port ---------------------------------------

async function serve() {
  const { openDatabase } = await import("../server/db/client");
  const { createApp } = await import("../server/app");
  const { loadConfig } = await import("../server/config");
  const { setInsightCache } = await import("../server/insight/cache");
  setInsightCache(process.env.QB_BENCH_CACHE !== "off");
  const db = openDatabase(process.env.QB_BENCH_DB!);
  const app = createApp(db, loadConfig({ NODE_ENV: "test", SESSION_SECRET: "bench-secret-at-least-16" }), { clientDir: null });
  const server = app.listen(0, "127.0.0.1", () => {
    const address = server.address();
    process.stdout.write(`PORT ${typeof address === "object" && address ? address.port : 0}\n`);
  });
  process.on("SIGTERM", () => server.close(() => process.exit(0)));
}

// ---- bench role -------------------------------------------------------------------------------------------

interface Size {
  label: string;
  instructors: number;
  classesPerInstructorQuarter: number;
}

async function buildDatabase(size: Size): Promise<{ file: string; attempts: number; seconds: number }> {
  const { generateNetwork } = await import("../tests/fixtures/insight/generateNetwork");
  const { createUser } = await import("../server/users/service");
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "qb-bench-insight-")), "network.sqlite");
  const started = performance.now();
  const { db, attempts } = generateNetwork(file, { instructors: size.instructors, quarters: 8, classesPerInstructorQuarter: size.classesPerInstructorQuarter, attemptsPerClass: 10 });
  await createUser(db, { email: EMAIL, displayName: "Bench", role: "coordinator", instructorId: null, password: PASSWORD });
  db.$client.close();
  return { file, attempts, seconds: (performance.now() - started) / 1000 };
}

async function startServer(file: string, cache: boolean): Promise<{ child: ChildProcess; base: string }> {
  const child = spawn(process.execPath, ["--import", "tsx", self], {
    env: { ...process.env, QB_BENCH_ROLE: "server", QB_BENCH_DB: file, QB_BENCH_CACHE: cache ? "on" : "off" },
    stdio: ["ignore", "pipe", "inherit"],
  });
  const port = await new Promise<number>((resolve, reject) => {
    let out = "";
    child.stdout!.on("data", (chunk) => {
      out += chunk;
      const match = /PORT (\d+)/.exec(out);
      if (match) resolve(Number(match[1]));
    });
    child.on("exit", (code) => reject(new Error(`bench server exited with ${code}`)));
  });
  return { child, base: `http://127.0.0.1:${port}` };
}

function stopServer(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    child.removeAllListeners("exit");
    child.on("exit", () => resolve());
    child.kill("SIGTERM");
  });
}

/** Signs in and returns the cookie header for the session. */
async function signIn(base: string): Promise<string> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const cookies = csrf.headers.getSetCookie().map((c) => c.split(";")[0]);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const login = await fetch(`${base}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": csrfToken, cookie: cookies.join("; ") },
    body: JSON.stringify({ email: EMAIL, password: PASSWORD }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status} ${await login.text()}`);
  const session = login.headers.getSetCookie().map((c) => c.split(";")[0]);
  const jar = new Map([...cookies, ...session].map((c) => [c.split("=")[0], c]));
  return [...jar.values()].join("; ");
}

async function timedGet(url: string, cookie: string): Promise<number> {
  const started = performance.now();
  const res = await fetch(url, { headers: { cookie } });
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`${url} answered ${res.status}`);
  return performance.now() - started;
}

interface LoadFigures {
  requests: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
}

function load(url: string, cookie: string, seconds: number): Promise<LoadFigures> {
  const times: number[] = [];
  let errors = 0;
  return new Promise((resolve, reject) => {
    const instance = autocannon({ url, connections: 10, duration: seconds, headers: { cookie } }, (err) => {
      if (err) return reject(err);
      resolve({ requests: times.length, p50: quantile(times, 0.5) ?? NaN, p95: quantile(times, 0.95) ?? NaN, p99: quantile(times, 0.99) ?? NaN, errors });
    });
    instance.on("response", (_client, status, _bytes, ms) => {
      if (status !== 200) errors += 1;
      times.push(ms);
    });
  });
}

interface Measured {
  attempts: number;
  cold: Record<string, number>;
  warm: Record<string, LoadFigures>;
}

async function measure(size: Size, seconds: number, query: string): Promise<Measured> {
  const built = await buildDatabase(size);
  console.log(`${size.label}: ${built.attempts.toLocaleString("en-GB")} attempts generated in ${built.seconds.toFixed(1)} s`);
  const cold: Record<string, number> = {};
  const warm: Record<string, LoadFigures> = {};
  try {
    const uncached = await startServer(built.file, false);
    try {
      const cookie = await signIn(uncached.base);
      for (const endpoint of ENDPOINTS) {
        const runs: number[] = [];
        for (let i = 0; i < COLD_RUNS; i++) runs.push(await timedGet(`${uncached.base}${endpoint.path}?${query}`, cookie));
        cold[endpoint.name] = quantile(runs, 0.5)!;
      }
    } finally {
      await stopServer(uncached.child);
    }
    const cachedServer = await startServer(built.file, true);
    try {
      const cookie = await signIn(cachedServer.base);
      for (const endpoint of ENDPOINTS) {
        const url = `${cachedServer.base}${endpoint.path}?${query}`;
        await timedGet(url, cookie); // the one computation per database state
        warm[endpoint.name] = await load(url, cookie, seconds);
      }
    } finally {
      await stopServer(cachedServer.child);
    }
  } finally {
    fs.rmSync(path.dirname(built.file), { recursive: true, force: true });
  }
  return { attempts: built.attempts, cold, warm };
}

async function bench() {
  const scale = Number(process.env.QB_BENCH_SCALE ?? 1);
  const seconds = Number(process.env.QB_BENCH_DURATION ?? 15);
  if (!(scale > 0 && scale <= 1) || !(seconds > 0 && seconds <= 120)) {
    throw new Error("QB_BENCH_SCALE must be in (0, 1] and QB_BENCH_DURATION in (0, 120] seconds");
  }
  // the whole of both networks: every quarter, the heaviest period a user can ask for
  const query = "from=2024-Q1&to=2025-Q4";
  const small = await measure({ label: "baseline", instructors: 25, classesPerInstructorQuarter: 3 }, seconds, query);
  const large = await measure({ label: "large", instructors: 500, classesPerInstructorQuarter: Math.max(1, Math.round(25 * scale)) }, seconds, query);

  const ms = (value: number) => value.toFixed(1).padStart(8);
  console.log(`\nPeriod ${query.replace("&", ", ")}; 10 connections × ${seconds} s per endpoint; times in ms.`);
  console.log(`${"endpoint".padEnd(22)} ${"attempts".padStart(10)} ${"cold".padStart(8)} ${"p50".padStart(8)} ${"p95".padStart(8)} ${"p99".padStart(8)} ${"req".padStart(7)} err`);
  for (const { name } of ENDPOINTS) {
    for (const m of [small, large]) {
      const w = m.warm[name];
      console.log(
        `${name.padEnd(22)} ${m.attempts.toLocaleString("en-GB").padStart(10)} ${ms(m.cold[name])} ${ms(w.p50)} ${ms(w.p95)} ${ms(w.p99)} ${String(w.requests).padStart(7)} ${w.errors}`,
      );
    }
  }
  const attemptRatio = large.attempts / small.attempts;
  const floor = large.warm[ENDPOINTS[0].name].p95;
  console.log(`\nAttempts, large / baseline: ${attemptRatio.toFixed(0)}×`);
  for (const { name } of ENDPOINTS.slice(1)) {
    const coldRatio = large.cold[name] / small.cold[name];
    const loadRatio = large.warm[name].p95 / small.warm[name].p95;
    const verdict = large.warm[name].p95 < GOAL_P95_MS ? "meets" : "misses";
    console.log(
      `${name.padEnd(22)} cold cost ${coldRatio.toFixed(1)}× (vs ${attemptRatio.toFixed(0)}× attempts); p95 under load ${loadRatio.toFixed(2)}×, ` +
        `${(large.warm[name].p95 / floor).toFixed(2)}× the floor's; p95 ${large.warm[name].p95.toFixed(1)} ms ${verdict} the ${GOAL_P95_MS} ms goal`,
    );
  }
}

if (process.env.QB_BENCH_ROLE === "server") {
  await serve();
} else {
  await bench();
}
