import { z } from 'zod';
import { CONTROL_CHARACTER, CONTROL_CHARACTER_MESSAGE } from '../api/text.ts';
import { calendarDateSchema } from '../api/calendar-date.ts';
import { countExpandedParts } from './expand.ts';
import { parseShorthand } from './shorthand.ts';
import { DISTANCE_UNITS, PACE_PERS, PART_KINDS, PLAN_LIMITS, RELATIVE_PACE_REFS } from './types.ts';
import type { ExpandedPart, Part, PlanItem, Repeat } from './types.ts';

const L = PLAN_LIMITS;

/** A plan's date: ISO `YYYY-MM-DD` from 1900 to 2100 (shared/api/calendar-date.ts). */
export const PlanDateSchema = calendarDateSchema('2026-10-03');

const TitleSchema = z
  .string({ error: 'A title is text.' })
  .trim()
  .max(L.maxTitleLength, `Keep the title under ${L.maxTitleLength} characters.`)
  // The server refuses these for every field (issue 13 #13); the form says so at the field as it is typed (issue 17).
  .refine((text) => !CONTROL_CHARACTER.test(text), CONTROL_CHARACTER_MESSAGE);

/** Free notes on a session ("on the track, lane 3"); blank means none. */
const NotesSchema = z
  .string({ error: 'Notes are text.' })
  .trim()
  .max(L.maxTextLength, `Keep the notes under ${L.maxTextLength} characters.`)
  .refine((text) => !CONTROL_CHARACTER.test(text), CONTROL_CHARACTER_MESSAGE);

const DistanceAmountSchema = z
  .object({
    type: z.literal('distance'),
    distance_m: z
      .number({ error: 'A distance is a number of metres.' })
      .min(L.minDistanceM, 'A part is at least 1 m long.')
      .max(L.maxDistanceM, 'A part is at most 250 km long.'),
    unit: z.enum(DISTANCE_UNITS, { error: 'A distance is written in mi, km or m.' }),
  })
  .strict();

const DurationAmountSchema = z
  .object({
    type: z.literal('duration'),
    duration_s: z
      .number({ error: 'A time is a number of seconds.' })
      .int('A time is whole seconds.')
      .min(L.minDurationS, 'A time must be at least 1 s.')
      .max(L.maxDurationS, 'A part lasts at most 24 h.'),
  })
  .strict();

export const AmountSchema = z.discriminatedUnion('type', [DistanceAmountSchema, DurationAmountSchema], {
  error: 'An amount is a distance or a time.',
});

const PaceSchema = z
  .number({ error: 'A pace is a number of seconds per km.' })
  .positive('A pace must be more than 0:00.')
  .min(L.fastestPaceSPerKm, 'A pace must be between 1:30 and 20:00 per km.')
  .max(L.slowestPaceSPerKm, 'A pace must be between 1:30 and 20:00 per km.');

const HeartRateSchema = z
  .number({ error: 'A heart rate is a number of beats per minute.' })
  .int('A heart rate is a whole number.')
  .min(L.minHeartRate, 'A heart rate is from 30 to 240 bpm.')
  .max(L.maxHeartRate, 'A heart rate is from 30 to 240 bpm.');

export const TargetSchema = z.discriminatedUnion(
  'type',
  [
    z.object({ type: z.literal('pace'), fast_s_per_km: PaceSchema, slow_s_per_km: PaceSchema, per: z.enum(PACE_PERS) }).strict(),
    z
      .object({
        type: z.literal('relative'),
        ref: z.enum(RELATIVE_PACE_REFS, { error: 'A race pace is goal, MP, HMP, 10K or 5K.' }),
        offset: z
          .object({
            s_per_km: z
              .number({ error: 'An offset is a number of seconds per km.' })
              .refine((s) => s !== 0, 'Leave out an offset of 0.')
              .refine((s) => Math.abs(s) <= L.maxOffsetSPerKm, 'An offset is at most 2:00 per km either way.'),
            per: z.enum(['mi', 'km']),
          })
          .strict()
          .optional(),
      })
      .strict(),
    z.object({ type: z.literal('heart_rate'), low_bpm: HeartRateSchema, high_bpm: HeartRateSchema }).strict(),
    z.object({ type: z.literal('effort') }).strict(),
  ],
  { error: 'A target is a pace, a race pace, a heart rate or effort.' },
);

