// CSV export neutralises spreadsheet formulas. The dangerous first characters (= + - @ tab CR) and the
// single-quote prefix are the OWASP "CSV Injection" advice (owasp.org/www-community/attacks/CSV_Injection);
// quoting and CRLF line ends follow RFC 4180.
import { describe, expect, it } from "vitest";
import { csvField, neutraliseFormula, toCsv } from "../../src/lib/csv";

describe("neutraliseFormula", () => {
  it.each([
    ["=1+2", "'=1+2"],
    ["+41 20 000 00 00", "'+41 20 000 00 00"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1:A9)", "'@SUM(A1:A9)"],
    ["\t=cmd", "'\t=cmd"],
    ["\r=cmd", "'\r=cmd"],
  ])("prefixes a quote to %j", (input, expected) => {
    expect(neutraliseFormula(input)).toBe(expected);
  });

  it.each(["NORTH-1", "Robin Example", "a=b", "", "'already quoted", "50 mm"])("leaves %j alone", (input) => {
    expect(neutraliseFormula(input)).toBe(input);
  });
});

describe("csvField", () => {
  it("keeps real numbers numeric, including negative ones", () => {
    expect(csvField(-5)).toBe("-5");
    expect(csvField(0.25)).toBe("0.25");
    expect(csvField(Number.NaN)).toBe("");
  });

  it("neutralises before quoting, so a formula hidden in a quoted field is caught too", () => {
    expect(csvField('=HYPERLINK("http://x.example","click")')).toBe(`"'=HYPERLINK(""http://x.example"",""click"")"`);
    expect(csvField("-1,5")).toBe(`"'-1,5"`);
  });

  it("quotes commas, quotes and line breaks (RFC 4180)", () => {
    expect(csvField("North, East")).toBe('"North, East"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
  });

  it("writes empty cells for null and undefined, yes/no for booleans", () => {
    expect(csvField(null)).toBe("");
    expect(csvField(undefined)).toBe("");
    expect(csvField(true)).toBe("yes");
    expect(csvField(false)).toBe("no");
  });
});

describe("toCsv", () => {
  it("writes a header row and CRLF-terminated records", () => {
    expect(toCsv(["Code", "Share"], [["N-1", 0.5], ["=evil()", -1]])).toBe("Code,Share\r\nN-1,0.5\r\n'=evil(),-1\r\n");
  });

  it("neutralises header cells as well", () => {
    expect(toCsv(["=Name"], [])).toBe("'=Name\r\n");
  });
});
