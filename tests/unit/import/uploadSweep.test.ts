// Uploads are forgotten after six hours, and with them every file of refused rows their jobs wrote.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it, vi } from "vitest";
import { ImportRecords } from "../../../server/imports/records";
import { rejectedRowsPath, UploadStore } from "../../../server/imports/uploads";
import { makeTestDb } from "../../helpers/testApp";

const HOUR_MS = 60 * 60 * 1000;
let dir: string | undefined;

afterEach(() => {
  vi.useRealTimers();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe("upload store sweep", () => {
  it("removes an expired upload with the refused-row files of each of its jobs, and nothing newer", () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), "qb-upload-store-"));
    const db = makeTestDb();
    const store = new UploadStore(new ImportRecords(db), dir);
    vi.useFakeTimers({ toFake: ["Date"], now: new Date("2026-10-02T09:00:00Z") });

    const oldPath = store.newPath();
    fs.writeFileSync(oldPath, "class_id\n");
    const first = store.add({ path: oldPath, fileName: "classes.csv", size: 9 }, "classes", 1);
    const oldRejected = [rejectedRowsPath(oldPath, "job-a"), rejectedRowsPath(oldPath, "job-b")];
    for (const file of oldRejected) fs.writeFileSync(file, "row,reason\n");

    vi.setSystemTime(new Date("2026-10-02T09:00:00Z").getTime() + 6 * HOUR_MS + 1);
    const newPath = store.newPath();
    fs.writeFileSync(newPath, "class_id\n");
    fs.writeFileSync(rejectedRowsPath(newPath, "job-c"), "row,reason\n");
    const upload = store.add({ path: newPath, fileName: "classes.csv", size: 9 }, "classes", 1);

    for (const gone of [oldPath, ...oldRejected]) expect(fs.existsSync(gone), gone).toBe(false);
    expect(fs.readdirSync(dir).sort()).toEqual([path.basename(newPath), path.basename(rejectedRowsPath(newPath, "job-c"))].sort());
    expect(store.get(upload.id, { id: 1, role: "coordinator" }).path).toBe(newPath);
    // the removed upload's id says why it is gone, to its owner; to others it does not exist
    const ownerAsks = () => store.get(first.id, { id: 1, role: "instructor" });
    expect(ownerAsks).toThrow(expect.objectContaining({ status: 410, message: expect.stringContaining("kept for 6 hours") }));
    expect(() => store.get(first.id, { id: 2, role: "instructor" })).toThrow(expect.objectContaining({ status: 404 }));
    db.$client.close();
  });
});
