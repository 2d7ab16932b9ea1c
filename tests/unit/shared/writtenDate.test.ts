import { describe, expect, it } from "vitest";
import { writtenDate } from "../../../shared/writtenDate";

describe("writtenDate", () => {
  it("writes a calendar date out in full, whatever the server's time zone", () => {
    expect(writtenDate("2025-10-01")).toBe("1 October 2025");
    expect(writtenDate("2026-12-31")).toBe("31 December 2026");
  });

  it("writes an instant as its UTC day", () => {
    expect(writtenDate(new Date("2026-03-01T23:30:00Z"))).toBe("1 March 2026");
    expect(writtenDate("2026-03-01T23:30:00Z")).toBe("1 March 2026");
  });

  it("leaves text that is not a date as it is", () => {
    expect(writtenDate("unknown")).toBe("unknown");
  });
});
