// Web import API (docs/import-formats.md, "Web API"): upload → preview with a suggested mapping → validate
// (a dry-run job the page polls) → import (a job) → summary; history, undo and mapping presets.
import fs from "node:fs";
import path from "node:path";
import { Router, type Request, type RequestHandler } from "express";
import multer from "multer";
import { importColumns } from "../../shared/import/columns";
import { can } from "../../shared/permissions";
import {
  batchListQuerySchema,
  newPresetSchema,
  presetListQuerySchema,
  runRequestSchema,
  uploadFormSchema,
  type ImportSummary,
  type Preview,
  type RunRequest,
} from "../../shared/import/api";
import { resolveHeader } from "../../shared/import/header";
import { identityMapping, type ImportMapping } from "../../shared/import/mapping";
import { suggestMapping } from "../../shared/import/suggest";
import type { Db } from "../db/client";
import { allow, signedInUser } from "../auth/guard";
import { AppError, badRequest } from "../errors";
import { parseId, parseWith } from "../http/validate";
import type { Logger } from "../logging/logger";
import { getBatch, listBatches, rejectedRows, rejectedRowsCsv } from "./history";
import { ImportJobs } from "./jobs";
import { ImportRecords } from "./records";
import { createPreset, deletePreset, getPreset, listPresets } from "./presets";
import { safeFileName } from "./service";
import { undoBatch } from "./undo";
import { readHead, UploadStore, type StoredUpload } from "./uploads";
import type { CurrentUser } from "../../shared/schemas/auth";

export const MAX_UPLOAD_BYTES = 50 * 1024 * 1024;
const CSV_TYPES = new Set(["text/csv", "application/csv", "text/plain", "application/vnd.ms-excel", "text/comma-separated-values"]);

export interface ImportRouteOptions {
  /** The upload folder to use as it is; by default a new one of this process in the temp folder. */
  uploadDir?: string;
  maxUploadBytes?: number;
  logger?: Logger;
  /** Called after each web import that wrote a batch (the alert digest). */
  afterImport?: (summary: ImportSummary) => void;
}

