import { describe, expect, it } from "vitest";
import { fieldErrorsFromDetails } from "../../src/lib/fieldErrors";

describe("fieldErrorsFromDetails", () => {
  it("reads the server's { path, message } list, first message per field", () => {
    expect(
      fieldErrorsFromDetails([
        { path: "currentPassword", message: "Not your current password" },
        { path: "currentPassword", message: "second message" },
        { path: "instructorId", message: "Choose an existing instructor" },
      ]),
    ).toEqual({ currentPassword: "Not your current password", instructorId: "Choose an existing instructor" });
  });

  it("files nested paths under their top-level field and path-less problems under 'form'", () => {
    expect(fieldErrorsFromDetails([{ path: "address.street", message: "Too long" }, { path: "", message: "Whole form" }])).toEqual({
      address: "Too long",
      form: "Whole form",
    });
  });

  it("reads zod issue arrays and flattened field errors", () => {
    expect(fieldErrorsFromDetails([{ path: ["email"], message: "Bad e-mail" }])).toEqual({ email: "Bad e-mail" });
    expect(fieldErrorsFromDetails({ fieldErrors: { name: ["Enter a name"] } })).toEqual({ name: "Enter a name" });
  });

  it("ignores details it does not understand", () => {
    expect(fieldErrorsFromDetails("oops")).toEqual({});
    expect(fieldErrorsFromDetails([{ nope: 1 }])).toEqual({});
    expect(fieldErrorsFromDetails(null)).toEqual({});
  });
});
