// Import throughput against baselines measured in the same run, on generated files in a temp folder.
//
// Attempt summaries, 1 million rows, imported end to end (parse, validation, scoring, writes) vs
//   (a) Debian's sqlite3 CLI `.import` of the same file into a plain table: the floor;
//   (b) a plain csv-parse → prepared-insert loop without validation, writing the same rows to the same
//       attempts table (class values copied by the INSERT's own SELECT, the device's numbers as they come).
//   Goals: faster than (b) while validating, ≥ 100,000 rows/s, within 5× of (a) with scoring and the metric
//   summaries, peak RSS under 300 MB.
// Compression streams, 10 million rows (50,000 attempts of 200), analysed and stored vs csv-parse alone
// reading the same file. Goals: ≥ 200,000 rows/s, within 1.5× of parse-only.
//
// Each measured task runs in a child process of its own, so its peak memory (maxRSS) is its own.
// Run: npx tsx bench/import.bench.ts   (QB_BENCH_SCALE=0.1 for a quick run)
//   QB_BENCH_LARGE_DB=<file>  also time a late import of one class into a copy of that large network
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { quarterDates } from "../shared/period";
import { ATTEMPTS_COLUMNS } from "../server/demo/importFiles";

const SCALE = Number(process.env.QB_BENCH_SCALE ?? 1);
const ATTEMPT_ROWS = Math.max(1000, Math.round(1_000_000 * SCALE));
const STREAM_ATTEMPTS = Math.max(50, Math.round(50_000 * SCALE));
const PER_STREAM = 200;
const CLASSES = 5000;
const here = fileURLToPath(import.meta.url);

interface TaskResult {
  seconds: number;
  rows: number;
  maxRssMb: number;
  note?: string;
}

// ---------- data ----------

/** Small deterministic PRNG (mulberry32) so every run imports the same invented data. */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = Math.imul(a ^ (a >>> 15), 1 | a);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

function writeLines(file: string, header: string, count: number, line: (i: number) => string) {
  const fd = fs.openSync(file, "w");
  let buffer = `${header}\n`;
  for (let i = 0; i < count; i++) {
    buffer += `${line(i)}\n`;
    if (buffer.length > 1 << 20) {
      fs.writeSync(fd, buffer);
      buffer = "";
    }
  }
  fs.writeSync(fd, buffer);
  fs.closeSync(fd);
}

/** The device-summary columns of an attempts file, as both the bulk and the late import write them. */
const ATTEMPTS_HEADER = ATTEMPTS_COLUMNS.join(",");

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

function generate(dir: string) {
  const random = prng(20261201);
  writeLines(path.join(dir, "classes.csv"), "class_id,date,site,instructor,course,learners,passed,manikins", CLASSES, (i) => {
    const learners = 4 + (i % 9);
    return `CL-${pad(i, 5)},2026-${pad(7 + (i % 3))}-${pad(1 + (i % 28))},SITE-${i % 24},INS-${i % 180},adult,${learners},${learners - (i % 3)},MK-${i % 400}`;
  });
  const share3 = (ok: number) => {
    const rest = 100 - ok;
    const a = Math.round(rest * random() * 10) / 10;
    return `${ok},${a},${(rest - a).toFixed(1)}`;
  };
  writeLines(path.join(dir, "attempts.csv"), ATTEMPTS_HEADER, ATTEMPT_ROWS, (i) => {
    const c = i % CLASSES;
    const result = random() < 0.3 ? (random() < 0.6 ? "pass" : "fail") : "";
    return `AT-${pad(i, 7)},CL-${pad(c, 5)},L-${pad(i % 90_000, 5)},MK-${c % 400},adult,${i % 2 ? "live" : "hidden"},2026-${pad(7 + (c % 3))}-${pad(1 + (c % 28))}T${pad(8 + (i % 10))}:${pad(i % 60)}:00+02:00,${(60 + random() * 60).toFixed(1)},${100 + Math.floor(random() * 120)},${(95 + random() * 30).toFixed(1)},${(45 + random() * 15).toFixed(1)},${share3(Math.round(40 + random() * 60))},${share3(Math.round(40 + random() * 60))},${(50 + random() * 50).toFixed(1)},${(55 + random() * 45).toFixed(1)},${(random() * 12).toFixed(1)},${result}`;
  });
  // Streams: two attempts at a time interleaved row by row, as a two-manikin station's merged export would.
  const identity = (a: number) => {
    const c = a % CLASSES;
    return `ST-${pad(a, 6)},CL-${pad(c, 5)},L-${pad(a % 90_000, 5)},MK-${c % 400},adult,${a % 2 ? "live" : "hidden"},2026-${pad(7 + (c % 3))}-${pad(1 + (c % 28))}T10:00:00Z,${a % 5 === 0 ? "pass" : ""}`;
  };
  const times = new Int32Array(2);
  writeLines(
    path.join(dir, "compressions.csv"),
    "attempt_id,class_id,learner,manikin,profile,feedback,started_at,instructor_result,t_ms,depth_mm,release_mm",
    STREAM_ATTEMPTS * PER_STREAM,
    (i) => {
      const pair = Math.floor(i / (2 * PER_STREAM));
      const within = i % (2 * PER_STREAM);
      const which = within % 2;
      const k = within >> 1;
      const attempt = pair * 2 + which;
      if (k === 0) times[which] = 0;
      else times[which] += random() < 0.03 ? 2_500 + Math.floor(random() * 9_000) : 440 + Math.floor(random() * 240);
      return `${identity(attempt)},${times[which]},${(44 + random() * 20).toFixed(1)},${(random() * 8).toFixed(1)}`;
    },
  );
}

