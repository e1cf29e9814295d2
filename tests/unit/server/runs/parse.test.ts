import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { ImportRejection } from '../../../../server/features/runs/parse/import-rejection.ts';
import { parseTrackFile } from '../../../../server/features/runs/parse/parse-track-file.ts';
import { parseIsoTime } from '../../../../server/features/runs/parse/parse-time.ts';
import { analyseTrack } from '../../../../shared/tracks/analyse.ts';

const SAMPLES = join(import.meta.dirname, '..', '..', '..', '..', 'fixtures', 'gps-samples');
const read = (file: string): Buffer => readFileSync(join(SAMPLES, file));

function rejectionOf(input: Buffer | string): ImportRejection {
  try {
    parseTrackFile(typeof input === 'string' ? Buffer.from(input) : input);
  } catch (error) {
    if (error instanceof ImportRejection) return error;
    throw error;
  }
  throw new Error('expected a rejection');
}

// Expected figures from fixtures/gps-samples/REFERENCE.tsv (computed outside the project with
// GeographicLib and the files' own DistanceMeters). GPX distances compare with the geodesic sum
// within segments; TCX distances with the device's last − first DistanceMeters.
describe.each<[string, number, number, number, number, 'device' | 'geodesic']>([
  // file, activity, elapsed_s, reference distance (m), tolerance (fraction), source
  ['run-hr-4s.gpx', 0, 948, 3100.6, 0.001, 'geodesic'],
  ['ride-1s-4-segments.gpx', 0, 1126, 4747.4, 0.001, 'geodesic'],
  ['watch-run-no-elevation.gpx', 0, 1696, 10188.9, 0.001, 'geodesic'],
  ['run-excerpt-3-segments.gpx', 0, 2569.308, 87.8, 0.01, 'geodesic'],
  ['handheld-1s-partial-hr.gpx', 0, 122, 61.8, 0.01, 'geodesic'],
  // Slow walking/hiking tracks: intervals under 0.3 m/s count as standing (jitter rule), so the
  // distance is below the raw geodesic sum (gpxpy's moving distance is 4415.1 m and 17 405 m).
  ['lake-gpx10-8-tracks.gpx', 0, 7190, 4576.9, 0.1, 'geodesic'],
  ['handheld-10h-extensions.gpx', 0, 36624, 18214.5, 0.15, 'geodesic'],
  ['watch-run-15-laps.tcx', 0, 3270, 14332.3, 0.0001, 'device'],
  ['watch-run-14-laps.tcx', 0, 3922, 10746.6, 0.0001, 'device'],
  // 1991 s, not REFERENCE.tsv's 1992: the last trackpoint has only a time (no position, no
  // distance), so cleaning drops it.
  ['watch-run-3-laps.tcx', 0, 1991, 4686.3, 0.0001, 'device'],
  ['treadmill-no-position.tcx', 0, 1638, 4111.5, 0.0001, 'device'],
  ['ride-excerpt-distance-offset.tcx', 0, 463, 1376.1, 0.0001, 'device'],
  ['two-activities.tcx', 0, 3270, 14332.3, 0.0001, 'device'],
  ['two-activities.tcx', 1, 5280, 19149.4, 0.0001, 'device'],
  ['odd-backwards-time.tcx', 0, 1, 2.7, 0.02, 'device'],
])('%s (activity %i)', (file, activity, elapsed, distance, tolerance, source) => {
  const runs = parseTrackFile(read(file));
  const run = runs[activity]!;
  const { summary, splits } = analyseTrack(run.track);

  it(`lasts ${elapsed} s from first to last point`, () => {
    expect(summary.elapsed_s).toBeCloseTo(elapsed, 3);
  });

  it(`measures ${distance} m from the ${source} distance (±${tolerance * 100} %)`, () => {
    expect(summary.distance_source).toBe(source);
    // Sparse GPS tracks (points 2 s or more apart) are measured along the curve through their points
    // (shared/tracks/README.md, sample-file table): the point-to-point sum is what REFERENCE.tsv
    // computes, and the curve adds at most a few metres per 100 m of bends, never takes any off.
    const report = summary.distance_report;
    const sparse = source === 'geodesic' && !report.smoothed && report.median_interval_s! > 1.5;
    const measured = sparse ? report.raw_distance_m : summary.distance_m;
    expect(Math.abs(measured - distance) / distance).toBeLessThanOrEqual(tolerance);
    if (sparse) expect(summary.distance_m / report.raw_distance_m - 1).toBeGreaterThanOrEqual(0);
    if (sparse) expect(summary.distance_m / report.raw_distance_m - 1).toBeLessThan(0.03);
  });

  it('has splits whose distances add up to the run', () => {
    const sum = splits.km.reduce((s, x) => s + x.distance_m, 0);
    expect(Math.abs(sum - summary.distance_m)).toBeLessThan(1);
    expect(summary.moving_s).toBeLessThanOrEqual(summary.elapsed_s + 1e-9);
  });
});

