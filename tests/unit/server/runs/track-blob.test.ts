import { constants, gunzipSync, gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import {
  decodeColumns,
  gzipPackedColumns,
  packColumns,
  TRACK_LAYOUT,
  type TrackLayout,
} from '../../../../server/features/runs/track-blob.ts';
import { generateLakeRun, longRunPhases } from '../../../../shared/tracks/synthetic.ts';

const bytesOf = (column: Float64Array) => new Uint8Array(column.buffer, column.byteOffset, column.byteLength);

/** Half an hour around the lake with unknown heart rates, and the extremes of a double (NaN payloads, −0, subnormals). */
function awkwardColumns(): Record<string, Float64Array> {
  const { points } = generateLakeRun({
    start_t: Date.UTC(2026, 2, 1, 7),
    phases: longRunPhases(0.5, 3.2),
    seed: 11,
    gps_sigma_m: 1.5,
    ele_sigma_m: 1,
  });
  // A NaN with a payload of its own: a layout that rewrote NaN as the canonical one would fail here.
  const payloadNaN = new Float64Array(new Uint32Array([0x12345, 0x7ff80abc]).buffer)[0]!;
  return {
    t: Float64Array.from(points, (p) => p.t),
    lat: Float64Array.from(points, (p) => p.lat ?? Number.NaN),
    lon: Float64Array.from(points, (p) => p.lon ?? Number.NaN),
    // Every seventh heart rate unknown.
    hr: Float64Array.from(points, (_, k) => (k % 7 === 0 ? Number.NaN : 120 + (k % 40))),
    edge: Float64Array.from(
      points,
      (_, k) => [Number.MAX_VALUE, -0, Number.MIN_VALUE, 1e-300, payloadNaN, -Infinity, Infinity, 0][k % 8]!,
    ),
  };
}

describe('stored track columns (track-blob.ts)', () => {
  it('new tracks are stored as XOR byte planes (session 10)', () => {
    expect(TRACK_LAYOUT).toBe('xor-planes');
    expect(packColumns({ t: new Float64Array([1, 2]) }).layout).toBe('xor-planes');
  });

  for (const layout of ['columns', 'xor-planes'] as const satisfies readonly TrackLayout[]) {
    it(`${layout}: read back bit for bit, NaN (unknown and with payloads), −0 and infinities included`, async () => {
      const columns = awkwardColumns();
      const packed = packColumns(columns, layout);
      expect(packed.layout).toBe(layout);
      // Packed in an ArrayBuffer of its own, so a compute thread can move it to the event loop without a copy.
      expect(packed.raw.byteOffset).toBe(0);
      expect(packed.raw.buffer.byteLength).toBe(packed.raw.byteLength);
      expect(packed.columns).toEqual(['t', 'lat', 'lon', 'hr', 'edge']);
      const n = packed.pointCount;
      expect(n).toBe(columns.t!.length);
      const data = await gzipPackedColumns(packed.raw, layout);
      // gzip's own check (RFC 1952): the blob is a gzip stream of 8 bytes × columns × points.
      expect(gunzipSync(data).length).toBe(8 * 5 * n);
      // Any gzip level or strategy reads back alike (tracks stored before session 7 were written at level 6).
      const otherGzip = gzipSync(gunzipSync(data), { level: 6 });
      for (const blob of [data, otherGzip]) {
        const back = decodeColumns(packed.columns, n, blob, layout);
        for (const name of packed.columns) expect(Buffer.compare(bytesOf(columns[name]!), bytesOf(back[name]!)), name).toBe(0);
      }
    });
  }

  it('plain columns are each column’s Float64 bytes in turn; XOR planes are the 8 byte planes of each value XOR its predecessor', () => {
    const t = new Float64Array([1_700_000_000_000, 1_700_000_001_000, 1_700_000_002_000]);
    const hr = new Float64Array([Number.NaN, 141, 141]);
    const plain = packColumns({ t, hr }, 'columns').raw;
    expect(Buffer.compare(plain, Buffer.concat([bytesOf(t), bytesOf(hr)]))).toBe(0);
    const planes = packColumns({ t, hr }, 'xor-planes').raw;
    // Worked by hand from the definition: value k's bytes XOR value k−1's (the first XOR 0), byte j of every value together.
    for (const [c, column] of [t, hr].entries()) {
      const bytes = bytesOf(column);
      for (let k = 0; k < 3; k++)
        for (let j = 0; j < 8; j++) {
          const want = bytes[k * 8 + j]! ^ (k === 0 ? 0 : bytes[(k - 1) * 8 + j]!);
          expect(planes[c * 24 + j * 3 + k], `column ${c} value ${k} byte ${j}`).toBe(want);
        }
    }
    // The equal heart rates XOR to zero: the plane bytes of the third value are all 0.
    for (let j = 0; j < 8; j++) expect(planes[24 + j * 3 + 2]).toBe(0);
  });

  it('a long track is gzipped in pieces, one gzip member each, and reads back bit for bit (session 9)', async () => {
    // 6 columns × 100 000 points = 4.8 MB: four pieces of 1.2 MB.
    const n = 100_000;
    const columns: Record<string, Float64Array> = {};
    for (const [c, name] of ['t', 'd', 'lat', 'lon', 'ele', 'hr'].entries())
      columns[name] = Float64Array.from({ length: n }, (_, k) => (k % 97 === c ? Number.NaN : Math.sin(k * (c + 1)) * 1e3 + k));
    for (const [layout, options] of [
      ['columns', { level: 4 }],
      ['xor-planes', { level: 4, strategy: constants.Z_RLE }],
    ] as const) {
      const packed = packColumns(columns, layout);
      const data = await gzipPackedColumns(packed.raw, layout);
      // RFC 1952 2.2: a gzip file is a series of members; here each quarter of the columns is one (gzip is
      // deterministic for given options, so the blob is exactly the four pieces' gzip streams one after another).
      const quarter = packed.raw.byteLength / 4;
      const members = [0, 1, 2, 3].map((i) => gzipSync(packed.raw.subarray(i * quarter, (i + 1) * quarter), options));
      expect(Buffer.compare(data, Buffer.concat(members)), layout).toBe(0);
      expect(Buffer.compare(gunzipSync(data), Buffer.from(packed.raw)), layout).toBe(0);
      const back = decodeColumns(packed.columns, packed.pointCount, data, layout);
      for (const name of packed.columns) expect(Buffer.compare(bytesOf(columns[name]!), bytesOf(back[name]!)), name).toBe(0);
    }
    // About 1.5 s of gzip on a quiet core; the bound only ends a hang (it hit the default 5 s under load 15).
  }, 30_000);

  it('XOR planes of a real long run are smaller than plain columns at level 4 (the reason for the layout)', async () => {
    const { points } = generateLakeRun({
      start_t: Date.UTC(2026, 2, 1, 7),
      phases: longRunPhases(3, 3.2),
      seed: 5,
      gps_sigma_m: 1.5,
      ele_sigma_m: 1,
    });
    const columns = {
      t: Float64Array.from(points, (p) => p.t),
      lat: Float64Array.from(points, (p) => p.lat ?? Number.NaN),
      lon: Float64Array.from(points, (p) => p.lon ?? Number.NaN),
      ele: Float64Array.from(points, (p) => p.ele ?? Number.NaN),
    };
    const plain = await gzipPackedColumns(packColumns(columns, 'columns').raw, 'columns');
    const planes = await gzipPackedColumns(packColumns(columns, 'xor-planes').raw, 'xor-planes');
    expect(planes.length).toBeLessThan(plain.length);
  });

  it('a blob that does not hold the points its row counts is an error, not a short track', () => {
    const packed = packColumns({ t: new Float64Array([1, 2, 3]) });
    const data = gzipSync(packed.raw);
    expect(() => decodeColumns(['t'], 4, data, 'xor-planes')).toThrow(/does not hold/);
  });
});
