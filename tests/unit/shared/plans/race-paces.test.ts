import { describe, expect, it } from 'vitest';
import { racePacesFor } from '../../../../shared/plans/race-paces.ts';

const MARATHON_GOAL = { date: '2027-04-18', distance_m: 42195, time_s: 3 * 3600 };

describe('racePacesFor', () => {
  it('a marathon goal of 3:00:00 gives goal pace and MP of 255.96 s/km (10800 / 42.195)', () => {
    const paces = racePacesFor(MARATHON_GOAL, [], '2026-12-01');
    expect(paces.goal).toBeCloseTo(255.955, 2);
    expect(paces.MP).toBe(paces.goal);
  });

  it('carries the goal to other distances with Daniels & Gilbert: a 3:00:00 marathon is index 53.5283 (REFERENCES.md §3.2)', () => {
    const paces = racePacesFor(MARATHON_GOAL, [], '2026-12-01');
    // Faster per km over shorter races, and in order.
    expect(paces['5K']!).toBeLessThan(paces['10K']!);
    expect(paces['10K']!).toBeLessThan(paces.HMP!);
    expect(paces.HMP!).toBeLessThan(paces.MP!);
  });

  it('prefers a recent race result for the other paces: a half in 1:25:00 (index 54.4535) gives HMP = 5100 / 21.0975', () => {
    const paces = racePacesFor(MARATHON_GOAL, [{ date: '2026-10-01', distance_m: 21097.5, time_s: 5100 }], '2026-12-01');
    expect(paces.HMP).toBeCloseTo(5100 / 21.0975, 1);
    expect(paces.MP).toBeCloseTo(255.955, 2); // still the goal's own pace
  });

  it('ignores results older than half a year or in the future', () => {
    const old = racePacesFor(null, [{ date: '2025-01-01', distance_m: 10000, time_s: 2400 }], '2026-12-01');
    expect(old).toEqual({});
    const future = racePacesFor(null, [{ date: '2027-01-01', distance_m: 10000, time_s: 2400 }], '2026-12-01');
    expect(future).toEqual({});
  });

  it('with a 10K result only: 10K pace is 240 s/km, no goal pace', () => {
    const paces = racePacesFor(null, [{ date: '2026-11-01', distance_m: 10000, time_s: 2400 }], '2026-12-01');
    expect(paces.goal).toBeUndefined();
    expect(paces['10K']).toBeCloseTo(240, 1);
  });
});