describe('sample details', () => {
  it('reads two activities from one TCX as two runs with their laps', () => {
    const runs = parseTrackFile(read('two-activities.tcx'));
    expect(runs).toHaveLength(2);
    expect(runs.map((r) => r.laps.length)).toEqual([15, 11]); // 26 laps in all (SOURCES.tsv)
    const lapSum = runs[0]!.laps.reduce((s, l) => s + (l.distance_m ?? 0), 0);
    expect(lapSum).toBeCloseTo(14332.3, 1); // REFERENCE.tsv laps_sum activity 1
  });

  it('keeps device laps as recorded', () => {
    const [run] = parseTrackFile(read('treadmill-no-position.tcx'));
    expect(run!.laps[0]).toMatchObject({
      start_t: Date.parse('2025-10-24T15:25:26Z'),
      total_time_s: 681.55,
      distance_m: 1609.34,
    });
    expect(run!.laps).toHaveLength(3);
  });

  it('reads heart rate and cadence from the RunCadence extension of an indoor run', () => {
    const [run] = parseTrackFile(read('treadmill-no-position.tcx'));
    const points = run!.track.points;
    expect(points.every((p) => p.lat === undefined)).toBe(true);
    expect(points.filter((p) => p.hr !== undefined)).toHaveLength(215);
    expect(points.some((p) => (p.cad ?? 0) > 0)).toBe(true);
  });

  it('reads heart rate from a prefixed GPX extension and keeps the points without it', () => {
    const [run] = parseTrackFile(read('handheld-1s-partial-hr.gpx'));
    const withHr = run!.track.points.filter((p) => p.hr !== undefined);
    expect(run!.track.points).toHaveLength(16);
    expect(withHr).toHaveLength(9); // partial(9/16) in SOURCES.tsv
    expect(run!.track.segment_starts).toHaveLength(3);
  });

  it('reads cadence from every point despite two extensions blocks per point', () => {
    const [run] = parseTrackFile(read('run-excerpt-3-segments.gpx'));
    expect(run!.track.points.every((p) => p.cad !== undefined)).toBe(true);
    expect(run!.track.points.filter((p) => p.hr !== undefined)).toHaveLength(13);
  });

  it('drops the backwards and duplicate points of the hand-edited TCX and says how many', () => {
    const [run] = parseTrackFile(read('odd-backwards-time.tcx'));
    expect(run!.track.report).toMatchObject({ dropped_backwards: 1, merged_duplicates: 1, invalid_positions: 2 });
  });

  it('ignores the 255 bpm "no sensor" heart rate', () => {
    const [run] = parseTrackFile(read('watch-run-14-laps.tcx'));
    expect(analyseTrack(run!.track).summary.avg_hr).toBeNull();
  });

  it('has no ascent when the file has no elevation', () => {
    const [run] = parseTrackFile(read('watch-run-no-elevation.gpx'));
    expect(analyseTrack(run!.track).summary.ascent_m).toBeNull();
  });

  it('reads a gzip-compressed file whatever it is called', () => {
    const runs = parseTrackFile(gzipSync(read('run-hr-4s.gpx')));
    // The same points as the plain file: the geodesic point-to-point sum is REFERENCE.tsv's 3100.6 m
    // (the run's distance itself follows bends between the 4 s points and reads about 0.5 m more).
    expect(analyseTrack(runs[0]!.track).summary.distance_report.raw_distance_m).toBeCloseTo(3100.6, 0);
  });
});

