import { z } from 'zod';
import { parseClockTime } from './clock-time.ts';
import { MILE_M, RACE_DISTANCE_CHOICES } from './distances.ts';
import type { RaceEquivalent } from './equivalence.ts';
import { checkNegativeSplit, checkRaceDistance, checkRacePace, checkRaceResult, checkRaceTime } from './limits.ts';
import {
  DEPRECATED_INDEX_SOURCE,
  DEPRECATED_TRAINING_PACE_KINDS,
  DEPRECATION_NOTICE,
  type DeprecatedTrainingPaces,
} from './deprecated-training-paces.ts';
import type { Pace, SplitTable } from './paces.ts';
import { RACE_EFFORTS, type RaceEffortKind, type TrainingRanges } from './training-ranges.ts';

/**
 * A number from a query string (or a form): text is read as a number, blank counts as missing.
 * `missing` and `notNumber` are the sentences for those two cases.
 */
function numberInput(missing: string, notNumber: string) {
  return z.preprocess(
    (value) => (typeof value === 'string' ? (value.trim() === '' ? undefined : Number(value)) : value),
    z.number({ error: (issue) => (issue.input === undefined ? missing : notNumber) }),
  );
}

const DistanceParamSchema = numberInput(
  'Give the race distance in metres (distance_m), e.g. 21097.5 for a half marathon.',
  'The distance must be a number of metres, e.g. 21097.5 for a half marathon.',
).superRefine((distanceM, ctx) => {
  const problem = checkRaceDistance(distanceM);
  if (problem) ctx.addIssue({ code: 'custom', message: problem });
});

const TimeParamSchema = numberInput(
  'Give the race time in seconds (time_s), e.g. 5100 for 1:25:00.',
  'The time must be a number of seconds, e.g. 5100 for 1:25:00.',
).superRefine((timeS, ctx) => {
  const problem = checkRaceTime(timeS);
  if (problem) ctx.addIssue({ code: 'custom', message: problem });
});

/**
 * Checks the pace of a query whose distance and time each passed their own checks (a field that failed already
 * has its issue); adds the pace problem to `time_s`. True when distance, time and pace are all fine.
 */
function addPaceIssue(q: { distance_m: number; time_s: number }, ctx: z.RefinementCtx): boolean {
  if (checkRaceDistance(q.distance_m) || checkRaceTime(q.time_s)) return false;
  const problem = checkRacePace(q.distance_m, q.time_s);
  if (problem) ctx.addIssue({ code: 'custom', message: problem, path: ['time_s'] });
  return problem === null;
}

export const PaceUnitSchema = z.enum(['mi', 'km'], { error: 'Unit must be mi or km.' });

/** `GET /api/tools/equivalents?distance_m=&time_s=`: a race result in metres and seconds. */
export const EquivalentsQuerySchema = z
  .object({ distance_m: DistanceParamSchema, time_s: TimeParamSchema })
  .superRefine((q, ctx) => {
    addPaceIssue(q, ctx);
  });
export type EquivalentsQuery = z.infer<typeof EquivalentsQuerySchema>;

/**
 * `GET /api/tools/paces?distance_m=&time_s=&unit=&negative_split_s=`: a goal (or a result) in metres and seconds,
 * the split table's unit (default mi) and the negative split in seconds (default 0, even pacing). `include=training_paces`
 * adds the deprecated field of the previous release (kept for one release).
 */
export const PacesQuerySchema = z
  .object({
    distance_m: DistanceParamSchema,
    time_s: TimeParamSchema,
    unit: PaceUnitSchema.default('mi'),
    negative_split_s: numberInput(
      'Give the negative split in seconds, or leave it out for even pacing.',
      'The negative split must be a number of seconds, e.g. 60 for a second half one minute faster.',
    ).optional(),
    include: z
      .enum(['training_paces'], { error: 'include can only be training_paces (deprecated), or left out.' })
      .optional()
      .meta({
        deprecated: true,
        description: 'Deprecated, for one release: training_paces adds the previous release’s field; read training_ranges.',
      }),
  })
  .superRefine((q, ctx) => {
    if (!addPaceIssue(q, ctx)) return;
    const splitProblem = checkNegativeSplit(q.negative_split_s ?? 0, q.time_s);
    if (splitProblem) ctx.addIssue({ code: 'custom', message: splitProblem, path: ['negative_split_s'] });
  })
  .transform((q) => ({ ...q, negative_split_s: q.negative_split_s ?? 0 }));
