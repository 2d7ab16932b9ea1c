// The demo network's files: formats, counts, dates, arithmetic and cross-references between the files.
import { beforeAll, describe, expect, it } from "vitest";
import { generateDemoNetwork, type DemoNetwork } from "../../../server/demo/generate";
import { DEFAULT_POLICY, type PatientType } from "../../../shared/scoring/policy";
import { headerOf, readCsv, readFiles, streamsByAttempt, type DemoFiles, type Row } from "./demoRows";

const TODAY = "2026-12-01";

let network: DemoNetwork;
let files: DemoFiles;
let streams: Map<string, Row[]>;

beforeAll(() => {
  network = generateDemoNetwork({ seed: 20261201, today: TODAY });
  files = readFiles(network);
  streams = streamsByAttempt(files.compressions);
});

/** One row per attempt of the compressions file (the identity columns; the stream test checks the rest). */
const firstRows = () => [...streams.values()].map((rows) => rows[0]);

const typeOfAsset = (assetId: string): PatientType => ({ A: "adult", C: "child", I: "infant" })[assetId.split("-")[1][0]] as PatientType;

describe("demo network: determinism", () => {
  it("gives byte-identical output for the same seed and today", () => {
    const again = generateDemoNetwork({ seed: 20261201, today: TODAY });
    expect(again.files).toEqual(network.files);
    expect(JSON.stringify(again)).toBe(JSON.stringify(network));
  });

  it("gives different files for a different seed, with the same directory", () => {
    const other = generateDemoNetwork({ seed: 7, today: TODAY });
    for (const kind of ["classes", "attempts", "compressions", "equipment"] as const) {
      expect(other.files[kind]).not.toBe(network.files[kind]);
    }
    expect(other.instructors).toEqual(network.instructors);
  });

  it("refuses a today that is not a date", () => {
    expect(() => generateDemoNetwork({ today: "2026-13-01" })).toThrow(RangeError);
    expect(() => generateDemoNetwork({ seed: 1.5 })).toThrow(RangeError);
  });
});

describe("demo network: file formats", () => {
  it("writes the import formats' columns in order", () => {
    expect(headerOf(network.files.classes)).toEqual([
      "class_id",
      "date",
      "site",
      "instructor",
      "course",
      "learners",
      "passed",
      "manikins",
      "lungs_replaced",
      "mouthpieces_cleaned",
      "batteries_replaced",
    ]);
    expect(headerOf(network.files.attempts)).toEqual([
      "attempt_id",
      "class_id",
      "learner",
      "manikin",
      "profile",
      "feedback",
      "started_at",
      "duration_s",
      "compressions",
      "rate_cpm",
      "depth_mm",
      "depth_ok_pct",
      "too_shallow_pct",
      "too_deep_pct",
      "rate_ok_pct",
      "too_slow_pct",
      "too_fast_pct",
      "recoil_ok_pct",
      "hands_on_pct",
      "longest_pause_s",
      "instructor_result",
    ]);
    expect(headerOf(network.files.compressions)).toEqual([
      "attempt_id",
      "class_id",
      "learner",
      "manikin",
      "profile",
      "feedback",
      "started_at",
      "instructor_result",
      "t_ms",
      "depth_mm",
      "release_mm",
    ]);
    expect(headerOf(network.files.equipment)).toEqual(["date", "manikin", "site", "event", "quantity", "patient_type", "note"]);
  });

  it("ends every file with a line end and uses the allowed values", () => {
    for (const text of Object.values(network.files)) expect(text.endsWith("\n")).toBe(true);
    const bad: string[] = [];
    for (const c of files.classes) {
      if (!["infant", "child", "adult", "all-ages"].includes(c.course)) bad.push(`${c.class_id} course ${c.course}`);
    }
    for (const a of [...files.attempts, ...firstRows()]) {
      if (!["infant", "child", "adult"].includes(a.profile)) bad.push(`${a.attempt_id} profile ${a.profile}`);
      if (!["live", "hidden"].includes(a.feedback)) bad.push(`${a.attempt_id} feedback ${a.feedback}`);
      if (!["pass", "fail", ""].includes(a.instructor_result)) bad.push(`${a.attempt_id} result ${a.instructor_result}`);
      if (!/^L-[0-9A-Z]{5}$/.test(a.learner)) bad.push(`${a.attempt_id} learner ${a.learner}`);
      if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/.test(a.started_at)) bad.push(`${a.attempt_id} started ${a.started_at}`);
    }
    expect(bad).toEqual([]);
  });
});

