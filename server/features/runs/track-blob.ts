import { endianness } from 'node:os';
import { promisify } from 'node:util';
import { constants, gunzipSync, gzip } from 'node:zlib';

/**
 * How a stored track's columns are laid out before gzip (`run_tracks.data_layout`, issue 19 session 10):
 *
 * - `columns`: each column's Float64 values (little-endian), one column after another. Every track stored
 *   before session 10, and what a row that names no layout holds (the column's default).
 * - `xor-planes`: the same columns, each value's 64 bits XORed with the previous value's in its column (the
 *   first with 0), then each column cut into 8 byte planes (byte 0 of every value, then byte 1, …, byte 7). Lossless
 *   bit for bit (NaN payloads, −0 included). Neighbouring values share sign, exponent and top mantissa bits, so
 *   the high planes are long runs of zeros: gzip with its run-length strategy (Z_RLE, matches at distance 1 only)
 *   packs the 30 h GPX's 6.9 MB of columns into 2.14 MB in about a quarter of the CPU level 4 took for 2.52 MB
 *   on the plain columns (tests/bench/README.md, "Session 10"). The low planes of positions, distance and
 *   elevation are noise that no setting compresses (about 108 KB each of 108 KB).
 */
export type TrackLayout = 'columns' | 'xor-planes';
export const TRACK_LAYOUT: TrackLayout = 'xor-planes';

/** Plain columns: level 4 (half the CPU of zlib's default 6 for < 1 % more bytes, session 7). */
const GZIP_COLUMNS = { level: 4 } as const;
/** XOR planes: the runs of zeros are the only redundancy, so run-length matching alone is enough (see above). */
const GZIP_XOR_PLANES = { level: 4, strategy: constants.Z_RLE } as const;
const gzipAsync = promisify(gzip);

// Both layouts read a Float64's bytes as they lie in memory; every platform Node runs on here is little-endian.
if (endianness() !== 'LE') throw new Error('stored tracks are little-endian; this machine is not');

/**
 * A run's point series before compression, in `layout` (default: the one new tracks are stored in), 8 bytes ×
 * columns × points, in an ArrayBuffer of its own (so a compute thread can hand it over without a copy).
 */
export function packColumns(
  columns: Record<string, Float64Array>,
  layout: TrackLayout = TRACK_LAYOUT,
): { columns: string[]; pointCount: number; layout: TrackLayout; raw: Uint8Array } {
  const names = Object.keys(columns);
  const pointCount = names.length ? columns[names[0]!]!.length : 0;
  const raw = new Uint8Array(names.length * pointCount * 8);
  names.forEach((name, c) => {
    const column = columns[name]!;
    if (column.length !== pointCount) throw new Error(`column ${name} has ${column.length} values, expected ${pointCount}`);
    const at = c * pointCount * 8;
    if (layout === 'columns') raw.set(new Uint8Array(column.buffer, column.byteOffset, column.byteLength), at);
    else writeXorPlanes(new Uint32Array(column.buffer, column.byteOffset, pointCount * 2), raw, at, pointCount);
  });
  return { columns: names, pointCount, layout, raw };
}

/** One column's values (as 2 × n Uint32: low half, high half) as 8 byte planes of XORed neighbours, at `at` in `out`. */
function writeXorPlanes(words: Uint32Array, out: Uint8Array, at: number, n: number): void {
  let prevLo = 0;
  let prevHi = 0;
  for (let i = 0; i < n; i++) {
    const lo = words[2 * i]!;
    const hi = words[2 * i + 1]!;
    const xLo = lo ^ prevLo;
    const xHi = hi ^ prevHi;
    prevLo = lo;
    prevHi = hi;
    out[at + i] = xLo;
    out[at + n + i] = xLo >>> 8;
    out[at + 2 * n + i] = xLo >>> 16;
    out[at + 3 * n + i] = xLo >>> 24;
    out[at + 4 * n + i] = xHi;
    out[at + 5 * n + i] = xHi >>> 8;
    out[at + 6 * n + i] = xHi >>> 16;
    out[at + 7 * n + i] = xHi >>> 24;
  }
}

/** The inverse of writeXorPlanes: one column's values from its 8 planes at `at` in `raw`. */
function readXorPlanes(raw: Uint8Array, at: number, n: number): Float64Array {
  const column = new Float64Array(n);
  const words = new Uint32Array(column.buffer);
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    lo ^= raw[at + i]! | (raw[at + n + i]! << 8) | (raw[at + 2 * n + i]! << 16) | (raw[at + 3 * n + i]! << 24);
    hi ^= raw[at + 4 * n + i]! | (raw[at + 5 * n + i]! << 8) | (raw[at + 6 * n + i]! << 16) | (raw[at + 7 * n + i]! << 24);
    words[2 * i] = lo;
    words[2 * i + 1] = hi;
  }
  return column;
}

/**
 * Columns of at least this many bytes are gzipped as several pieces at once (below: one piece). Each
 * piece is a gzip member of its own and the members follow each other, which is one gzip file
 * (RFC 1952, 2.2: "A gzip file consists of a series of members"; zlib's gunzip reads them all).
 */
const PIECE_BYTES = 1024 * 1024;
/** libuv's default thread pool (UV_THREADPOOL_SIZE) has 4 threads; more pieces would only queue. */
const MAX_PIECES = 4;

/**
 * The stored blob of packed columns: gzip on libuv's thread pool, never on the event loop. A long
 * track's columns (the 30 h file's 6.9 MB) are cut into up to four pieces gzipped at the same time, so
 * the blob is ready in about half the time on two cores (session 9, tests/bench/README.md) for a few
 * hundred bytes more (each piece starts with an empty window).
 */
export async function gzipPackedColumns(raw: Uint8Array, layout: TrackLayout = TRACK_LAYOUT): Promise<Buffer> {
  const options = layout === 'columns' ? GZIP_COLUMNS : GZIP_XOR_PLANES;
  const pieces = Math.max(1, Math.min(MAX_PIECES, Math.floor(raw.byteLength / PIECE_BYTES)));
  if (pieces === 1) return gzipAsync(raw, options);
  const size = Math.ceil(raw.byteLength / pieces);
  const members: Array<Promise<Buffer>> = [];
  for (let start = 0; start < raw.byteLength; start += size) {
    members.push(gzipAsync(raw.subarray(start, Math.min(raw.byteLength, start + size)), options));
  }
  return Buffer.concat(await Promise.all(members));
}

/**
 * A stored track's columns, by name, from its blob in the layout its row names (`run_tracks.data_layout`, whose
 * default `columns` covers rows stored before it). No default here: a blob read in the wrong layout decodes to
 * other numbers without an error.
 */
export function decodeColumns(
  names: readonly string[],
  pointCount: number,
  data: Buffer,
  layout: TrackLayout,
): Record<string, Float64Array> {
  const raw = gunzipSync(data);
  if (raw.length !== names.length * pointCount * 8) throw new Error('a stored track does not hold the points its row counts');
  const out: Record<string, Float64Array> = {};
  names.forEach((name, c) => {
    if (layout === 'xor-planes') {
      out[name] = readXorPlanes(raw, c * pointCount * 8, pointCount);
      return;
    }
    const copy = new Float64Array(pointCount);
    const bytes = raw.subarray(c * pointCount * 8, (c + 1) * pointCount * 8);
    new Uint8Array(copy.buffer).set(bytes);
    out[name] = copy;
  });
  return out;
}
