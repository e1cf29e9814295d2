/**
 * The point templates (server/features/runs/parse/point-template.ts) read track points straight
 * from the bytes. They must change nothing: every file gives the same raw points, counts, laps,
 * sport and name, the same cleaned runs with the same warnings, or the same refusal, as the
 * events alone (`fastPoints: false`, the path every earlier test was written against).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { damage, excerpt } from '../../../support/damaged-xml.ts';
import { decodeXml, xmlBytesOf } from '../../../../server/features/runs/parse/detect.ts';
import { readGpx } from '../../../../server/features/runs/parse/gpx-reader.ts';
import { ImportRejection } from '../../../../server/features/runs/parse/import-rejection.ts';
import { parseTrackFile } from '../../../../server/features/runs/parse/parse-track-file.ts';
import {
  parseAnyIsoTime,
  parseAnyNumber,
  readCommonIsoTime,
  readPlainDecimal,
} from '../../../../server/features/runs/parse/parse-time.ts';
import { readTcx } from '../../../../server/features/runs/parse/tcx-reader.ts';
import { XmlReadError } from '../../../../server/features/runs/parse/xml-events.ts';
import { POINT_FIELDS, PointColumns } from '../../../../shared/tracks/point-columns.ts';
import {
  createPrng,
  generateLakeRun,
  longRunPhases,
  TEN_K_WITH_STOP,
  type Phase,
  type SyntheticOptions,
} from '../../../../shared/tracks/synthetic.ts';
import type { DeviceLap } from '../../../../shared/tracks/types.ts';
import { writeGpx, writeTcx } from '../../../../shared/tracks/write-track.ts';

const SAMPLE_DIR = join(import.meta.dirname, '..', '..', '..', '..', 'fixtures', 'gps-samples');
const START_T = Date.UTC(2024, 8, 14, 6, 30);

/** Columns as the exact bytes of their doubles, so NaN, −0 and every bit must match. */
function columnsOf(columns: PointColumns): Record<string, string> {
  const out: Record<string, string> = { length: String(columns.length) };
  for (const field of POINT_FIELDS) out[field] = Buffer.from(columns.column(field).buffer).toString('base64');
  out.position_given = Buffer.from(columns.position_given.subarray(0, columns.length)).toString('base64');
  return out;
}

/** Any value with its PointColumns replaced by their bytes. */
function comparable(value: unknown): unknown {
  if (value instanceof PointColumns) return columnsOf(value);
  if (Array.isArray(value)) return value.map(comparable);
  if (value !== null && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([key, inner]) => [key, comparable(inner)]));
  }
  return value;
}

/** What the reader gives for the document (raw points before cleaning), or how it refuses. */
function rawOutcome(bytes: Buffer, fastPoints: boolean): unknown {
  const doc = xmlBytesOf(bytes);
  const isTcx = /<(\w+:)?TrainingCenterDatabase[\s>]/.test(bytes.subarray(0, 4096).toString('latin1'));
  try {
    const contents = isTcx ? readTcx(doc, { fastPoints }) : readGpx(doc, { fastPoints });
    return comparable({ ...contents, templatePoints: undefined });
  } catch (error) {
    if (error instanceof XmlReadError) return { error: 'XmlReadError' };
    throw error;
  }
}

/** What an upload of the bytes gives: the cleaned runs with their warnings, or the refusal's code and sentence. */
function parseOutcome(bytes: Buffer, fastPoints: boolean): unknown {
  try {
    return comparable(parseTrackFile(bytes, { fastPoints }));
  } catch (error) {
    if (error instanceof ImportRejection) return { rejection: error.code, message: error.message };
    throw error;
  }
}

/** Points the templates read in the document (0 when it is not a track the readers get to). */
function templatePoints(bytes: Buffer): number {
  try {
    const doc = xmlBytesOf(bytes);
    const head = bytes.subarray(0, 4096).toString('latin1');
    return /<(\w+:)?TrainingCenterDatabase[\s>]/.test(head) ? readTcx(doc).templatePoints : readGpx(doc).templatePoints;
  } catch {
    return 0;
  }
}

