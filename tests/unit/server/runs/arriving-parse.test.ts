/**
 * A file read while it arrives (parseArrivingTrackFile, server/features/runs/parse/arriving.ts) must give
 * exactly what `parseTrackFile` gives for the whole file: the same runs to the bit, or the same refusal
 * word for word, whatever sizes its bytes come in. Each file here arrives in chunks of 1 byte, 7, 4 096
 * and random sizes, into memory longer than the file (as an upload's is), with the reader's lookahead
 * at its real size and at a few bytes (so points are cut at the arrival's edge all the time).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { damage } from '../../../support/damaged-xml.ts';
import { ArrivalStopped, type Arrival } from '../../../../server/features/runs/parse/arriving.ts';
import { ImportRejection } from '../../../../server/features/runs/parse/import-rejection.ts';
import { parseArrivingTrackFile, parseTrackFile } from '../../../../server/features/runs/parse/parse-track-file.ts';
import type { ReadOptions } from '../../../../server/features/runs/parse/point-template.ts';
import { POINT_FIELDS, PointColumns } from '../../../../shared/tracks/point-columns.ts';
import { createPrng, generateLakeRun, TEN_K_WITH_STOP } from '../../../../shared/tracks/synthetic.ts';
import { writeGpx, writeTcx } from '../../../../shared/tracks/write-track.ts';
import { writeDocument } from '../../../bench/bench-files.ts';

const SAMPLE_DIR = join(import.meta.dirname, '..', '..', '..', '..', 'fixtures', 'gps-samples');
const START_T = Date.UTC(2024, 8, 14, 6, 30);

/** Bytes arriving a chunk at a time as the reader asks for them; the end is told only when it asks past it. */
class ChunkedArrival implements Arrival {
  readonly memory: Buffer;
  length = -1;
  arrived = 0;
  waits = 0;

  constructor(
    private readonly file: Buffer,
    private readonly nextChunk: () => number,
    extraMemory: number,
  ) {
    this.memory = Buffer.alloc(file.length + extraMemory);
  }

  waitFor(end: number): number {
    this.waits++;
    while (this.arrived < Math.min(end, this.file.length)) {
      const count = Math.min(Math.max(1, this.nextChunk()), this.file.length - this.arrived);
      this.file.copy(this.memory, this.arrived, this.arrived, this.arrived + count);
      this.arrived += count;
    }
    if (this.arrived === this.file.length && end > this.arrived) this.length = this.file.length;
    return this.arrived;
  }
}

/** Columns as the exact bytes of their doubles (up to their length), so NaN, −0 and every bit must match. */
function comparable(value: unknown): unknown {
  if (value instanceof PointColumns) {
    const out: Record<string, string> = { length: String(value.length) };
    for (const field of POINT_FIELDS) out[field] = Buffer.from(value.column(field).buffer).toString('base64');
    out.position_given = Buffer.from(value.position_given.subarray(0, value.length)).toString('base64');
    return out;
  }
  if (Array.isArray(value)) return value.map(comparable);
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([key, inner]) => [key, comparable(inner)]));
  }
  return value;
}

function outcome(read: () => unknown): unknown {
  try {
    return comparable(read());
  } catch (error) {
    if (error instanceof ImportRejection) return { rejection: error.code, message: error.message };
    throw error;
  }
}

const CHUNKINGS: { name: string; chunk: (random: () => number) => number }[] = [
  { name: '1 byte', chunk: () => 1 },
  { name: '7 bytes', chunk: () => 7 },
  { name: '4096 bytes', chunk: () => 4096 },
  { name: 'random sizes', chunk: (random) => 1 + Math.floor(random() ** 3 * 20_000) },
];

/**
 * Reads `bytes` arriving in every chunking (with the real lookahead and a tiny one) and expects the whole
 * file's outcome each time; gives whether the reader read it while it arrived (false: after, as for gzip).
 */
