import { describe, expect, it } from "vitest";
import { cli } from "../helpers/cli";
import { tempDbFile } from "../helpers/testApp";

describe("quarterbeat users", () => {
  const db = tempDbFile("qb-cli-users");

  it("adds a user with the password from standard input, lists and deactivates it", () => {
    const added = cli(
      ["--db", db, "users", "add", "Lead@Example.org", "--name", "Quality Lead", "--role", "quality_lead", "--password-stdin"],
      "a-long-enough-password\n",
    );
    expect(added.stderr).toBe("");
    expect(added.code).toBe(0);
    expect(added.stdout).toContain("lead@example.org");

    const listed = cli(["--db", db, "users", "list", "--json"]);
    expect(listed.code).toBe(0);
    const users = JSON.parse(listed.stdout);
    expect(users).toEqual([expect.objectContaining({ email: "lead@example.org", role: "quality_lead", active: true })]);

    expect(cli(["--db", db, "users", "deactivate", "lead@example.org"]).code).toBe(0);
    expect(JSON.parse(cli(["--db", db, "users", "list", "--json"]).stdout)[0].active).toBe(false);
  });

  it("refuses a too-short password with exit code 1 and says why", () => {
    const res = cli(["--db", db, "users", "add", "short@example.org", "--name", "Short", "--role", "funder", "--password-stdin"], "short\n");
    expect(res.code).toBe(1);
    expect(res.stderr).toMatch(/password: Use at least 10 characters/);
  });

  it("answers a usage error with exit code 2", () => {
    expect(cli(["--db", db, "users", "add", "x@example.org", "--name", "X", "--role", "admiral", "--password-stdin"], "long-enough-password").code).toBe(2);
    expect(cli(["--db", db, "no-such-command"]).code).toBe(2);
  });

  it("never takes the password as an argument", () => {
    const res = cli(["--db", db, "users", "add", "y@example.org", "--name", "Y", "--role", "funder", "--password", "long-enough-password"]);
    expect(res.code).toBe(2);
  });
});
