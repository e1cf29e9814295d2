import { describe, expect, it } from 'vitest';
import { HALF_MARATHON_M, MARATHON_M, MILE_M } from '../../../../shared/race/distances.ts';
import { paceFromGoal, splitTable } from '../../../../shared/race/paces.ts';

describe('paceFromGoal (international mile 1609.344 m)', () => {
  it.each<[string, number, number, number, number]>([
    // name, distance m, goal s, s/km, s/mi
    ['3:00:00 marathon', MARATHON_M, 10800, 255.9545, 411.9188], // REFERENCES.md §1 derived checks
    ['50:00 10K = 5:00/km', 10000, 3000, 300, 482.8032], // REFERENCES.md §1 (pace 5:00/km = 482.8032 s/mi)
    ['40:00 10K = 4:00/km', 10000, 2400, 240, 386.2426], // REFERENCES.md §1 (pace 4:00/km)
    ['7:00 mile', MILE_M, 420, 260.9759, 420], // REFERENCES.md §1 (pace 7:00/mi = 260.9759 s/km)
  ])('%s', (_name, d, t, perKm, perMi) => {
    const pace = paceFromGoal(d, t);
    expect(pace.s_per_km).toBeCloseTo(perKm, 4);
    expect(pace.s_per_mi).toBeCloseTo(perMi, 4);
  });
});

describe('splitTable, even pacing', () => {
  it('marathon per mile: 26 full miles then the last 0.218757 mi, finishing on the goal (REFERENCES.md §1 split bookkeeping)', () => {
    const table = splitTable(MARATHON_M, 10800, { unit: 'mi' });
    expect(table.splits).toHaveLength(27);
    expect(table.splits[0]!.distance_m).toBeCloseTo(MILE_M, 9);
    expect(table.splits[0]!.cumulative_s).toBeCloseTo(411.9188, 4); // REFERENCES.md §1: 3:00:00 marathon = 411.9188 s/mi
    expect(table.splits[25]!.distance_m).toBeCloseTo(26 * MILE_M, 6);
    const last = table.splits.at(-1)!;
    expect(last.n).toBe(27);
    expect(last.distance_m).toBe(MARATHON_M);
    expect(last.split_distance_m).toBeCloseTo(352.056, 3); // REFERENCES.md §1: 26 mi + 352.056 m
    expect(last.cumulative_s).toBeCloseTo(10800, 9);
    for (const split of table.splits) expect(split.pace_s_per_unit).toBeCloseTo(411.9188, 3);
  });

  it('marathon per km: 42 full km then 195 m (REFERENCES.md §1 split bookkeeping)', () => {
    const table = splitTable(MARATHON_M, 10800, { unit: 'km' });
    expect(table.splits).toHaveLength(43);
    expect(table.splits.at(-1)!.split_distance_m).toBeCloseTo(195, 6);
    expect(table.splits[9]!.cumulative_s).toBeCloseTo(2559.545, 2); // 10 × 255.9545 s/km, REFERENCES.md §1
  });

  it('half per mile: 13 full miles then 176.028 m (REFERENCES.md §1 split bookkeeping)', () => {
    const table = splitTable(HALF_MARATHON_M, 5100, { unit: 'mi' });
    expect(table.splits).toHaveLength(14);
    expect(table.splits.at(-1)!.split_distance_m).toBeCloseTo(176.028, 3);
  });

  it.each<[string, number, 'mi' | 'km', number]>([
    ['10 km per km: exactly 10 splits, no empty eleventh', 10000, 'km', 10],
    ['5 km per km', 5000, 'km', 5],
    ['one mile per mile', MILE_M, 'mi', 1],
    ['800 m per km: one partial split', 800, 'km', 1],
  ])('%s', (_name, d, unit, count) => {
    const table = splitTable(d, 600, { unit });
    expect(table.splits).toHaveLength(count);
    expect(table.splits.at(-1)!.distance_m).toBe(d);
    expect(table.splits.at(-1)!.cumulative_s).toBeCloseTo(600, 9);
  });

  it('checkpoints every 5 km and at the finish; none duplicated when the distance is a multiple of 5 km', () => {
    expect(splitTable(MARATHON_M, 10800, { unit: 'km' }).checkpoints.map((c) => c.distance_m)).toEqual([
      5000,
      10000,
      15000,
      20000,
      25000,
      30000,
      35000,
      40000,
      MARATHON_M,
    ]);
    expect(splitTable(10000, 2400, { unit: 'km' }).checkpoints.map((c) => c.distance_m)).toEqual([5000, 10000]);
    expect(splitTable(3000, 600, { unit: 'km' }).checkpoints.map((c) => c.distance_m)).toEqual([3000]);
  });

  it('5 km checkpoints of a 3:00:00 marathon are 1279.77 s apart (5 × 255.9545 s/km, REFERENCES.md §1)', () => {
    const { checkpoints } = splitTable(MARATHON_M, 10800, { unit: 'mi' });
    expect(checkpoints[0]!.cumulative_s).toBeCloseTo(1279.7725, 3);
    expect(checkpoints[1]!.segment_s).toBeCloseTo(1279.7725, 3);
    expect(checkpoints.at(-1)!.cumulative_s).toBeCloseTo(10800, 9);
  });
});

describe('splitTable, negative split as two even halves', () => {
  const table = splitTable(HALF_MARATHON_M, 5400, { unit: 'km', negativeSplitS: 120 });

  it('halves take (goal + N)/2 and (goal − N)/2: 1:31:00 out, 1:29:00 back', () => {
    expect(table.halves[0].time_s).toBe(2760);
    expect(table.halves[1].time_s).toBe(2640);
    expect(table.halves[0].time_s - table.halves[1].time_s).toBe(120);
    expect(table.halves[0].pace.s_per_km).toBeCloseTo(2760 / 10.54875, 9);
  });

  it('the clock at halfway is the first half time, and at the finish the goal', () => {
    // Split 10 ends at 10 km, before halfway (10.54875 km): all first-half pace.
    expect(table.splits[9]!.cumulative_s).toBeCloseTo(10000 * (2760 / 10548.75), 9);
    expect(table.splits.at(-1)!.cumulative_s).toBeCloseTo(5400, 9);
  });

  it('paces are constant within each half and the split over halfway mixes them', () => {
    const first = table.halves[0].pace.s_per_km;
    const second = table.halves[1].pace.s_per_km;
    expect(table.splits[0]!.pace_s_per_unit).toBeCloseTo(first, 9);
    expect(table.splits[20]!.pace_s_per_unit).toBeCloseTo(second, 9);
    const straddling = table.splits[10]!; // 10 → 11 km
    expect(straddling.pace_s_per_unit).toBeLessThan(first);
    expect(straddling.pace_s_per_unit).toBeGreaterThan(second);
  });

  it('a negative split of 0 is even pacing', () => {
    const even = splitTable(HALF_MARATHON_M, 5400, { unit: 'km', negativeSplitS: 0 });
    expect(even.halves[0].time_s).toBe(even.halves[1].time_s);
    expect(even.negative_split_s).toBe(0);
  });

  it.each<[string, number, number, number]>([
    ['zero distance', 0, 5400, 0],
    ['zero goal', 10000, 0, 0],
    ['negative split below 0', 10000, 2400, -1],
    ['negative split as large as the goal', 10000, 2400, 2400],
    ['NaN split', 10000, 2400, Number.NaN],
  ])('refuses %s', (_name, d, goal, n) => {
    expect(() => splitTable(d, goal, { unit: 'km', negativeSplitS: n })).toThrow(RangeError);
  });
});
