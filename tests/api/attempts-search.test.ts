// The attempt search over the whole result (tests/fixtures/insight/network.ts): every filter, sorting by any
// listed column with the attempt id breaking ties, paging with the total, the instructor's row scope, the
// CSV of the whole result, and 422 naming the field for values the search does not know.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attemptSortKeys } from "../../shared/filters";
import { attemptListAnswerSchema, type AttemptRow } from "../../shared/schemas/insight";
import type { Agent } from "../helpers/testApp";
import { startInsightApp, type InsightTestContext } from "../fixtures/insight/setup";

let t: InsightTestContext;
beforeAll(async () => {
  t = await startInsightApp();
});
afterAll(() => t.db.$client.close());

async function list(agent: Agent, query: string) {
  return attemptListAnswerSchema.parse((await agent.get(`/api/attempts?${query}`).expect(200)).body);
}

/** Every row of a search, page by page. */
async function allPages(agent: Agent, query: string, pageSize: number): Promise<{ rows: AttemptRow[]; totals: number[] }> {
  const rows: AttemptRow[] = [];
  const totals: number[] = [];
  for (let page = 1; ; page++) {
    const answer = await list(agent, `${query}&pageSize=${pageSize}&page=${page}`);
    totals.push(answer.total);
    rows.push(...answer.attempts);
    if (answer.attempts.length < pageSize) return { rows, totals };
  }
}

const ALL_QUARTERS = "from=2025-Q3&to=2026-Q2";

describe("GET /api/attempts filters", () => {
  it("narrows to attempts with or without a stored compression stream", async () => {
    const withStream = await list(t.coordinator, `${ALL_QUARTERS}&stream=yes`);
    expect(withStream.attempts.map((a) => a.id)).toEqual(["A1-2604-001"]);
    expect(withStream.total).toBe(1);
    const everything = await list(t.coordinator, `${ALL_QUARTERS}&pageSize=1`);
    const without = await list(t.coordinator, `${ALL_QUARTERS}&stream=no&pageSize=200`);
    expect(without.total).toBe(everything.total - 1);
    expect(without.attempts.some((a) => a.hasStream)).toBe(false);
  });

  it("finds a learner by the whole code or by its start, ignoring case", async () => {
    const exact = await list(t.coordinator, "learner=lrn-a1-2604-1");
    expect(exact.attempts.map((a) => a.id)).toEqual(["A1-2604-001"]);
    // LRN-A1-2604-1 and LRN-A1-2604-10 start with it
    const prefix = await list(t.coordinator, "learner=LRN-A1-2604-1&learnerMatch=prefix");
    expect(prefix.attempts.map((a) => a.learner).sort()).toEqual(["LRN-A1-2604-1", "LRN-A1-2604-10"]);
    const wholeClass = await list(t.coordinator, "learner=LRN-A1-2604-&learnerMatch=prefix");
    expect(wholeClass.total).toBe(10);
    // "%" and "_" would be wildcards to LIKE; the search compares the start of the code as text
    expect((await list(t.coordinator, "learner=LRN_A1&learnerMatch=prefix")).total).toBe(0);
  });

  it("combines error, instructor, manikin, class, site, patient type and feedback display", async () => {
    // 2026-Q2 shallow attempts: A1 2, B1 4, C1 2 (fixture header)
    const shallowB1 = await list(t.coordinator, "error=too_shallow&instructor=B1&manikin=MK-S1");
    expect(shallowB1.total).toBe(4);
    expect(new Set(shallowB1.attempts.map((a) => a.classId))).toEqual(new Set(["B1-2605"]));
    const hiddenB1 = await list(t.coordinator, "error=too_shallow&class=B1-2605&feedback=hidden&site=SOUTH&profile=adult");
    expect(hiddenB1.total).toBe(2);
    expect(hiddenB1.attempts.every((a) => a.feedback === "hidden" && a.errors.includes("too_shallow"))).toBe(true);
    const infant = await list(t.coordinator, "profile=infant&manikin=MK-N2");
    expect(infant.total).toBe(4);
  });
});

