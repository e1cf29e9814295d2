import { describe, expect, it } from 'vitest';
import { isSameRun, SAME_RUN_DISTANCE_SHARE, SAME_RUN_START_S } from '../../../../shared/runs/duplicates.ts';

// Issue #14's rule: start within 5 s, distance within 2 % (of the longer). The limits are ours, from
// the sample files: REFERENCE.tsv's device and position distances of one run differ by at most 0.55 %.
describe('isSameRun', () => {
  const run = { started_at_t: Date.UTC(2026, 10, 1, 7), distance_m: 10_000 };
  it.each<[string, number, number, boolean]>([
    ['the same start and distance', 0, 10_000, true],
    ['5 s later, 2 % shorter (the edges)', 5_000, 9_800, true],
    ['5 s earlier, 200 m longer (under 2 % of 10 200 m)', -5_000, 10_200, true],
    ['5.001 s later', 5_001, 10_000, false],
    ['2.1 % shorter', 0, 9_790, false],
    ['a day later', 86_400_000, 10_000, false],
  ])('%s → %s', (_, shiftMs, distance, same) => {
    const other = { started_at_t: run.started_at_t + shiftMs, distance_m: distance };
    expect(isSameRun(run, other)).toBe(same);
    expect(isSameRun(other, run)).toBe(same);
  });

  it('two runs without distance (a treadmill file without any) starting together are the same run', () => {
    expect(isSameRun({ ...run, distance_m: 0 }, { ...run, distance_m: 0 })).toBe(true);
    expect(SAME_RUN_START_S).toBe(5);
    expect(SAME_RUN_DISTANCE_SHARE).toBe(0.02);
  });
});
