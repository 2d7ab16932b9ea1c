// The one CSV writer. Quoting, doubled quotes and CRLF line ends follow RFC 4180 ("Common Format and MIME
// Type for Comma-Separated Values (CSV) Files", section 2). The dangerous first characters (= + - @ tab CR)
// and the single-quote prefix follow the OWASP "CSV Injection" guidance.
import { parse } from "csv-parse/sync";
import { describe, expect, it } from "vitest";
import { csvField, csvLine, csvRecord, IMPORT_FILE_CSV, neutraliseFormula, SPREADSHEET_CSV, toCsv } from "../../shared/csv";

describe("neutraliseFormula (OWASP CSV Injection)", () => {
  it.each([
    ["=1+2", "'=1+2"],
    ["+41 20 000 00 00", "'+41 20 000 00 00"],
    ["-2+3", "'-2+3"],
    ["@SUM(A1:A9)", "'@SUM(A1:A9)"],
    ["\t=cmd", "'\t=cmd"],
    ["\r=cmd", "'\r=cmd"],
    ["-Infinity", "'-Infinity"],
  ])("prefixes a quote to %j", (input, expected) => {
    expect(neutraliseFormula(input)).toBe(expected);
  });

  it.each(["NORTH-1", "Robin Example", "a=b", "", "'already quoted", "50 mm", "-0.5", "+3", "-6", "-1e3"])("leaves %j alone", (input) => {
    expect(neutraliseFormula(input)).toBe(input);
  });

  it("guards a tab before a number, which a spreadsheet would not read as a plain number", () => {
    expect(neutraliseFormula("\t1")).toBe("'\t1");
  });
});

describe("csvField", () => {
  it("keeps real numbers numeric, including negative ones", () => {
    expect(csvField(-5, SPREADSHEET_CSV)).toBe("-5");
    expect(csvField(0.25, SPREADSHEET_CSV)).toBe("0.25");
    expect(csvField(Number.NaN, SPREADSHEET_CSV)).toBe("");
    expect(csvField(Number.POSITIVE_INFINITY, SPREADSHEET_CSV)).toBe("");
  });

  it("neutralises before quoting, so a formula hidden in a quoted field is caught too", () => {
    expect(csvField('=HYPERLINK("http://x.example","click")', SPREADSHEET_CSV)).toBe(`"'=HYPERLINK(""http://x.example"",""click"")"`);
    expect(csvField("-1,5", SPREADSHEET_CSV)).toBe(`"'-1,5"`);
  });

  it("keeps formula-like text exactly in files Quarterbeat reads back", () => {
    expect(csvField("=1+2", IMPORT_FILE_CSV)).toBe("=1+2");
    expect(csvField("-2+3, then", IMPORT_FILE_CSV)).toBe('"-2+3, then"');
  });

  it("quotes commas, quotes, line breaks (RFC 4180) and edge spaces", () => {
    expect(csvField("North, East", SPREADSHEET_CSV)).toBe('"North, East"');
    expect(csvField('say "hi"', SPREADSHEET_CSV)).toBe('"say ""hi"""');
    expect(csvField("two\nlines", SPREADSHEET_CSV)).toBe('"two\nlines"');
    expect(csvField("two\r\nlines", IMPORT_FILE_CSV)).toBe('"two\r\nlines"');
    expect(csvField(" pad", SPREADSHEET_CSV)).toBe('" pad"');
    expect(csvField("pad ", SPREADSHEET_CSV)).toBe('"pad "');
  });

  it("writes empty cells for null and undefined, yes/no for booleans, ISO text for dates", () => {
    expect(csvField(null, SPREADSHEET_CSV)).toBe("");
    expect(csvField(undefined, SPREADSHEET_CSV)).toBe("");
    expect(csvField(true, SPREADSHEET_CSV)).toBe("yes");
    expect(csvField(false, SPREADSHEET_CSV)).toBe("no");
    expect(csvField(new Date(Date.UTC(2026, 6, 14, 9, 30)), SPREADSHEET_CSV)).toBe("2026-07-14T09:30:00.000Z");
  });
});

describe("records and documents", () => {
  it("ends every record with CRLF (RFC 4180), the last one included", () => {
    expect(
      toCsv(
        ["Code", "Share"],
        [
          ["N-1", 0.5],
          ["=evil()", -1],
        ],
        SPREADSHEET_CSV,
      ),
    ).toBe("Code,Share\r\nN-1,0.5\r\n'=evil(),-1\r\n");
    expect(csvLine(["=cmd()", "-0.5", "a,b", 'say "hi"', "@x", " pad", "ok"], SPREADSHEET_CSV)).toBe(`'=cmd(),-0.5,"a,b","say ""hi""",'@x," pad",ok\r\n`);
    expect(csvRecord(["a", 1, null], IMPORT_FILE_CSV)).toBe("a,1,");
  });

  it("neutralises header cells as well", () => {
    expect(toCsv(["=Name"], [], SPREADSHEET_CSV)).toBe("'=Name\r\n");
  });

  it("refuses a row whose field count differs from the header, naming the row", () => {
    expect(() => toCsv(["a", "b"], [["1", "2"], ["3"]], IMPORT_FILE_CSV)).toThrow(/row 3 has 1 fields, the header has 2/);
  });

  it("reads back to the same values with a standard CSV reader", () => {
    const values = ["plain", "North, East", 'say "hi"', "two\r\nlines", " pad ", "=1+2", ""];
    const text = toCsv(["v1", "v2", "v3", "v4", "v5", "v6", "v7"], [values], IMPORT_FILE_CSV);
    expect(parse(text, { from_line: 2 })).toEqual([values]);
  });
});