export type PacesQuery = z.infer<typeof PacesQuerySchema>;

export const RaceEquivalentSchema = z.object({
  distance_m: z.number(),
  riegel_s: z.number(),
  daniels_gilbert_s: z.number(),
}) satisfies z.ZodType<RaceEquivalent>;

export const EquivalentsResponseSchema = z.object({ equivalents: z.array(RaceEquivalentSchema) });
export type EquivalentsResponse = z.infer<typeof EquivalentsResponseSchema>;

const PaceSchema = z.object({ s_per_km: z.number(), s_per_mi: z.number() }) satisfies z.ZodType<Pace>;

const SplitTableSchema = z.object({
  unit: PaceUnitSchema,
  distance_m: z.number(),
  goal_s: z.number(),
  negative_split_s: z.number(),
  halves: z.tuple([
    z.object({ distance_m: z.number(), time_s: z.number(), pace: PaceSchema }),
    z.object({ distance_m: z.number(), time_s: z.number(), pace: PaceSchema }),
  ]),
  splits: z.array(
    z.object({
      n: z.number(),
      distance_m: z.number(),
      split_distance_m: z.number(),
      cumulative_s: z.number(),
      split_s: z.number(),
      pace_s_per_unit: z.number(),
    }),
  ),
  checkpoints: z.array(z.object({ distance_m: z.number(), cumulative_s: z.number(), segment_s: z.number() })),
}) satisfies z.ZodType<SplitTable>;

const RACE_EFFORT_KINDS = RACE_EFFORTS.map((e) => e.kind) as [RaceEffortKind, ...RaceEffortKind[]];

const TrainingRangeSchema = z.discriminatedUnion('basis', [
  z.object({
    basis: z.literal('marathon-effort'),
    kind: z.enum(['easy', 'steady']),
    label: z.string(),
    purpose: z.string(),
    /** The range is this share slower (more time per km) than the Daniels & Gilbert marathon effort, 0.12 = 12 %. */
    slower_low: z.number(),
    slower_high: z.number(),
    fast: PaceSchema,
    slow: PaceSchema,
    source: z.string(),
  }),
  z.object({
    basis: z.literal('race-equivalent'),
    kind: z.enum(RACE_EFFORT_KINDS),
    label: z.string(),
    purpose: z.string(),
    distance_m: z.number(),
    shorthand: z.enum(['MP', 'HMP', '10K', '5K']).nullable(),
    riegel: PaceSchema,
    daniels_gilbert: PaceSchema,
    fast: PaceSchema,
    slow: PaceSchema,
    source: z.string(),
  }),
]);

const TrainingRangesSchema = z.object({
  result: z.object({ distance_m: z.number(), time_s: z.number() }),
  ranges: z.array(TrainingRangeSchema),
}) satisfies z.ZodType<TrainingRanges>;

const DeprecatedTrainingPacesSchema = z
  .object({
    notice: z.literal(DEPRECATION_NOTICE),
    index: z.number(),
    index_source: z.literal(DEPRECATED_INDEX_SOURCE),
    ranges: z.array(
      z.object({
        kind: z.enum(DEPRECATED_TRAINING_PACE_KINDS),
        label: z.string(),
        purpose: z.string(),
        vo2max_fraction_low: z.number(),
        vo2max_fraction_high: z.number(),
        fast: PaceSchema,
        slow: PaceSchema,
        source: z.string(),
      }),
    ),
  })
  .meta({
    deprecated: true,
    description:
      'Deprecated, for one release, and only with ?include=training_paces: the previous kind values, each mapped onto one of training_ranges. Read training_ranges.',
  }) satisfies z.ZodType<DeprecatedTrainingPaces>;

/**
 * `GET /api/tools/paces` answer: the even pace, the split table and the training pace ranges (named by race effort,
 * plus easy and steady) for the same race; `training_paces` only with `?include=training_paces` (deprecated).
 */
export const PacesResponseSchema = z.object({
  distance_m: z.number(),
  time_s: z.number(),
  pace: PaceSchema,
  split_table: SplitTableSchema,
  training_ranges: TrainingRangesSchema,
  training_paces: DeprecatedTrainingPacesSchema.optional(),
});
export type PacesResponse = z.infer<typeof PacesResponseSchema>;
export type TrainingRangesAnswer = PacesResponse['training_ranges'];
export type TrainingRangeAnswer = TrainingRangesAnswer['ranges'][number];

