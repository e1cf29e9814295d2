import { describe, expect, it } from 'vitest';
import { racePacesFor } from '../../../../shared/plans/race-paces.ts';
import { RELATIVE_PACE_REFS } from '../../../../shared/plans/types.ts';
import {
  DEPRECATED_KIND_MAPPING,
  DEPRECATED_TRAINING_PACE_KINDS,
  deprecatedTrainingPaces,
} from '../../../../shared/race/deprecated-training-paces.ts';
import { HALF_MARATHON_M, MARATHON_M, MILE_M } from '../../../../shared/race/distances.ts';
import { oxygenCost, performanceIndex, raceEquivalents } from '../../../../shared/race/equivalence.ts';
import {
  EASY_RULE,
  OWN_CHOICE_SOURCE,
  RACE_EFFORTS,
  RACE_EQUIVALENTS_SOURCE,
  raceNamedPaceLabel,
  rangeFromMarathonEffort,
  STEADY_RULE,
  trainingRanges,
  type MarathonEffortRange,
  type RaceEffortRange,
  type TrainingRange,
} from '../../../../shared/race/training-ranges.ts';

const effortRanges = (ranges: TrainingRange[]) => ranges.filter((r): r is RaceEffortRange => r.basis === 'race-equivalent');
const relativeRange = (ranges: TrainingRange[], kind: 'easy' | 'steady') =>
  ranges.find((r): r is MarathonEffortRange => r.kind === kind)!;

/** Results of several distances, each checked below. */
const RESULTS: Array<[string, number, number]> = [
  ['half in 1:25:00', HALF_MARATHON_M, 5100],
  ['5K in 20:00', 5000, 1200],
  ['10K in 40:00', 10_000, 2400],
  ['marathon in 3:00:00', MARATHON_M, 10_800],
  ['mile in 6:00', MILE_M, 360],
  ['12 km in 55:00', 12_000, 3300],
];

describe('trainingRanges: kinds and order', () => {
  it('names its ranges by race effort plus easy and steady, slowest first', () => {
    const { ranges } = trainingRanges(HALF_MARATHON_M, 5100);
    expect(ranges.map((r) => r.kind)).toEqual([
      'easy',
      'steady',
      'marathon-effort',
      'half-marathon-effort',
      '10k-effort',
      '5k-effort',
      'mile-effort',
    ]);
    expect(ranges.map((r) => r.label)).toEqual([
      'Easy',
      'Steady',
      'Marathon effort',
      'Half marathon effort',
      '10K effort',
      '5K effort',
      'Mile effort',
    ]);
  });

  it.each(RESULTS)('for a %s, every range is slow ≥ fast and the fast ends get quicker down the list', (_n, d, t) => {
    const { ranges } = trainingRanges(d, t);
    expect(ranges.length).toBeGreaterThan(0);
    for (const r of ranges) {
      expect(r.fast.s_per_km).toBeLessThanOrEqual(r.slow.s_per_km);
      // REFERENCES.md §1: 1 mile = 1.609344 km, so s/mi = s/km × 1.609344.
      expect(r.fast.s_per_mi).toBeCloseTo(r.fast.s_per_km * 1.609344, 9);
      expect(r.slow.s_per_mi).toBeCloseTo(r.slow.s_per_km * 1.609344, 9);
    }
    const fastEnds = ranges.map((r) => r.fast.s_per_km);
    for (let i = 1; i < fastEnds.length; i++) expect(fastEnds[i]).toBeLessThan(fastEnds[i - 1]!);
  });

  it('refuses a non-positive result', () => {
    expect(() => trainingRanges(0, 1200)).toThrow(RangeError);
    expect(() => trainingRanges(5000, -1)).toThrow(RangeError);
  });
});

