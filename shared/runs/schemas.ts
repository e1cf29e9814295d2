import { z } from 'zod';
import { ActivityKindSchema } from './activity-kind.ts';
import { calendarDateSchema } from '../api/calendar-date.ts';
import { NoteConcernSchema } from '../notes/schemas.ts';

export const SplitUnitSchema = z.enum(['mi', 'km'], { error: 'Unit must be mi or km.' });

export const SplitsCsvQuerySchema = z.object({ unit: SplitUnitSchema.default('mi') });

const IsoDateSchema = calendarDateSchema('2026-10-03');

/** What the runs list can be ordered by: start time, distance, moving time, pace (moving time per metre). */
export const RUN_LIST_SORTS = ['date', 'distance', 'duration', 'pace'] as const;
export type RunListSort = (typeof RUN_LIST_SORTS)[number];
export type RunListOrder = 'asc' | 'desc';

export const ListRunsQuerySchema = z.object({
  from: IsoDateSchema.optional(),
  to: IsoDateSchema.optional(),
  page: z.coerce.number({ error: 'Page must be a number.' }).int().min(1, 'Pages start at 1.').default(1),
  per_page: z.coerce
    .number({ error: 'per_page must be a number.' })
    .int()
    .min(1)
    .max(200, 'At most 200 runs a page.')
    .default(50),
  runner_id: z.uuid({ error: 'Not a runner id.' }).optional(),
  sort: z.enum(RUN_LIST_SORTS, { error: `Sort by one of: ${RUN_LIST_SORTS.join(', ')}.` }).default('date'),
  order: z.enum(['asc', 'desc'], { error: 'Order must be asc or desc.' }).default('desc'),
  /**
   * Keyset paging (issue 19): the `next_cursor` of the page before; the runs that follow its last run in the
   * same sort and order. Opaque; at most 300 characters (shared/runs/list-cursor.ts).
   */
  after: z.string().max(300, 'This link to more runs no longer works. Start again from the first page of your runs.').optional(),
});
export type ListRunsQuery = z.infer<typeof ListRunsQuerySchema>;

export const RenameRunInputSchema = z
  .object({
    name: z
      .string({ error: 'Give the run a name.' })
      .trim()
      .min(1, 'Give the run a name.')
      .max(120, 'Keep the name under 120 characters.')
      .optional(),
    /** Run, ride or hike: the runner corrects what the import decided (issue #14). */
    kind: ActivityKindSchema.optional(),
  })
  .strict()
  .refine((input) => input.name !== undefined || input.kind !== undefined, { message: 'Give the run a name.' });

/** One line of the runs list. */
export const RunListItemSchema = z.object({
  id: z.string(),
  name: z.string(),
  started_at: z.string(),
  local_date: z.string(),
  local_time: z.string(),
  time_zone: z.string(),
  distance_m: z.number(),
  elapsed_s: z.number(),
  moving_s: z.number(),
  pace_s_per_km: z.number().nullable(),
  ascent_m: z.number().nullable(),
  avg_hr: z.number().nullable(),
  /** Run, ride or hike; rides and hikes are kept out of running totals and plan checks. */
  kind: ActivityKindSchema,
});
export type RunListItem = z.infer<typeof RunListItemSchema>;
/** `PATCH /api/runs/:id`: the renamed run as the list shows it. */
export const RunListItemAnswerSchema = z.object({ run: RunListItemSchema });
export type RunListItemAnswer = z.infer<typeof RunListItemAnswerSchema>;

export const ImportResultSchema = z.object({
  imported: z.array(RunListItemSchema.extend({ file: z.string() })),
  /**
   * `same file`: these very bytes were uploaded before. `same run`: an activity starting within 5 s of
   * a stored run with a distance within 2 % (shared/runs/duplicates.ts); upload again with
   * `?duplicates=import` to import it anyway. `activity`: 1-based activity of a multi-activity file, else null.
   */
  duplicates: z.array(
    z.object({
      file: z.string(),
      runId: z.string(),
      reason: z.enum(['same file', 'same run']),
      activity: z.number().nullable(),
    }),
  ),
  rejected: z.array(z.object({ file: z.string(), error: z.string() })),
});
export type ImportResult = z.infer<typeof ImportResultSchema>;

/** `POST /api/runs?duplicates=import`: import activities that match a stored run anyway. */
export const UploadRunsQuerySchema = z
  .object({ duplicates: z.enum(['skip', 'import'], { error: "duplicates is 'skip' or 'import'." }).optional() })
  .strict();

export const NewRunNoteInputSchema = z
  .object({
    text: z
      .string({ error: 'Write the note first.' })
      .trim()
      .min(1, 'Write the note first.')
      .max(4000, 'Keep a note under 4000 characters.'),
    /** The runner flags a note about pain or illness; their coach is told at once. */
    concern: NoteConcernSchema.nullable().optional(),
  })
  .strict();

export const RunNoteSchema = z.object({
  id: z.string(),
  run_id: z.string(),
  author: z.object({ id: z.string(), name: z.string(), role: z.string() }),
  text: z.string(),
  created_at: z.string(),
  concern: NoteConcernSchema.nullable(),
  /** The reader has not opened it yet (never true for the reader's own notes). */
  unread: z.boolean(),
});
export type RunNote = z.infer<typeof RunNoteSchema>;
/** `GET /api/runs/:id/notes`: the run's notes. */
export const RunNoteListAnswerSchema = z.object({ notes: z.array(RunNoteSchema) });
export type RunNoteListAnswer = z.infer<typeof RunNoteListAnswerSchema>;
/** `POST /api/runs/:id/notes`: the note added. */
export const RunNoteAnswerSchema = z.object({ note: RunNoteSchema });
export type RunNoteAnswer = z.infer<typeof RunNoteAnswerSchema>;

/**
 * How a run's distance was measured (`details.distance` of `GET /api/runs/:id`; null for runs
 * imported before it was recorded). See shared/tracks/README.md.
 */
export const DistanceReportSchema = z.object({
  source: z.enum(['device', 'geodesic', 'none']),
  /** Noisy positions were smoothed before measuring. */
  smoothed: z.boolean(),
  /** Measured position jitter per axis, m (positions only). */
  jitter_m: z.number().nullable(),
  median_interval_s: z.number().nullable(),
  /** Point-to-point moving distance before smoothing, m. */
  raw_distance_m: z.number(),
  distance_m: z.number(),
});
export type DistanceReportAnswer = z.infer<typeof DistanceReportSchema>;

/** GET /api/me/storage: the original files a user keeps against their quota. */
export const StorageUsageSchema = z.object({
  used_bytes: z.number(),
  quota_bytes: z.number(),
  files: z.number(),
});
export type StorageUsage = z.infer<typeof StorageUsageSchema>;
