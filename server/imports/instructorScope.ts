// What an instructor's own file may name. A coordinator's file (and the command line, which runs as the
// coordinator) creates the sites, instructors and manikins it names; an instructor's file may only name what
// the network already has, and only their own instructor code, their own site and their own classes, so an
// upload cannot add a site to everyone's filters or file a class under someone else's site.
import type { ClassRow } from "../../shared/import/rows";
import type { CodeRegistry } from "./codes";
import type { ClassInfo, RowProblem } from "./run";

export class InstructorScope {
  private readonly siteId: number | null;
  private readonly siteCode: string | null;

  constructor(
    private readonly codes: CodeRegistry,
    private readonly instructorId: number,
    private readonly classInfo: (classId: string) => ClassInfo | null,
  ) {
    this.siteId = codes.instructorSite(instructorId);
    this.siteCode = this.siteId === null ? null : codes.codeOf("sites", this.siteId);
  }

  /** The first reason this class row is outside the instructor's own scope, or null. */
  classIssue(cls: ClassRow): RowProblem | null {
    if (this.codes.find("instructors", cls.instructorCode) !== this.instructorId) {
      return { column: "instructor", reason: `${cls.instructorCode} is not your instructor code; instructors may import only their own classes` };
    }
    const existing = this.classInfo(cls.id);
    if (existing && existing.instructorId !== this.instructorId) {
      return { column: "class_id", reason: `class ${cls.id} is already recorded for another instructor; instructors may change only their own classes` };
    }
    const siteId = this.codes.find("sites", cls.siteCode);
    if (this.siteId === null) {
      return { column: "site", reason: "your instructor record has no site; ask the coordinator to set it before importing classes" };
    }
    if (siteId === undefined) {
      return { column: "site", reason: `${cls.siteCode} is not a site of the network; instructors may name only their own site (${this.siteCode})` };
    }
    if (siteId !== this.siteId) {
      return { column: "site", reason: `${cls.siteCode} is not your site; instructors may file classes only under their own site (${this.siteCode})` };
    }
    for (const asset of cls.manikins) {
      const issue = this.manikinIssue("manikins", asset);
      if (issue) return issue;
    }
    return null;
  }

  /** A manikin the network does not have yet: only the coordinator adds manikins. */
  manikinIssue(column: string, assetId: string): RowProblem | null {
    if (this.codes.find("manikins", assetId) !== undefined) return null;
    return {
      column,
      reason: `manikin ${assetId} is not registered in the network; instructors may name only existing manikins (the coordinator adds new ones)`,
    };
  }
}