describe("demo network: sizes", () => {
  it("has about 300 classes over 8 quarters and about 6,000 attempts", () => {
    expect(files.classes.length).toBeGreaterThanOrEqual(270);
    expect(files.classes.length).toBeLessThanOrEqual(330);
    const attempts = files.attempts.length + streams.size;
    expect(attempts).toBeGreaterThanOrEqual(5400);
    expect(attempts).toBeLessThanOrEqual(6600);
    const quarters = new Set(files.classes.map((c) => `${c.date.slice(0, 4)}-${Math.ceil(Number(c.date.slice(5, 7)) / 3)}`));
    expect([...quarters].sort()).toEqual(["2025-1", "2025-2", "2025-3", "2025-4", "2026-1", "2026-2", "2026-3", "2026-4"]);
  });

  it("has 300–400 full streams of 60–300 compressions each", () => {
    expect(streams.size).toBeGreaterThanOrEqual(300);
    expect(streams.size).toBeLessThanOrEqual(400);
    for (const rows of streams.values()) {
      expect(rows.length).toBeGreaterThanOrEqual(60);
      expect(rows.length).toBeLessThanOrEqual(300);
    }
  });

  it("has 4 sites, 12 instructors and 40 manikins of all three types", () => {
    expect(network.sites).toHaveLength(4);
    expect(network.instructors).toHaveLength(12);
    const commissioned = files.equipment.filter((e) => e.event === "commissioned");
    expect(new Set(commissioned.map((e) => e.manikin)).size).toBe(40);
    expect(new Set(commissioned.map((e) => e.patient_type))).toEqual(new Set(["infant", "child", "adult"]));
  });
});

describe("demo network: dates", () => {
  it("never dates anything after today", () => {
    // Classes run up to yesterday, so no start time can be ahead of the clock.
    expect(files.classes.filter((c) => !(c.date < TODAY && c.date >= "2025-01-01"))).toEqual([]);
    expect([...files.attempts, ...files.compressions].filter((a) => a.started_at >= `${TODAY}T00:00:00Z`)).toEqual([]);
    expect(files.equipment.filter((e) => e.date > TODAY)).toEqual([]);
  });

  it("moves the whole history with another today", () => {
    const shifted = generateDemoNetwork({ today: "2025-08-20" });
    const earlier = {
      classes: readCsv(shifted.files.classes),
      attempts: readCsv(shifted.files.attempts),
      equipment: readCsv(shifted.files.equipment),
    };
    const dates = earlier.classes.map((c) => c.date).sort();
    expect(dates[0] >= "2023-10-01").toBe(true); // eight quarters: 2023-Q4 … 2025-Q3
    expect(dates[dates.length - 1] < "2025-08-20").toBe(true);
    expect(earlier.equipment.filter((e) => e.date > "2025-08-20")).toEqual([]);
    expect(earlier.attempts.filter((a) => a.started_at >= "2025-08-20T00:00:00Z")).toEqual([]);
  });

  it("starts each attempt on its class's day", () => {
    const classDate = new Map(files.classes.map((c) => [c.class_id, c.date]));
    const elsewhere = [...files.attempts, ...firstRows()].filter((a) => a.started_at.slice(0, 10) !== classDate.get(a.class_id));
    expect(elsewhere).toEqual([]);
  });
});

