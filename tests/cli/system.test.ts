// `quarterbeat backup` records each copy with its verification; `quarterbeat system --json` answers what
// GET /api/system answers, from the same service.
import fs from "node:fs";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { systemReportSchema } from "../../shared/schemas/system";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

const db = tempDbFile("qb-cli-system");
afterAll(() => fs.rmSync(path.dirname(db), { recursive: true, force: true }));

describe("quarterbeat system", () => {
  it("lists a verified backup made by the CLI and the database's size in the shared schema", () => {
    const copy = path.join(path.dirname(db), "copies/first.sqlite");
    const backup = cli(["--db", db, "backup", copy]);
    expect(backup.stderr).toBe("");
    expect(backup.code).toBe(0);
    expect(backup.stdout).toMatch(/verified: Integrity check passed/);

    const res = cli(["--db", db, "system", "--json"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    const system = systemReportSchema.parse(JSON.parse(res.stdout));
    expect(system.database.file).toBe(path.resolve(db));
    expect(system.database.pageCount).toBeGreaterThan(0);
    expect(system.migration.current).toBe(true);
    expect(system.growth).toEqual([]);
    expect(system.backups.dir).toBe(path.join(path.dirname(db), "backups"));
    expect(system.backups.recent).toEqual([expect.objectContaining({ file: copy, source: "cli", verified: true, sizeBytes: fs.statSync(copy).size })]);
    expect(system.backups.lastVerified?.file).toBe(copy);
    expect(system.mail).toMatchObject({ delivery: "outbox", server: null, reportSends: { sent: 0, failed: 0 } });
  });

  it("prints the program's version from package.json", () => {
    const version = (JSON.parse(fs.readFileSync(path.resolve("package.json"), "utf8")) as { version: string }).version;
    const res = cli(["--version"]);
    expect(res.stderr).toBe("");
    expect(res.code).toBe(0);
    expect(res.stdout.trim()).toBe(version);
  });

  it("prints the same state as text without --json", () => {
    const res = cli(["--db", db, "system"]);
    expect(res.code).toBe(0);
    expect(res.stdout).toMatch(/^Quarterbeat \d+\.\d+\.\d+; schema \d{4}_\w+ \(\d+ migrations, up to date\)/);
    expect(res.stdout).toContain("Last verified backup: ");
    expect(res.stdout).toContain("first.sqlite");
  });
});