describe('race-effort ranges against the race equivalents table', () => {
  it.each(RESULTS)('for a %s, each effort is the table row at its distance, by both models', (_n, d, t) => {
    const table = raceEquivalents(d, t);
    const efforts = effortRanges(trainingRanges(d, t).ranges);
    expect(efforts).toHaveLength(RACE_EFFORTS.length);
    for (const range of efforts) {
      const row = table.find((r) => r.distance_m === range.distance_m)!;
      const km = range.distance_m / 1000;
      expect(range.riegel.s_per_km).toBe(row.riegel_s / km);
      expect(range.daniels_gilbert.s_per_km).toBe(row.daniels_gilbert_s / km);
      // The range spans the two models.
      expect(range.fast.s_per_km).toBe(Math.min(row.riegel_s, row.daniels_gilbert_s) / km);
      expect(range.slow.s_per_km).toBe(Math.max(row.riegel_s, row.daniels_gilbert_s) / km);
      expect(range.source).toBe(RACE_EQUIVALENTS_SOURCE);
    }
  });

  it('half 1:25:00 → marathon effort spans Riegel 10 633.151 s and Daniels & Gilbert 10 644.4 s over 42.195 km', () => {
    const marathon = effortRanges(trainingRanges(HALF_MARATHON_M, 5100).ranges).find((r) => r.kind === 'marathon-effort')!;
    expect(marathon.riegel.s_per_km * 42.195).toBeCloseTo(10_633.151, 3); // REFERENCES.md §3.1
    expect(marathon.daniels_gilbert.s_per_km * 42.195).toBeCloseTo(10_644.4, 1); // REFERENCES.md §3.2
    expect(marathon.fast).toEqual(marathon.riegel);
    expect(marathon.slow).toEqual(marathon.daniels_gilbert);
  });

  it('5K 20:00 → 10K effort by Riegel is 2501.918 s; mile 6:00 → 5K effort by Riegel is 1197.189 s (REFERENCES.md §3.1)', () => {
    const tenK = effortRanges(trainingRanges(5000, 1200).ranges).find((r) => r.kind === '10k-effort')!;
    expect(tenK.riegel.s_per_km * 10).toBeCloseTo(2501.918, 3);
    const fiveK = effortRanges(trainingRanges(MILE_M, 360).ranges).find((r) => r.kind === '5k-effort')!;
    expect(fiveK.riegel.s_per_km * 5).toBeCloseTo(1197.189, 3);
  });

  it('a marathon of 11 439.74 s (index 50) gives the Daniels & Gilbert 5K 1196.02, 10K 2479.60, half 5491.20 s (REFERENCES.md §3.2)', () => {
    expect(performanceIndex(MARATHON_M, 11_439.74)).toBeCloseTo(50, 4);
    const efforts = effortRanges(trainingRanges(MARATHON_M, 11_439.74).ranges);
    const secondsAt = (kind: string) => {
      const e = efforts.find((r) => r.kind === kind)!;
      return e.daniels_gilbert.s_per_km * (e.distance_m / 1000);
    };
    expect(secondsAt('5k-effort')).toBeCloseTo(1196.02, 1);
    expect(secondsAt('10k-effort')).toBeCloseTo(2479.6, 1);
    expect(secondsAt('half-marathon-effort')).toBeCloseTo(5491.2, 1);
  });

  it('at the result’s own distance both models give the result: one pace, 10K in 40:00 = 240 s/km (REFERENCES.md §1)', () => {
    const tenK = effortRanges(trainingRanges(10_000, 2400).ranges).find((r) => r.kind === '10k-effort')!;
    expect(tenK.fast.s_per_km).toBe(240);
    expect(tenK.slow.s_per_km).toBe(240);
  });
});

describe('the shorthand’s race-named paces and the race-effort ranges come from the same number', () => {
  it.each(RESULTS)(
    'for a %s as the recent result, @ MP, @ HMP, @ 10K and @ 5K equal the Daniels & Gilbert pace of each range',
    (_n, d, t) => {
      const paces = racePacesFor(null, [{ date: '2026-11-01', distance_m: d, time_s: t }], '2026-12-01');
      const efforts = effortRanges(trainingRanges(d, t).ranges);
      const named = efforts.filter((e) => e.shorthand !== null);
      expect(named.map((e) => e.shorthand)).toEqual(['MP', 'HMP', '10K', '5K']);
      for (const effort of named) expect(paces[effort.shorthand!]).toBe(effort.daniels_gilbert.s_per_km);
    },
  );

  it('with only a goal race, the other race efforts follow the goal as the Tools page does for that time', () => {
    const goal = { date: '2027-04-18', distance_m: MARATHON_M, time_s: 10_800 };
    const paces = racePacesFor(goal, [], '2026-12-01');
    const efforts = effortRanges(trainingRanges(MARATHON_M, 10_800).ranges);
    expect(efforts.filter((e) => e.shorthand !== null)).toHaveLength(4); // MP, HMP, 10K, 5K
    for (const effort of efforts.filter((e) => e.shorthand !== null))
      expect(paces[effort.shorthand!]).toBe(effort.daniels_gilbert.s_per_km);
  });

  it('every race-named pace has one label, shared by the Tools page and the plan editor', () => {
    expect(RELATIVE_PACE_REFS.map(raceNamedPaceLabel)).toEqual([
      'Goal race pace',
      'Marathon effort',
      'Half marathon effort',
      '10K effort',
      '5K effort',
    ]);
    for (const effort of RACE_EFFORTS.filter((e) => e.shorthand))
      expect(raceNamedPaceLabel(effort.shorthand!)).toBe(effort.label);
  });
});

