import { describe, expect, it } from 'vitest';
import { lapCoverageProblem } from '../../../../shared/tracks/lap-coverage.ts';
import type { DeviceLap } from '../../../../shared/tracks/types.ts';

const lap = (total_time_s: number | null, distance_m: number | null): DeviceLap => ({
  start_t: 0,
  total_time_s,
  distance_m,
  avg_hr: null,
  max_hr: null,
});

describe('lapCoverageProblem', () => {
  it('refuses 1 s and 2.7 m of track beside two laps of 2283 s and 6839.97 m (odd-backwards-time.tcx, REFERENCE.tsv)', () => {
    const laps = [lap(2283, 6839.97), lap(2283, 6839.97)];
    // 13 679.94 m / 1609.344 m per mile (shared/REFERENCES.md §1) = 8.50 mi; 4566 s = 1:16:06.
    expect(lapCoverageProblem({ elapsed_s: 1, distance_m: 2.7 }, laps, { dropped_backwards: 1 })).toBe(
      'Times in this file go backwards: 1 point earlier than the one before was left out, and the track left covers only 0:01 and 3 m, while its device laps record 1:16:06 and 13.68 km (8.50 mi). Nothing was imported: export the activity from the device again.',
    );
    expect(lapCoverageProblem({ elapsed_s: 1, distance_m: 2.7 }, laps, { dropped_backwards: 0 })).toMatch(
      /^This file's track covers only 0:01 and 3 m, while its device laps record/,
    );
  });

  it('keeps a track covering a tenth of its laps in time or in distance (an excerpt), and tracks without laps', () => {
    const laps = [lap(2283, 6839.97)];
    // ride-excerpt-distance-offset.tcx: 463 s and 1376.1 m of a 2283 s, 6840 m lap.
    expect(lapCoverageProblem({ elapsed_s: 463, distance_m: 1376.1 }, laps, { dropped_backwards: 0 })).toBeNull();
    expect(lapCoverageProblem({ elapsed_s: 300, distance_m: 10 }, laps, { dropped_backwards: 3 })).toBeNull();
    expect(lapCoverageProblem({ elapsed_s: 10, distance_m: 700 }, laps, { dropped_backwards: 3 })).toBeNull();
    expect(lapCoverageProblem({ elapsed_s: 1, distance_m: 1 }, [], { dropped_backwards: 3 })).toBeNull();
  });

  it('small laps (under 5 min and 1 km) are not weighed; laps with only a time are judged on time', () => {
    expect(lapCoverageProblem({ elapsed_s: 1, distance_m: 1 }, [lap(200, 900)], { dropped_backwards: 0 })).toBeNull();
    expect(lapCoverageProblem({ elapsed_s: 10, distance_m: 5 }, [lap(3600, null)], { dropped_backwards: 2 })).toMatch(
      /2 points earlier than the one before were left out.*device laps record 1:00:00\. Nothing/,
    );
  });
});
