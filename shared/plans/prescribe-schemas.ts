import { z } from 'zod';
import { PlanDateSchema, PlanItemsSchema, PlanItemSchema, PlanSchema, ShorthandTextSchema } from './schemas.ts';
import { PLAN_LIMITS } from './types.ts';

/**
 * Issue 15, "the coach prescribes": copying weeks, applying library sessions to several runners,
 * the session library, the record of changes, day marks and the calendar feed. The numbers here
 * are the limits a stranger could push (documented in server/features/plans/README.md).
 */

/** Runners one library session may be applied to at once (the contract: 1–100). */
export const MAX_ASSIGN_RUNNERS = 100;
/** Named sessions one person may keep in their library. */
export const MAX_LIBRARY_SESSIONS = 500;
/** Longest library name. */
export const MAX_LIBRARY_NAME = 80;
/** Longest note on a day mark. */
export const MAX_DAY_NOTE = 500;
/** Minutes of cross-training one day can hold (a whole day). */
export const MAX_DAY_MINUTES = 24 * 60;

const RunnerIdSchema = z.uuid({ error: 'Not a runner id.' });

/** `POST /api/plans/copy-week`. Without `mode`, a target week that has sessions answers 409 with `details.existing`. */
export const CopyWeekInputSchema = z
  .object({
    from_start: PlanDateSchema,
    to_start: PlanDateSchema,
    runner_id: RunnerIdSchema.optional(),
    mode: z.enum(['replace', 'add'], { error: 'Choose "replace" or "add".' }).optional(),
  })
  .strict()
  .refine((w) => w.from_start !== w.to_start, { message: 'Choose a different week to copy to.', path: ['to_start'] });
export type CopyWeekInput = z.infer<typeof CopyWeekInputSchema>;

/** What a write of several sessions did, and the batch to undo it with (`DELETE /api/plans/batches/:id`). */
export const PlanBatchResultSchema = z.object({
  plans: z.array(PlanSchema),
  /** Sessions a "replace" removed. */
  replaced: z.number().int(),
  batch_id: z.string(),
});
export type PlanBatchResult = z.infer<typeof PlanBatchResultSchema>;

/** The 409 of a copy onto a week with sessions. */
export const CopyWeekConflictDetailsSchema = z.object({ existing: z.number().int() });

const RunnerIdsSchema = z
  .array(RunnerIdSchema, { error: 'Choose the runners as a list.' })
  .min(1, 'Choose at least one runner.')
  .max(MAX_ASSIGN_RUNNERS, `Choose at most ${MAX_ASSIGN_RUNNERS} runners at a time.`)
  .refine((ids) => new Set(ids).size === ids.length, 'A runner is chosen twice.');

const TitleSchema = z
  .string({ error: 'A title is text.' })
  .trim()
  .max(PLAN_LIMITS.maxTitleLength, `Keep the title under ${PLAN_LIMITS.maxTitleLength} characters.`);

/** `POST /api/plans/assign`: `{runner_ids, date, title?, text}` or `{runner_ids, date, library_id}`. */
export const AssignInputSchema = z
  .object({
    runner_ids: RunnerIdsSchema,
    date: PlanDateSchema,
    title: TitleSchema.optional(),
    text: ShorthandTextSchema.optional(),
    library_id: z.uuid({ error: 'Not a library session id.' }).optional(),
  })
  .strict()
  .superRefine((a, ctx) => {
    if ((a.text === undefined) === (a.library_id === undefined)) {
      ctx.addIssue({
        code: 'custom',
        message: 'Send the session as shorthand text or name a library session, one of the two.',
        path: ['text'],
      });
    }
  });
export type AssignInput = z.infer<typeof AssignInputSchema>;

export const AssignedPlanSchema = PlanSchema;
export const AssignResultSchema = z.object({ plans: z.array(AssignedPlanSchema), batch_id: z.string() });
export type AssignResult = z.infer<typeof AssignResultSchema>;

const LibraryNameSchema = z
  .string({ error: 'Name the session.' })
  .trim()
  .min(1, 'Name the session, e.g. "Track 800s".')
  .max(MAX_LIBRARY_NAME, `Keep the name under ${MAX_LIBRARY_NAME} characters.`);

const NotesSchema = z
  .string({ error: 'Notes are text.' })
  .trim()
  .max(PLAN_LIMITS.maxTextLength, `Keep the notes under ${PLAN_LIMITS.maxTextLength} characters.`);

/**
 * `POST /api/library`: `{name, title?, text}` (or `parts`), or `{name, plan_id}` to keep one of the
 * sessions you may read, with its parts and fuel plan.
 */
export const CreateLibrarySessionInputSchema = z
  .object({
    name: LibraryNameSchema,
    title: TitleSchema.optional(),
    notes: NotesSchema.optional(),
    text: ShorthandTextSchema.optional(),
    parts: PlanItemsSchema.optional(),
    plan_id: z.uuid({ error: 'Not a plan id.' }).optional(),
  })
  .strict()
  .superRefine((s, ctx) => {
    const given = [s.text, s.parts, s.plan_id].filter((v) => v !== undefined).length;
    if (given !== 1) {
      ctx.addIssue({
        code: 'custom',
        message: "Write the session (e.g. '45 min easy') or name the session to keep, one of the two.",
        path: ['text'],
      });
    }
  });
export type CreateLibrarySessionInput = z.infer<typeof CreateLibrarySessionInputSchema>;

/** `PATCH /api/library/:id`. */
export const UpdateLibrarySessionInputSchema = z
  .object({
    name: LibraryNameSchema.optional(),
    title: TitleSchema.optional(),
    notes: NotesSchema.optional(),
    text: ShorthandTextSchema.optional(),
  })
  .strict()
  .refine((s) => Object.keys(s).length > 0, 'Nothing to change.');
