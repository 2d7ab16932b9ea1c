// The Methods page and docs/methods.md state the same methods in the same words (both from shared/methods.ts).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { methodNotes } from "../../shared/methods";

const doc = fs.readFileSync(path.resolve(__dirname, "../../docs/methods.md"), "utf8");

describe("docs/methods.md", () => {
  it.each(methodNotes.map((note) => [note.title, note] as const))("states %s as the Methods page does", (_title, note) => {
    expect(doc).toContain(`## ${note.title}\n\n${note.text}\n`);
    for (const source of note.sources) expect(doc).toContain(`- ${source}`);
  });

  it("gives every method a source and a unique anchor", () => {
    expect(new Set(methodNotes.map((note) => note.id)).size).toBe(methodNotes.length);
    for (const note of methodNotes) expect(note.sources.length).toBeGreaterThan(0);
  });
});