describe("demo network: attempt arithmetic", () => {
  it("writes shares that add up to exactly 100 and stay in range", () => {
    const bad: string[] = [];
    for (const a of files.attempts) {
      const groups = [
        [a.depth_ok_pct, a.too_shallow_pct, a.too_deep_pct],
        [a.rate_ok_pct, a.too_slow_pct, a.too_fast_pct],
      ].map((g) => g.map(Number));
      for (const group of groups) {
        if (group.reduce((x, y) => x + y, 0) !== 100) bad.push(`${a.attempt_id}: ${group.join(" + ")} ≠ 100`);
        if (!group.every((share) => Number.isInteger(share) && share >= 0)) bad.push(`${a.attempt_id}: ${group}`);
      }
      for (const column of ["recoil_ok_pct", "hands_on_pct"]) {
        const value = Number(a[column]);
        if (!(value >= 0 && value <= 100)) bad.push(`${a.attempt_id}: ${column} ${value}`);
      }
      if (Number(a.longest_pause_s) > Number(a.duration_s)) bad.push(`${a.attempt_id}: pause longer than attempt`);
      const rate = Number(a.rate_cpm);
      if (!(rate >= 20 && rate <= 300)) bad.push(`${a.attempt_id}: rate ${rate}`);
    }
    expect(bad).toEqual([]);
  });

  it("keeps mean depth between the bounds its depth shares allow", () => {
    // Shallow compressions lie below the band, the others within it or (too deep) between its top and
    // 100 mm, so the mean is bounded by the shares. One point of rounding in each share adds slack.
    const bad = files.attempts.filter((a) => {
      const band = DEFAULT_POLICY.bands[a.profile as PatientType];
      const [ok, shallow, deep] = [a.depth_ok_pct, a.too_shallow_pct, a.too_deep_pct].map((v) => Number(v) / 100);
      const depth = Number(a.depth_mm);
      const slack = 0.01 * 100 + 0.05;
      const highest = shallow * band.depthMinMm + ok * band.depthMaxMm + deep * 100 + slack;
      const lowest = ok * band.depthMinMm + deep * band.depthMaxMm - slack;
      return depth > highest || depth < lowest;
    });
    expect(bad).toEqual([]);
    // The bounds are not empty words: infant attempts at 100 % too shallow must be below 35 mm on average.
    const allShallowInfants = files.attempts.filter((a) => a.profile === "infant" && a.too_shallow_pct === "100");
    expect(allShallowInfants.length).toBeGreaterThan(0);
    expect(allShallowInfants.filter((a) => Number(a.depth_mm) >= 35)).toEqual([]);
  });

  it("has compressions ≈ duration × rate × hands-on", () => {
    const bad = files.attempts.filter((a) => {
      const expected = (Number(a.duration_s) / 60) * Number(a.rate_cpm) * (Number(a.hands_on_pct) / 100);
      // Rounding of the hands-on share (±0.5 %) and the first compression and those after pauses (which
      // carry no interval) make up the difference.
      return Math.abs(Number(a.compressions) - expected) > 0.01 * expected + 8;
    });
    expect(bad).toEqual([]);
  });

  it("writes streams that a manikin could record", () => {
    const bad: string[] = [];
    const identity = ["class_id", "learner", "manikin", "profile", "feedback", "started_at", "instructor_result"];
    for (const rows of streams.values()) {
      const first = rows[0];
      let previous = -1;
      rows.forEach((r, i) => {
        const where = `${r.attempt_id} row ${i}`;
        // The attempt's columns repeat on every row.
        for (const column of identity) if (r[column] !== first[column]) bad.push(`${where}: ${column} changes`);
        const t = Number(r.t_ms);
        if (!Number.isInteger(t) || t <= previous) bad.push(`${where}: t_ms ${r.t_ms} after ${previous}`);
        previous = t;
        const depth = Number(r.depth_mm);
        const release = Number(r.release_mm);
        if (!(depth > 0 && depth <= 100)) bad.push(`${where}: depth ${depth}`);
        if (!(release >= 0 && release < depth)) bad.push(`${where}: release ${release}`);
      });
    }
    expect(bad).toEqual([]);
  });

  it("includes pauses of 3–12 s and leaning in some streams", () => {
    let withPause = 0;
    let leaning = 0;
    for (const rows of streams.values()) {
      const gaps = rows.slice(1).map((r, i) => Number(r.t_ms) - Number(rows[i].t_ms));
      const pauses = gaps.filter((g) => g > 2000);
      expect(pauses.filter((p) => p < 3000 || p > 12000)).toEqual([]);
      if (pauses.length > 0) withPause++;
      const recoilMax = DEFAULT_POLICY.bands[rows[0].profile as PatientType].recoilMaxMm;
      if (rows.filter((r) => Number(r.release_mm) > recoilMax).length > rows.length * 0.3) leaning++;
    }
    expect(withPause).toBeGreaterThan(streams.size * 0.2);
    expect(leaning).toBeGreaterThan(streams.size * 0.05);
  });
});