describe('samples that are refused, each with a sentence', () => {
  it.each([
    ['empty-track.gpx', "This file's track is empty."],
    ['route-only.gpx', 'This file only has waypoints or a planned route, not a recorded track.'],
    ['waypoints-only-latin1.gpx', 'This file only has waypoints or a planned route, not a recorded track.'],
    ['lake-gpx10-no-times.gpx', 'Most points in this file have no timestamps (291 of 296), so splits cannot be computed.'],
    [
      'truncated-export.gpx',
      'This file is incomplete: it ends before the track is closed, so the export or the upload was probably cut short.',
    ],
  ])('%s', (file, message) => {
    expect(rejectionOf(read(file)).message).toBe(message);
  });
});

const gpx = (points: string, extra = ''): string =>
  `<?xml version="1.0"?><gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1" xmlns:ns3="urn:x">${extra}<trk><trkseg>${points}</trkseg></trk></gpx>`;
const pt = (s: number, lat = '46.2', lon = '-31.4', inner = ''): string =>
  `<trkpt lat="${lat}" lon="${lon}"><time>2024-09-14T06:30:${String(s).padStart(2, '0')}Z</time>${inner}</trkpt>`;

describe('messy inputs built here', () => {
  it.each<[string, string, number]>([
    ['missing elevation', gpx(pt(0) + pt(1, '46.20003') + pt(2, '46.20006')), 3],
    [
      'missing heart rate on some points',
      gpx(
        pt(
          0,
          '46.2',
          '-31.4',
          '<extensions><ns3:TrackPointExtension><ns3:hr>140</ns3:hr></ns3:TrackPointExtension></extensions>',
        ) + pt(1, '46.20003'),
      ),
      2,
    ],
    ['duplicate timestamps', gpx(pt(0) + pt(0, '46.20001') + pt(1, '46.20003')), 2],
    ['a time that goes backwards', gpx(pt(0) + pt(5, '46.20003') + pt(3, '46.20001') + pt(6, '46.20006')), 3],
    [
      'NaN and out-of-range coordinates among good points',
      gpx(pt(0) + pt(1, 'NaN') + pt(2, '95') + pt(3, '46.2', '200') + pt(4, '46.20003')),
      2,
    ],
    [
      'a time with a zone offset and fractions',
      gpx(pt(0) + '<trkpt lat="46.2" lon="-31.4"><time>2024-09-14T08:30:05.123456+02:00</time></trkpt>'),
      2,
    ],
  ])('imports %s', (_label, xml, count) => {
    const [run] = parseTrackFile(Buffer.from(xml));
    expect(run!.track.points).toHaveLength(count);
    const { summary } = analyseTrack(run!.track);
    expect(Number.isFinite(summary.distance_m)).toBe(true);
  });

  it.each<[string, Buffer | string, string]>([
    ['an empty file', '', 'This file is empty.'],
    ['a single point', gpx(pt(0)), "This file's track has a single point, so there is no distance or time to split."],
    [
      'no timestamps',
      gpx('<trkpt lat="1" lon="1"></trkpt><trkpt lat="1" lon="1.001"></trkpt>'),
      'This file has no timestamps, so splits cannot be computed.',
    ],
    ['only invalid coordinates', gpx(pt(0, 'x') + pt(1, '91')), "This file's track has no valid positions or distances."],
    [
      'an HTML page renamed .gpx',
      '<!DOCTYPE html><html><body>Sign in</body></html>',
      'This file is not a GPS track (it looks like a web page, HTML).',
    ],
    [
      'JPEG bytes renamed .gpx',
      Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46]),
      'This file is not a GPS track (it looks like an image).',
    ],
    ['plain text', 'lat,lon\n1,2\n', 'This file is not a GPS track: Pacewright reads GPX and TCX files from a watch or app.'],
    [
      'other XML',
      '<?xml version="1.0"?><invoice><total>3</total></invoice>',
      'This file is not a GPS track: Pacewright reads GPX and TCX files from a watch or app.',
    ],
    [
      'a TCX course (planned route)',
      '<TrainingCenterDatabase><Courses><Course><Track/></Course></Courses></TrainingCenterDatabase>',
      'This file only has a planned course, not a recorded run.',
    ],
    [
      'a gzip file that is cut short',
      gzipSync(Buffer.from(gpx(pt(0) + pt(1)))).subarray(0, 30),
      'This compressed file is damaged or incomplete, so it cannot be opened.',
    ],
  ])('refuses %s', (_label, input, message) => {
    expect(rejectionOf(typeof input === 'string' ? Buffer.from(input) : input).message).toBe(message);
  });

  it('refuses an XML entity bomb without expanding it', () => {
    const bomb =
      '<?xml version="1.0"?><!DOCTYPE gpx [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;">' +
      '<!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;"><!ENTITY d "&c;&c;&c;&c;&c;&c;&c;&c;&c;&c;">]>' +
      gpx(pt(0, '46.2', '-31.4', '<name>&d;&d;&d;&d;</name>') + pt(1)).replace('<?xml version="1.0"?>', '');
    const rejection = rejectionOf(bomb);
    expect(rejection.code).toBe('xml-entities');
    expect(rejection.message).toMatch(/declares XML entities/);
  });

  it('refuses an external entity and never reads it', () => {
    const xxe = `<?xml version="1.0"?><!DOCTYPE gpx [<!ENTITY secret SYSTEM "file:///etc/passwd">]>${gpx(pt(0, '46.2', '-31.4', '<name>&secret;</name>') + pt(1)).replace('<?xml version="1.0"?>', '')}`;
    expect(rejectionOf(xxe).code).toBe('xml-entities');
  });

  it('refuses a document that names an external DTD, even without entities', () => {
    for (const doctype of ['<!DOCTYPE gpx SYSTEM "http://lake.invalid/gpx.dtd">', '<!DOCTYPE gpx PUBLIC "-//X//Y" "gpx.dtd">']) {
      const withDtd = gpx(pt(0) + pt(1)).replace('<?xml version="1.0"?>', `<?xml version="1.0"?>${doctype}`);
      expect(rejectionOf(withDtd).code).toBe('xml-external-dtd');
    }
  });

  it('decodes only the predefined entities in a document it accepts', () => {
    const [run] = parseTrackFile(
      Buffer.from(gpx(pt(0) + pt(1, '46.20003')).replace('<trk>', '<trk><name>Tom &amp; Lake</name>')),
    );
    expect(run!.name).toBe('Tom & Lake');
  });

  it('refuses malformed XML with a sentence', () => {
    const broken = gpx(pt(0) + pt(1)).replace('</trkseg>', '</trksegment>');
    expect(rejectionOf(broken).code).toBe('malformed-xml');
  });

  it('imports a TCX trackpoint without position when it carries distance', () => {
    const tcx =
      '<TrainingCenterDatabase><Activities><Activity Sport="Running"><Lap StartTime="2024-09-14T06:30:00Z"><Track>' +
      '<Trackpoint><Time>2024-09-14T06:30:00Z</Time><DistanceMeters>0</DistanceMeters></Trackpoint>' +
      '<Trackpoint><Time>2024-09-14T06:35:00Z</Time><DistanceMeters>1000</DistanceMeters><HeartRateBpm><Value>150</Value></HeartRateBpm></Trackpoint>' +
      '</Track></Lap></Activity></Activities></TrainingCenterDatabase>';
    const [run] = parseTrackFile(Buffer.from(tcx));
    const { summary, splits } = analyseTrack(run!.track);
    expect(summary.distance_m).toBe(1000);
    expect(splits.km[0]!.pace_s).toBe(300);
  });
});

describe('parseIsoTime', () => {
  it.each<[string, number]>([
    ['2024-09-14T06:30:00Z', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['2024-09-14T06:30:00.5Z', Date.UTC(2024, 8, 14, 6, 30, 0, 500)],
    ['2020-12-27T15:59:36.000+01:00', Date.UTC(2020, 11, 27, 14, 59, 36)],
    ['2020-12-27T15:59:36-0130', Date.UTC(2020, 11, 27, 17, 29, 36)],
    ['2024-09-14T06:30:00', Date.UTC(2024, 8, 14, 6, 30, 0)],
  ])('%s', (text, expected) => {
    expect(parseIsoTime(text)).toBe(expected);
  });

  it.each(['', 'yesterday', '2024-13-01T00:00:00Z', '1726295400'])('gives NaN for "%s"', (text) => {
    expect(parseIsoTime(text)).toBeNaN();
  });
});
