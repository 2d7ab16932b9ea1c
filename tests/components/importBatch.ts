// One import batch as the history API answers it, for the imports page's tests.
import type { ImportBatch } from "../../shared/import/api";

export const appliedBatch: ImportBatch = {
  id: 3,
  kind: "attempts",
  fileName: "wrenmoor-q3.csv",
  sha256: "0".repeat(64),
  source: "web",
  status: "applied",
  userId: 7,
  userEmail: "robin@example.org",
  rowsRead: 12,
  inserted: 12,
  updated: 0,
  unchanged: 0,
  rejected: 0,
  newCodes: null,
  warnings: null,
  createdAt: "2026-10-01T09:00:00.000Z",
  undoneAt: null,
};