/** The templates change nothing a reader or an upload can see; gives how many points they read. */
function expectSameBothWays(bytes: Buffer): number {
  expect(rawOutcome(bytes, true)).toEqual(rawOutcome(bytes, false));
  expect(parseOutcome(bytes, true)).toEqual(parseOutcome(bytes, false));
  return templatePoints(bytes);
}

const SAMPLES = readdirSync(SAMPLE_DIR)
  .filter((file) => /\.(gpx|tcx)$/.test(file))
  .map((file) => ({ file, bytes: readFileSync(join(SAMPLE_DIR, file)) }));

function lapsEvery(options: SyntheticOptions, seconds: number): DeviceLap[] {
  const total = options.phases.reduce((sum, phase) => sum + phase.duration_s, 0);
  return Array.from({ length: Math.ceil(total / seconds) }, (_, k) => ({
    start_t: options.start_t + k * seconds * 1000,
    total_time_s: seconds,
    distance_m: 1000 + k,
    avg_hr: null,
    max_hr: null,
  }));
}

const INTERVALS: Phase[] = [
  { kind: 'run', duration_s: 600, speed_mps: 3 },
  ...Array.from({ length: 4 }, (): Phase[] => [
    { kind: 'run', duration_s: 180, speed_mps: 4.5 },
    { kind: 'stop', duration_s: 60 },
  ]).flat(),
];

/** Generated runs as our writers (and so the demo seed and `npm run bench`) write them. */
const GENERATED: { file: string; bytes: Buffer }[] = [
  { file: 'exact 10 k', options: { start_t: START_T, phases: TEN_K_WITH_STOP, seed: 7 } },
  { file: 'noisy 10 k', options: { start_t: START_T, phases: TEN_K_WITH_STOP, seed: 7, gps_sigma_m: 1, ele_sigma_m: 1 } },
  {
    file: 'intervals, 2 s, device distance',
    options: { start_t: START_T, phases: INTERVALS, seed: 11, gps_sigma_m: 2, device_distance: true, sample_s: 2 },
  },
  {
    file: 'long run with stops, 5 s',
    options: { start_t: START_T, phases: longRunPhases(2, 3.1), seed: 3, gps_sigma_m: 1.5, sample_s: 5 },
  },
].flatMap(({ file, options }) => {
  const { points } = generateLakeRun(options);
  const half = Math.floor(points.length / 2);
  return [
    { file: `${file}.gpx`, bytes: Buffer.from(writeGpx('Lake loop', [points])) },
    { file: `${file}, two segments.gpx`, bytes: Buffer.from(writeGpx('Lake loop', [points.slice(0, half), points.slice(half)])) },
    { file: `${file}.tcx`, bytes: Buffer.from(writeTcx(points, lapsEvery(options, 600))) },
  ];
});