function expectSameAsWhole(bytes: Buffer, seed: number, chunkings = CHUNKINGS): boolean {
  const whole = outcome(() => parseTrackFile(bytes));
  let streamed = true;
  for (const [k, { chunk }] of chunkings.entries()) {
    for (const lookahead of [undefined, 1 + (seed % 40)]) {
      const random = createPrng(seed * 31 + k);
      const arrival = new ChunkedArrival(bytes, () => chunk(random), Math.floor(random() * 600));
      const options: ReadOptions = lookahead === undefined ? {} : { arrivalLookahead: lookahead };
      let gaveNull = false;
      const got = outcome(() => {
        const runs = parseArrivingTrackFile(arrival, options);
        if (runs === null) gaveNull = true;
        return runs;
      });
      if (gaveNull) streamed = false;
      else expect(got).toEqual(whole);
    }
  }
  return streamed;
}

const SAMPLES = readdirSync(SAMPLE_DIR)
  .filter((file) => /\.(gpx|tcx)$/.test(file))
  .map((file) => ({ file, bytes: readFileSync(join(SAMPLE_DIR, file)) }));

const tenK = generateLakeRun({ start_t: START_T, phases: TEN_K_WITH_STOP, seed: 7, gps_sigma_m: 1, ele_sigma_m: 1 }).points;
const half = Math.floor(tenK.length / 2);
const GENERATED = [
  { file: 'noisy 10 k.gpx', bytes: Buffer.from(writeGpx('Lake loop', [tenK])) },
  { file: 'noisy 10 k, two segments.gpx', bytes: Buffer.from(writeGpx('Lake loop', [tenK.slice(0, half), tenK.slice(half)])) },
  { file: 'noisy 10 k.tcx', bytes: Buffer.from(writeTcx(tenK, [])) },
  // The benchmark's files (tests/bench/bench-files.ts) at their smallest size.
  { file: 'bench 1 h.gpx', bytes: Buffer.from(writeDocument('gpx', 1, 3.2)) },
  { file: 'bench 1 h.tcx', bytes: Buffer.from(writeDocument('tcx', 1, 3.2)) },
];