// ---------- tasks (each in its own child process) ----------

async function freshDbWithClasses(dir: string, name: string) {
  const { openDatabase } = await import("../server/db/client");
  const { importFile } = await import("../server/imports/service");
  const file = path.join(dir, `${name}.sqlite`);
  for (const suffix of ["", "-wal", "-shm"]) fs.rmSync(file + suffix, { force: true });
  const db = openDatabase(file);
  const classes = await importFile(db, { kind: "classes", input: { path: path.join(dir, "classes.csv") }, source: "seed" });
  if (classes.status !== "imported") throw new Error(`class log refused: ${JSON.stringify(classes.issues.slice(0, 3))}`);
  return db;
}

async function task(name: string, dir: string): Promise<TaskResult> {
  const { importFile } = await import("../server/imports/service");
  switch (name) {
    case "attempts-quarterbeat": {
      const db = await freshDbWithClasses(dir, name);
      const start = performance.now();
      const s = await importFile(db, { kind: "attempts", input: { path: path.join(dir, "attempts.csv") }, source: "seed" });
      const seconds = (performance.now() - start) / 1000;
      if (s.status !== "imported" || s.inserted !== ATTEMPT_ROWS)
        throw new Error(`attempts not imported: ${JSON.stringify({ ...s, issues: s.issues.slice(0, 3) })}`);
      db.$client.close();
      return { seconds, rows: s.rowsRead, maxRssMb: 0 };
    }
    case "attempts-naive": {
      const db = await freshDbWithClasses(dir, name);
      const { parse } = await import("csv-parse");
      const sqlite = db.$client;
      const start = performance.now();
      const insert = sqlite.prepare(
        `INSERT INTO attempts (id, class_id, learner, manikin_id, profile, feedback, started_at, quarter, site_id, instructor_id, duration_s, compressions,
           rate_cpm, depth_mm, depth_ok_pct, too_shallow_pct, too_deep_pct, rate_ok_pct, too_slow_pct, too_fast_pct, recoil_ok_pct, hands_on_pct,
           longest_pause_s, instructor_result, source, score, passed, error_mask, policy_version)
         SELECT @attempt_id, c.id, @learner, (SELECT id FROM manikins WHERE asset_id = @manikin), @profile, @feedback, @started_at, c.quarter, c.site_id, c.instructor_id,
           @duration_s, @compressions, @rate_cpm, @depth_mm, @depth_ok_pct, @too_shallow_pct, @too_deep_pct, @rate_ok_pct, @too_slow_pct, @too_fast_pct,
           @recoil_ok_pct, @hands_on_pct, @longest_pause_s, nullif(@instructor_result, ''), 'summary', 0, 0, 0, 1
         FROM classes c WHERE c.id = @class_id`,
      );
      sqlite.prepare("INSERT OR IGNORE INTO policy_versions (version, policy) VALUES (1, '{}')").run();
      sqlite.exec("BEGIN");
      let rows = 0;
      const parser = fs.createReadStream(path.join(dir, "attempts.csv")).pipe(parse({ columns: true }));
      for await (const record of parser) {
        insert.run(record);
        rows++;
      }
      sqlite.exec("COMMIT");
      const seconds = (performance.now() - start) / 1000;
      db.$client.close();
      return { seconds, rows, maxRssMb: 0 };
    }
    case "attempts-sqlite3": {
      const db = path.join(dir, "sqlite3-floor.sqlite");
      fs.rmSync(db, { force: true });
      const start = performance.now();
      const result = spawnSync("sqlite3", [db, ".import --csv attempts.csv attempts_plain"], { cwd: dir, encoding: "utf8" });
      const seconds = (performance.now() - start) / 1000;
      if (result.status !== 0) throw new Error(`sqlite3 failed: ${result.stderr}`);
      return { seconds, rows: ATTEMPT_ROWS, maxRssMb: 0, note: "C, no validation, plain table" };
    }
    case "compressions-quarterbeat": {
      const db = await freshDbWithClasses(dir, name);
      const start = performance.now();
      const s = await importFile(db, { kind: "compressions", input: { path: path.join(dir, "compressions.csv") }, source: "seed" });
      const seconds = (performance.now() - start) / 1000;
      if (s.status !== "imported" || s.inserted !== STREAM_ATTEMPTS)
        throw new Error(`streams not imported: ${JSON.stringify({ ...s, issues: s.issues.slice(0, 3) })}`);
      db.$client.close();
      return { seconds, rows: s.rowsRead, maxRssMb: 0 };
    }
    case "late-import": {
      // one class of 24 attempts into a copy of a large network, as a late file in a busy quarter: a small
      // import must cost what it holds, not what the database holds
      const { openDatabase } = await import("../server/db/client");
      const copy = path.join(dir, "late-import.sqlite");
      for (const suffix of ["", "-wal", "-shm"]) fs.rmSync(copy + suffix, { force: true });
      fs.copyFileSync(process.env.QB_BENCH_LARGE_DB!, copy);
      const db = openDatabase(copy);
      const owner = db.$client
        .prepare(
          "SELECT i.code AS instructor, s.code AS site, c.quarter FROM classes c JOIN instructors i ON i.id = c.instructor_id JOIN sites s ON s.id = c.site_id ORDER BY c.date DESC LIMIT 1",
        )
        .get() as { instructor: string; site: string; quarter: string };
      const date = `${quarterDates(owner.quarter).first.slice(0, 8)}15`;
      fs.writeFileSync(
        path.join(dir, "late-classes.csv"),
        `class_id,date,site,instructor,course,learners,passed,manikins\nLATE-1,${date},${owner.site},${owner.instructor},adult,12,10,\n`,
      );
      const lines = Array.from(
        { length: 24 },
        (_, i) => `LATE-A${i},LATE-1,LL-${i % 12},,adult,live,${date}T10:00:00Z,120,230,112,54,80,20,0,80,12,8,90,85,4,pass`,
      );
      fs.writeFileSync(path.join(dir, "late-attempts.csv"), `${ATTEMPTS_HEADER}\n${lines.join("\n")}\n`);
      const start = performance.now();
      for (const kind of ["classes", "attempts"] as const) {
        const s = await importFile(db, { kind, input: { path: path.join(dir, `late-${kind}.csv`) }, source: "seed" });
        if (s.status !== "imported") throw new Error(`late ${kind} refused: ${JSON.stringify(s.issues.slice(0, 3))}`);
      }
      const seconds = (performance.now() - start) / 1000;
      const attempts = db.$client.prepare("SELECT count(*) FROM attempts").pluck().get() as number;
      db.$client.close();
      return { seconds, rows: 25, maxRssMb: 0, note: `into ${attempts.toLocaleString("en")} attempts` };
    }
    case "compressions-parse-only": {
      const { parse } = await import("csv-parse");
      const start = performance.now();
      const parser = parse({ bom: true, relax_column_count: true, skip_empty_lines: true });
      let rows = -1;
      for await (const chunk of fs.createReadStream(path.join(dir, "compressions.csv"), { highWaterMark: 1 << 20 })) {
        parser.write(chunk);
        while (parser.read() !== null) rows++;
      }
      parser.end();
      for await (const _ of parser) rows++;
      return { seconds: (performance.now() - start) / 1000, rows, maxRssMb: 0 };
    }
  }
  throw new Error(`unknown task ${name}`);
}