describe('track points read by templates give exactly what the events give', () => {
  it.each(SAMPLES.map((s) => [s.file, s.bytes] as const))('sample %s', (_file, bytes) => {
    expectSameBothWays(bytes);
  });

  it('and the templates read the points of the plain samples', () => {
    const read = SAMPLES.map((s) => templatePoints(s.bytes));
    // Most device files are read by templates; the rest (odd layouts) go the old way, as they should.
    expect(read.filter((n) => n > 0).length).toBeGreaterThanOrEqual(SAMPLES.length / 2);
  });

  it.each(GENERATED.map((g) => [g.file, g.bytes] as const))('generated %s', (_file, bytes) => {
    const read = expectSameBothWays(bytes);
    // All but the first point of each stretch are read by a template.
    const points = bytes.toString('latin1').split(/<(?:trkpt|Trackpoint)[\s>]/).length - 1;
    expect(read).toBeGreaterThan(points * 0.9);
  });

  const gpx = (points: string, head = ''): Buffer =>
    Buffer.from(
      `<?xml version="1.0"?>\n<gpx version="1.1" xmlns:x="urn:x"${head}><trk><name>n</name><type>running</type><trkseg>\n${points}\n</trkseg></trk></gpx>\n`,
    );
  /** Twenty points a second apart, `shape(k)` giving point k. */
  const many = (shape: (k: number, time: string) => string): string =>
    Array.from({ length: 20 }, (_, k) => shape(k, new Date(START_T + k * 1000).toISOString())).join('\n');
  const pt = (k: number, time: string, inner = '', attrs = `lat="46.2${k}" lon="-31.4${k}"`): string =>
    `<trkpt ${attrs}><ele>1${k}.5</ele><time>${time}</time>${inner}</trkpt>`;

  it.each<[string, Buffer, boolean]>([
    // label, document, whether templates read some of its points
    ['plain points', gpx(many((k, t) => pt(k, t))), true],
    [
      'points alternating with and without heart rate',
      gpx(many((k, t) => pt(k, t, k % 2 ? `<extensions><x:hr>1${k}0</x:hr></extensions>` : ''))),
      true,
    ],
    [
      'five shapes in turn (more than the templates kept)',
      gpx(many((k, t) => pt(k, t, `<extensions>${'<x:cad>80</x:cad>'.repeat(k % 5)}</extensions>`))),
      true,
    ],
    [
      'CRLF and indentation',
      gpx(many((k, t) => `  <trkpt lat="46.${k}" lon="1">\r\n    <time>${t}</time>\r\n  </trkpt>`).replaceAll('\n', '\r\n')),
      true,
    ],
    [
      'values with spaces, signs, exponents and odd digits',
      gpx(
        many((k, t) =>
          pt(
            k,
            t,
            '',
            [
              `lat=" 46.2" lon="1"`,
              `lat="+46.2" lon="1e1"`,
              `lat="46." lon=".5"`,
              `lat="-0" lon="00012"`,
              `lat="46.20000000000000001" lon="1"`,
            ][k % 5],
          ),
        ),
      ),
      true,
    ],
    [
      'numbers the plain reader leaves to the general one',
      gpx(
        many(
          (k, t) =>
            `<trkpt lat="1" lon="2"><ele>${['1e2', '.5', '5.', '-0', '0x10', 'NaN', 'Infinity', '1_0', '١٢', '12345678901234567'][k % 10]}</ele><time>${t}</time></trkpt>`,
        ),
      ),
      true,
    ],
    [
      'times in many forms',
      gpx(
        many(
          (k, t) =>
            `<trkpt lat="1" lon="2"><time>${[t, t.replace('.000Z', 'Z'), t.replace('Z', '+02:00'), t.replace('.000Z', '.1234Z'), t.toLowerCase(), t.replace('.000Z', ''), t.replace('T', ' '), '2024-02-30T10:00:00Z', '2024-13-01T00:00:00Z', '0099-01-01T00:00:00Z'][k % 10]}</time></trkpt>`,
        ),
      ),
      true,
    ],
    [
      'a lat attribute twice after prefixes are removed',
      gpx(many((k, t) => pt(k, t, '', `x:lat="1${k}" lat="2${k}" lon="3"`))),
      true,
    ],
    ['a point without lat', gpx(many((k, t) => pt(k, t, '', `lon="3${k}"`))), true],
    [
      'namespace declarations on points',
      gpx(many((k, t) => pt(k, t, '', `xmlns:y="urn:y" y:lat="5" lat="4${k}" lon="3"`))),
      true,
    ],
    [
      'heart rate as a direct child (ignored) and deep (read)',
      gpx(many((k, t) => pt(k, t, `<hr>99</hr><extensions><a><HeartRate>1${k}1</HeartRate></a></extensions>`))),
      true,
    ],
    [
      'heart rate twice (the last counts)',
      gpx(many((k, t) => pt(k, t, `<extensions><x:hr>10${k}</x:hr><x:hr>1${k}</x:hr></extensions>`))),
      true,
    ],
    ['mixed text in a value', gpx(many((k, t) => pt(k, t, `<extensions><x:hr>1<b/>${k}</x:hr></extensions>`))), true],
    ['text in the point itself', gpx(many((k, t) => `<trkpt lat="1" lon="2">${k}<time>${t}</time></trkpt>`)), true],
    ['a waypoint inside each point', gpx(many((k, t) => pt(k, t, '<wpt lat="1" lon="2"/>'))), false],
    ['a track inside each point', gpx(many((k, t) => pt(k, t, '<trk><trkseg/></trk>'))), false],
    ['a point inside each point', gpx(many((k, t) => pt(k, t, pt(k, t)))), false],
    ['points directly in the track', Buffer.from(`<gpx><trk>\n${many((k, t) => pt(k, t))}\n</trk></gpx>`), true],
    [
      'points in a route and a track',
      Buffer.from(
        `<gpx><rte>\n${many((k, t) => pt(k, t))}\n</rte><trk><trkseg>\n${many((k, t) => pt(k, t))}\n</trkseg></trk></gpx>`,
      ),
      true,
    ],
    [
      'points after an empty segment is closed',
      Buffer.from(`<gpx><trk><trkseg></trkseg>\n${many((k, t) => pt(k, t))}\n</trk></gpx>`),
      true,
    ],
    [
      'a comment, CDATA and an entity in some points',
      gpx(many((k, t) => pt(k, t, ['', '<!-- c -->', '<name><![CDATA[x]]></name>', '<name>a &amp; b</name>'][k % 4]))),
      true,
    ],
    ['non-ASCII text in some points', gpx(many((k, t) => pt(k, t, k % 3 ? '' : '<name>Løype</name>'))), true],
    [
      'a Latin-1 document',
      Buffer.from(
        `<?xml version="1.0" encoding="ISO-8859-1"?>\n<gpx><trk><name>Løype</name><trkseg>\n${many((k, t) => pt(k, t))}\n</trkseg></trk></gpx>`,
        'latin1',
      ),
      true,
    ],
    [
      'a point cut off at the end',
      Buffer.from(`<gpx><trk><trkseg>\n${many((k, t) => pt(k, t))}\n<trkpt lat="1" lon="2"><ele>1</e`),
      false,
    ],
    [
      'points nested at the depth limit',
      Buffer.from(
        `<gpx>${'<x>'.repeat(60)}<trk><trkseg>\n${many((k, t) => pt(k, t, '<extensions><x:hr>1</x:hr></extensions>'))}\n</trkseg></trk>${'</x>'.repeat(60)}</gpx>`,
      ),
      false,
    ],
  ])('GPX: %s', (_label, bytes, read) => {
    expect(expectSameBothWays(bytes) > 0).toBe(read);
  });

  it('GPX: a file of ever-changing shapes stops learning templates and keeps the events', () => {
    const shapes = Array.from({ length: 600 }, (_, k) =>
      pt(k % 10, new Date(START_T + k * 1000).toISOString(), `<extensions>${'<a/>'.repeat(k % 300)}</extensions>`),
    );
    const bytes = gpx(shapes.join('\n'));
    const read = expectSameBothWays(bytes);
    // 256 learnt (each read once), the 4 kept read again when their shapes come back; events for the rest.
    expect(read).toBe(260);
  });

  it.each<[string, Buffer, boolean]>([
    [
      'points with and without a name (always the same result)',
      gpx(many((k, t) => pt(k, t, k % 2 ? '<name>a</name>' : ''))),
      true,
    ],
  ])('GPX: %s', (_label, bytes, read) => {
    expect(expectSameBothWays(bytes) > 0).toBe(read);
  });

  const tcx = (points: string, activity = true): Buffer =>
    Buffer.from(
      `<?xml version="1.0"?>\n<TrainingCenterDatabase xmlns:ns3="urn:x"><${activity ? 'Activities><Activity Sport="Running"' : 'Courses><Course'}><Id>x</Id><Lap StartTime="2024-09-14T06:30:00Z"><TotalTimeSeconds>60</TotalTimeSeconds><Track>\n${points}\n</Track></Lap></${activity ? 'Activity></Activities' : 'Course></Courses'}></TrainingCenterDatabase>\n`,
    );
  const tp = (k: number, time: string, inner = `<DistanceMeters>${k}.5</DistanceMeters>`): string =>
    `<Trackpoint><Time>${time}</Time><Position><LatitudeDegrees>46.2${k}</LatitudeDegrees><LongitudeDegrees>-31.4</LongitudeDegrees></Position>${inner}</Trackpoint>`;

  it.each<[string, Buffer, boolean]>([
    ['plain points', tcx(many((k, t) => tp(k, t))), true],
    [
      'heart rate and cadence',
      tcx(many((k, t) => tp(k, t, `<HeartRateBpm><Value>1${k}</Value></HeartRateBpm><Cadence>8${k}</Cadence>`))),
      true,
    ],
    [
      'RunCadence, then Cadence',
      tcx(
        many((k, t) =>
          tp(k, t, `<Extensions><ns3:TPX><ns3:RunCadence>7${k}</ns3:RunCadence></ns3:TPX></Extensions><Cadence>8${k}</Cadence>`),
        ),
      ),
      true,
    ],
    [
      'Cadence, then RunCadence',
      tcx(
        many((k, t) =>
          tp(k, t, `<Cadence>x</Cadence><Extensions><ns3:TPX><ns3:RunCadence>7${k}</ns3:RunCadence></ns3:TPX></Extensions>`),
        ),
      ),
      true,
    ],
    [
      'RunCadence twice',
      tcx(
        many((k, t) =>
          tp(k, t, `<Extensions><ns3:RunCadence>7${k}</ns3:RunCadence><ns3:RunCadence>6</ns3:RunCadence></Extensions>`),
        ),
      ),
      true,
    ],
    [
      'no position (treadmill)',
      tcx(many((k, t) => `<Trackpoint><Time>${t}</Time><DistanceMeters>${k}</DistanceMeters></Trackpoint>`)),
      true,
    ],
    [
      'a latitude only',
      tcx(
        many((k, t) => `<Trackpoint><Time>${t}</Time><Position><LatitudeDegrees>4${k}</LatitudeDegrees></Position></Trackpoint>`),
      ),
      true,
    ],
    [
      'Time and DistanceMeters not directly in the point',
      tcx(
        many((k, t) => tp(k, t, `<Extensions><Time>${t}</Time><DistanceMeters>9</DistanceMeters><Value>5</Value></Extensions>`)),
      ),
      true,
    ],
    ['a lap inside each point', tcx(many((k, t) => tp(k, t, '<Lap StartTime="x"/>'))), false],
    [
      'points of a course',
      tcx(
        many((k, t) => tp(k, t)),
        false,
      ),
      false,
    ],
  ])('TCX: %s', (_label, bytes, read) => {
    expect(expectSameBothWays(bytes) > 0).toBe(read);
  });
});

