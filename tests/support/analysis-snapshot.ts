/**
 * A fingerprint of `analyseTrack` on a fixed set of files, to prove that a faster analysis gives exactly
 * the results of the one before it (issue 19, session 8). The set: every file in fixtures/gps-samples,
 * the bench's generated files (tests/bench/bench-files.ts) at a small size, and generated tracks of every
 * kind the analysis treats differently (clean, wandering, white jitter, sparse; every route; stops,
 * pauses, gaps). The fingerprint keeps summaries, splits and fastest sections as numbers (JSON writes a
 * double so that it reads back bit for bit) and each per-point series as a SHA-256 of its bytes.
 *
 * Written from a checkout of main before a change with
 *   node --import tsx tests/support/analysis-snapshot.ts > tests/unit/shared/tracks/analysis-snapshot.json
 * and compared by tests/unit/shared/tracks/analysis-snapshot.test.ts. Rewrite it only when a change of
 * results is meant (and say so in the commit).
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { parseTrackFile } from '../../server/features/runs/parse/parse-track-file.ts';
import { analyseTrack, type RunAnalysis } from '../../shared/tracks/analyse.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { writeDocument } from '../bench/bench-files.ts';
import { NO_NOISE, noise, trackOptions } from './gps-track-arbitraries.ts';
import { generateGpsTrack, type GpsNoise } from './gps-tracks.ts';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const SAMPLES = path.join(ROOT, 'fixtures/gps-samples');

export interface SnapshotCase {
  name: string;
  bytes: () => Buffer;
}

/** Generated tracks: `count` of one kind, the same on every run (fixed fast-check seed). */
function generated(kind: string, noiseOf: fc.Arbitrary<GpsNoise>, sample: number, count: number, seed: number): SnapshotCase[] {
  return fc.sample(trackOptions(noiseOf, fc.constant(sample)), { numRuns: count, seed }).map((options, k) => ({
    name: `generated ${kind} ${sample}s #${k + 1} (${options.route})`,
    bytes: () => Buffer.from(writeGpx('generated', generateGpsTrack(options).segments)),
  }));
}

const WHITE: fc.Arbitrary<GpsNoise> = fc.record({
  sigma_m: fc.constant(0),
  tau_s: fc.constant(60),
  white_m: fc.double({ min: 0.3, max: 1, noNaN: true }),
});

export function snapshotCases(): SnapshotCase[] {
  const files = readdirSync(SAMPLES)
    .filter((name) => name.endsWith('.gpx') || name.endsWith('.tcx'))
    .sort()
    .map((name) => ({ name, bytes: () => readFileSync(path.join(SAMPLES, name)) }));
  const bench = (['gpx', 'tcx'] as const).flatMap((format) => [
    { name: `bench 0.2 h ${format}`, bytes: () => Buffer.from(writeDocument(format, 0.2, 3.2)) },
    { name: `bench 1 h ${format}`, bytes: () => Buffer.from(writeDocument(format, 1, 1.6)) },
  ]);
  return [
    ...files,
    ...bench,
    ...generated('clean', NO_NOISE, 1, 4, 801),
    ...generated('wander 0.3-1 m', noise(0.3, 1), 1, 6, 802),
    ...generated('wander 1-3 m', noise(1, 3), 1, 4, 803),
    ...generated('white 0.3-1 m', WHITE, 1, 6, 804),
    ...generated('wander 0.3-1 m', noise(0.3, 1), 2, 3, 805),
    ...generated('wander 0.3-1 m', noise(0.3, 1), 5, 3, 806),
  ];
}

const digest = (array: Float64Array | Uint8Array | null): string | null =>
  array === null
    ? null
    : createHash('sha256')
        .update(Buffer.from(array.buffer, array.byteOffset, array.byteLength))
        .digest('hex');

/** What is compared: everything `analyseTrack` returns, the series by digest. */
export function fingerprint(analysis: RunAnalysis): unknown {
  const { series } = analysis;
  return {
    summary: analysis.summary,
    splits: analysis.splits,
    fastest: analysis.fastest,
    series: {
      points: series.t.length,
      distance_source: series.distance_source,
      distance_report: series.distance_report,
      t: digest(series.t),
      d: digest(series.d),
      moving: digest(series.moving),
      segment_break: digest(series.segment_break),
      ele_smooth: digest(series.ele_smooth),
      ele_filtered: digest(series.ele_filtered),
      hr: digest(series.hr),
      cad: digest(series.cad),
      flat_d: digest(series.flat_d),
    },
  };
}

/** Every run of a case, or the refusal's message when the file is refused. */
export function fingerprintCase(testCase: SnapshotCase): unknown {
  let runs;
  try {
    runs = parseTrackFile(testCase.bytes());
  } catch (error) {
    return { refused: (error as Error).message };
  }
  return runs.map((run) => fingerprint(analyseTrack(run.track)));
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const out: Record<string, unknown> = {};
  for (const testCase of snapshotCases()) out[testCase.name] = fingerprintCase(testCase);
  process.stdout.write(`${JSON.stringify(out, null, 1)}\n`);
}
