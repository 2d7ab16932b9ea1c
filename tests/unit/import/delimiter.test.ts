// Reading the column separator off an import file's header line.
import { describe, expect, it } from "vitest";
import { detectDelimiter, headerLine } from "../../../shared/import/delimiter";

describe("detectDelimiter", () => {
  it("picks the separator used most often outside quotes", () => {
    expect(detectDelimiter("class_id,date,site")).toBe("comma");
    expect(detectDelimiter("class_id;date;site")).toBe("semicolon");
    expect(detectDelimiter("class_id\tdate\tsite")).toBe("tab");
    // separators inside a quoted name do not count
    expect(detectDelimiter('"depth, mm";"rate, /min";"recoil, %"')).toBe("semicolon");
    expect(detectDelimiter('"a;b;c;d",e,f')).toBe("comma");
  });

  it("falls back to commas for a single column or a tie", () => {
    expect(detectDelimiter("class_id")).toBe("comma");
    expect(detectDelimiter("a,b;c")).toBe("comma");
  });
});

describe("headerLine", () => {
  it("skips blank lines and a byte-order mark, and says whether the line is complete", () => {
    expect(headerLine("\uFEFF\n \r\na;b\r\n1;2")).toEqual({ line: "a;b", complete: true });
    expect(headerLine("a;b")).toEqual({ line: "a;b", complete: false });
    expect(headerLine("\n  \n")).toBeNull();
  });
});
