// Compression streams: the packed codec, grouping rows in any order (in memory and spilled), and the import
// of streams as attempts with their metrics checked by hand.
import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { importMappingSchema } from "../../../shared/import/mapping";
import Database from "better-sqlite3";
import { analyzeStream } from "../../../shared/scoring/analyzeStream";
import { DEFAULT_POLICY } from "../../../shared/scoring/policy";
import { decodeStream, encodeStream, StreamCodecError, tenthsToMm } from "../../../server/streams/codec";
import { StreamGrouper } from "../../../server/streams/grouper";
import { count, fixture, freshDb, load, STREAM_HEADER } from "./helpers";

describe("stream codec", () => {
  it("round-trips a stream with short steps in 6 bytes a compression", () => {
    const t = [0, 480, 1010, 1530, 4200, 4700];
    const depth = [552, 498, 601, 0, 65535, 510];
    const release = [0, 12, 3, 7, 0, 99];
    const blob = encodeStream(t, depth, release);
    expect(blob.length).toBe(12 + 5 * 2 + 6 * 4);
    const back = decodeStream(blob);
    expect(Array.from(back.tMs)).toEqual(t);
    expect(Array.from(back.depthTenths)).toEqual(depth);
    expect(Array.from(back.releaseTenths)).toEqual(release);
  });

  it("switches to 4-byte steps when a gap exceeds 65.535 s, and keeps large start times", () => {
    const t = [1_000_000, 1_000_500, 1_090_000, 2_147_483_647];
    const blob = encodeStream(t, [500, 500, 500, 500], [0, 0, 0, 0]);
    expect(blob[3] & 1).toBe(1);
    expect(Array.from(decodeStream(blob).tMs)).toEqual(t);
  });

  it("round-trips empty and single-compression streams and a slice of longer arrays", () => {
    expect(decodeStream(encodeStream([], [], [])).tMs.length).toBe(0);
    const one = decodeStream(encodeStream([7], [123], [4]));
    expect([one.tMs[0], one.depthTenths[0], one.releaseTenths[0]]).toEqual([7, 123, 4]);
    const slice = decodeStream(encodeStream(Int32Array.from([5, 10, 20, 30]), Uint16Array.from([1, 2, 3, 4]), Uint16Array.from([0, 0, 1, 1]), 1, 3));
    expect(Array.from(slice.tMs)).toEqual([10, 20]);
    expect(Array.from(slice.depthTenths)).toEqual([2, 3]);
  });

  it("refuses what it could not decode exactly, and data that is not a stream", () => {
    expect(() => encodeStream([0, 0], [1, 1], [0, 0])).toThrow(StreamCodecError);
    expect(() => encodeStream([10, 5], [1, 1], [0, 0])).toThrow(/strictly increase/);
    expect(() => encodeStream([0], [1.5], [0])).toThrow(/tenths/);
    expect(() => encodeStream([-1], [1], [0])).toThrow(StreamCodecError);
    expect(() => decodeStream(Buffer.from("not a stream"))).toThrow(/not a Quarterbeat compression stream/);
    const blob = encodeStream([0, 500], [500, 500], [0, 0]);
    expect(() => decodeStream(blob.subarray(0, blob.length - 1))).toThrow(/should be/);
  });

  it("converts tenths back to millimetres", () => {
    expect(Array.from(tenthsToMm(Uint16Array.from([552, 5])))).toEqual([55.2, 0.5]);
  });
});