describe("demo network: references between files", () => {
  it("uses unique ids, and no attempt is in both attempt files", () => {
    expect(new Set(files.classes.map((c) => c.class_id)).size).toBe(files.classes.length);
    const summaryIds = new Set(files.attempts.map((a) => a.attempt_id));
    expect(summaryIds.size).toBe(files.attempts.length);
    expect([...streams.keys()].filter((id) => summaryIds.has(id))).toEqual([]);
  });

  it("links every attempt to an existing class, a manikin of that class and a matching profile", () => {
    const classes = new Map(files.classes.map((c) => [c.class_id, c]));
    const bad: string[] = [];
    for (const a of [...files.attempts, ...firstRows()]) {
      const c = classes.get(a.class_id);
      if (!c) {
        bad.push(`${a.attempt_id}: no class ${a.class_id}`);
        continue;
      }
      if (!c.manikins.split(";").includes(a.manikin)) bad.push(`${a.attempt_id}: ${a.manikin} not in ${c.class_id}`);
      if (typeOfAsset(a.manikin) !== a.profile) bad.push(`${a.attempt_id}: ${a.profile} on ${a.manikin}`);
      if (c.course !== "all-ages" && a.profile !== c.course) bad.push(`${a.attempt_id}: ${a.profile} in ${c.course} class`);
    }
    expect(bad).toEqual([]);
  });

  it("keeps class counts consistent", () => {
    const learnersSeen = new Map<string, Set<string>>();
    for (const a of [...files.attempts, ...firstRows()]) {
      const set = learnersSeen.get(a.class_id) ?? new Set<string>();
      set.add(a.learner);
      learnersSeen.set(a.class_id, set);
    }
    for (const c of files.classes) {
      const learners = Number(c.learners);
      expect(Number(c.passed)).toBeLessThanOrEqual(learners);
      expect(learners).toBeGreaterThanOrEqual(4);
      expect(learners).toBeLessThanOrEqual(16);
      expect(learnersSeen.get(c.class_id)?.size ?? 0).toBeLessThanOrEqual(learners);
      for (const m of c.manikins.split(";")) expect(m.startsWith(`${c.site}-`)).toBe(true);
    }
    // A few classes reached the network as class-log entries only.
    const withoutData = files.classes.filter((c) => !learnersSeen.has(c.class_id)).length;
    expect(withoutData).toBeGreaterThan(0);
    expect(withoutData).toBeLessThan(files.classes.length * 0.1);
  });

  it("never runs two attempts on one manikin at the same time", () => {
    const durationOf = (a: Row) => {
      const rows = streams.get(a.attempt_id);
      return rows ? (Number(rows[rows.length - 1].t_ms) + 1000) / 1000 : Number(a.duration_s) + 2;
    };
    const byManikin = new Map<string, Row[]>();
    for (const a of [...files.attempts, ...firstRows()]) {
      const list = byManikin.get(a.manikin);
      if (list) list.push(a);
      else byManikin.set(a.manikin, [a]);
    }
    const overlaps: string[] = [];
    for (const list of byManikin.values()) {
      list.sort((x, y) => x.started_at.localeCompare(y.started_at));
      for (let i = 1; i < list.length; i++) {
        const end = Date.parse(list[i - 1].started_at) + durationOf(list[i - 1]) * 1000;
        if (Date.parse(list[i].started_at) < end) overlaps.push(`${list[i - 1].attempt_id} and ${list[i].attempt_id}`);
      }
    }
    expect(overlaps).toEqual([]);
  });

  it("names only directory sites and instructors", () => {
    const sites = new Set(network.sites.map((s) => s.code));
    const instructors = new Set(network.instructors.map((i) => i.code));
    for (const i of network.instructors) expect(sites).toContain(i.site);
    for (const c of files.classes) {
      expect(sites).toContain(c.site);
      expect(instructors).toContain(c.instructor);
    }
    expect(files.equipment.filter((e) => !sites.has(e.site))).toEqual([]);
  });
});

