/**
 * The point-tag count (server/features/runs/parse/point-tags.ts) is taken while a file is read,
 * no longer in a pass of its own before. It must be exactly the count of that pass
 * (`countTrackPointTags`) whenever the file is read to its end, whichever way its points are read
 * (templates or events), and a file over the 200 000-point limit must get the same refusal as
 * when the count came first: before anything else is said about it, and before the reader has
 * gone past the limit.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { damage, excerpt } from '../../../support/damaged-xml.ts';
import { decodeXml, detectFormat, xmlBytesOf } from '../../../../server/features/runs/parse/detect.ts';
import { readGpx } from '../../../../server/features/runs/parse/gpx-reader.ts';
import { ImportRejection } from '../../../../server/features/runs/parse/import-rejection.ts';
import { countTrackPointTags, parseTrackFile } from '../../../../server/features/runs/parse/parse-track-file.ts';
import { PointTagCounter } from '../../../../server/features/runs/parse/point-tags.ts';
import { readTcx } from '../../../../server/features/runs/parse/tcx-reader.ts';
import { XmlReadError } from '../../../../server/features/runs/parse/xml-events.ts';
import { MAX_TRACK_POINTS } from '../../../../shared/runs/upload-limits.ts';
import { createPrng, generateLakeRun, TEN_K_WITH_STOP } from '../../../../shared/tracks/synthetic.ts';
import { writeGpx, writeTcx } from '../../../../shared/tracks/write-track.ts';

const SAMPLE_DIR = join(import.meta.dirname, '..', '..', '..', '..', 'fixtures', 'gps-samples');
const SAMPLES = readdirSync(SAMPLE_DIR)
  .filter((file) => /\.(gpx|tcx)$/.test(file))
  .map((file) => ({ file, text: decodeXml(readFileSync(join(SAMPLE_DIR, file))) }));
const LAKE = generateLakeRun({ start_t: Date.UTC(2024, 8, 14, 6, 30), phases: TEN_K_WITH_STOP, seed: 7, gps_sigma_m: 1 }).points;
const GENERATED = [
  { file: 'lake.gpx', text: writeGpx('Lake loop', [LAKE]) },
  { file: 'lake.tcx', text: writeTcx(LAKE, []) },
];

/**
 * The count the reader kept, or null when the file is refused before reading or its XML stops the
 * read (the count is then taken again in one pass: see `parseTrackFile`), beside the one-pass count.
 */
function countedBothWays(bytes: Buffer, fastPoints: boolean): { whileReading: number; onePass: number } | null {
  const doc = xmlBytesOf(bytes);
  let format: 'gpx' | 'tcx';
  try {
    format = detectFormat(doc);
  } catch {
    return null;
  }
  const pointTags = new PointTagCounter(doc.bytes, format);
  try {
    if (format === 'gpx') readGpx(doc, { fastPoints, pointTags });
    else readTcx(doc, { fastPoints, pointTags });
  } catch (error) {
    if (error instanceof XmlReadError) return null;
    throw error;
  }
  return { whileReading: pointTags.total, onePass: countTrackPointTags(doc, format) };
}

function expectSameCount(text: string): number {
  let read = 0;
  for (const fastPoints of [true, false]) {
    const counts = countedBothWays(Buffer.from(text, 'utf8'), fastPoints);
    if (counts === null) continue;
    expect(counts.whileReading).toBe(counts.onePass);
    read++;
  }
  return read;
}

/** What an upload of the bytes gives: the refusal's code, or the points of each run. */
function outcome(bytes: Buffer, fastPoints = true): string | number[] {
  try {
    return parseTrackFile(bytes, { fastPoints }).map((run) => run.track.columns.length);
  } catch (error) {
    if (error instanceof ImportRejection) return error.code;
    throw error;
  }
}

const point = (k: number, inner = ''): string =>
  `<trkpt lat="46.${String(1000 + k)}" lon="7.${String(2000 + k)}">${inner}<time>2024-01-01T00:${String(Math.floor(k / 60) % 60).padStart(2, '0')}:${String(k % 60).padStart(2, '0')}Z</time></trkpt>\n`;
const gpx = (body: string, before = ''): string =>
  `<?xml version="1.0" encoding="UTF-8"?>\n<gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1">${before}<trk><trkseg>\n${body}</trkseg></trk></gpx>\n`;