export const PartSchema = z
  .object({
    type: z.literal('part'),
    kind: z.enum(PART_KINDS, { error: `A part kind is one of: ${PART_KINDS.join(', ')}.` }),
    amount: AmountSchema,
    target: TargetSchema,
  })
  .strict()
  .superRefine((part, ctx) => {
    const t = part.target;
    if (t.type === 'pace' && t.fast_s_per_km > t.slow_s_per_km) {
      ctx.addIssue({
        code: 'custom',
        message: 'A pace range is written fast-slow: the fast pace is the smaller number.',
        path: ['target'],
      });
    }
    if (t.type === 'pace' && t.per === 'rep' && part.amount.type !== 'distance') {
      ctx.addIssue({
        code: 'custom',
        message: "A pace given as a time for the part's distance needs a distance.",
        path: ['target'],
      });
    }
    if (t.type === 'heart_rate' && t.low_bpm > t.high_bpm) {
      ctx.addIssue({ code: 'custom', message: 'A heart-rate range is written low-high.', path: ['target'] });
    }
  });

export const RepeatSchema = z
  .object({
    type: z.literal('repeat'),
    count: z
      .number({ error: 'A repeat count is a number.' })
      .int('A repeat count is a whole number.')
      .min(1, `A repeat is done 1 to ${L.maxRepeatCount} times.`)
      .max(L.maxRepeatCount, `A repeat is done 1 to ${L.maxRepeatCount} times.`),
    parts: z
      .array(PartSchema)
      .min(1, 'A repeat needs at least one part.')
      .max(L.maxExpandedParts, `A session plan has at most ${L.maxExpandedParts} parts.`),
  })
  .strict();

export const PlanItemSchema = z.discriminatedUnion('type', [PartSchema, RepeatSchema], {
  error: 'Each item is a part or a repeat.',
});

/** The items of a plan with the guard rails: 1–50 items, at most 200 parts with repeats unrolled. */
export const PlanItemsSchema = z
  .array(PlanItemSchema)
  .min(1, 'A session plan has at least one part.')
  .max(L.maxItems, `A session plan has at most ${L.maxItems} parts and repeats.`)
  .superRefine((items, ctx) => {
    const n = countExpandedParts(items);
    if (n > L.maxExpandedParts) {
      ctx.addIssue({
        code: 'custom',
        message: `With its repeats unrolled this plan has ${n} parts; a session plan has at most ${L.maxExpandedParts}.`,
      });
    }
  });

/** Shorthand text that must parse; a failure carries `{position, expected}` in the issue's params. */
export const ShorthandTextSchema = z
  .string({ error: 'Write the session as text.' })
  .max(L.maxTextLength, `Keep the shorthand under ${L.maxTextLength} characters.`)
  .superRefine((text, ctx) => {
    const result = parseShorthand(text);
    if (!result.ok) {
      ctx.addIssue({
        code: 'custom',
        message: result.error.message,
        params: { position: result.error.position, expected: result.error.expected },
      });
    }
  });

/** `POST /api/plans/parse` */
export const ParsePlanInputSchema = z.object({ text: z.string({ error: 'Write the session as text.' }) }).strict();

/** One part of a plan with its repeats unrolled (shared/plans/expand.ts). */
export const ExpandedPartSchema = z.object({
  type: z.literal('part'),
  kind: z.enum(PART_KINDS),
  amount: AmountSchema,
  target: TargetSchema,
  /** 0-based position in the expanded list. */
  index: z.number(),
  /** 0-based index of the plan item it came from. */
  item_index: z.number(),
  /** Set when it came from a repeat: round 1…rounds, and its 0-based step within the round. */
  repeat: z.object({ round: z.number(), rounds: z.number(), step: z.number() }).nullable(),
});

