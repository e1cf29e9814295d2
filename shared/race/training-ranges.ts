import type { RelativePaceRef } from '../plans/types.ts';
import { HALF_MARATHON_M, MARATHON_M, MILE_M } from './distances.ts';
import { raceEquivalentAt, type RaceEquivalent } from './equivalence.ts';
import type { Pace } from './paces.ts';

/**
 * Training pace ranges, named by race effort (product.md's vocabulary): the hard kinds of session at the runner's
 * equivalent race efforts (race equivalents by Riegel 1981 and Daniels & Gilbert 1979, the same two models as the
 * equivalents table), plus an easy and a steady range set relative to the runner's marathon effort. The widths of
 * easy and steady are our own choice, said so in the data (`source`).
 */

/** A race-named pace of the plan shorthand (`@ MP`, `@ HMP`, `@ 10K`, `@ 5K`); `goal` is not a race effort. */
export type RaceEffortShorthand = Exclude<RelativePaceRef, 'goal'>;

export interface RaceEffort {
  kind: 'marathon-effort' | 'half-marathon-effort' | '10k-effort' | '5k-effort' | 'mile-effort';
  label: string;
  distance_m: number;
  /** How a plan names this pace (`@ MP`), or null when the shorthand has no name for it. */
  shorthand: RaceEffortShorthand | null;
  purpose: string;
}

/** The race efforts, slowest first. Labels are the words of the Tools page and the plan editor alike. */
export const RACE_EFFORTS: readonly RaceEffort[] = [
  {
    kind: 'marathon-effort',
    label: 'Marathon effort',
    distance_m: MARATHON_M,
    shorthand: 'MP',
    purpose: 'Blocks of a long run at the pace a marathon would take today.',
  },
  {
    kind: 'half-marathon-effort',
    label: 'Half marathon effort',
    distance_m: HALF_MARATHON_M,
    shorthand: 'HMP',
    purpose: 'Tempo runs of 20–40 minutes, or long reps with short jogs.',
  },
  {
    kind: '10k-effort',
    label: '10K effort',
    distance_m: 10_000,
    shorthand: '10K',
    purpose: 'Reps of 1–2 km with jog recoveries.',
  },
  {
    kind: '5k-effort',
    label: '5K effort',
    distance_m: 5000,
    shorthand: '5K',
    purpose: 'Reps of 400 m to 1 km with jog recoveries.',
  },
  {
    kind: 'mile-effort',
    label: 'Mile effort',
    distance_m: MILE_M,
    shorthand: null,
    purpose: 'Short reps of 200–400 m and strides, with full recoveries.',
  },
];

export type RaceEffortKind = RaceEffort['kind'];

/** The race effort a shorthand name stands for: `MP` → marathon effort. */
export function raceEffortOf(shorthand: RaceEffortShorthand): RaceEffort {
  return RACE_EFFORTS.find((e) => e.shorthand === shorthand)!;
}

/**
 * What a race-named pace of a plan is called on screen: "Goal race pace", or the race effort's label ("Marathon
 * effort" for `MP`). The plan editor, the plan check and the Tools page all use these words.
 */
export function raceNamedPaceLabel(ref: RelativePaceRef): string {
  return ref === 'goal' ? 'Goal race pace' : raceEffortOf(ref).label;
}

/** A range set relative to marathon effort: `slower_low`–`slower_high` more time per km than it (0.12 = 12 %). */
export interface MarathonEffortRangeRule {
  kind: 'easy' | 'steady';
  label: string;
  slower_low: number;
  slower_high: number;
  purpose: string;
}

/**
 * Easy: 12–30 % more time per km than marathon effort (a 4:30/km marathon effort gives 5:02–5:51/km). OUR OWN
 * CHOICE, not a published rule: wide on purpose, so the slow end covers recovery days, and its fast end leaves a
 * clear gap below marathon effort. Easy days go by feel first; the range is a ceiling on pace, not a target.
 */
export const EASY_RULE: MarathonEffortRangeRule = {
  kind: 'easy',
  label: 'Easy',
  slower_low: 0.12,
  slower_high: 0.3,
  purpose: 'Most of the week’s running: easy days, long runs and recovery runs.',
};

/**
 * Steady: 4–12 % more time per km than marathon effort, between easy and marathon effort with no gap or overlap.
 * OUR OWN CHOICE, not a published rule.
 */
export const STEADY_RULE: MarathonEffortRangeRule = {
  kind: 'steady',
  label: 'Steady',
  slower_low: 0.04,
  slower_high: 0.12,
  purpose: 'Steady runs and the middle of long runs: a notch quicker than easy.',
};

export type TrainingRangeKind = MarathonEffortRangeRule['kind'] | RaceEffortKind;

/** "12–30 % more time per km than marathon effort": a rule in words, for notes and flag sources. */
export function describeMarathonEffortRule(rule: Pick<MarathonEffortRangeRule, 'slower_low' | 'slower_high'>): string {
  return `${Math.round(rule.slower_low * 100)}–${Math.round(rule.slower_high * 100)} % more time per km than marathon effort`;
}

