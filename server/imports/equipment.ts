// Equipment logs: dated events per manikin. Events have no id of their own, so each is keyed by a hash of
// its values (eventKey): a re-import of the same file is unchanged, a repeated row in one file is refused.
// `commissioned` sets the manikin's patient type, site and in-service date; `retired` its retirement date.
import { createHash } from "node:crypto";
import type { RowReader } from "../../shared/import/rows";
import type { KindImporter } from "./kind";
import type { ImportRun } from "./run";

export function equipmentEventKey(values: readonly (string | number | null)[]): string {
  return createHash("sha256").update(JSON.stringify(values)).digest("hex").slice(0, 32);
}

export function equipmentImporter(run: ImportRun, reader: RowReader): KindImporter {
  const sqlite = run.sqlite;
  const insert = sqlite.prepare(
    "INSERT INTO equipment_events (event_key, date, manikin_id, site_id, event, quantity, note, batch_id) VALUES (?, ?, ?, ?, ?, ?, ?, ?) ON CONFLICT(event_key) DO NOTHING",
  );
  const existingBatch = sqlite.prepare("SELECT batch_id FROM equipment_events WHERE event_key = ?").pluck();
  const manikinRow = sqlite.prepare("SELECT id, asset_id, patient_type, site_id, in_service_since, retired_on, created_at FROM manikins WHERE id = ?");
  const updateManikin = sqlite.prepare("UPDATE manikins SET patient_type = ?, site_id = ?, in_service_since = ?, retired_on = ? WHERE id = ?");
  const firstRowOf = new Map<string, number>();

  /** Applies what an event says about its manikin; the previous values go to batch_changes. */
  function applyToManikin(manikinId: number, change: { patientType?: string | null; siteId?: number | null; inServiceSince?: string; retiredOn?: string }) {
    const current = manikinRow.get(manikinId) as
      { id: number; patient_type: string | null; site_id: number | null; in_service_since: string | null; retired_on: string | null } | undefined;
    if (!current) return;
    const next = {
      patient_type: change.patientType !== undefined ? change.patientType : current.patient_type,
      site_id: change.siteId !== undefined && change.siteId !== null ? change.siteId : current.site_id,
      in_service_since: change.inServiceSince ?? current.in_service_since,
      retired_on: change.retiredOn ?? current.retired_on,
    };
    if (
      next.patient_type === current.patient_type &&
      next.site_id === current.site_id &&
      next.in_service_since === current.in_service_since &&
      next.retired_on === current.retired_on
    ) {
      return;
    }
    if (!run.codes.isNew("manikins", String((current as { asset_id?: string }).asset_id))) {
      run.recordChange("manikins", String(manikinId), current);
    }
    updateManikin.run(next.patient_type, next.site_id, next.in_service_since, next.retired_on, manikinId);
  }

  return {
    unit: "rows",
    row(fields, row) {
      const issues = reader.issues;
      issues.length = 0;
      const e = reader.at(fields, row).equipmentRow();
      if (!e) return run.rejectRow(fields, issues);
      const key = equipmentEventKey([e.date, e.manikin, e.siteCode, e.event, e.quantity, e.patientType, e.note]);
      // Equipment logs are small: remembering each event's first row in memory is fine.
      const first = firstRowOf.get(key);
      if (first !== undefined) {
        reader.fail(null, `the same event as row ${first}; give one row with a quantity instead of repeating it`);
        return run.rejectRow(fields, issues);
      }
      firstRowOf.set(key, row);
      const siteId = e.siteCode === null ? null : run.codes.site(e.siteCode);
      const manikinId = run.codes.manikin(e.manikin, siteId);
      if (!run.write) {
        run.count(existingBatch.get(key) === undefined ? "inserted" : "unchanged");
        return;
      }
      if (insert.run(key, e.date, manikinId, siteId, e.event, e.quantity, e.note, run.batchId).changes === 0) {
        run.count("unchanged");
        return;
      }
      run.count("inserted");
      if (e.event === "commissioned") applyToManikin(manikinId, { patientType: e.patientType, siteId, inServiceSince: e.date });
      else if (e.event === "retired") applyToManikin(manikinId, { retiredOn: e.date });
    },
    finish() {},
  };
}
