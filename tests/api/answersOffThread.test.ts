// The long insight answers are computed in a worker thread when the database is a file: the same text as the
// in-process computation, errors reaching the caller as they would in-process, and nothing kept from a state
// of the data the answer was not computed in.
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Db } from "../../server/db/client";
import { openDatabase } from "../../server/db/client";
import { AppError } from "../../server/errors";
import { resolveFilters } from "../../server/insight/filters";
import { answerJson } from "../../server/offThread/answers";
import { answerText, closeAnswerThread } from "../../server/offThread/pool";
import { viewerOf } from "../../server/insight/viewer";
import type { CurrentUser } from "../../shared/schemas/auth";
import { generateNetwork } from "../fixtures/insight/generateNetwork";
import { tempDbFile } from "../helpers/testApp";

const file = tempDbFile("qb-off-thread");
let db: Db;

const coordinator = { id: 1, email: "c@network.example", displayName: "Coordinator", role: "coordinator", instructorId: null } as CurrentUser;
const instructor = { id: 2, email: "i@network.example", displayName: "Instructor", role: "instructor", instructorId: 1 } as CurrentUser;

beforeAll(() => {
  ({ db } = generateNetwork(file, { instructors: 12, quarters: 2, classesPerInstructorQuarter: 2, attemptsPerClass: 10 }));
});
afterAll(async () => {
  await closeAnswerThread(db);
  db.$client.close();
  fs.rmSync(path.dirname(file), { recursive: true, force: true });
});

describe("insight answers off the event loop", () => {
  it("answers from the worker with the very text computed in-process, for each long answer", async () => {
    const viewer = viewerOf(db, coordinator);
    const mine = viewerOf(db, instructor);
    const filters = resolveFilters(db, {}, viewer);
    const ownFilters = resolveFilters(db, {}, mine);
    const pending = answerText(db, "test:overview", "overview", [viewer, filters, { limits: "binomial", splitAt: null }]);
    // a file database is answered by the worker: the caller gets a promise, not a finished answer
    expect(pending).toBeInstanceOf(Promise);
    expect(await pending).toBe(answerJson(db, "overview", [viewer, filters, { limits: "binomial", splitAt: null }]));
    expect(await answerText(db, "test:standing", "standing", [mine, ownFilters, "case-mix"])).toBe(answerJson(db, "standing", [mine, ownFilters, "case-mix"]));
    expect(await answerText(db, "test:instructors", "instructors", [filters, "case-mix"])).toBe(answerJson(db, "instructors", [filters, "case-mix"]));
    expect(await answerText(db, "test:techniqueErrors", "techniqueErrors", [filters, "too_shallow"])).toBe(
      answerJson(db, "techniqueErrors", [filters, "too_shallow"]),
    );
    const search = {
      error: null,
      classId: null,
      stream: null,
      learner: null,
      learnerMatch: "exact",
      sort: "score",
      dir: "desc",
      onlyInstructorId: null,
    } as const;
    expect(await answerText(db, "test:attempts", "attempts", [filters, search, { page: 2, pageSize: 50 }])).toBe(
      answerJson(db, "attempts", [filters, search, { page: 2, pageSize: 50 }]),
    );
    // the equipment answers, whose usage figures follow the viewer's grid
    expect(await answerText(db, "test:fleet", "fleet", [viewer, filters, "2025-12-31"])).toBe(answerJson(db, "fleet", [viewer, filters, "2025-12-31"]));
    expect(await answerText(db, "test:drift", "drift", [viewer, filters])).toBe(answerJson(db, "drift", [viewer, filters]));
    // the checks after an import, as the digest reads them
    expect(await answerText(db, "test:signals", "signals", ["2025-12-31"])).toBe(answerJson(db, "signals", ["2025-12-31"]));
  });

  it("passes an answer's refusal back as the same error", async () => {
    // My standing for an account linked to no instructor is refused in-process with 403
    const viewer = viewerOf(db, coordinator);
    const filters = resolveFilters(db, {}, viewer);
    const refused = await Promise.resolve(answerText(db, "test:refused", "standing", [viewer, filters, "case-mix"])).catch((err: unknown) => err);
    expect(refused).toBeInstanceOf(AppError);
    expect(refused).toMatchObject({ status: 403, message: "Your account is not linked to an instructor." });
  });

  it("computes in-process where the database cannot be shared with a thread", () => {
    const memory = openDatabase(":memory:");
    try {
      const viewer = viewerOf(memory, coordinator);
      expect(typeof answerText(memory, "test:memory", "overview", [viewer, resolveFilters(memory, {}, viewer), { limits: "binomial", splitAt: null }])).toBe(
        "string",
      );
    } finally {
      memory.$client.close();
    }
  });
});
