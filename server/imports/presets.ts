// Saved column mappings ("presets") for the upload page: the same JSON the CLI reads with --map.
import type { ImportKind, UserRole } from "../../shared/domain";
import type { ImportPreset } from "../../shared/import/api";
import { importMappingSchema, unknownMappingColumns, type ImportMapping } from "../../shared/import/mapping";
import { can } from "../../shared/permissions";
import type { Db } from "../db/client";
import { AppError, conflict, forbidden, notFound } from "../errors";

interface PresetRow {
  id: number;
  name: string;
  kind: ImportKind;
  mapping: string;
  created_by: number | null;
  created_at: string;
}

function toPreset(row: PresetRow): ImportPreset {
  return {
    id: row.id,
    name: row.name,
    kind: row.kind,
    mapping: importMappingSchema.parse(JSON.parse(row.mapping)),
    createdBy: row.created_by,
    createdAt: row.created_at,
  };
}

export function listPresets(db: Db, kind?: ImportKind): ImportPreset[] {
  const rows = (
    kind
      ? db.$client.prepare("SELECT * FROM import_presets WHERE kind = ? ORDER BY name").all(kind)
      : db.$client.prepare("SELECT * FROM import_presets ORDER BY kind, name").all()
  ) as PresetRow[];
  return rows.map(toPreset);
}

export function getPreset(db: Db, id: number): ImportPreset {
  const row = db.$client.prepare("SELECT * FROM import_presets WHERE id = ?").get(id) as PresetRow | undefined;
  if (!row) throw notFound(`Mapping preset ${id}`);
  return toPreset(row);
}

export function createPreset(db: Db, input: { name: string; kind: ImportKind; mapping: ImportMapping }, userId: number | null): ImportPreset {
  const unknown = unknownMappingColumns(input.kind, input.mapping);
  if (unknown.length > 0) {
    throw new AppError(
      "invalid",
      422,
      "The mapping is not valid.",
      unknown.map((name) => ({ path: "mapping", message: `${name} is not a column of ${input.kind} files` })),
    );
  }
  if (db.$client.prepare("SELECT 1 FROM import_presets WHERE name = ?").get(input.name)) {
    throw conflict(`A preset named ${input.name} already exists.`, [{ path: "name", message: "Already in use" }]);
  }
  const id = db.$client
    .prepare("INSERT INTO import_presets (name, kind, mapping, created_by) VALUES (?, ?, ?, ?) RETURNING id")
    .pluck()
    .get(input.name, input.kind, JSON.stringify(input.mapping), userId) as number;
  return getPreset(db, id);
}

/** Importers with "any" reach delete any preset; others only their own. */
export function deletePreset(db: Db, id: number, user: { id: number; role: UserRole }) {
  const preset = getPreset(db, id);
  if (!can(user, "importData", "any") && preset.createdBy !== user.id) throw forbidden("Only the preset's author or a coordinator can delete it.");
  db.$client.prepare("DELETE FROM import_presets WHERE id = ?").run(id);
}