describe("GET /api/attempts sorting and paging", () => {
  it("sorts the whole result, not a page, with the attempt id breaking ties", async () => {
    const { rows, totals } = await allPages(t.coordinator, `${ALL_QUARTERS}&sort=score&dir=asc`, 37);
    const expected = [...rows].sort((a, b) => a.score - b.score || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
    expect(rows.map((a) => a.id)).toEqual(expected.map((a) => a.id));
    // 29 + 20 + 263 + 44 attempts over the four quarters
    expect(new Set(totals)).toEqual(new Set([356]));
    expect(new Set(rows.map((a) => a.id)).size).toBe(356);
  });

  it("sorts descending with ties still in ascending id order, so pages never overlap", async () => {
    // D1-2601's 263 attempts start at 09:00 … 09:59 and again, so many share a start time
    const { rows } = await allPages(t.coordinator, "quarter=2026-Q1&sort=startedAt&dir=desc", 50);
    expect(rows).toHaveLength(263);
    for (let i = 1; i < rows.length; i++) {
      const [before, after] = [rows[i - 1], rows[i]];
      expect(before.startedAt >= after.startedAt).toBe(true);
      if (before.startedAt === after.startedAt) expect(before.id < after.id).toBe(true);
    }
  });

  it("sorts by a joined code and by the first error", async () => {
    const bySite = await list(t.coordinator, "sort=site&dir=desc&pageSize=200");
    expect(bySite.attempts[0].site?.code).toBe("SOUTH");
    expect(bySite.attempts.at(-1)!.site?.code).toBe("NORTH");
    const byError = await list(t.coordinator, "sort=errors&pageSize=200");
    // attempts without errors first, then by the first error in the scoring's order
    expect(byError.attempts[0].errors).toEqual([]);
    expect(byError.attempts.at(-1)!.errors).toEqual(["long_pause"]);
  });

  it("accepts every listed sort column", async () => {
    for (const sort of attemptSortKeys) {
      const answer = await list(t.coordinator, `sort=${sort}&dir=desc&pageSize=5`);
      expect(answer.total).toBe(44);
    }
  });

  it("gives the total of the whole result on every page, and an empty page past the end", async () => {
    const last = await list(t.coordinator, "pageSize=20&page=3");
    expect(last).toMatchObject({ page: 3, total: 44 });
    expect(last.attempts).toHaveLength(4);
    const past = await list(t.coordinator, "pageSize=20&page=4");
    expect(past.total).toBe(44);
    expect(past.attempts).toHaveLength(0);
  });
});

describe("GET /api/attempts row scope", () => {
  it("keeps an instructor to their own attempts under every filter and order", async () => {
    const { rows } = await allPages(t.instructor, `${ALL_QUARTERS}&sort=learner&dir=asc`, 25);
    expect(rows).toHaveLength(39);
    expect(new Set(rows.map((a) => a.instructor?.code))).toEqual(new Set(["A1"]));
    // a manikin the options do not offer an instructor (another site's) is refused, whether it exists or not
    await t.instructor.get("/api/attempts?manikin=MK-S1").expect(403);
    expect((await list(t.instructor, "learner=LRN-B1&learnerMatch=prefix")).total).toBe(0);
    await t.instructor.get("/api/attempts?instructor=B1").expect(403);
    expect((await list(t.instructor, "instructor=A1&error=too_shallow")).total).toBe(2);
  });

  it("refuses funders", async () => {
    await t.funder.get("/api/attempts").expect(403);
    await t.funder.get("/api/attempts.csv").expect(403);
  });
});

describe("GET /api/attempts validation", () => {
  it.each([
    ["sort=learnerName", "sort"],
    ["sort=score&dir=up", "dir"],
    ["stream=maybe", "stream"],
    ["learner=L%200042", "learner"],
    ["learner=L-1&learnerMatch=fuzzy", "learnerMatch"],
    ["error=bad_hair", "error"],
  ])("answers %s with 422 naming %s", async (query, field) => {
    const res = await t.coordinator.get(`/api/attempts?${query}`).expect(422);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(field);
    const csv = await t.coordinator.get(`/api/attempts.csv?${query}`).expect(422);
    expect(csv.body.error.details.map((d: { path: string }) => d.path)).toContain(field);
  });
});

describe("GET /api/attempts.csv", () => {
  function parseLines(text: string): string[] {
    expect(text.endsWith("\r\n")).toBe(true);
    return text.slice(0, -2).split("\r\n");
  }

  it("holds the whole filtered result in the list's order, not one page", async () => {
    const res = await t.coordinator.get(`/api/attempts.csv?${ALL_QUARTERS}&error=too_shallow&sort=score&dir=desc`).expect(200);
    expect(res.headers["content-type"]).toMatch(/^text\/csv/);
    expect(res.headers["content-disposition"]).toBe("attachment; filename=attempts-2025-Q3-to-2026-Q2.csv");
    const lines = parseLines(res.text);
    expect(lines[0].split(",").slice(0, 5)).toEqual(["Attempt", "Started", "Period", "Class", "Learner"]);
    const { rows } = await allPages(t.coordinator, `${ALL_QUARTERS}&error=too_shallow&sort=score&dir=desc`, 200);
    expect(rows.length).toBeGreaterThan(200);
    expect(lines.slice(1).map((l) => l.split(",")[0])).toEqual(rows.map((a) => a.id));
    const first = lines[1].split(",");
    expect(first[lines[0].split(",").indexOf("Errors")]).toBe("Compressions mostly not deep enough");
  });

  it("keeps an instructor to their own attempts", async () => {
    const res = await t.instructor.get(`/api/attempts.csv?${ALL_QUARTERS}`).expect(200);
    const lines = parseLines(res.text);
    expect(lines).toHaveLength(40);
    const instructorColumn = lines[0].split(",").indexOf("Instructor");
    expect(new Set(lines.slice(1).map((l) => l.split(",")[instructorColumn]))).toEqual(new Set(["A1"]));
  });

  it("writes the header alone when nothing matches", async () => {
    const res = await t.coordinator.get("/api/attempts.csv?learner=NOBODY").expect(200);
    expect(parseLines(res.text)).toHaveLength(1);
  });
});
