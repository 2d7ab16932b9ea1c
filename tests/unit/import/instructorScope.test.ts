// What an instructor's file may name: only existing sites, instructors and manikins, only their own site and
// instructor code. A coordinator's file (and the command line) still creates the codes it names.
import { describe, expect, it } from "vitest";
import { ATTEMPT_HEADER, count, freshDb, load, STREAM_HEADER } from "./helpers";

const CLASS_HEADER = "class_id,date,site,instructor,course,learners,passed,manikins";

async function networkWithManikins() {
  const { db, people } = await freshDb();
  // the coordinator registers MK-1 at NORTH (A1's site) through a class of A1's
  await load(db, "classes", `${CLASS_HEADER}\nC-A1-1,2026-07-14,NORTH,A1,adult,4,4,MK-1\n`);
  const instructor = { userId: people.users.instructor.id, role: "instructor" as const, instructorId: people.instructors.a1.id };
  return { db, people, instructor };
}

const codeCounts = (db: Parameters<typeof count>[0]) => [count(db, "sites"), count(db, "instructors"), count(db, "manikins")];

describe("an instructor's class log", () => {
  it("imports their own class at their own site with registered manikins", async () => {
    const { db, instructor } = await networkWithManikins();
    const s = await load(db, "classes", `${CLASS_HEADER}\nC-A1-2,2026-07-20,NORTH,A1,child,5,4,MK-1\n`, { actor: instructor, source: "web" });
    expect(s).toMatchObject({ status: "imported", inserted: 1 });
    expect(s.newCodes).toEqual({ sites: [], instructors: [], manikins: [] });
  });

  it("refuses a new site, another site, a new manikin and a new instructor code, naming row, column and reason, and creates nothing", async () => {
    const { db, instructor } = await networkWithManikins();
    const before = codeCounts(db);
    const csv = [
      CLASS_HEADER,
      "C-A1-3,2026-07-21,EVILSITE,A1,adult,4,4,",
      "C-A1-4,2026-07-22,SOUTH,A1,adult,4,4,",
      "C-A1-5,2026-07-23,NORTH,A1,adult,4,4,MK-1;EVIL-M1",
      "C-A1-6,2026-07-24,NORTH,NEW9,adult,4,4,",
      "C-A1-7,2026-07-25,NORTH,A1,adult,4,4,MK-1",
    ].join("\n");
    const s = await load(db, "classes", csv, { actor: instructor, source: "web" });
    expect(s.status).toBe("refused");
    expect(s.file).toBe("classes.csv");
    expect(s.issues).toEqual([
      { row: 1, column: "site", reason: "EVILSITE is not a site of the network; instructors may name only their own site (NORTH)" },
      { row: 2, column: "site", reason: "SOUTH is not your site; instructors may file classes only under their own site (NORTH)" },
      {
        row: 3,
        column: "manikins",
        reason: "manikin EVIL-M1 is not registered in the network; instructors may name only existing manikins (the coordinator adds new ones)",
      },
      { row: 4, column: "instructor", reason: "NEW9 is not your instructor code; instructors may import only their own classes" },
    ]);
    expect(codeCounts(db)).toEqual(before);
    expect(count(db, "classes")).toBe(1);
  });

  it("refuses the same rows in a validation (dry run), so the preview says what the import would", async () => {
    const { db, instructor } = await networkWithManikins();
    const s = await load(db, "classes", `${CLASS_HEADER}\nC-A1-3,2026-07-21,EVILSITE,A1,adult,4,4,EVIL-M1\n`, {
      actor: instructor,
      source: "web",
      dryRun: true,
    });
    expect(s.status).toBe("refused");
    expect(s.issues.map((i) => i.column)).toEqual(["site"]);
  });

  it("keeps valid rows and lists the refused ones with --skip-invalid, still creating no code", async () => {
    const { db, instructor } = await networkWithManikins();
    const before = codeCounts(db);
    const csv = `${CLASS_HEADER}\nC-A1-8,2026-07-21,EVILSITE,A1,adult,4,4,EVIL-M1\nC-A1-9,2026-07-21,NORTH,A1,adult,4,4,MK-1\n`;
    const s = await load(db, "classes", csv, { actor: instructor, source: "web", skipInvalid: true });
    expect(s).toMatchObject({ status: "imported", inserted: 1, rejected: 1 });
    expect(codeCounts(db)).toEqual(before);
  });

  it("refuses a class whose instructor has no site", async () => {
    const { db, people, instructor } = await networkWithManikins();
    db.$client.prepare("UPDATE instructors SET site_id = NULL WHERE id = ?").run(people.instructors.a1.id);
    const s = await load(db, "classes", `${CLASS_HEADER}\nC-A1-2,2026-07-20,NORTH,A1,child,5,4,\n`, { actor: instructor, source: "web" });
    expect(s.issues).toEqual([
      { row: 1, column: "site", reason: "your instructor record has no site; ask the coordinator to set it before importing classes" },
    ]);
  });
});

