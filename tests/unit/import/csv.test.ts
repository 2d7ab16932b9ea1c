import { describe, expect, it } from "vitest";
import { csvLine } from "../../../server/imports/run";

describe("refused-rows CSV", () => {
  it("quotes where CSV needs it and defuses formula-like text (OWASP CSV injection), keeping numbers", () => {
    expect(csvLine(["=cmd()", "-0.5", "a,b", 'say "hi"', "@x", " pad", "ok"])).toBe(`'=cmd(),-0.5,"a,b","say ""hi""",'@x," pad",ok\n`);
  });
});