/** `POST /api/plans/parse`: the items, their expanded list and the canonical text. */
export const ParsedPlanSchema = z.object({
  parts: z.array(PlanItemSchema),
  expanded: z.array(ExpandedPartSchema),
  text: z.string(),
});
export type ParsedPlan = z.infer<typeof ParsedPlanSchema>;

function oneWayOfWriting(plan: { text?: string | undefined; parts?: unknown }, ctx: z.RefinementCtx, required: boolean): void {
  if (plan.text !== undefined && plan.parts !== undefined) {
    ctx.addIssue({
      code: 'custom',
      message: 'Send the session either as shorthand text or as parts, not both.',
      path: ['parts'],
    });
  }
  if (required && plan.text === undefined && plan.parts === undefined) {
    ctx.addIssue({ code: 'custom', message: "Write the session, e.g. '45 min easy'.", path: ['text'] });
  }
}

/** `POST /api/plans`: `{date, title?, text}` or `{date, title?, parts}`; a coach may add `runner_id`. */
export const CreatePlanInputSchema = z
  .object({
    date: PlanDateSchema,
    title: TitleSchema.optional(),
    notes: NotesSchema.optional(),
    text: ShorthandTextSchema.optional(),
    parts: PlanItemsSchema.optional(),
    runner_id: z.uuid({ error: 'Not a runner id.' }).optional(),
  })
  .strict()
  .superRefine((plan, ctx) => oneWayOfWriting(plan, ctx, true));
export type CreatePlanInput = z.infer<typeof CreatePlanInputSchema>;

/** `PATCH /api/plans/:id`: any of date (moves the plan), title, and text or parts. */
export const UpdatePlanInputSchema = z
  .object({
    date: PlanDateSchema.optional(),
    title: TitleSchema.optional(),
    notes: NotesSchema.optional(),
    text: ShorthandTextSchema.optional(),
    parts: PlanItemsSchema.optional(),
  })
  .strict()
  .superRefine((plan, ctx) => {
    oneWayOfWriting(plan, ctx, false);
    if (Object.keys(plan).length === 0) ctx.addIssue({ code: 'custom', message: 'Nothing to change.' });
  });
export type UpdatePlanInput = z.infer<typeof UpdatePlanInputSchema>;

/** A stored plan as the API returns it; `text` is the canonical shorthand of `parts`. */
export const PlanSchema = z.object({
  id: z.string(),
  date: z.string(),
  title: z.string(),
  notes: z.string(),
  text: z.string(),
  parts: z.array(PlanItemSchema),
  runner_id: z.string(),
  author_id: z.string().nullable(),
  /** Who wrote the session (null when that account is gone), who changed it last, and when. */
  author_name: z.string().nullable(),
  updated_at: z.string(),
  updated_by_name: z.string().nullable(),
  created_at: z.string(),
});
export type Plan = z.infer<typeof PlanSchema>;

/** `POST /api/plans`, `GET /api/plans/:id` and `PATCH /api/plans/:id`: the one plan. */
export const PlanAnswerSchema = z.object({ plan: PlanSchema });
export type PlanAnswer = z.infer<typeof PlanAnswerSchema>;
/** `GET /api/plans?from&to[&runner_id]`: the plans dated in the range. */
export const PlanListAnswerSchema = z.object({ plans: z.array(PlanSchema) });
export type PlanListAnswer = z.infer<typeof PlanListAnswerSchema>;

// The hand-written model in types.ts and these schemas must describe the same JSON.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const PART_MATCHES: Same<z.infer<typeof PartSchema>, Part> = true;
const REPEAT_MATCHES: Same<z.infer<typeof RepeatSchema>, Repeat> = true;
const ITEM_MATCHES: Same<z.infer<typeof PlanItemSchema>, PlanItem> = true;
const EXPANDED_MATCHES: Same<z.infer<typeof ExpandedPartSchema>, ExpandedPart> = true;
void [PART_MATCHES, REPEAT_MATCHES, ITEM_MATCHES, EXPANDED_MATCHES];