describe("an instructor's attempts and streams", () => {
  const attempt = (id: string, manikin: string) => `${id},C-A1-1,L-1,${manikin},adult,live,2026-07-14T09:30:00Z,120,230,112,54,85,10,5,80,12,8,90,85,4,`;

  it("refuses an attempt on a manikin the network does not have, and takes one on a registered manikin", async () => {
    const { db, instructor } = await networkWithManikins();
    const refused = await load(db, "attempts", [ATTEMPT_HEADER, attempt("A-1", "MK-1"), attempt("A-2", "EVIL-M1")].join("\n"), {
      actor: instructor,
      source: "web",
    });
    expect(refused.status).toBe("refused");
    expect(refused.issues).toEqual([
      {
        row: 2,
        column: "manikin",
        reason: "manikin EVIL-M1 is not registered in the network; instructors may name only existing manikins (the coordinator adds new ones)",
      },
    ]);
    expect(count(db, "manikins", "asset_id = 'EVIL-M1'")).toBe(0);
    const fine = await load(db, "attempts", [ATTEMPT_HEADER, attempt("A-1", "MK-1"), attempt("A-3", "")].join("\n"), { actor: instructor, source: "web" });
    expect(fine).toMatchObject({ status: "imported", inserted: 2 });
  });

  it("refuses a compression stream on a new manikin", async () => {
    const { db, instructor } = await networkWithManikins();
    const rows = [0, 500, 1000].map((t) => `S-1,C-A1-1,L-2,EVIL-M2,adult,live,2026-07-14T11:00:00Z,,${t},55,0`);
    const s = await load(db, "compressions", [STREAM_HEADER, ...rows].join("\n"), { actor: instructor, source: "web" });
    expect(s.status).toBe("refused");
    expect(s.issues[0]).toMatchObject({ row: 1, column: "manikin" });
    expect(s.issues[0].reason).toMatch(/^manikin EVIL-M2 is not registered/);
    expect(count(db, "manikins", "asset_id = 'EVIL-M2'")).toBe(0);
  });
});

describe("the coordinator's and the command line's imports", () => {
  it("still create the sites, instructors and manikins they name", async () => {
    const { db, people } = await networkWithManikins();
    const coordinator = { userId: people.users.coordinator.id, role: "coordinator" as const, instructorId: null };
    const s = await load(db, "classes", `${CLASS_HEADER}\nC-N-1,2026-07-21,WEST,W1,adult,4,4,MK-9\n`, { actor: coordinator, source: "web" });
    expect(s.newCodes).toEqual({ sites: ["WEST"], instructors: ["W1"], manikins: ["MK-9"] });
    const cli = await load(db, "classes", `${CLASS_HEADER}\nC-N-2,2026-07-22,EASTON,E1,adult,4,4,MK-10\n`);
    expect(cli.newCodes).toEqual({ sites: ["EASTON"], instructors: ["E1"], manikins: ["MK-10"] });
  });
});