describe('easy and steady: set from marathon effort (our own choice)', () => {
  it('the rules are 12–30 % and 4–12 % more time per km than marathon effort, documented as our own choice', () => {
    expect([EASY_RULE.slower_low, EASY_RULE.slower_high]).toEqual([0.12, 0.3]);
    expect([STEADY_RULE.slower_low, STEADY_RULE.slower_high]).toEqual([0.04, 0.12]);
    // Steady meets easy with no gap and no overlap.
    expect(STEADY_RULE.slower_high).toBe(EASY_RULE.slower_low);
  });

  it('marathon in 3:00:00: marathon effort 255.9545 s/km (REFERENCES.md §1) gives easy 286.669–332.741 and steady 266.193–286.669 s/km', () => {
    const { ranges } = trainingRanges(MARATHON_M, 10_800);
    const easy = relativeRange(ranges, 'easy');
    const steady = relativeRange(ranges, 'steady');
    expect(easy.fast.s_per_km).toBeCloseTo(255.9545 * 1.12, 3);
    expect(easy.fast.s_per_km).toBeCloseTo(286.669, 3);
    expect(easy.slow.s_per_km).toBeCloseTo(332.741, 3);
    expect(steady.fast.s_per_km).toBeCloseTo(266.193, 3);
    expect(steady.slow.s_per_km).toBeCloseTo(286.669, 3);
    for (const r of [easy, steady]) expect(r.source).toBe(OWN_CHOICE_SOURCE);
    expect(OWN_CHOICE_SOURCE).toMatch(/our own choice/);
  });

  it.each(RESULTS)(
    'for a %s, easy and steady are the rules applied to the Daniels & Gilbert marathon row of the table',
    (_n, d, t) => {
      const marathonRow = raceEquivalents(d, t).find((r) => r.distance_m === MARATHON_M)!;
      const marathonEffort = marathonRow.daniels_gilbert_s / 42.195;
      const { ranges } = trainingRanges(d, t);
      for (const rule of [EASY_RULE, STEADY_RULE]) {
        const range = relativeRange(ranges, rule.kind);
        expect(range.fast.s_per_km).toBe(marathonEffort * (1 + rule.slower_low));
        expect(range.slow.s_per_km).toBe(marathonEffort * (1 + rule.slower_high));
      }
      // Steady is slower than marathon effort, whichever model is quicker there.
      expect(relativeRange(ranges, 'steady').fast.s_per_km).toBeGreaterThan(marathonEffort);
    },
  );

  it.each([0, -250, Number.NaN, Number.POSITIVE_INFINITY])('refuses a marathon effort of %s s/km', (pace) => {
    expect(() => rangeFromMarathonEffort(EASY_RULE, pace)).toThrow(RangeError);
  });
});

describe('deprecated training_paces (kept one release)', () => {
  it('keeps the earlier kind values readable, each reading one of today’s ranges, with no number of its own', () => {
    const old = deprecatedTrainingPaces(HALF_MARATHON_M, 5100);
    const { ranges } = trainingRanges(HALF_MARATHON_M, 5100);
    expect(old.ranges.map((r) => r.kind)).toEqual([...DEPRECATED_TRAINING_PACE_KINDS]);
    expect(old.index).toBeCloseTo(54.4535, 4); // REFERENCES.md §3.2: half 1:25:00 → 54.4535
    expect(old.notice).toMatch(/read training_ranges/);
    for (const entry of old.ranges) {
      const today = ranges.find((r) => r.kind === DEPRECATED_KIND_MAPPING[entry.kind])!;
      expect(entry.fast).toEqual(today.fast);
      expect(entry.slow).toEqual(today.slow);
      expect(entry.label).toBe(today.label);
      // The shares are what each end costs by VO₂(v) (REFERENCES.md §3.2), not bands.
      expect(entry.vo2max_fraction_high * old.index).toBeCloseTo(oxygenCost(60_000 / today.fast.s_per_km), 9);
      expect(entry.vo2max_fraction_low * old.index).toBeCloseTo(oxygenCost(60_000 / today.slow.s_per_km), 9);
    }
  });
});
