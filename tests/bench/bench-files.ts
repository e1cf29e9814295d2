/**
 * The files `npm run bench` measures (import-bench.ts), also written by cpu-bench.ts so both read the
 * same bytes: runs of 1 h, 3 h and 30 h at 1 s around the invented lake, as GPX and as TCX.
 */
import { generateLakeRun, longRunPhases, type SyntheticOptions } from '../../shared/tracks/synthetic.ts';
import type { DeviceLap } from '../../shared/tracks/types.ts';
import { writeGpx, writeTcx } from '../../shared/tracks/write-track.ts';

/** Fixed start, seed and noise, so every run benchmarks the same bytes. */
const START_T = Date.UTC(2024, 8, 14, 6, 30, 0);
/** 1.6 m/s for 30 h covers 170 km: a 100-mile race with its stops. */
export const RUNS = [
  { label: '1h', hours: 1, speed: 3.2 },
  { label: '3h', hours: 3, speed: 3.2 },
  { label: '30h', hours: 30, speed: 1.6 },
] as const;

export function writeDocument(format: 'gpx' | 'tcx', hours: number, speed: number): string {
  const options: SyntheticOptions = {
    start_t: START_T,
    phases: longRunPhases(hours, speed),
    seed: 3,
    gps_sigma_m: 1.5,
    ele_sigma_m: 1,
    // Watches write their own running distance into TCX.
    device_distance: format === 'tcx',
  };
  const { points } = generateLakeRun(options);
  if (format === 'gpx') return writeGpx('Lake Tamsel long run', [points]);
  // One device lap per hour (the profile's 59 min running + 1 min stop).
  const laps: DeviceLap[] = [];
  for (let h = 0; h < Math.ceil(hours); h++) {
    laps.push({
      start_t: START_T + h * 3_600_000,
      total_time_s: 3600,
      distance_m: speed * 3540,
      avg_hr: null,
      max_hr: null,
    });
  }
  return writeTcx(points, laps);
}