// ---- Forms: what people type on the Tools page, turned into the query values above with the same checks. ----

export const CUSTOM_DISTANCE = 'custom';
const DISTANCE_IDS: [string, ...string[]] = [CUSTOM_DISTANCE, ...RACE_DISTANCE_CHOICES.map((c) => c.id)];

const RaceEntryFieldsSchema = z.object({
  distance: z.enum(DISTANCE_IDS, { error: 'Pick a distance.' }),
  custom_distance: z.string().optional(),
  custom_unit: z.enum(['km', 'mi'], { error: 'Pick km or mi for the distance.' }).default('km'),
  time: z.string({ error: 'Enter a time as h:mm:ss, e.g. 1:25:00.' }),
});

type RaceEntryFields = z.infer<typeof RaceEntryFieldsSchema>;
type IssueSink = { issues: Array<{ code: 'custom'; message: string; path: string[]; input: unknown }> };

/** Reads the distance and time fields, adding an issue beside the field at fault; null when any is wrong. */
function readRaceEntry(fields: RaceEntryFields, ctx: IssueSink): { distance_m: number; time_s: number } | null {
  let distanceM: number | null;
  if (fields.distance === CUSTOM_DISTANCE) {
    const text = fields.custom_distance?.trim().replace(',', '.') ?? '';
    const amount = text === '' ? Number.NaN : Number(text);
    distanceM = Number.isFinite(amount) ? amount * (fields.custom_unit === 'mi' ? MILE_M : 1000) : null;
    const problem = distanceM === null ? `Enter the distance in ${fields.custom_unit}, e.g. 30.` : checkRaceDistance(distanceM);
    if (problem) {
      ctx.issues.push({ code: 'custom', message: problem, path: ['custom_distance'], input: fields.custom_distance });
      distanceM = null;
    }
  } else {
    distanceM = RACE_DISTANCE_CHOICES.find((c) => c.id === fields.distance)!.distance_m;
  }

  const timeS = parseClockTime(fields.time);
  const timeProblem = timeS === null ? 'Enter the time as h:mm:ss or m:ss, e.g. 1:25:00 or 19:56.' : checkRaceTime(timeS);
  if (timeProblem) {
    ctx.issues.push({ code: 'custom', message: timeProblem, path: ['time'], input: fields.time });
    return null;
  }
  if (distanceM === null || timeS === null) return null;
  const problem = checkRaceResult(distanceM, timeS);
  if (problem) {
    ctx.issues.push({ code: 'custom', message: problem, path: ['time'], input: fields.time });
    return null;
  }
  return { distance_m: distanceM, time_s: timeS };
}

/**
 * The race result form (distance picked from a list or typed in km/mi, time as h:mm:ss) → the query of
 * `GET /api/tools/equivalents`. Problems are reported on `distance`, `custom_distance` and `time`.
 */
export const RaceResultFormSchema = RaceEntryFieldsSchema.transform((fields, ctx): EquivalentsQuery => {
  const entry = readRaceEntry(fields, ctx as IssueSink);
  return entry ?? z.NEVER;
});
export type RaceResultFormInput = z.input<typeof RaceResultFormSchema>;

/**
 * The pace calculator form: the race fields, the split table's unit and a negative split as m:ss (blank for even
 * pacing) → the query of `GET /api/tools/paces`. Problems are reported beside the field at fault.
 */
export const PaceFormSchema = RaceEntryFieldsSchema.extend({
  unit: PaceUnitSchema,
  negative_split: z.string().optional(),
}).transform((fields, ctx): PacesQuery => {
  const sink = ctx as IssueSink;
  const entry = readRaceEntry(fields, sink);
  const text = fields.negative_split?.trim() ?? '';
  const negativeSplitS = text === '' ? 0 : parseClockTime(text);
  if (negativeSplitS === null) {
    sink.issues.push({
      code: 'custom',
      message: 'Enter the negative split as m:ss, e.g. 1:30, or leave it blank for even pacing.',
      path: ['negative_split'],
      input: fields.negative_split,
    });
    return z.NEVER;
  }
  if (!entry) return z.NEVER;
  const problem = checkNegativeSplit(negativeSplitS, entry.time_s);
  if (problem) {
    sink.issues.push({ code: 'custom', message: problem, path: ['negative_split'], input: fields.negative_split });
    return z.NEVER;
  }
  return { ...entry, unit: fields.unit, negative_split_s: negativeSplitS };
});
export type PaceFormInput = z.input<typeof PaceFormSchema>;