export type UpdateLibrarySessionInput = z.infer<typeof UpdateLibrarySessionInputSchema>;

export const LibrarySessionSchema = z.object({
  id: z.string(),
  name: z.string(),
  title: z.string(),
  notes: z.string(),
  text: z.string(),
  parts: z.array(PlanItemSchema),
  has_fuel_plan: z.boolean(),
  updated_at: z.string(),
});
export type LibrarySession = z.infer<typeof LibrarySessionSchema>;

/** One recorded change of a session: who, when, what. */
export const PlanChangeSchema = z.object({
  id: z.string(),
  plan_id: z.string(),
  kind: z.enum(['added', 'changed', 'moved', 'deleted']),
  summary: z.string(),
  actor_id: z.string().nullable(),
  actor_name: z.string(),
  created_at: z.string(),
});
export type PlanChange = z.infer<typeof PlanChangeSchema>;

export const DAY_MARK_KINDS = ['rest', 'ill', 'injured', 'cross-training'] as const;
export type DayMarkKind = (typeof DAY_MARK_KINDS)[number];

/** `PUT /api/days/:date`. Minutes belong to cross-training only. */
export const PutDayMarkInputSchema = z
  .object({
    kind: z.enum(DAY_MARK_KINDS, { error: 'Mark the day as rest, ill, injured or cross-training.' }),
    minutes: z
      .number({ error: 'Minutes are a number.' })
      .int('Minutes are a whole number.')
      .min(1, 'Cross-training lasts at least 1 minute.')
      .max(MAX_DAY_MINUTES, 'A day has at most 1 440 minutes.')
      .optional(),
    note: z
      .string({ error: 'A note is text.' })
      .trim()
      .max(MAX_DAY_NOTE, `Keep the note under ${MAX_DAY_NOTE} characters.`)
      .optional(),
    runner_id: RunnerIdSchema.optional(),
  })
  .strict()
  .superRefine((m, ctx) => {
    if (m.kind === 'cross-training' && m.minutes === undefined) {
      ctx.addIssue({ code: 'custom', message: 'Say how many minutes of cross-training.', path: ['minutes'] });
    }
    if (m.kind !== 'cross-training' && m.minutes !== undefined) {
      ctx.addIssue({ code: 'custom', message: 'Only a cross-training day has minutes.', path: ['minutes'] });
    }
  });
export type PutDayMarkInput = z.infer<typeof PutDayMarkInputSchema>;

export const DayMarkSchema = z.object({
  runner_id: z.string(),
  date: z.string(),
  kind: z.enum(DAY_MARK_KINDS),
  minutes: z.number().int().nullable(),
  note: z.string(),
  author_id: z.string().nullable(),
  updated_at: z.string(),
});
export type DayMark = z.infer<typeof DayMarkSchema>;

/** `GET /api/runners/:id`: what a plan page needs to name a runner and show their plan-check tolerance. */
export const RunnerSummarySchema = z.object({
  id: z.string(),
  name: z.string(),
  unit: z.enum(['mi', 'km']),
  pace_tolerance: z.number(),
  week_starts_on: z.number().int(),
  /** The runner's own time zone (IANA name): their plan marks "today" by their clock, not the reader's. */
  time_zone: z.string(),
});
export type RunnerSummary = z.infer<typeof RunnerSummarySchema>;

/** `POST /api/me/calendar`: the secret feed address, shown once. */
export const CalendarFeedSchema = z.object({ url: z.string() });
export type CalendarFeed = z.infer<typeof CalendarFeedSchema>;

/** `GET /api/me/calendar`: whether the feed is on and since when (the address itself is never shown again). */
export const CalendarFeedStatusSchema = z.object({ on: z.boolean(), since: z.string().nullable() });
export type CalendarFeedStatus = z.infer<typeof CalendarFeedStatusSchema>;

/** `PUT /api/runners/:id/pace-tolerance`: the tolerance now stored, seconds per km. */
export const PaceToleranceAnswerSchema = z.object({ pace_tolerance: z.number() });
export type PaceToleranceAnswer = z.infer<typeof PaceToleranceAnswerSchema>;

/** `GET /api/plans/:id/changes`: the plan's change log. */
export const PlanChangesAnswerSchema = z.object({ changes: z.array(PlanChangeSchema) });
export type PlanChangesAnswer = z.infer<typeof PlanChangesAnswerSchema>;

/** `GET /api/library`: the coach's saved sessions. */
export const LibrarySessionListAnswerSchema = z.object({ sessions: z.array(LibrarySessionSchema) });
export type LibrarySessionListAnswer = z.infer<typeof LibrarySessionListAnswerSchema>;
/** `POST /api/library` and `PATCH /api/library/:id`: the saved session. */
export const LibrarySessionAnswerSchema = z.object({ session: LibrarySessionSchema });
export type LibrarySessionAnswer = z.infer<typeof LibrarySessionAnswerSchema>;

/** `GET /api/days?from&to[&runner_id]`: the day marks in the range. */
export const DayMarkListAnswerSchema = z.object({ day_marks: z.array(DayMarkSchema) });
export type DayMarkListAnswer = z.infer<typeof DayMarkListAnswerSchema>;
/** `PUT /api/days/:date`: the day mark now stored. */
export const DayMarkAnswerSchema = z.object({ day_mark: DayMarkSchema });
export type DayMarkAnswer = z.infer<typeof DayMarkAnswerSchema>;

/** `GET /api/runners/:id`: the runner a coach looks at. */
export const RunnerSummaryAnswerSchema = z.object({ runner: RunnerSummarySchema });
export type RunnerSummaryAnswer = z.infer<typeof RunnerSummaryAnswerSchema>;