describe('a file read while it arrives gives what the whole file gives', () => {
  it.each(SAMPLES.map((s) => [s.file, s.bytes] as const))('sample %s', (_file, bytes) => {
    expectSameAsWhole(bytes, bytes.length);
  });

  it.each(GENERATED.map((g) => [g.file, g.bytes] as const))(
    'generated %s',
    (_file, bytes) => {
      // Read while arriving: a file larger than its head is not left for after.
      expect(expectSameAsWhole(bytes, bytes.length)).toBe(true);
    },
    120_000,
  );

  it('reads the points as they come: most of the reading is done before the last byte', () => {
    const bytes = GENERATED[3]!.bytes;
    let arrivedWhenAsked = -1;
    const arrival = new ChunkedArrival(bytes, () => 4096, 100);
    const asks: number[] = [];
    const waitFor = arrival.waitFor.bind(arrival);
    arrival.waitFor = (end) => {
      asks.push(end);
      if (end > bytes.length) arrivedWhenAsked = Math.max(arrivedWhenAsked, arrival.arrived);
      return waitFor(end);
    };
    expect(comparable(parseArrivingTrackFile(arrival))).toEqual(comparable(parseTrackFile(bytes)));
    // It asked for the bytes a lookahead at a time (hundreds of waits), not for the whole file first.
    expect(asks.filter((end) => end <= bytes.length).length).toBeGreaterThan(5);
    expect(asks[0]).toBeLessThan(bytes.length / 10);
  });

  it('the same bytes written otherwise: byte-order mark, Latin-1, prefixed points, a point of 100 KB', () => {
    const gpx = GENERATED[0]!.bytes.toString('utf8');
    const withBom = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), GENERATED[0]!.bytes]);
    const latin1 = Buffer.from(
      gpx.replace(/^<\?xml[^>]*\?>/, '<?xml version="1.0" encoding="ISO-8859-1"?>').replace('Lake loop', 'Lac \u00e9t\u00e9'),
      'latin1',
    );
    const prefixed = Buffer.from(
      gpx.replace(/<(\/?)trkpt/g, '<$1g:trkpt').replace('<gpx ', '<gpx xmlns:g="http://www.topografix.com/GPX/1/1" '),
    );
    const points = gpx.split('<trkpt');
    points[40] = points[40]!.replace('</trkpt>', `<extensions><note>${'x'.repeat(100_000)}</note></extensions></trkpt>`);
    const bigPoint = Buffer.from(points.join('<trkpt'));
    const utf8Name = Buffer.from(gpx.replace('Lake loop', 'Boucle du lac \u2014 \u00e9t\u00e9 \ud83c\udfc3'));
    for (const [k, bytes] of [withBom, latin1, prefixed, bigPoint, utf8Name].entries()) {
      expect(expectSameAsWhole(bytes, 100 + k)).toBe(true);
    }
  }, 120_000);

  it('refusals word for word: entities declared at the end, cut short, not closed, a web page, too little track', () => {
    const gpx = GENERATED[0]!.bytes.toString('utf8');
    const files = [
      gpx + '<!-- <!ENTITY x "y"> -->',
      gpx.slice(0, Math.floor(gpx.length * 0.7)),
      gpx.replace('</gpx>', ''),
      gpx.replace(/<trkpt /, '<trkpt lat="1" lat="2" '),
      gpx.replace(/<\/trkseg>/, '</trksegx>'),
      '<!doctype html><html><body>' + 'x'.repeat(40_000) + '</body></html>',
      gpx.replace(/<trkseg>[\s\S]*<\/trkseg>/, '<trkseg></trkseg>' + ' '.repeat(2_000_000)),
    ];
    for (const [k, text] of files.entries()) {
      const bytes = Buffer.from(text);
      expectSameAsWhole(bytes, 200 + k, CHUNKINGS.slice(2));
      expect(outcome(() => parseTrackFile(bytes))).toHaveProperty('rejection');
    }
  }, 120_000);

  it('gzip and UTF-16 are left for after arrival (null), and give the same after', () => {
    const bytes = GENERATED[0]!.bytes;
    const utf16 = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(bytes.toString('utf8'), 'utf16le')]);
    for (const file of [gzipSync(Buffer.concat([bytes, Buffer.alloc(20_000, 32)])), utf16]) {
      const arrival = new ChunkedArrival(file, () => 1000, 10);
      expect(parseArrivingTrackFile(arrival)).toBeNull();
      // It decided on the head, without waiting for the rest.
      expect(arrival.length).toBe(-1);
    }
  });

  it('stops when the bytes stop coming (ArrivalStopped passes through)', () => {
    const bytes = GENERATED[3]!.bytes;
    const arrival = new ChunkedArrival(bytes, () => 4096, 0);
    const waitFor = arrival.waitFor.bind(arrival);
    arrival.waitFor = (end) => {
      if (arrival.arrived > bytes.length / 2) throw new ArrivalStopped('stopped');
      return waitFor(end);
    };
    expect(() => parseArrivingTrackFile(arrival)).toThrow(ArrivalStopped);
  });

  it('150 damaged files of a few hundred KB: the same result or the same refusal', () => {
    const random = createPrng(23);
    const bases = GENERATED.slice(0, 3).map((g) => g.bytes.toString('utf8'));
    let refused = 0;
    let read = 0;
    for (let i = 0; i < 150; i++) {
      const base = bases[i % bases.length]!;
      const damaged = Buffer.from(random() < 0.3 ? damage(damage(base, random), random) : damage(base, random), 'utf8');
      expectSameAsWhole(damaged, 1000 + i, [CHUNKINGS[i % CHUNKINGS.length]!]);
      if ('rejection' in (outcome(() => parseTrackFile(damaged)) as object)) refused++;
      else read++;
    }
    expect(read).toBeGreaterThan(10);
    expect(refused).toBeGreaterThan(20);
  }, 300_000);
});