/** Where each kind of range comes from; carried in the data so the page and the API can say it. */
export const RACE_EQUIVALENTS_SOURCE = 'Riegel (1981) and Daniels & Gilbert (1979) race equivalents';
export const OWN_CHOICE_SOURCE = 'our own choice';

/** A pace in seconds per km, also per mile (1609.344 m, REFERENCES.md §1). */
export function paceFromSecondsPerKm(sPerKm: number): Pace {
  return { s_per_km: sPerKm, s_per_mi: (sPerKm * MILE_M) / 1000 };
}

/**
 * The range `rule` gives around a marathon effort of `marathonEffortSPerKm` seconds per km: fast end × (1 + low),
 * slow end × (1 + high). Throws a RangeError on a pace that is not positive and finite.
 */
export function rangeFromMarathonEffort(rule: MarathonEffortRangeRule, marathonEffortSPerKm: number): { fast: Pace; slow: Pace } {
  if (!Number.isFinite(marathonEffortSPerKm) || marathonEffortSPerKm <= 0) {
    throw new RangeError('The marathon effort pace must be a positive finite number.');
  }
  return {
    fast: paceFromSecondsPerKm(marathonEffortSPerKm * (1 + rule.slower_low)),
    slow: paceFromSecondsPerKm(marathonEffortSPerKm * (1 + rule.slower_high)),
  };
}

/**
 * The pace of one race effort for a result of `distanceM` metres in `timeS` seconds, by both equivalence models:
 * the equivalents table's row at that distance (`raceEquivalentAt`) divided by the distance. The Daniels & Gilbert
 * pace is the number a plan's `@ MP`, `@ HMP`, `@ 10K` or `@ 5K` resolves to (shared/plans/race-paces.ts).
 */
export function raceEffortPaces(
  effort: Pick<RaceEffort, 'distance_m'>,
  distanceM: number,
  timeS: number,
): { riegel: Pace; daniels_gilbert: Pace } {
  const row: RaceEquivalent = raceEquivalentAt(distanceM, timeS, effort.distance_m);
  const km = effort.distance_m / 1000;
  return { riegel: paceFromSecondsPerKm(row.riegel_s / km), daniels_gilbert: paceFromSecondsPerKm(row.daniels_gilbert_s / km) };
}

interface RangeCommon {
  label: string;
  purpose: string;
  /** The faster and the slower end of the range. */
  fast: Pace;
  slow: Pace;
  source: string;
}

/** A hard kind of session at a race effort; its range spans the two models (the same pace when they agree). */
export interface RaceEffortRange extends RangeCommon {
  basis: 'race-equivalent';
  kind: RaceEffortKind;
  distance_m: number;
  shorthand: RaceEffortShorthand | null;
  riegel: Pace;
  daniels_gilbert: Pace;
}

/** Easy or steady: a band of time per km slower than the Daniels & Gilbert marathon effort. */
export interface MarathonEffortRange extends RangeCommon {
  basis: 'marathon-effort';
  kind: MarathonEffortRangeRule['kind'];
  slower_low: number;
  slower_high: number;
}

export type TrainingRange = RaceEffortRange | MarathonEffortRange;

export interface TrainingRanges {
  /** The race result the ranges come from. */
  result: { distance_m: number; time_s: number };
  /** Slowest first: easy, steady, then marathon, half marathon, 10K, 5K and mile effort. */
  ranges: TrainingRange[];
}

/**
 * Training pace ranges from a race result of `distanceM` metres in `timeS` seconds. Race-effort ranges run from the
 * faster to the slower of the Riegel and Daniels & Gilbert paces at that distance; easy and steady are set from the
 * Daniels & Gilbert marathon effort (the pace `@ MP` uses). Throws a RangeError on a non-positive result.
 */
export function trainingRanges(distanceM: number, timeS: number): TrainingRanges {
  const efforts: RaceEffortRange[] = RACE_EFFORTS.map((effort) => {
    const { riegel, daniels_gilbert } = raceEffortPaces(effort, distanceM, timeS);
    const [fast, slow] = riegel.s_per_km <= daniels_gilbert.s_per_km ? [riegel, daniels_gilbert] : [daniels_gilbert, riegel];
    return {
      basis: 'race-equivalent',
      kind: effort.kind,
      label: effort.label,
      purpose: effort.purpose,
      distance_m: effort.distance_m,
      shorthand: effort.shorthand,
      riegel,
      daniels_gilbert,
      fast,
      slow,
      source: RACE_EQUIVALENTS_SOURCE,
    };
  });
  const marathonEffort = efforts[0]!.daniels_gilbert.s_per_km;
  const relative = [EASY_RULE, STEADY_RULE].map((rule): MarathonEffortRange => ({
    basis: 'marathon-effort',
    kind: rule.kind,
    label: rule.label,
    purpose: rule.purpose,
    slower_low: rule.slower_low,
    slower_high: rule.slower_high,
    ...rangeFromMarathonEffort(rule, marathonEffort),
    source: OWN_CHOICE_SOURCE,
  }));
  return { result: { distance_m: distanceM, time_s: timeS }, ranges: [...relative, ...efforts] };
}