describe("demo network: equipment", () => {
  const lifeEvents = () => files.equipment.filter((e) => !e.note.startsWith("After class"));

  it("has patient types on commissioning rows only, and no duplicate rows", () => {
    const bad = files.equipment.filter((e) =>
      e.event === "commissioned" ? !["infant", "child", "adult"].includes(e.patient_type) : e.patient_type !== "" || !(Number(e.quantity) >= 1),
    );
    expect(bad).toEqual([]);
    const keys = files.equipment.map((e) => `${e.date}|${e.manikin}|${e.event}`);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it("records every kind of event, one retirement and two open faults", () => {
    const kinds = new Set(files.equipment.map((e) => e.event));
    expect([...kinds].sort()).toEqual(["battery_replaced", "commissioned", "fault", "lung_replaced", "mouthpiece_cleaned", "retired", "serviced"].sort());
    expect(files.equipment.filter((e) => e.event === "retired")).toHaveLength(1);
    const faults = files.equipment.filter((e) => e.event === "fault");
    expect(faults.length).toBeGreaterThanOrEqual(4);
    // Open: no service or retirement of that manikin on or after the fault.
    const open = faults.filter(
      (f) => !lifeEvents().some((e) => e.manikin === f.manikin && (e.event === "serviced" || e.event === "retired") && e.date >= f.date),
    );
    expect(open).toHaveLength(2);
  });

  it("has exactly one manikin overdue for its yearly service", () => {
    // Due after 365 days: the default policy's serviceEveryDays.
    const dueDays = DEFAULT_POLICY.equipment.serviceEveryDays;
    const retired = new Set(files.equipment.filter((e) => e.event === "retired").map((e) => e.manikin));
    const overdue = files.equipment
      .filter((e) => e.event === "commissioned" && !retired.has(e.manikin))
      .filter((c) => {
        const services = files.equipment.filter((e) => e.manikin === c.manikin && e.event === "serviced").map((e) => e.date);
        const last = [c.date, ...services].sort().pop()!;
        return (Date.parse(TODAY) - Date.parse(last)) / 86_400_000 > dueDays;
      });
    expect(overdue.map((e) => e.manikin)).toEqual(["LTQ-C02"]);
  });

  it("uses manikins only while they are in service", () => {
    const life = new Map<string, { from: string; until: string | null; outOf: [string, string | null][] }>();
    for (const e of lifeEvents()) {
      const entry = life.get(e.manikin) ?? { from: "", until: null, outOf: [] };
      if (e.event === "commissioned") entry.from = e.date;
      if (e.event === "retired") entry.until = e.date;
      if (e.event === "fault") entry.outOf.push([e.date, null]);
      if (e.event === "serviced") {
        const open = entry.outOf.find((span) => span[1] === null);
        if (open) open[1] = e.date;
      }
      life.set(e.manikin, entry);
    }
    for (const c of files.classes) {
      for (const m of c.manikins.split(";")) {
        const entry = life.get(m)!;
        expect(c.date >= entry.from, `${m} used before commissioning`).toBe(true);
        if (entry.until) expect(c.date < entry.until, `${m} used after retirement`).toBe(true);
        for (const [from, to] of entry.outOf) {
          expect(c.date >= from && (to === null || c.date < to), `${m} used while faulty on ${c.date}`).toBe(false);
        }
      }
    }
  });

  it("matches the class log's consumables with the equipment log", () => {
    const perClass = new Map<string, Record<string, number>>();
    for (const e of files.equipment.filter((x) => x.note.includes("After class"))) {
      for (const id of e.note.match(/CL-\d+/g)!) {
        const totals = perClass.get(id) ?? {};
        // Rows merged from two classes would double-count; the schedule keeps one class per site and day.
        totals[e.event] = (totals[e.event] ?? 0) + Number(e.quantity);
        perClass.set(id, totals);
      }
    }
    let logged = 0;
    for (const c of files.classes) {
      if (c.lungs_replaced === "") {
        expect(c.mouthpieces_cleaned).toBe("");
        expect(c.batteries_replaced).toBe("");
        continue;
      }
      logged++;
      const totals = perClass.get(c.class_id) ?? {};
      expect(Number(c.lungs_replaced)).toBe(totals.lung_replaced ?? 0);
      expect(Number(c.mouthpieces_cleaned)).toBe(totals.mouthpiece_cleaned ?? 0);
      expect(Number(c.batteries_replaced)).toBe(totals.battery_replaced ?? 0);
    }
    expect(logged).toBeGreaterThan(files.classes.length * 0.9);
  });
});

describe("demo network: directory", () => {
  it("has one account per role at a reserved .example domain", () => {
    expect(network.network.name).not.toBe("");
    expect(network.accounts.map((a) => a.role).sort()).toEqual(["coordinator", "funder", "instructor", "quality_lead"]);
    const codes = new Set(network.instructors.map((i) => i.code));
    for (const account of network.accounts) {
      expect(account.email).toMatch(/^[a-z.]+@[a-z-]+\.example$/); // RFC 2606 reserves .example
      expect(account.password.length).toBeGreaterThanOrEqual(10); // the product's minimum password length
      if (account.role === "instructor") expect(codes).toContain(account.instructor);
      else expect(account.instructor).toBeNull();
    }
  });

  it("never writes a learner name: learner codes only", () => {
    const learners = new Set([...files.attempts, ...files.compressions].map((a) => a.learner));
    expect([...learners].filter((code) => !/^L-[0-9A-Z]{5}$/.test(code))).toEqual([]);
    const instructorNames = network.instructors.map((i) => i.name);
    for (const name of instructorNames) expect(network.files.attempts).not.toContain(name);
  });
});

describe("demo network: CSV quoting", () => {
  it("quotes notes with commas so they read back unchanged", () => {
    const withComma = files.equipment.filter((e) => e.note.includes(","));
    expect(withComma.length).toBeGreaterThan(0);
    expect(readCsv(network.files.equipment)).toHaveLength(files.equipment.length);
  });
});
