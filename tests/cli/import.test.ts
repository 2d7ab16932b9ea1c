// `quarterbeat import`, `analyze` and `stats` as a person runs them: exit codes, readable and JSON output,
// and the quarter summary's numbers worked out by hand.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { attemptMetricKeys } from "../../shared/scoring/analyzeStream";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

const root = path.resolve(__dirname, "../..");
// Each CLI run starts Node and tsx afresh: seconds each on a busy machine.
const SLOW = { timeout: 180_000 };
const fixture = (name: string) => path.join(root, "tests/fixtures/import", name);

describe("quarterbeat import", () => {
  const db = tempDbFile("qb-cli-import");

  it("imports files in order, a class log before its attempts, and exits 0", SLOW, () => {
    const res = cli(["--db", db, "import", "classes", fixture("classes-valid.csv")]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    expect(res.stdout).toContain("classes-valid.csv (classes): imported as batch 1");
    expect(res.stdout).toContain("new codes: sites NORTH, SOUTH, EAST; instructors A1, B1, Z9; manikins MK-1, MK-2, MK-3");
    const attempts = cli(["--db", db, "import", "attempts", fixture("attempts-valid.csv"), "--json"]);
    expect(attempts.code).toBe(0);
    const out = JSON.parse(attempts.stdout);
    expect(out.files[0]).toMatchObject({ file: "attempts-valid.csv", status: "imported", inserted: 4, batchId: 2 });
  });

  it("reports a second import of the same file as unchanged", SLOW, () => {
    const res = cli(["--db", db, "import", "attempts", fixture("attempts-valid.csv"), "--json"]);
    expect(res.code).toBe(0);
    expect(JSON.parse(res.stdout).files[0]).toMatchObject({ inserted: 0, updated: 0, unchanged: 4 });
  });

  it("reads a semicolon-separated file and says which separator it used", SLOW, () => {
    const res = cli(["--db", db, "import", "classes", fixture("classes-semicolon.csv"), "--dry-run"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    expect(res.stdout).toContain("classes-semicolon.csv (classes): valid (dry run, nothing written)");
    expect(res.stdout).toContain("columns separated by semicolons");
    const tab = cli(["--db", db, "import", "classes", fixture("classes-tab.csv"), "--dry-run", "--json"]);
    expect(JSON.parse(tab.stdout).files[0]).toMatchObject({ delimiter: "tab", status: "validated", rejected: 0 });
  });

  it("exits 1 for a refused file, naming file, row, column and reason, and writes nothing", SLOW, () => {
    const res = cli(["--db", db, "import", "attempts", fixture("attempts-bad.csv")]);
    expect(res.code).toBe(1);
    expect(res.stdout).toContain("attempts-bad.csv (attempts): REFUSED, nothing written");
    expect(res.stdout).toContain(`attempts-bad.csv, row 2, learner: "Jane Doe" looks like a personal name`);
    expect(res.stderr).toContain("attempts-bad.csv was refused; nothing was written from it.");
    expect(res.stderr).toContain("--skip-invalid");
  });

  it("imports the valid rows with --skip-invalid, and only validates with --dry-run", SLOW, () => {
    const dry = cli(["--db", db, "import", "attempts", fixture("attempts-bad.csv"), "--skip-invalid", "--dry-run", "--json"]);
    expect(dry.code).toBe(0);
    expect(JSON.parse(dry.stdout).files[0]).toMatchObject({ status: "validated", inserted: 1, rejected: 11, batchId: null });
    const res = cli(["--db", db, "import", "attempts", fixture("attempts-bad.csv"), "--skip-invalid", "--json"]);
    expect(res.code).toBe(0);
    expect(JSON.parse(res.stdout).files[0]).toMatchObject({ status: "imported", inserted: 1, rejected: 11 });
  });

  it("reads a mapping file and records the user named by --as", SLOW, () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-cli-map-"));
    const map = path.join(dir, "map.json");
    fs.writeFileSync(map, JSON.stringify({ columns: { class_id: "Class", date: "Day" } }));
    const csv = path.join(dir, "log.csv");
    fs.writeFileSync(csv, "Class,Day,site,instructor,course,learners,passed,manikins\nC-900,2026-08-30,NORTH,A1,infant,3,3,\n");
    const unknownUser = cli(["--db", db, "import", "classes", csv, "--map", map, "--as", "nobody@example.org"]);
    expect(unknownUser.code).toBe(2);
    expect(unknownUser.stderr).toContain("No user with the e-mail nobody@example.org");
    const added = spawnSync(
      process.execPath,
      [
        "--import",
        "tsx",
        path.join(root, "cli/main.ts"),
        "--db",
        db,
        "users",
        "add",
        "coord@example.org",
        "--name",
        "Coordinator",
        "--role",
        "coordinator",
        "--password-stdin",
      ],
      {
        cwd: root,
        input: "a-long-enough-password\n",
        encoding: "utf8",
        env: { ...process.env, QUARTERBEAT_DB: "" },
      },
    );
    expect(added.status).toBe(0);
    const res = cli(["--db", db, "import", "classes", csv, "--map", map, "--as", "coord@example.org", "--json"]);
    expect(res.code).toBe(0);
    expect(JSON.parse(res.stdout).files[0]).toMatchObject({ status: "imported", inserted: 1 });
  });

  it("exits 2 for usage mistakes: unknown kind, missing file, bad mapping", SLOW, () => {
    expect(cli(["--db", db, "import", "learners", fixture("classes-valid.csv")]).code).toBe(2);
    const missing = cli(["--db", db, "import", "classes", "no-such-file.csv"]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain("No file no-such-file.csv");
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-cli-map-"));
    fs.writeFileSync(path.join(dir, "bad.json"), JSON.stringify({ units: { depth: "furlong" } }));
    const badMap = cli(["--db", db, "import", "classes", fixture("classes-valid.csv"), "--map", path.join(dir, "bad.json")]);
    expect(badMap.code).toBe(2);
    expect(badMap.stderr).toContain("units.depth");
    expect(cli(["--db", db, "import", "classes"]).code).toBe(2);
  });
});

describe("quarterbeat analyze", () => {
  it("prints one JSON object per attempt with exactly the metric names, score, passed and errors", SLOW, () => {
    const res = cli(["analyze", fixture("compressions-valid.csv"), "--json"]);
    expect(res.code).toBe(0);
    const rows = JSON.parse(res.stdout);
    expect(rows.map((r: { attempt_id: string }) => r.attempt_id)).toEqual(["S-001", "S-002"]);
    expect(Object.keys(rows[0]).sort()).toEqual(["attempt_id", ...attemptMetricKeys, "score", "passed", "errors"].sort());
    // S-002 (child band 45–55 mm, rate 100–120/min; AHA 2020 Part 4 via DEFAULT_POLICY): depths 40, 40, 40
    // → all too shallow; intervals 600 ms = 100/min exactly → on target; releases 2 mm ≤ 4 → full recoil.
    // Score = (0 + 100 + 100) / 3 = 66.666… at full precision.
    expect(rows[1]).toMatchObject({
      compressions: 3,
      duration_s: 1.2,
      rate_cpm: 100,
      depth_ok_pct: 0,
      too_shallow_pct: 100,
      rate_ok_pct: 100,
      recoil_ok_pct: 100,
      passed: false,
      errors: ["too_shallow"],
    });
    expect(rows[1].score).toBe(200 / 3);
  });

  it("prints a table with the reason an attempt cannot pass", SLOW, () => {
    const res = cli(["analyze", fixture("compressions-valid.csv"), "--profile", "adult"]);
    expect(res.code).toBe(0);
    expect(res.stdout).toContain("Compressions mostly not deep enough");
    expect(res.stdout).toContain("2 attempts from 8 rows");
  });

  it("refuses a bad file with file, row, column and reason, and a bad option with exit 2", SLOW, () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-cli-analyze-"));
    const file = path.join(dir, "bad.csv");
    fs.writeFileSync(file, "attempt_id,t_ms,depth_mm,release_mm\nR-1,0,55,0\nR-1,500,deep,0\n");
    const res = cli(["analyze", file, "--profile", "adult"]);
    expect(res.code).toBe(1);
    expect(res.stderr).toContain(`${file}, row 2, depth_mm: "deep" is not a number`);
    expect(cli(["analyze", file, "--profile", "giant"]).code).toBe(2);
    const noProfile = cli(["analyze", file]);
    expect(noProfile.code).toBe(1);
    expect(noProfile.stderr).toContain(`required column "profile" is missing`);
  });
});

describe("quarterbeat stats", () => {
  it("summarises a quarter of the fixture files, every number worked out by hand", SLOW, () => {
    const db = tempDbFile("qb-cli-stats");
    for (const [kind, file] of [
      ["classes", "classes-valid.csv"],
      ["attempts", "attempts-valid.csv"],
      ["compressions", "compressions-valid.csv"],
    ]) {
      expect(cli(["--db", db, "import", kind, fixture(file)]).code).toBe(0);
    }
    const res = cli(["--db", db, "stats", "--quarter", "2026-Q3", "--json"]);
    expect(res.code).toBe(0);
    const s = JSON.parse(res.stdout);
    // Class logs: C-001 (10 learners, 8 passed), C-002 (6, 6), C-003 (12, 9): 3 classes at 3 sites by 3 instructors.
    expect(s).toMatchObject({ quarter: "2026-Q3", classes: 3, learners: 28, instructors: 3, sites: 3 });
    expect(s.course_pass_rate).toBeCloseTo(23 / 28, 12); // (8 + 6 + 9) / 28
    // Attempts: A-001 pass; A-002 fail (depth 40 %, rate 50 %); A-003 pass; A-004 fail (hands-on 55 %, pause
    // 12.5 s); S-001 fail (depth 60 %); S-002 fail (depth 0 %) → 2 of 6 passed.
    expect(s).toMatchObject({ attempts: 6, passed: 2 });
    expect(s.pass_rate).toBeCloseTo(1 / 3, 12);
    // Wilson 95 % for 2/6: p = 1/3, z = 1.959964, z² = 3.841459; centre = p + z²/12 = 0.653455;
    // spread = z·√(p(1−p)/6 + z²/144) = 1.959964·√(0.037037 + 0.026677) = 0.494728; denominator 1 + z²/6 = 1.640243
    // → (0.653455 ∓ 0.494633) / 1.640243 = 0.0968 – 0.7000.
    expect(s.pass_rate_ci95[0]).toBeCloseTo(0.0968, 4);
    expect(s.pass_rate_ci95[1]).toBeCloseTo(0.7, 4);
    // Scores (mean of depth, rate and recoil shares): A-001 (85+80+90)/3 = 85, A-002 (40+50+95)/3 = 61.667,
    // A-003 (75+78+70)/3 = 74.333, A-004 (72+71+72)/3 = 71.667, S-001 (60+100+80)/3 = 80, S-002 (0+100+100)/3 = 66.667;
    // sorted 61.667, 66.667, 71.667, 74.333, 80, 85 → median (71.667 + 74.333)/2 = 73.
    expect(s.median.score).toBeCloseTo(73, 10);
    expect(s.median.depth_ok_pct).toBe(66); // 0, 40, 60, 72, 75, 85 → (60 + 72)/2
    expect(s.median.rate_ok_pct).toBe(79); // 50, 71, 78, 80, 100, 100 → (78 + 80)/2
    expect(s.median.recoil_ok_pct).toBe(85); // 70, 72, 80, 90, 95, 100 → (80 + 90)/2
    expect(s.median.hands_on_pct).toBe(82.5); // 55, 65, 80, 85, 100, 100 → (80 + 85)/2
    // Errors: too_shallow A-002, S-001 (20 % shallow = 20 % deep → shallow), S-002; too_slow A-002 (45 % slow);
    // low_hands_on and long_pause A-004.
    expect(s.errors).toEqual({ too_shallow: 3, too_deep: 0, too_slow: 1, too_fast: 0, incomplete_recoil: 0, low_hands_on: 1, long_pause: 1 });
    // Live: A-001 ✓, A-003 ✓, A-004 ✗, S-001 ✗ → 2/4; hidden: A-002 ✗, S-002 ✗ → 0/2.
    expect(s.by_feedback).toEqual({ live: { attempts: 4, pass_rate: 0.5 }, hidden: { attempts: 2, pass_rate: 0 } });
    // Judged by both: A-001 (pass, pass), A-002 (fail, fail), A-004 (fail, fail), S-001 (pass, fail):
    // p0 = 3/4; instructor says pass 2/4, Quarterbeat 1/4 → pe = ½·¼ + ½·¾ = ½ → κ = (¾ − ½)/(1 − ½) = 0.5.
    // A-003 and S-002 carry no judgement. The disagreements, 1 against 0, are balanced as far as 1 can tell:
    // exact McNemar p = 2 × P(X ≤ 0), X ~ Binomial(1, 0.5) = 1, capped at 1; PABAK = 2 × ¾ − 1 = 0.5.
    expect(s.agreement).toMatchObject({
      attempts: 4,
      kappa: 0.5,
      pabak: 0.5,
      mcnemar_p: 1,
      unjudged: 2,
      table: { both_pass: 1, instructor_pass_measured_fail: 1, instructor_fail_measured_pass: 0, both_fail: 2 },
    });
  });

  it("checks the interval and kappa on imported data against published examples", SLOW, () => {
    // 263 attempts in 2025-Q2, 81 passing; 100 of them judged by an instructor, as in Gerstman's table
    // [[40, 9], [6, 45]] (instructor pass/fail × Quarterbeat pass/fail).
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-cli-refs-"));
    fs.writeFileSync(path.join(dir, "classes.csv"), "class_id,date,site,instructor,course,learners,passed,manikins\nR-1,2025-05-10,NORTH,A1,adult,263,81,\n");
    const header =
      "attempt_id,class_id,learner,manikin,profile,feedback,started_at,duration_s,compressions,rate_cpm,depth_mm,depth_ok_pct,too_shallow_pct,too_deep_pct,rate_ok_pct,too_slow_pct,too_fast_pct,recoil_ok_pct,hands_on_pct,longest_pause_s,instructor_result";
    const good = "120,230,110,54,85,10,5,85,10,5,90,85,3"; // passes the default rule
    const poor = "120,230,110,44,40,55,5,85,10,5,90,85,3"; // depth on target 40 % < 70 % → fails
    const lines = [header];
    const add = (n: number, metrics: string, judged: string) => {
      for (let i = 0; i < n; i++) lines.push(`R-${lines.length},R-1,L-${lines.length},MK-1,adult,live,2025-05-10T10:00:00Z,${metrics},${judged}`);
    };
    add(40, good, "pass"); // both pass
    add(9, poor, "pass"); // instructor pass, Quarterbeat fail
    add(6, good, "fail"); // instructor fail, Quarterbeat pass
    add(45, poor, "fail"); // both fail
    add(81 - 46, good, ""); // the rest of the 81 passing attempts, not judged
    add(263 - 100 - 35, poor, "");
    fs.writeFileSync(path.join(dir, "attempts.csv"), `${lines.join("\n")}\n`);
    const db = tempDbFile("qb-cli-refs");
    expect(cli(["--db", db, "import", "classes", path.join(dir, "classes.csv")]).code).toBe(0);
    expect(cli(["--db", db, "import", "attempts", path.join(dir, "attempts.csv")]).code).toBe(0);
    const s = JSON.parse(cli(["--db", db, "stats", "--quarter", "2025-Q2", "--json"]).stdout);
    expect(s).toMatchObject({ attempts: 263, passed: 81 });
    // Newcombe, Stat Med 1998;17:857–872, Table I: 81/263 → Wilson 0.2553 – 0.3662.
    expect(s.pass_rate_ci95[0]).toBeCloseTo(0.2553, 4);
    expect(s.pass_rate_ci95[1]).toBeCloseTo(0.3662, 4);
    // Gerstman, Epidemiology Kept Simple, Example 10.1: [[40, 9], [6, 45]] → κ = 0.6995.
    expect(s.agreement.attempts).toBe(100);
    expect(s.agreement.kappa).toBeCloseTo(0.6995, 4);
  });

  it("exits 2 for a malformed quarter", SLOW, () => {
    const res = cli(["stats", "--quarter", "2026-3"]);
    expect(res.code).toBe(2);
    expect(res.stderr).toContain("Use the form 2026-Q3");
  });
});
