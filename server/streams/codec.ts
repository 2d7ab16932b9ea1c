// Packs one attempt's compression stream into a small BLOB (docs/decisions/002-stream-storage.md).
//
// Layout, little-endian:
//   0  2 bytes  magic "QS"
//   2  u8       format version (1)
//   3  u8       flags: bit 0 set = time steps stored as u32, clear = as u16
//   4  u32      n, number of compressions
//   8  u32      t of the first compression, ms since the attempt started
//   12 (n-1) time steps in ms (u16 or u32), each > 0 — times strictly increase
//   …  n × u16  peak depth, tenths of a millimetre
//   …  n × u16  release depth, tenths of a millimetre
// So a typical compression costs 6 bytes; a stream with a step over 65.535 s costs 8.

export const STREAM_FORMAT_VERSION = 1;
const MAGIC_0 = 0x51; // Q
const MAGIC_1 = 0x53; // S
const HEADER_BYTES = 12;
const WIDE_TIMES = 1;
/** Largest depth storable in tenths of a millimetre in a u16: 6553.5 mm, far beyond any manikin. */
export const MAX_TENTHS = 0xffff;

export interface DecodedStream {
  /** Times in ms since the attempt started, strictly increasing. */
  tMs: Int32Array;
  depthTenths: Uint16Array;
  releaseTenths: Uint16Array;
}

export class StreamCodecError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "StreamCodecError";
  }
}

/**
 * Encodes entries from..to-1 of arrays sorted by time (times whole ms, 0 ≤ t < 2^31; depths whole tenths of
 * a millimetre, 0–65535). Throws StreamCodecError for anything it could not decode back exactly.
 */
export function encodeStream(tMs: ArrayLike<number>, depthTenths: ArrayLike<number>, releaseTenths: ArrayLike<number>, from = 0, to = tMs.length): Buffer {
  const n = to - from;
  let wide = false;
  for (let i = from; i < to; i++) {
    const t = tMs[i];
    if (!Number.isInteger(t) || t < 0 || t > 0x7fffffff)
      throw new StreamCodecError(`time ${t} ms at entry ${i - from} is not a whole number of ms from 0 to 2^31-1`);
    if (i > from) {
      const step = t - tMs[i - 1];
      if (step <= 0) throw new StreamCodecError(`times must strictly increase; entry ${i - from} (${t} ms) follows ${tMs[i - 1]} ms`);
      if (step > 0xffff) wide = true;
    }
    checkTenths(depthTenths[i], "depth", i - from);
    checkTenths(releaseTenths[i], "release", i - from);
  }
  const stepBytes = wide ? 4 : 2;
  const size = HEADER_BYTES + Math.max(0, n - 1) * stepBytes + n * 4;
  const buffer = Buffer.allocUnsafe(size);
  const view = new DataView(buffer.buffer, buffer.byteOffset, buffer.byteLength);
  buffer[0] = MAGIC_0;
  buffer[1] = MAGIC_1;
  buffer[2] = STREAM_FORMAT_VERSION;
  buffer[3] = wide ? WIDE_TIMES : 0;
  view.setUint32(4, n, true);
  view.setUint32(8, n > 0 ? tMs[from] : 0, true);
  let offset = HEADER_BYTES;
  for (let i = from + 1; i < to; i++) {
    const step = tMs[i] - tMs[i - 1];
    if (wide) view.setUint32(offset, step, true);
    else view.setUint16(offset, step, true);
    offset += stepBytes;
  }
  for (let i = from; i < to; i++, offset += 2) view.setUint16(offset, depthTenths[i], true);
  for (let i = from; i < to; i++, offset += 2) view.setUint16(offset, releaseTenths[i], true);
  return buffer;
}

function checkTenths(value: number, what: string, entry: number) {
  if (!Number.isInteger(value) || value < 0 || value > MAX_TENTHS) {
    throw new StreamCodecError(`${what} ${value} at entry ${entry} is not a whole number of tenths of a mm from 0 to ${MAX_TENTHS}`);
  }
}

export function decodeStream(blob: Uint8Array): DecodedStream {
  if (blob.length < HEADER_BYTES || blob[0] !== MAGIC_0 || blob[1] !== MAGIC_1) throw new StreamCodecError("not a Quarterbeat compression stream");
  if (blob[2] !== STREAM_FORMAT_VERSION) throw new StreamCodecError(`stream format version ${blob[2]} is not known to this version of Quarterbeat`);
  const view = new DataView(blob.buffer, blob.byteOffset, blob.byteLength);
  const wide = (blob[3] & WIDE_TIMES) !== 0;
  const n = view.getUint32(4, true);
  const stepBytes = wide ? 4 : 2;
  const expected = HEADER_BYTES + Math.max(0, n - 1) * stepBytes + n * 4;
  if (blob.length !== expected) throw new StreamCodecError(`stream of ${n} compressions should be ${expected} bytes, is ${blob.length}`);
  const tMs = new Int32Array(n);
  const depthTenths = new Uint16Array(n);
  const releaseTenths = new Uint16Array(n);
  let offset = HEADER_BYTES;
  if (n > 0) tMs[0] = view.getUint32(8, true);
  for (let i = 1; i < n; i++, offset += stepBytes) {
    tMs[i] = tMs[i - 1] + (wide ? view.getUint32(offset, true) : view.getUint16(offset, true));
  }
  for (let i = 0; i < n; i++, offset += 2) depthTenths[i] = view.getUint16(offset, true);
  for (let i = 0; i < n; i++, offset += 2) releaseTenths[i] = view.getUint16(offset, true);
  return { tMs, depthTenths, releaseTenths };
}

/** Depths in millimetres for the analysis core. */
export function tenthsToMm(tenths: Uint16Array): Float64Array {
  const mm = new Float64Array(tenths.length);
  for (let i = 0; i < tenths.length; i++) mm[i] = tenths[i] / 10;
  return mm;
}
