import { gunzipSync, gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { decodeColumns, gzipPackedColumns, packColumns } from '../../../../server/features/runs/track-blob.ts';
import { generateLakeRun, longRunPhases } from '../../../../shared/tracks/synthetic.ts';

describe('stored track columns (track-blob.ts)', () => {
  it('read back bit for bit, NaN (unknown) included, whatever gzip level wrote them', async () => {
    const { points } = generateLakeRun({
      start_t: Date.UTC(2026, 2, 1, 7),
      phases: longRunPhases(0.5, 3.2),
      seed: 11,
      gps_sigma_m: 1.5,
      ele_sigma_m: 1,
    });
    const columns = {
      t: Float64Array.from(points, (p) => p.t),
      lat: Float64Array.from(points, (p) => p.lat ?? Number.NaN),
      lon: Float64Array.from(points, (p) => p.lon ?? Number.NaN),
      // Every seventh heart rate unknown, and the extremes of a double.
      hr: Float64Array.from(points, (_, k) => (k % 7 === 0 ? Number.NaN : 120 + (k % 40))),
      edge: Float64Array.from(points, (_, k) => [Number.MAX_VALUE, -0, Number.MIN_VALUE, 1e-300][k % 4]!),
    };
    const packed = packColumns(columns);
    // Packed in an ArrayBuffer of its own, so a compute thread can move it to the event loop without a copy.
    expect(packed.raw.byteOffset).toBe(0);
    expect(packed.raw.buffer.byteLength).toBe(packed.raw.byteLength);
    const blob = { columns: packed.columns, pointCount: packed.pointCount, data: await gzipPackedColumns(packed.raw) };
    expect(blob.columns).toEqual(['t', 'lat', 'lon', 'hr', 'edge']);
    expect(blob.pointCount).toBe(points.length);
    // gzip's own check (RFC 1952): the blob is a gzip stream of 8 bytes × columns × points.
    expect(gunzipSync(blob.data).length).toBe(8 * 5 * points.length);
    // Tracks stored before session 7 were written at level 6: they read back the same.
    const olderBlob = gzipSync(gunzipSync(blob.data), { level: 6 });
    for (const data of [blob.data, olderBlob]) {
      const back = decodeColumns(blob.columns, blob.pointCount, data);
      for (const name of blob.columns) {
        const a = new Uint8Array(columns[name as keyof typeof columns].buffer);
        const b = new Uint8Array(back[name]!.buffer);
        expect(Buffer.compare(a, b), name).toBe(0);
      }
    }
  });

  it('a long track is gzipped in pieces, one gzip member each, and reads back bit for bit (session 9)', async () => {
    // 6 columns × 100 000 points = 4.8 MB: four pieces of 1.2 MB.
    const n = 100_000;
    const columns: Record<string, Float64Array> = {};
    for (const [c, name] of ['t', 'd', 'lat', 'lon', 'ele', 'hr'].entries())
      columns[name] = Float64Array.from({ length: n }, (_, k) => (k % 97 === c ? Number.NaN : Math.sin(k * (c + 1)) * 1e3 + k));
    const packed = packColumns(columns);
    const data = await gzipPackedColumns(packed.raw);
    // RFC 1952 2.2: a gzip file is a series of members; here each quarter of the columns is one (gzip is
    // deterministic for a given level, so the blob is exactly the four pieces' gzip streams one after another).
    const quarter = packed.raw.byteLength / 4;
    const members = [0, 1, 2, 3].map((i) => gzipSync(packed.raw.subarray(i * quarter, (i + 1) * quarter), { level: 4 }));
    expect(Buffer.compare(data, Buffer.concat(members))).toBe(0);
    expect(Buffer.compare(gunzipSync(data), Buffer.from(packed.raw))).toBe(0);
    const back = decodeColumns(packed.columns, packed.pointCount, data);
    for (const name of packed.columns) {
      expect(Buffer.compare(new Uint8Array(columns[name]!.buffer), new Uint8Array(back[name]!.buffer)), name).toBe(0);
    }
  });
});