describe("stream grouper", () => {
  function collect(grouper: StreamGrouper) {
    const out: Record<number, { rows: number[]; t: number[] }> = {};
    for (const g of grouper.attempts()) out[g.idx] = { rows: Array.from(g.rows), t: Array.from(g.tMs) };
    return out;
  }

  it("gives each attempt its rows in time order, the same whether the buffer spills or not", () => {
    // rows of three attempts, shuffled: (attempt, time)
    const rows: [number, number][] = [];
    for (let a = 0; a < 3; a++) for (let k = 0; k < 7; k++) rows.push([a, k * 500]);
    const shuffled = rows
      .map((r, i) => ({ r, key: (i * 7919) % 21 }))
      .sort((x, y) => x.key - y.key)
      .map((x) => x.r);
    const results = [1 << 20, 4].map((capacity) => {
      const scratch = new Database("");
      const grouper = new StreamGrouper(scratch, capacity);
      shuffled.forEach(([a, t], i) => grouper.add(a, i + 1, t, 500, 0));
      const out = collect(grouper);
      const spills = grouper.spills;
      scratch.close();
      return { out, spills };
    });
    expect(results[0].spills).toBe(0);
    expect(results[1].spills).toBeGreaterThan(3);
    expect(results[1].out).toEqual(results[0].out);
    expect(results[0].out[2].t).toEqual([0, 500, 1000, 1500, 2000, 2500, 3000]);
  });
});

