// Uploaded files waiting for preview, validation and import. Stored under random names in a private temp
// folder (the original name is only ever shown, never used as a path) and removed after a few hours. Each
// upload is also recorded in SQLite (records.ts): after a restart, or once removed, its id answers 410 with
// the reason instead of 404. The folders that stopped servers left behind are removed when a new store
// starts (uploadSweep.ts); the files of this database's stopped server also by its records.
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { parse } from "csv-parse";
import { delimiterChars, detectDelimiter, headerLine, type Delimiter } from "../../shared/import/delimiter";
import type { ImportKind, UserRole } from "../../shared/domain";
import type { Upload } from "../../shared/import/api";
import { apiErrorCodes } from "../../shared/errorCodes";
import { AppError, notFound } from "../errors";
import { mayUseImport, uploadEndedMessage, type ImportRecords } from "./records";
import { sweepOrphanedUploadFolders, uploadFolderPrefix } from "./uploadSweep";

export interface StoredUpload extends Upload {
  path: string;
  userId: number;
}

const KEEP_MS = 6 * 60 * 60 * 1000;
const REJECTED_SUFFIX = ".rejected.csv";

/** Where a job writes the refused rows of an upload: beside it, so the upload's sweep removes them too. */
export function rejectedRowsPath(uploadPath: string, jobId: string): string {
  return `${uploadPath}.${jobId}${REJECTED_SUFFIX}`;
}

export class UploadStore {
  readonly dir: string;
  private readonly uploads = new Map<string, StoredUpload>();

  /** `dir`: a folder to use as it is; otherwise a new one of this process under `root`, after sweeping. */
  constructor(
    private readonly records: ImportRecords,
    dir?: string,
    root = os.tmpdir(),
  ) {
    if (dir === undefined) {
      sweepOrphanedUploadFolders(root);
      this.dir = fs.mkdtempSync(uploadFolderPrefix(root));
    } else {
      this.dir = dir;
    }
    fs.mkdirSync(this.dir, { recursive: true, mode: 0o700 });
  }

  /** A fresh random path inside the upload folder. */
  newPath(): string {
    return path.join(this.dir, `${crypto.randomBytes(16).toString("hex")}.csv`);
  }

  add(file: { path: string; fileName: string; size: number }, kind: ImportKind, userId: number): StoredUpload {
    this.sweep();
    const upload: StoredUpload = {
      id: crypto.randomBytes(12).toString("hex"),
      fileName: file.fileName,
      kind,
      size: file.size,
      uploadedAt: new Date().toISOString(),
      path: file.path,
      userId,
    };
    this.uploads.set(upload.id, upload);
    this.records.saveUpload({ ...upload, endedAt: null, endReason: null });
    return upload;
  }

  /** The upload, if it exists and this user may use it (mayUseImport); 410 once its file is removed. */
  get(id: string, user: { id: number; role: UserRole }): StoredUpload {
    const upload = this.uploads.get(id);
    if (upload && mayUseImport(upload.userId, user)) return upload;
    // not live here: removed after its time, or left by a stopped server (its file is gone)
    const record = upload ? null : this.records.findUpload(id);
    if (record && mayUseImport(record.userId, user)) throw new AppError(apiErrorCodes.uploadGone, 410, uploadEndedMessage(record.endReason));
    throw notFound("The upload");
  }

  private sweep() {
    const cutoff = Date.now() - KEEP_MS;
    const expired = [...this.uploads.values()].filter((upload) => Date.parse(upload.uploadedAt) < cutoff);
    if (expired.length === 0) return;
    const files = fs.readdirSync(this.dir);
    for (const upload of expired) {
      fs.rmSync(upload.path, { force: true });
      // every job's refused rows of this upload (rejectedRowsPath)
      const start = `${path.basename(upload.path)}.`;
      for (const name of files) if (name.startsWith(start) && name.endsWith(REJECTED_SUFFIX)) fs.rmSync(path.join(this.dir, name), { force: true });
      this.uploads.delete(upload.id);
      this.records.saveUpload({ ...upload, endedAt: new Date().toISOString(), endReason: "expired" });
    }
  }
}

/** The header and the first rows of a CSV file, read without loading the rest, with the separator they use. */
export async function readHead(file: string, rows = 20): Promise<{ header: string[]; rows: string[][]; delimiter: Delimiter | null }> {
  const line = headerLine(await readStart(file));
  const delimiter = line ? detectDelimiter(line.line) : null;
  const parser = fs.createReadStream(file, { highWaterMark: 64 * 1024 }).pipe(
    parse({
      bom: true,
      delimiter: delimiterChars[delimiter ?? "comma"],
      relax_column_count: true,
      skip_empty_lines: true,
      to_line: rows + 1 + 50,
      relax_quotes: true,
    }),
  );
  const records: string[][] = [];
  try {
    for await (const record of parser) {
      records.push(record as string[]);
      if (records.length > rows) break;
    }
  } catch {
    // A file that is not CSV shows what could be read; validation reports the problem with its row.
  }
  return { header: records[0] ?? [], rows: records.slice(1, rows + 1), delimiter };
}

/** The file's first 64 KiB as text: enough for any header line. */
async function readStart(file: string): Promise<string> {
  const handle = await fs.promises.open(file, "r");
  try {
    const buffer = Buffer.alloc(64 * 1024);
    const { bytesRead } = await handle.read(buffer, 0, buffer.length, 0);
    return buffer.subarray(0, bytesRead).toString("utf8");
  } finally {
    await handle.close();
  }
}
