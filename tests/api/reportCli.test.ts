// `quarterbeat report`: writes and stores the PDF, e-mails it with --send (to the local mail service when no
// SMTP_URL is set), and explains itself when there is nothing to report.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { PDFParse } from "pdf-parse";
import { beforeAll, describe, expect, it } from "vitest";
import { openDatabase } from "../../server/db/client";
import { improvementActions, mailbox, reports } from "../../server/db/schema";
import { insertReportFixture } from "../unit/report/fixture";
import { makeTestDb, seedPeople, tempDbFile } from "../helpers/testApp";

const root = path.resolve(__dirname, "../..");
// the command runs in a scratch folder (where --out files go), so tsx is named by its full path
const tsxLoader = pathToFileURL(path.join(root, "node_modules/tsx/dist/loader.mjs")).href;
const dbFile = tempDbFile("qb-cli-report");
const outDir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-cli-report-out-"));

function cli(args: string[]) {
  const env: NodeJS.ProcessEnv = { ...process.env, QUARTERBEAT_DB: "" };
  delete env.SMTP_URL;
  const result = spawnSync(process.execPath, ["--import", tsxLoader, path.join(root, "cli/main.ts"), "--db", dbFile, ...args], {
    cwd: outDir,
    encoding: "utf8",
    env,
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

function readDb<T>(read: (db: ReturnType<typeof openDatabase>) => T): T {
  const db = openDatabase(dbFile);
  try {
    return read(db);
  } finally {
    db.$client.close();
  }
}

beforeAll(async () => {
  const db = makeTestDb(dbFile);
  insertReportFixture(db, await seedPeople(db));
  db.$client.close();
});

describe("quarterbeat report", () => {
  it("writes the PDF, stores the version and prints the headline", async () => {
    const res = cli(["report", "--quarter", "2026-Q3", "--out", "q3.pdf"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    expect(res.stdout).toContain("Stored version 1 of the 2026-Q3 report");
    expect(res.stdout).toContain("65.0 % of measured attempts met the network's pass rule (95 % interval 49.5–77.9 %).");
    const written = fs.readFileSync(path.join(outDir, "q3.pdf"));
    const stored = readDb((db) => db.select().from(reports).all());
    expect(stored).toHaveLength(1);
    expect(Buffer.compare(written, Buffer.from(stored[0].pdf))).toBe(0);
    const parser = new PDFParse({ data: new Uint8Array(written) });
    const { text } = await parser.getText();
    await parser.destroy();
    expect(text).toContain("95 % interval 49.5–77.9 %");
  });

  it("refuses --send without a cover note, before storing anything", () => {
    const res = cli(["report", "--year", "2026", "--send"]);
    expect(res.code).toBe(2);
    expect(res.stderr).toContain("--send needs a cover note for the funders.");
    expect(readDb((db) => db.select().from(mailbox).all())).toHaveLength(0);
  });

  it("with --send and no SMTP_URL, delivers to the local mail service so the message shows in the Outbox", () => {
    const res = cli(["report", "--year", "2026", "--send", "--note", "Our year in figures.", "--to", "board@foundation.example"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    expect(res.stdout).toContain("Sent to funder@test.example, board@foundation.example.");
    expect(fs.existsSync(path.join(outDir, "quarterbeat-funder-report-2026-v1.pdf"))).toBe(true);
    const messages = readDb((db) => db.select().from(mailbox).all());
    // one message per recipient, each opening with the cover note
    expect(messages.map((m) => m.recipients)).toEqual([["funder@test.example"], ["board@foundation.example"]]);
    expect(messages[0].text).toMatch(/^Our year in figures\./);
    expect(messages[0].attachments[0].filename).toBe("quarterbeat-funder-report-2026-v1.pdf");
  });

  it("says clearly that a period without data has nothing to report, and stores nothing", () => {
    const res = cli(["report", "--quarter", "2027-Q1", "--out", "empty.pdf"]);
    expect(res.code).toBe(1);
    expect(res.stderr).toContain("There are no classes or measured attempts for 2027-Q1, so there is nothing to report.");
    expect(res.stderr).toContain("Import the class logs and attempts for that period first");
    expect(fs.existsSync(path.join(outDir, "empty.pdf"))).toBe(false);
  });

  it("answers a usage error when no period is given, and refuses a malformed one", () => {
    const none = cli(["report", "--out", "x.pdf"]);
    expect(none.code).toBe(2);
    expect(none.stderr).toContain("Give either --quarter or --year.");
    const bad = cli(["report", "--quarter", "2026-Q7"]);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/not a report period/);
  });

  it("lists the improvement actions with --include-actions, without their owner", async () => {
    readDb((db) =>
      db
        .insert(improvementActions)
        .values({ title: "Rate metronome in every class", aim: "passRate", target: 70, startDate: "2026-07-06", owner: "Robin Owner", status: "under_way" })
        .run(),
    );
    const res = cli(["report", "--quarter", "2026-Q3", "--out", "with-actions.pdf", "--include-actions"]);
    expect(res.code, res.stderr).toBe(0);
    const parser = new PDFParse({ data: new Uint8Array(fs.readFileSync(path.join(outDir, "with-actions.pdf"))) });
    const { text } = await parser.getText();
    await parser.destroy();
    expect(text).toMatch(/Rate metronome in every class\s+Measured pass rate\s+Whole network\s+6 July 2026\s+Under way/);
    expect(text).not.toContain("Robin Owner");
  });
});