describe("importing compression streams", () => {
  it("analyses each attempt with the scoring core and stores its packed stream", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const s = await load(db, "compressions", "compressions-valid.csv");
    expect(s).toMatchObject({ status: "imported", unit: "attempts", rowsRead: 8, attemptsRead: 2, inserted: 2 });
    const a = db.$client.prepare("SELECT * FROM attempts WHERE id = 'S-001'").get() as Record<string, number | string>;
    // By hand (adult band 50–60 mm, rate 100–120/min, recoil ≤ 5 mm; AHA 2020 / ERC 2021 via DEFAULT_POLICY):
    // depths 55, 55, 55, 45, 65 → 3 on target, 1 shallow, 1 deep → 60 / 20 / 20 %;
    // intervals 500 ms = 120/min, on target (the limit is inclusive) → rate 120, 100 % on target;
    // releases 0, 0, 0, 0, 6 → 4 of 5 full recoil = 80 %; duration 2 s, no pauses → hands-on 100 %.
    // Score = (60 + 100 + 80) / 3 = 80; depth share below 70 % → too_shallow (shallow ≥ deep) → not passed.
    expect(a).toMatchObject({
      source: "stream",
      compressions: 5,
      duration_s: 2,
      rate_cpm: 120,
      depth_mm: 55,
      depth_ok_pct: 60,
      too_shallow_pct: 20,
      too_deep_pct: 20,
      rate_ok_pct: 100,
      recoil_ok_pct: 80,
      hands_on_pct: 100,
      pauses: 0,
      pauses_over10s: 0,
      longest_pause_s: 0,
      score: 80,
      passed: 0,
      error_mask: 1,
      instructor_result: "pass",
    });
    const blob = db.$client.prepare("SELECT data, compressions FROM compression_streams WHERE attempt_id = 'S-001'").get() as {
      data: Buffer;
      compressions: number;
    };
    const stream = decodeStream(blob.data);
    expect(blob.compressions).toBe(5);
    expect(Array.from(stream.tMs)).toEqual([0, 500, 1000, 1500, 2000]);
    expect(Array.from(stream.depthTenths)).toEqual([550, 550, 550, 450, 650]);
    // re-analysing the stored stream gives the stored metrics
    const again = analyzeStream(
      Array.from(stream.tMs, (t, i) => ({ t_ms: t, depth_mm: stream.depthTenths[i] / 10, release_mm: stream.releaseTenths[i] / 10 })),
      DEFAULT_POLICY.bands.adult,
      DEFAULT_POLICY,
    );
    expect(again.depth_ok_pct).toBe(a.depth_ok_pct);
    expect(await load(db, "compressions", "compressions-valid.csv")).toMatchObject({ inserted: 0, updated: 0, unchanged: 2 });
  });

  it("gives the same result for rows in shuffled order and when the rows spill to disk", async () => {
    const lines: string[] = [];
    for (let a = 0; a < 6; a++) {
      for (let k = 0; k < 40; k++) {
        const t = k * 520 + (k > 20 ? 3000 : 0) + ((a * 7) % 13);
        lines.push(
          `Q-${a},C-001,L-${a},MK-1,adult,${a % 2 ? "live" : "hidden"},2026-07-14T10:00:00Z,,${t},${(48 + ((a * 31 + k * 17) % 150) / 10).toFixed(1)},${((k * 13 + a) % 70) / 10}`,
        );
      }
    }
    const shuffled = lines
      .map((line, i) => ({ line, key: (i * 104_729) % lines.length }))
      .sort((x, y) => x.key - y.key)
      .map((x) => x.line);
    const results = [];
    for (const [order, bufferRows] of [
      [lines, undefined],
      [shuffled, undefined],
      [shuffled, 16],
    ] as const) {
      const { db } = await freshDb();
      await load(db, "classes", "classes-valid.csv");
      const s = await load(db, "compressions", `${STREAM_HEADER}\n${order.join("\n")}\n`, { streamBufferRows: bufferRows });
      expect(s).toMatchObject({ status: "imported", inserted: 6 });
      results.push(
        db.$client
          .prepare("SELECT a.*, s.data FROM attempts a JOIN compression_streams s ON s.attempt_id = a.id ORDER BY a.id")
          .all()
          .map((r) => ({ ...(r as object), batch_id: 0 })),
      );
    }
    expect(results[1]).toEqual(results[0]);
    expect(results[2]).toEqual(results[0]);
  });

  it("refuses an attempt whose rows disagree on a shared column, or that has two compressions at one time", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const csv = fs.readFileSync(fixture("compressions-bad.csv"), "utf8").trimEnd();
    const s = await load(db, "compressions", csv);
    expect(s.status).toBe("refused");
    expect(s.issues).toEqual([
      {
        row: 2,
        column: "feedback",
        reason: `"hidden" differs from "live" on row 1, the attempt's first row; every row of attempt D-1 must give the same feedback`,
      },
      { row: 5, column: "t_ms", reason: "t_ms 500 appears on rows 4 and 5 of attempt D-2; each compression needs its own time" },
      { row: 7, column: "t_ms", reason: "0.5 is not a whole number of milliseconds" },
      { row: 7, column: "depth_mm", reason: "101 is outside 0–100 mm" },
    ]);
    expect(s.attemptsRejected).toBe(3);
    expect(s.rejected).toBe(7); // every row of the three refused attempts
    expect(count(db, "attempts")).toBe(0);

    const skipped = await load(
      db,
      "compressions",
      `${csv}\nD-4,C-001,L-4,MK-1,adult,live,2026-07-14T10:00:00Z,,0,55,0\nD-4,C-001,L-4,MK-1,adult,live,2026-07-14T10:00:00Z,,500,55,0`,
      { skipInvalid: true },
    );
    expect(skipped).toMatchObject({ status: "imported", inserted: 1, attemptsRejected: 3, rejected: 7 });
    expect(db.$client.prepare("SELECT id FROM attempts").pluck().all()).toEqual(["D-4"]);
  });

  it("converts seconds and centimetres through a mapping (an invented device's export)", async () => {
    const { db } = await freshDb();
    await load(db, "classes", "classes-valid.csv");
    const mapping = importMappingSchema.parse(JSON.parse(fs.readFileSync(fixture("device-x7.map.json"), "utf8")));
    expect((await load(db, "compressions", "compressions-device-x7.csv", { mapping })).status).toBe("imported");
    const stream = decodeStream(db.$client.prepare("SELECT data FROM compression_streams WHERE attempt_id = 'M-1'").pluck().get() as Buffer);
    expect(Array.from(stream.tMs)).toEqual([0, 520]); // 0.52 s
    expect(Array.from(stream.depthTenths)).toEqual([550, 552]); // 5.5 cm, 5.52 cm
    expect(Array.from(stream.releaseTenths)).toEqual([0, 10]); // 0.1 cm
    expect(db.$client.prepare("SELECT feedback FROM attempts WHERE id = 'M-1'").pluck().get()).toBe("live");
  });
});
