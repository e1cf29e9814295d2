import { promisify } from 'node:util';
import { gunzipSync, gzip } from 'node:zlib';

/**
 * Level 4, not zlib's default 6: on the 30 h bench files (6.9 MB of columns) it takes half the CPU
 * (~70 against ~150 ms) for 0.6–0.9 % more bytes (2.52 against 2.51 MB, GPX); any level reads back alike.
 */
const GZIP_OPTIONS = { level: 4 } as const;
const gzipAsync = promisify(gzip);

/**
 * A run's point series before compression: each column a Float64Array (NaN = unknown), concatenated in
 * the order of `columns`, 8 bytes × columns × points, in an ArrayBuffer of its own (so a compute thread
 * can hand it over without a copy).
 */
export function packColumns(columns: Record<string, Float64Array>): { columns: string[]; pointCount: number; raw: Uint8Array } {
  const names = Object.keys(columns);
  const pointCount = names.length ? columns[names[0]!]!.length : 0;
  const raw = new Uint8Array(names.length * pointCount * 8);
  names.forEach((name, c) => {
    const column = columns[name]!;
    if (column.length !== pointCount) throw new Error(`column ${name} has ${column.length} values, expected ${pointCount}`);
    raw.set(new Uint8Array(column.buffer, column.byteOffset, column.byteLength), c * pointCount * 8);
  });
  return { columns: names, pointCount, raw };
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
export async function gzipPackedColumns(raw: Uint8Array): Promise<Buffer> {
  const pieces = Math.max(1, Math.min(MAX_PIECES, Math.floor(raw.byteLength / PIECE_BYTES)));
  if (pieces === 1) return gzipAsync(raw, GZIP_OPTIONS);
  const size = Math.ceil(raw.byteLength / pieces);
  const members: Array<Promise<Buffer>> = [];
  for (let start = 0; start < raw.byteLength; start += size) {
    members.push(gzipAsync(raw.subarray(start, Math.min(raw.byteLength, start + size)), GZIP_OPTIONS));
  }
  return Buffer.concat(await Promise.all(members));
}

export function decodeColumns(names: readonly string[], pointCount: number, data: Buffer): Record<string, Float64Array> {
  const raw = gunzipSync(data);
  const out: Record<string, Float64Array> = {};
  names.forEach((name, c) => {
    const copy = new Float64Array(pointCount);
    const bytes = raw.subarray(c * pointCount * 8, (c + 1) * pointCount * 8);
    new Uint8Array(copy.buffer).set(bytes);
    out[name] = copy;
  });
  return out;
}
