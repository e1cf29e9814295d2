import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseTrackFile } from '../../../../server/features/runs/parse/parse-track-file.ts';
import { activityKindOf } from '../../../../shared/runs/activity-kind.ts';
import { analyseTrack } from '../../../../shared/tracks/analyse.ts';

const read = (name: string) => readFileSync(path.join('fixtures/gps-samples', name));

describe('activityKindOf: the rule', () => {
  const hour = { distance_m: 10_000, moving_s: 3600 };
  it.each<[string | null, { distance_m: number; moving_s: number }, string]>([
    ['Biking', hour, 'ride'],
    ['cycling', hour, 'ride'],
    ['Hiking', hour, 'hike'],
    ['walking', hour, 'hike'],
    ['Running', hour, 'run'],
    ['Other', hour, 'run'],
    [null, hour, 'run'],
    // 6.6 m/s for 10 min: quicker than any runner holds (the 10 000 m record is about 6.37 m/s), even if the file says running.
    ['Running', { distance_m: 3960, moving_s: 600 }, 'ride'],
    // 6.6 m/s for only 4 min is not judged by speed.
    [null, { distance_m: 1584, moving_s: 240 }, 'run'],
    // 1.2 m/s (walking pace) for 2 h: a hike, unless the file says it is a run.
    [null, { distance_m: 8640, moving_s: 7200 }, 'hike'],
    ['Running', { distance_m: 8640, moving_s: 7200 }, 'run'],
    // Walking pace for 50 min is not long enough to call it a hike.
    [null, { distance_m: 3600, moving_s: 3000 }, 'run'],
  ])('sport %s, %o → %s', (sport, summary, kind) => {
    expect(activityKindOf(sport, summary)).toBe(kind);
  });
});

describe('activityKindOf on the sample files (fixtures/gps-samples/SOURCES.tsv)', () => {
  it.each<[string, number, string]>([
    // TCX Sport="Biking".
    ['ride-excerpt-distance-offset.tcx', 0, 'ride'],
    // No <type>; 16.4 km in about 6.6 h of moving time over 10.2 h (0.69 m/s): a hike.
    ['handheld-10h-extensions.gpx', 0, 'hike'],
    // No <type>; 10.19 km in 25 min of moving time (6.8 m/s, 2:27/km): no runner's speed.
    ['watch-run-no-elevation.gpx', 0, 'ride'],
    ['watch-run-15-laps.tcx', 0, 'run'],
    ['two-activities.tcx', 1, 'run'],
    ['run-hr-4s.gpx', 0, 'run'],
    ['run-excerpt-3-segments.gpx', 0, 'run'],
    // No <type>, and a ride's speeds that a fast runner also runs (median 4.4 m/s, never over 6 m/s
    // over 30 s): nothing in the file tells it from a run, so it comes in as a run and the runner changes it.
    ['ride-1s-4-segments.gpx', 0, 'run'],
  ])('%s (activity %i) → %s', (file, activity, kind) => {
    const run = parseTrackFile(read(file))[activity]!;
    expect(activityKindOf(run.sport, analyseTrack(run.track).summary)).toBe(kind);
  });
});
