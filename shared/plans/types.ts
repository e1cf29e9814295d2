/**
 * The session plan model: a plan is an ordered list of items, each a part or a repeat of parts.
 * Field names are snake_case because these objects travel as JSON unchanged (api-contract.md,
 * "Plans, plan check and pace tools"). Every pace is stored in seconds per km, whatever unit
 * it was written in; `per` remembers how it was written so it can be shown back the same way.
 */

/** Part kinds, in the words of product.md. */
export const PART_KINDS = [
  'warm-up',
  'easy',
  'steady',
  'tempo',
  'goal pace',
  'rep',
  'recovery jog',
  'cool-down',
  'strides',
] as const;
export type PartKind = (typeof PART_KINDS)[number];

/** Units a distance may be written in. */
export const DISTANCE_UNITS = ['mi', 'km', 'm'] as const;
export type DistanceUnit = (typeof DISTANCE_UNITS)[number];

/**
 * How a pace was written: per mile, per km, or as a time for the part's own distance
 * (`6 x 800 m @ 2:55-3:00` means 2:55–3:00 for each 800 m).
 */
export const PACE_PERS = ['mi', 'km', 'rep'] as const;
export type PacePer = (typeof PACE_PERS)[number];

/** Paces named by a race: the goal race's pace, marathon, half marathon, 10 km and 5 km pace. */
export const RELATIVE_PACE_REFS = ['goal', 'MP', 'HMP', '10K', '5K'] as const;
export type RelativePaceRef = (typeof RELATIVE_PACE_REFS)[number];

export interface DistanceAmount {
  type: 'distance';
  /** Metres (a mile is 1609.344 m). */
  distance_m: number;
  /** The unit it was written in, used to show it back. */
  unit: DistanceUnit;
}

export interface DurationAmount {
  type: 'duration';
  /** Whole seconds. */
  duration_s: number;
}

export type PartAmount = DistanceAmount | DurationAmount;

/** A pace range; a single pace has fast = slow (the plan check applies its tolerance). */
export interface PaceTarget {
  type: 'pace';
  /** Seconds per km; fast ≤ slow. */
  fast_s_per_km: number;
  slow_s_per_km: number;
  per: PacePer;
}

/** A pace named by a race (`@ MP`), optionally shifted (`@ MP+10s/mi`: 10 s per mile slower). */
export interface RelativePaceTarget {
  type: 'relative';
  ref: RelativePaceRef;
  offset?: {
    /** Seconds per km, positive = slower; never 0 (no offset is written as no `offset`). */
    s_per_km: number;
    per: 'mi' | 'km';
  };
}

export interface HeartRateTarget {
  type: 'heart_rate';
  low_bpm: number;
  high_bpm: number;
}

/** No number to hit: run it by feel. */
export interface EffortTarget {
  type: 'effort';
}

export type PartTarget = PaceTarget | RelativePaceTarget | HeartRateTarget | EffortTarget;

export interface Part {
  type: 'part';
  kind: PartKind;
  amount: PartAmount;
  target: PartTarget;
}

/** `6 x (800 m @ 2:55-3:00, 400 m jog)`: the parts run in order, `count` times. No nesting. */
export interface Repeat {
  type: 'repeat';
  count: number;
  parts: Part[];
}

export type PlanItem = Part | Repeat;

/** One entry of the flat list the plan check walks, with where it came from. */
export interface ExpandedPart extends Part {
  /** 0-based position in the expanded list. */
  index: number;
  /** 0-based index of the plan item it came from. */
  item_index: number;
  /** Set when it came from a repeat: round 1…rounds, and its 0-based step within the round. */
  repeat: { round: number; rounds: number; step: number } | null;
}

/** Seconds per km for each race-named pace the runner has; a missing one leaves targets unresolved. */
export type RacePaces = Partial<Record<RelativePaceRef, number>>;

/** A part's target made concrete for the plan check. */
export type ResolvedTarget =
  | { type: 'pace'; fast_s_per_km: number; slow_s_per_km: number; from: 'written' | RelativePaceRef }
  | { type: 'heart_rate'; low_bpm: number; high_bpm: number }
  | { type: 'effort' }
  | { type: 'unresolved'; ref: RelativePaceRef; reason: string };

/** Guard rails shared by the shorthand parser and the API schemas. */
export const PLAN_LIMITS = {
  /** Parts and repeats at the top level. */
  maxItems: 50,
  maxRepeatCount: 50,
  /** After repeats are unrolled (6 × (rep, jog) counts 12). */
  maxExpandedParts: 200,
  minDistanceM: 1,
  maxDistanceM: 250_000,
  minDurationS: 1,
  maxDurationS: 24 * 3600,
  /** Plausible running paces, 1:30–20:00 per km, after conversion to per km. */
  fastestPaceSPerKm: 90,
  slowestPaceSPerKm: 1200,
  /** A race-relative offset is at most 2:00 per km either way. */
  maxOffsetSPerKm: 120,
  minHeartRate: 30,
  maxHeartRate: 240,
  maxTextLength: 2000,
  maxTitleLength: 120,
} as const;
