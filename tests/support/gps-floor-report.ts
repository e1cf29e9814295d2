/**
 * Prints, per route, how far generated 1 s tracks' splits are from the truth and from their own wander
 * floor (tests/support/gps-wander-floor.ts): the figures of shared/tracks/README.md, "Turnarounds and
 * corners". Not a test; run by hand:
 *
 *   node --import tsx tests/support/gps-floor-report.ts            # 1–3 m of wander, 200 tracks, seed 14
 *   SEED=15 N=200 LO=1 HI=3 node --import tsx tests/support/gps-floor-report.ts
 *   WHITE=1 LO=0.3 HI=1 node --import tsx tests/support/gps-floor-report.ts   # white jitter only (floor 0)
 *   NO_EVENTS=1 …                                                  # the same tracks without stops, pauses, gaps
 *   TSV=1 …                                                        # one line per track as well
 */
import fc from 'fast-check';
import { noise, trackOptions } from './gps-track-arbitraries.ts';
import { measureTrack } from './gps-track-check.ts';
import type { GpsNoise, GpsTrackOptions } from './gps-tracks.ts';

const count = Number(process.env.N ?? 200);
const low = Number(process.env.LO ?? 1);
const high = Number(process.env.HI ?? 3);
const noiseKind: fc.Arbitrary<GpsNoise> = process.env.WHITE
  ? fc.record({ sigma_m: fc.constant(0), tau_s: fc.constant(60), white_m: fc.double({ min: low, max: high, noNaN: true }) })
  : noise(low, high);
const samples = fc.sample(trackOptions(noiseKind, fc.constant(1)), {
  seed: Number(process.env.SEED ?? 14),
  numRuns: count,
});

interface Row {
  route: string;
  events: number;
  worst: number;
  floor: number;
  excess: number;
  total: number;
  floorTotal: number;
}
const rows: Row[] = [];
const started = process.cpuUsage();
for (const [index, sampled] of samples.entries()) {
  const options: GpsTrackOptions = process.env.NO_EVENTS
    ? { ...sampled, phases: sampled.phases.filter((phase) => phase.kind === 'run') }
    : sampled;
  const errors = measureTrack(options);
  const events = options.phases.filter((phase) => phase.kind !== 'run');
  const row: Row = {
    route: options.route,
    events: events.length,
    worst: Math.max(errors.worst_elapsed_s, errors.worst_moving_s),
    floor: Math.max(errors.floor_elapsed_s, errors.floor_moving_s),
    excess: Math.max(errors.worst_elapsed_s - errors.floor_elapsed_s, errors.worst_moving_s - errors.floor_moving_s),
    total: errors.total_error,
    floorTotal: errors.floor_total,
  };
  rows.push(row);
  if (process.env.TSV)
    console.log(
      [
        index,
        options.route,
        events.map((phase) => phase.kind[0]).join('') || '-',
        options.noise.sigma_m.toFixed(2),
        options.noise.tau_s,
        row.worst.toFixed(2),
        row.floor.toFixed(2),
        (row.total * 100).toFixed(3),
        (row.floorTotal * 100).toFixed(3),
      ].join('\t'),
    );
}
const cpu = process.cpuUsage(started);

const fixed = (value: number, digits = 2): string => value.toFixed(digits);
console.log(
  '| route | n | worst split (s) | worst floor (s) | over 4.5 s | floor over 4.5 s | worst excess over floor (s) | mean excess (s) | excess, no events (s) | worst (excess − 4 s) per event (s) | mean total | worst total − floor total |',
);
console.log('| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |');
for (const route of ['lake', 'track', 'streets', 'out-and-back', 'all']) {
  const set = rows.filter((row) => route === 'all' || row.route === route);
  if (set.length === 0) continue;
  const max = (values: number[]): number => values.reduce((a, b) => Math.max(a, b), Number.NEGATIVE_INFINITY);
  const quiet = set.filter((row) => row.events === 0);
  const busy = set.filter((row) => row.events > 0);
  console.log(
    `| ${route} | ${set.length} | ${fixed(max(set.map((r) => r.worst)))} | ${fixed(max(set.map((r) => r.floor)))} | ${
      set.filter((r) => r.worst > 4.5).length
    } | ${set.filter((r) => r.floor > 4.5).length} | ${fixed(max(set.map((r) => r.excess)))} | ${fixed(
      set.reduce((a, r) => a + r.excess, 0) / set.length,
    )} | ${quiet.length ? fixed(max(quiet.map((r) => r.excess))) : '–'} | ${
      busy.length ? fixed(max(busy.map((r) => (r.excess - 4) / r.events))) : '–'
    } | ${fixed((100 * set.reduce((a, r) => a + r.total, 0)) / set.length, 3)} % | ${fixed(
      100 * max(set.map((r) => Math.abs(r.total - r.floorTotal))),
      2,
    )} % |`,
  );
}
console.log(`\n${count} tracks, CPU ${fixed((cpu.user + cpu.system) / 1e6, 1)} s`);