describe('damaged files: the same result or the same refusal with and without templates', () => {
  // The same damage as element-scanner.test.ts (tests/support/damaged-xml.ts), same seed.
  const small = [
    ...SAMPLES.map((s) => ({ file: s.file, text: excerpt(s.file, decodeXml(s.bytes)) })),
    ...GENERATED.slice(0, 3).map((g) => ({ file: g.file, text: excerpt(g.file, g.bytes.toString('utf8')) })),
  ];

  it('1 000 damaged samples', () => {
    const random = createPrng(8);
    let read = 0;
    let refused = 0;
    let templated = 0;
    for (let i = 0; i < 1000; i++) {
      const sample = small[i % small.length]!;
      const damaged = random() < 0.3 ? damage(damage(sample.text, random), random) : damage(sample.text, random);
      const bytes = Buffer.from(damaged, 'utf8');
      expectSameBothWays(bytes);
      if ('rejection' in (parseOutcome(bytes, true) as object)) refused++;
      else read++;
      templated += templatePoints(bytes);
    }
    // Both kinds happen, and templates did read points of damaged files.
    expect(read).toBeGreaterThan(100);
    expect(refused).toBeGreaterThan(100);
    expect(templated).toBeGreaterThan(1000);
  }, 60_000);

  it('1 000 files with damaged values (what the templates read themselves)', () => {
    const random = createPrng(19);
    const base = GENERATED.filter((g) => g.file.startsWith('intervals')).map((g) => ({
      file: g.file,
      text: excerpt(g.file, g.bytes.toString('utf8')),
    }));
    const VALUE_SNIPPETS = [
      ' ',
      '+',
      '-',
      '.',
      'e',
      'E',
      '1',
      '0',
      'Z',
      'z',
      ':',
      ',',
      'T',
      '&amp;',
      'é',
      '\t',
      '\r',
      '\n',
      '"',
      "'",
      '<',
      ']',
      '&#49;',
    ];
    let templated = 0;
    for (let i = 0; i < 1000; i++) {
      const { text } = base[i % base.length]!;
      // A value is a run of characters between '>' and '<' or inside quotes: damage one near a point.
      let out = text;
      for (let n = 1 + Math.floor(random() * 3); n > 0; n--) {
        const from = out.indexOf('<', Math.floor(random() * out.length));
        const at = from < 0 ? -1 : out.indexOf('>', from) + 1 + Math.floor(random() * 4);
        if (at <= 0) continue;
        const snippet = VALUE_SNIPPETS[Math.floor(random() * VALUE_SNIPPETS.length)]!;
        out = random() < 0.7 ? out.slice(0, at) + snippet + out.slice(at) : out.slice(0, at) + snippet + out.slice(at + 1);
      }
      const bytes = Buffer.from(out, 'utf8');
      expectSameBothWays(bytes);
      templated += templatePoints(bytes);
    }
    expect(templated).toBeGreaterThan(2000);
  }, 60_000);
});