export function importRoutes(db: Db, options: ImportRouteOptions = {}): Router {
  const router = Router();
  const records = new ImportRecords(db, options.logger);
  // what a stopped server left unfinished is ended before this one makes anything of its own
  records.endStoppedServerWork();
  const uploads = new UploadStore(records, options.uploadDir);
  const jobs = new ImportJobs(db.$client.name, records, options.logger, options.afterImport);
  const upload = multer({
    storage: multer.diskStorage({
      destination: uploads.dir,
      // never the client's name: a random one inside the private folder
      filename: (_req, _file, cb) => cb(null, path.basename(uploads.newPath())),
    }),
    limits: { fileSize: options.maxUploadBytes ?? MAX_UPLOAD_BYTES, files: 1, fields: 5 },
    fileFilter: (_req, file, cb) => {
      const extension = path.extname(file.originalname).toLowerCase();
      if (extension !== ".csv" || !CSV_TYPES.has(file.mimetype.toLowerCase())) {
        cb(new AppError("unsupported_file", 415, `Only CSV files (.csv, text/csv) can be imported; got ${extension || "no extension"} (${file.mimetype}).`));
        return;
      }
      cb(null, true);
    },
  });

  router.use("/imports", allow("importData"));

  // multer's own "File too large" names no limit: say what the limit is and what to do instead
  const maxMb = Math.round((options.maxUploadBytes ?? MAX_UPLOAD_BYTES) / 1024 / 1024);
  const receiveFile: RequestHandler = (req, res, next) =>
    upload.single("file")(req, res, (err?: unknown) => {
      if (!err || err instanceof AppError) return next(err);
      if (err instanceof multer.MulterError && err.code === "LIMIT_FILE_SIZE") {
        return next(
          new AppError(
            "too_large",
            413,
            `The file is larger than ${maxMb} MB, the most a web upload may be. Split it into smaller files, or import it with the command line (quarterbeat import).`,
          ),
        );
      }
      // a form the client got wrong (extra files or fields, cut off, no boundary) is a 400, not a server fault
      if (err instanceof multer.MulterError)
        return next(badRequest(`The upload form was not as expected (${err.message.toLowerCase()}): send one CSV file in the field named file, and the kind.`));
      if (err instanceof Error && !("syscall" in err))
        return next(badRequest("The upload could not be read: the form was cut off or is not a multipart form. Try again."));
      next(err);
    });

  router.get("/imports/formats", (_req, res) => {
    const formats = Object.fromEntries(
      Object.entries(importColumns).map(([kind, columns]) => [
        kind,
        columns.map((c) => ({ name: c.name, required: c.required, description: c.description, unit: c.unit ?? null })),
      ]),
    );
    res.json({ formats });
  });

  router.post("/imports/uploads", receiveFile, async (req, res) => {
    const user = signedInUser(req);
    const file = req.file;
    if (!file) throw badRequest("Attach the CSV file in the form field named file.");
    const form = uploadFormSchema.safeParse(req.body);
    if (!form.success) {
      fs.rmSync(file.path, { force: true });
      throw new AppError("invalid", 422, "Say what the file holds.", [{ path: "kind", message: "Choose classes, attempts, compressions or equipment" }]);
    }
    if (form.data.kind === "equipment" && !can(user, "importEquipment")) {
      fs.rmSync(file.path, { force: true });
      throw new AppError("forbidden", 403, "Equipment logs are imported by coordinators only.");
    }
    const stored = uploads.add({ path: file.path, fileName: safeFileName(file.originalname), size: file.size }, form.data.kind, user.id);
    res.status(201).json({ upload: publicUpload(stored), preview: await preview(stored, undefined) });
  });

  router.get("/imports/uploads/:id", (req, res) => {
    res.json({ upload: publicUpload(uploads.get(String(req.params.id), signedInUser(req))) });
  });

  router.post("/imports/uploads/:id/preview", async (req, res) => {
    const stored = uploads.get(String(req.params.id), signedInUser(req));
    const body = parseWith(runRequestSchema, req.body ?? {}, "The preview request");
    res.json({ preview: await preview(stored, mappingFor(body, stored)) });
  });

  const startJob = (mode: "validate" | "import") => (req: Request, res: import("express").Response) => {
    const user = signedInUser(req);
    const stored = uploads.get(String(req.params.id), user);
    const body = parseWith(runRequestSchema, req.body ?? {}, "The request");
    const job = jobs.start(stored, mode, mappingFor(body, stored) ?? identityMapping, body.skipInvalid ?? false, actorOf(user));
    res.status(202).json({ job });
  };
  router.post("/imports/uploads/:id/validate", startJob("validate"));
  router.post("/imports/uploads/:id/import", startJob("import"));

  router.get("/imports/jobs/:id", (req, res) => {
    res.json({ job: jobs.get(String(req.params.id), signedInUser(req)) });
  });

  router.get("/imports/jobs/:id/rejected.csv", (req, res) => {
    const file = jobs.rejectedCsv(String(req.params.id), signedInUser(req));
    res.attachment("refused-rows.csv").type("text/csv; charset=utf-8");
    fs.createReadStream(file).pipe(res);
  });

  router.get("/imports/batches", (req, res) => {
    const user = signedInUser(req);
    const query = parseWith(batchListQuerySchema, req.query, "The query");
    res.json(listBatches(db, { ...query, userId: ownBatchesOnly(user) }));
  });

  router.get("/imports/batches/:id", (req, res) => {
    const user = signedInUser(req);
    const batch = getBatch(db, parseId(req.params.id), ownBatchesOnly(user));
    const rejected = rejectedRows(db, batch.id);
    res.json({ batch, rejectedRows: rejected.rows, rejectedTotal: rejected.total });
  });

  router.get("/imports/batches/:id/rejected.csv", (req, res) => {
    const user = signedInUser(req);
    const batch = getBatch(db, parseId(req.params.id), ownBatchesOnly(user));
    res.attachment(`batch-${batch.id}-refused-rows.csv`).type("text/csv; charset=utf-8");
    for (const line of rejectedRowsCsv(db, batch.id)) res.write(line);
    res.end();
  });

  router.post("/imports/batches/:id/undo", allow("undoImport"), (req, res) => {
    const user = signedInUser(req);
    const id = parseId(req.params.id);
    const result = undoBatch(db, id, user.id);
    res.json({ batch: getBatch(db, id, null), deleted: result.deleted, restored: result.restored });
  });

  router.get("/imports/presets", (req, res) => {
    const query = parseWith(presetListQuerySchema, req.query, "The query");
    res.json({ presets: listPresets(db, query.kind) });
  });

  router.post("/imports/presets", (req, res) => {
    const input = parseWith(newPresetSchema, req.body, "The preset");
    res.status(201).json({ preset: createPreset(db, input, signedInUser(req).id) });
  });

  router.delete("/imports/presets/:id", (req, res) => {
    deletePreset(db, parseId(req.params.id), signedInUser(req));
    res.status(204).end();
  });

  function mappingFor(body: RunRequest, stored: StoredUpload): ImportMapping | undefined {
    if (body.mapping && body.presetId) throw badRequest("Give a mapping or a preset, not both.");
    if (body.presetId) {
      const preset = getPreset(db, body.presetId);
      if (preset.kind !== stored.kind) throw badRequest(`Preset ${preset.name} is for ${preset.kind} files; this upload holds ${stored.kind}.`);
      return preset.mapping;
    }
    return body.mapping;
  }

  return router;
}

function actorOf(user: CurrentUser) {
  return { userId: user.id, role: user.role, instructorId: user.instructorId ?? null };
}

/** Importers with "any" reach see every batch; the others only their own. */
function ownBatchesOnly(user: CurrentUser): number | null {
  return can(user, "importData", "any") ? null : user.id;
}

function publicUpload(stored: StoredUpload) {
  const { path: _path, userId: _user, ...rest } = stored;
  return rest;
}

/** Header, first rows and how each Quarterbeat column is found, under the given or the suggested mapping. */
async function preview(stored: StoredUpload, mapping: ImportMapping | undefined): Promise<Preview> {
  const head = await readHead(stored.path);
  const suggestion = suggestMapping(stored.kind, head.header, head.rows);
  const used = mapping ?? suggestion.mapping;
  const resolved = resolveHeader(head.header, stored.kind, used);
  return {
    delimiter: head.delimiter,
    header: head.header,
    rows: head.rows,
    columns: importColumns[stored.kind].map((c) => ({
      column: c.name,
      required: c.required,
      description: c.description,
      source: resolved.index[c.name] >= 0 ? head.header[resolved.index[c.name]].trim() : null,
    })),
    extra: resolved.extra,
    problems: resolved.problems,
    suggestedMapping: suggestion.mapping,
  };
}