describe('the point tags counted while reading equal the count of a pass of their own', () => {
  it.each([...SAMPLES, ...GENERATED].map((s) => [s.file, s.text] as const))('%s', (file, text) => {
    // A sample refused before reading (truncated, not a track) has no count to compare.
    let readable = true;
    try {
      detectFormat(xmlBytesOf(Buffer.from(text, 'utf8')));
    } catch (error) {
      expect(error).toBeInstanceOf(ImportRejection);
      readable = false;
    }
    expect(expectSameCount(text), file).toBe(readable ? 2 : 0);
  });

  it.each<[string, string]>([
    ['a comment of point tags between points', gpx(point(0) + '<!-- <trkpt lat="1" lon="2"/> <x:trkpt> -->\n' + point(1))],
    ['an element whose name starts like a point', gpx(point(0) + point(1).replaceAll('trkpt', 'trkpts') + point(2))],
    ['a prefixed point', gpx(point(0) + point(1).replaceAll('trkpt', 'p:trkpt') + point(2))],
    [
      'a point named with a prefix that is the point name',
      gpx(point(0) + point(1).replaceAll('trkpt', 'trkpt:trkpt') + point(2)),
    ],
    [
      'tag-like letters in a value the templates do not read',
      gpx([0, 1, 2, 3].map((k) => point(k, `<desc>${k % 2 ? 'a:trkpt/' : 'plain'}</desc>`)).join('')),
    ],
    [
      'tag-like letters in a number the templates read',
      gpx(point(0) + point(1).replace('lat="46.1001"', 'lat="a:trkpt "') + point(2)),
    ],
    ['an attribute named like a point', gpx([0, 1, 2].map((k) => point(k).replace('<trkpt ', '<trkpt x:trkpt ="1" ')).join(''))],
    ['a point tag in the name before the track', gpx(point(0) + point(1), '<metadata><desc>x:trkpt/</desc></metadata>')],
  ])('%s', (_case, text) => {
    expect(expectSameCount(text)).toBe(2);
    // And the upload gives the same with and without the templates.
    expect(outcome(Buffer.from(text), true)).toEqual(outcome(Buffer.from(text), false));
  });

  it('an element whose name starts like a point is never read as a point (it was, by a template)', () => {
    const text = gpx([0, 1, 2, 3].map((k) => point(k)).join('') + point(4).replaceAll('trkpt', 'trkpts') + point(5));
    expect(outcome(Buffer.from(text), true)).toEqual([5]);
    expect(outcome(Buffer.from(text), false)).toEqual([5]);
  });

  it('1 000 damaged files: equal whenever the file is read to its end', () => {
    // The damage of element-scanner.test.ts (tests/support/damaged-xml.ts), another seed.
    const random = createPrng(23);
    const small = [...SAMPLES, ...GENERATED].map((s) => excerpt(s.file, s.text));
    let read = 0;
    for (let i = 0; i < 1000; i++) read += expectSameCount(damage(small[i % small.length]!, random));
    expect(read).toBeGreaterThan(500);
  }, 60_000);
});

describe('the 200 000-point limit, counted while reading', () => {
  const plain = (k: number): string => `<trkpt lat="46.1" lon="7.2"><time>2024-01-01T00:00:00Z</time></trkpt>\n`.repeat(k);

  it(`${MAX_TRACK_POINTS} point tags are read; one more, even in a comment at the end, is refused`, () => {
    expect(outcome(Buffer.from(gpx(plain(MAX_TRACK_POINTS))))).not.toBe('too-many-points');
    expect(outcome(Buffer.from(gpx(plain(MAX_TRACK_POINTS) + '<!-- <trkpt> -->\n')))).toBe('too-many-points');
  }, 60_000);

  it('a file over the limit is refused as such although its XML breaks first, as when the count came first', () => {
    const broken = gpx(plain(MAX_TRACK_POINTS + 1), '<metadata><desc>&undefined;</desc></metadata>');
    expect(outcome(Buffer.from(broken), true)).toBe('too-many-points');
    expect(outcome(Buffer.from(broken), false)).toBe('too-many-points');
    // The same file within the limit says what is wrong with it.
    expect(outcome(Buffer.from(gpx(plain(10), '<metadata><desc>&undefined;</desc></metadata>')))).toBe('malformed-xml');
  }, 60_000);

  it('the read stops at the first tag past the limit, templates or events', () => {
    const text = gpx(plain(MAX_TRACK_POINTS + 5_000));
    for (const fastPoints of [true, false]) {
      const doc = xmlBytesOf(Buffer.from(text));
      const pointTags = new PointTagCounter(doc.bytes, 'gpx');
      expect(() => readGpx(doc, { fastPoints, pointTags })).toThrow(ImportRejection);
      expect(pointTags.total).toBeLessThanOrEqual(MAX_TRACK_POINTS + 1);
      expect(pointTags.total).toBeGreaterThan(MAX_TRACK_POINTS);
    }
  }, 60_000);
});
