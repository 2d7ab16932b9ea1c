// Site, instructor and manikin codes named in import files, resolved to ids. Codes the network has not seen
// yet are created (named by their code until someone renames them) and listed as new in the summary. In a
// dry run nothing is created: new codes get placeholder ids below zero.
import type Database from "better-sqlite3";

export interface NewCodes {
  sites: string[];
  instructors: string[];
  manikins: string[];
}

type CodeKind = keyof NewCodes;

export class CodeRegistry {
  readonly created: NewCodes = { sites: [], instructors: [], manikins: [] };
  private readonly ids: Record<CodeKind, Map<string, number>>;
  private readonly instructorSites = new Map<number, number | null>();
  private placeholder = -1;
  private readonly insert;

  constructor(
    sqlite: Database.Database,
    private readonly write: boolean,
  ) {
    const load = (sql: string) => new Map((sqlite.prepare(sql).raw().all() as [string, number][]).map(([code, id]) => [code, id]));
    this.ids = {
      sites: load("SELECT code, id FROM sites"),
      instructors: load("SELECT code, id FROM instructors"),
      manikins: load("SELECT asset_id, id FROM manikins"),
    };
    for (const [id, siteId] of sqlite.prepare("SELECT id, site_id FROM instructors").raw().all() as [number, number | null][]) {
      this.instructorSites.set(id, siteId);
    }
    this.insert = {
      sites: sqlite.prepare("INSERT INTO sites (code, name) VALUES (?, ?) RETURNING id"),
      instructors: sqlite.prepare("INSERT INTO instructors (code, name, site_id) VALUES (?, ?, ?) RETURNING id"),
      manikins: sqlite.prepare("INSERT INTO manikins (asset_id, site_id) VALUES (?, ?) RETURNING id"),
    };
  }

  /** The id of a code; undefined when it does not exist (yet). */
  find(kind: CodeKind, code: string): number | undefined {
    return this.ids[kind].get(code);
  }

  /** The code of an id; null when there is none. */
  codeOf(kind: CodeKind, id: number): string | null {
    for (const [code, known] of this.ids[kind]) if (known === id) return code;
    return null;
  }

  isNew(kind: CodeKind, code: string): boolean {
    return this.created[kind].includes(code);
  }

  site(code: string): number {
    return this.ids.sites.get(code) ?? this.create("sites", code, () => this.insert.sites.pluck().get(code, code) as number);
  }

  /** A new instructor belongs to the site of the class that first names them. */
  instructor(code: string, siteId: number | null): number {
    return (
      this.ids.instructors.get(code) ??
      this.create("instructors", code, () => this.insert.instructors.pluck().get(code, code, siteId !== null && siteId > 0 ? siteId : null) as number)
    );
  }

  manikin(assetId: string, siteId: number | null = null): number {
    return (
      this.ids.manikins.get(assetId) ??
      this.create("manikins", assetId, () => this.insert.manikins.pluck().get(assetId, siteId !== null && siteId > 0 ? siteId : null) as number)
    );
  }

  instructorSite(instructorId: number): number | null {
    return this.instructorSites.get(instructorId) ?? null;
  }

  private create(kind: CodeKind, code: string, insert: () => number): number {
    const id = this.write ? insert() : this.placeholder--;
    this.ids[kind].set(code, id);
    this.created[kind].push(code);
    return id;
  }
}