function runChild(name: string, dir: string): TaskResult | { skipped: string } {
  const result = spawnSync(process.execPath, ["--import", "tsx", here, "--task", name, dir], { encoding: "utf8", maxBuffer: 1 << 24 });
  const line = result.stdout.trim().split("\n").pop() ?? "";
  if (result.status !== 0 || !line.startsWith("{")) return { skipped: `failed: ${(result.stderr || result.stdout).trim().split("\n").slice(-3).join(" ")}` };
  return JSON.parse(line);
}

// ---------- main ----------

async function main() {
  if (process.argv[2] === "--task") {
    const result = await task(process.argv[3], process.argv[4]);
    result.maxRssMb = process.resourceUsage().maxRSS / 1024;
    console.log(JSON.stringify(result));
    return;
  }
  // QB_BENCH_DIR keeps the generated files (for profiling a single task with --task NAME DIR).
  const keep = process.env.QB_BENCH_DIR;
  const dir = keep ? (fs.mkdirSync(keep, { recursive: true }), keep) : fs.mkdtempSync(path.join(os.tmpdir(), "qb-import-bench-"));
  console.log(
    `Import benchmark, scale ${SCALE}: ${ATTEMPT_ROWS.toLocaleString("en")} attempt rows, ${(STREAM_ATTEMPTS * PER_STREAM).toLocaleString("en")} compression rows (${STREAM_ATTEMPTS.toLocaleString("en")} attempts). Files in ${dir}`,
  );
  const t0 = performance.now();
  generate(dir);
  const size = (f: string) => `${(fs.statSync(path.join(dir, f)).size / 1e6).toFixed(0)} MB`;
  console.log(
    `Generated in ${((performance.now() - t0) / 1000).toFixed(1)} s: attempts.csv ${size("attempts.csv")}, compressions.csv ${size("compressions.csv")}\n`,
  );

  const hasSqlite3 = spawnSync("sqlite3", ["-version"]).status === 0;
  const results = new Map<string, TaskResult | { skipped: string }>();
  const only = process.env.QB_BENCH_ONLY?.split(",");
  for (const name of ["attempts-sqlite3", "attempts-naive", "attempts-quarterbeat", "compressions-parse-only", "compressions-quarterbeat", "late-import"]) {
    if (only && !only.includes(name)) continue;
    if (name === "late-import" && !process.env.QB_BENCH_LARGE_DB) {
      results.set(name, { skipped: "QB_BENCH_LARGE_DB not set (npx tsx bench/largeNetwork.ts <file> writes one)" });
      continue;
    }
    if (name === "attempts-sqlite3" && !hasSqlite3) {
      results.set(name, { skipped: "sqlite3 is not installed (apt-get install -y sqlite3); baseline (a) skipped" });
      continue;
    }
    process.stdout.write(`running ${name} … `);
    const result = runChild(name, dir);
    results.set(name, result);
    console.log("skipped" in result ? result.skipped : `${result.seconds.toFixed(2)} s`);
  }

  const ok = (name: string) => {
    const r = results.get(name);
    return r && !("skipped" in r) ? r : undefined;
  };
  const rate = (r: TaskResult) => r.rows / r.seconds;
  const fmt = (n: number) => Math.round(n).toLocaleString("en");
  const table: Record<string, string | number>[] = [];
  for (const [name, r] of results) {
    if ("skipped" in r) table.push({ task: name, rows: "", seconds: "", "rows/s": "", "peak RSS MB": "", note: r.skipped });
    else
      table.push({
        task: name,
        rows: fmt(r.rows),
        seconds: r.seconds.toFixed(2),
        "rows/s": fmt(rate(r)),
        "peak RSS MB": r.maxRssMb.toFixed(0),
        note: r.note ?? "",
      });
  }
  console.log("");
  console.table(table);

  const goals: Record<string, string>[] = [];
  const goal = (what: string, value: string, target: string, met: boolean | undefined) =>
    goals.push({ goal: what, measured: value, target, met: met === undefined ? "n/a" : met ? "yes" : "NO" });
  const qb = ok("attempts-quarterbeat");
  const naive = ok("attempts-naive");
  const floor = ok("attempts-sqlite3");
  if (qb) {
    goal("attempts: rows/s", fmt(rate(qb)), "≥ 100,000", rate(qb) >= 100_000);
    goal(
      "attempts: time vs naive loop (b)",
      naive ? `${(qb.seconds / naive.seconds).toFixed(2)}×` : "n/a",
      "< 1×",
      naive ? qb.seconds < naive.seconds : undefined,
    );
    goal(
      "attempts: time vs sqlite3 .import (a)",
      floor ? `${(qb.seconds / floor.seconds).toFixed(2)}×` : "n/a",
      "≤ 5×",
      floor ? qb.seconds <= 5 * floor.seconds : undefined,
    );
    goal("attempts: peak RSS", `${qb.maxRssMb.toFixed(0)} MB`, "< 300 MB", qb.maxRssMb < 300);
  }
  const late = ok("late-import");
  if (late) goal("late import of one class into the large network", `${late.seconds.toFixed(2)} s`, "< 2 s", late.seconds < 2);
  const streams = ok("compressions-quarterbeat");
  const parseOnly = ok("compressions-parse-only");
  if (streams) {
    goal("compressions: rows/s", fmt(rate(streams)), "≥ 200,000", rate(streams) >= 200_000);
    goal(
      "compressions: time vs parse only",
      parseOnly ? `${(streams.seconds / parseOnly.seconds).toFixed(2)}×` : "n/a",
      "≤ 1.5×",
      parseOnly ? streams.seconds <= 1.5 * parseOnly.seconds : undefined,
    );
    goal("compressions: peak RSS", `${streams.maxRssMb.toFixed(0)} MB`, "(bounded)", undefined);
  }
  console.table(goals);
  console.log(
    `load average while running: ${os
      .loadavg()
      .map((l) => l.toFixed(1))
      .join(", ")} on ${os.cpus().length} cores`,
  );
  if (!keep) fs.rmSync(dir, { recursive: true, force: true });
}

await main();
