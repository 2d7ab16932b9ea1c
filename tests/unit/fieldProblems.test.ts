import { describe, expect, it } from "vitest";
import { fieldProblems } from "../../src/api/fieldProblems";

describe("fieldProblems", () => {
  it("reads the server's { path, message } list, first message per field", () => {
    expect(
      fieldProblems([
        { path: "currentPassword", message: "Not your current password" },
        { path: "currentPassword", message: "second message" },
        { path: "instructorId", message: "Choose an existing instructor" },
      ]),
    ).toEqual({ currentPassword: "Not your current password", instructorId: "Choose an existing instructor" });
  });

  it("files nested paths under their top-level field and path-less problems under 'form'", () => {
    expect(
      fieldProblems([
        { path: "address.street", message: "Too long" },
        { path: "", message: "Whole form" },
      ]),
    ).toEqual({
      address: "Too long",
      form: "Whole form",
    });
  });

  it("names no field for details it does not understand", () => {
    expect(fieldProblems("oops")).toEqual({});
    expect(fieldProblems([{ nope: 1 }])).toEqual({});
    expect(fieldProblems({ fieldErrors: { name: ["Enter a name"] } })).toEqual({});
    expect(fieldProblems(null)).toEqual({});
  });
});