describe('numbers and times read from bytes', () => {
  const pad = (value: number, width: number): string => String(value).padStart(width, '0');
  /** Reads `text` from the middle of a buffer with other bytes around it, as a slot is read. */
  function fromBytes(read: typeof readPlainDecimal, text: string): { handled: boolean; value: number } {
    const bytes = Buffer.from(`-9<${text}>-9`, 'latin1');
    const out = new Float64Array([12345]);
    const handled = read(bytes, 3, 3 + text.length, out, 0);
    return { handled, value: out[0]! };
  }

  it('times: 50 000 generated, including leap days, odd zones, fractions and impossible dates, equal to the general reader', () => {
    const random = createPrng(29);
    let handled = 0;
    for (let i = 0; i < 50_000; i++) {
      const year =
        [1600, 1900, 2000, 2023, 2024, 2100, 1970, 1969, 9999, 100, 99][i % 11]! + (i % 7 === 0 ? Math.floor(random() * 50) : 0);
      const month = 1 + Math.floor(random() * (i % 13 === 0 ? 14 : 12));
      const day = i % 5 === 0 ? 28 + Math.floor(random() * 4) : 1 + Math.floor(random() * 31);
      const hour = Math.floor(random() * 25);
      const minute = Math.floor(random() * 60);
      const second = Math.floor(random() * 61);
      const fraction = ['', '', '.5', '.25', '.125', '.000', '.1234', '.', ',5'][Math.floor(random() * 9)]!;
      const zoneMinutes = Math.floor(random() * 14 * 60) * (random() < 0.5 ? -1 : 1);
      const offset = `${zoneMinutes < 0 ? '-' : '+'}${pad(Math.floor(Math.abs(zoneMinutes) / 60), 2)}:${pad(Math.abs(zoneMinutes) % 60, 2)}`;
      const zone = ['Z', 'Z', offset, offset, 'z', '', '+0530', '+05'][Math.floor(random() * 8)]!;
      const separator = random() < 0.95 ? 'T' : ' ';
      const text = `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}${separator}${pad(hour, 2)}:${pad(minute, 2)}:${pad(second, 2)}${fraction}${zone}`;
      const result = fromBytes(readCommonIsoTime, text);
      if (result.handled) {
        handled++;
        expect(Object.is(result.value, parseAnyIsoTime(text)), text).toBe(true);
      } else expect(result.value, text).toBe(12345);
    }
    // Both ways are taken many times (the fast reader leaves the rarer forms to the general one).
    expect(handled).toBeGreaterThan(10_000);
    expect(handled).toBeLessThan(40_000);
  });

  it('numbers: 50 000 generated, equal to the general reader to the bit', () => {
    const random = createPrng(31);
    let handled = 0;
    const digits = (n: number): string => Array.from({ length: n }, () => Math.floor(random() * 10)).join('');
    for (let i = 0; i < 50_000; i++) {
      const sign = ['', '-', '+'][Math.floor(random() * 3)]!;
      const whole = digits(Math.floor(random() * 10));
      const fraction = random() < 0.8 ? `.${digits(Math.floor(random() * 20))}` : '';
      const exponent = random() < 0.05 ? `e${Math.floor(random() * 10)}` : '';
      const text = `${sign}${whole}${fraction}${exponent}`;
      const result = fromBytes(readPlainDecimal, text);
      if (result.handled) {
        handled++;
        expect(Object.is(result.value, parseAnyNumber(text)), text).toBe(true);
      } else expect(result.value, text).toBe(12345);
    }
    expect(handled).toBeGreaterThan(10_000);
    expect(handled).toBeLessThan(45_000);
  });
});
