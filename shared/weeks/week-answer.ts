/**
 * The week review answer (`GET /api/runners/:id/week`), declared once: the server answers with this
 * type and the client imports it. Every field here is rendered by the week review; the test
 * tests/unit/client/week-review-fields.test.ts walks these shapes and fails when one is not shown.
 */
import { z } from 'zod';
import { AmountsSchema } from '../fuel/answers.ts';
import { RunListItemSchema } from '../runs/schemas.ts';

export const SessionVerdictSchema = z.enum(['as planned', 'partly', 'missed', 'unplanned']);

export const WeekPlanSchema = z.object({
  id: z.string(),
  date: z.string(),
  title: z.string(),
  planned_distance_m: z.number().nullable(),
  planned_duration_s: z.number().nullable(),
  is_long_run: z.boolean(),
  easy_only: z.boolean(),
});

export const NoteAuthorSchema = z.object({ id: z.string(), name: z.string(), role: z.string() });

/** A note on a run or a week, with whether the reader has opened it (notes they wrote are never unread). */
export const WeekNoteSchema = z.object({
  id: z.string(),
  text: z.string(),
  created_at: z.string(),
  author: NoteAuthorSchema,
  /** The runner marked it as about pain or illness (the coach is told at once). */
  concern: z.enum(['pain', 'illness']).nullable(),
  unread: z.boolean(),
});

/** `POST /api/runners/:id/weeks/:start/notes`: the note just written. */
export const AddedWeekNoteSchema = z.object({
  id: z.string(),
  text: z.string(),
  concern: z.enum(['pain', 'illness']).nullable(),
});
export type AddedWeekNote = z.infer<typeof AddedWeekNoteSchema>;
/** `POST /api/runners/:id/weeks/:start/notes`: the note added to the week. */
export const AddedWeekNoteAnswerSchema = z.object({ note: AddedWeekNoteSchema });
export type AddedWeekNoteAnswer = z.infer<typeof AddedWeekNoteAnswerSchema>;

/** Fuel taken on the run against its fuel plan, with how the stomach and energy felt (1–5). */
export const WeekFuelTakenSchema = AmountsSchema.extend({
  entries: z.number(),
  /** The fuel plan's totals, when the run rehearsed one. */
  planned: AmountsSchema.nullable(),
  stomach: z.number().nullable(),
  energy: z.number().nullable(),
  notes: z.string(),
});

/** The after-run check-in. */
export const WeekCheckinSchema = z.object({
  run_id: z.string(),
  sleep_hours: z.number().nullable(),
  soreness: z.number().nullable(),
  mood: z.number().nullable(),
  walking_minutes: z.number().nullable(),
  mobility_minutes: z.number().nullable(),
  cold_water_temp_c: z.number().nullable(),
  cold_water_minutes: z.number().nullable(),
  notes: z.string(),
  updated_at: z.string(),
});

export const WeekDayRunSchema = RunListItemSchema.extend({
  date: z.string(),
  trimp: z.number().nullable(),
  session_verdict: SessionVerdictSchema.nullable(),
  plan_id: z.string().nullable().optional(),
  goal_pace_s: z.number().optional(),
  /** Why the session is not as planned, in one line ("goal-pace part +65 s/mi slow"), in the reader's unit. */
  verdict_reason: z.string().nullable(),
  /** An interval session's reps on one line, or null. */
  reps_line: z.string().nullable(),
  fuel_taken: WeekFuelTakenSchema.nullable(),
  checkin: WeekCheckinSchema.nullable(),
  notes: z.array(WeekNoteSchema),
});

/** A day marked rest, ill, injured or cross-training (minutes for cross-training only). */
export const WeekDayMarkSchema = z.object({
  date: z.string(),
  kind: z.enum(['rest', 'ill', 'injured', 'cross-training']),
  minutes: z.number().nullable(),
  note: z.string(),
});

export const WeekFlagSchema = z.object({
  code: z.enum(['volume-jump', 'load-spike', 'easy-too-fast', 'long-run-missed']),
  message: z.string(),
  source: z.string(),
  plan_id: z.string().optional(),
  run_id: z.string().optional(),
});

export const WeekTotalsSchema = z.object({
  planned_distance_m: z.number(),
  plans_without_distance: z.number(),
  planned_duration_s: z.number(),
  run_distance_m: z.number(),
  moving_s: z.number(),
  /** Cross-training minutes of the marked days, in seconds: time, not running distance. */
  cross_training_s: z.number(),
  /** Running time plus cross-training. */
  time_s: z.number(),
  sessions: z.object({
    as_planned: z.number(),
    partly: z.number(),
    missed: z.number(),
    /** Missed on a day marked rest, ill, injured or cross-training ("missed — ill"), not in `missed`. */
    missed_with_reason: z.number(),
    unplanned: z.number(),
  }),
  sessions_due: z.number(),
  moving_s_on_timed_plans: z.number(),
  goal_pace_s: z.number(),
  trimp: z.number().nullable(),
  runs_without_trimp: z.number(),
});

export const RunnerWeekSchema = z.object({
  runner_id: z.string(),
  runner: z.object({ id: z.string(), name: z.string() }),
  start: z.string(),
  end: z.string(),
  today: z.string(),
  /**
   * The runner's profile zone (IANA): the zone `today` and the week are read in, and the one the screens show
   * the week's notes, check-ins and reviews in, whatever zone the reader's device is set to.
   */
  time_zone: z.string(),
  week_starts_on: z.number(),
  days: z.array(
    z.object({
      date: z.string(),
      plans: z.array(WeekPlanSchema),
      runs: z.array(WeekDayRunSchema),
      /** Unread notes on this day's runs (for the dot on the day). */
      unread_notes: z.number(),
      day_marks: z.array(WeekDayMarkSchema),
    }),
  ),
  /** Plans before today with no run that day, with the day's mark as the reason (null: a plain miss). */
  missed_plans: z.array(
    z.object({
      plan_id: z.string(),
      date: z.string(),
      reason: z.enum(['rest', 'ill', 'injured', 'cross-training']).nullable(),
    }),
  ),
  totals: WeekTotalsSchema,
  long_run: z.object({ run_id: z.string(), distance_m: z.number(), share_of_week: z.number() }).nullable(),
  acute_chronic_ratio: z
    .object({
      end_date: z.string(),
      ratio: z.number().nullable(),
      acute_load: z.number().nullable(),
      chronic_load: z.number().nullable(),
      window: z.literal('coupled'),
      reason: z.enum(['not enough history', 'no load in the last 28 days']).nullable(),
    })
    .nullable(),
  flags: z.array(WeekFlagSchema),
  trend: z.array(z.object({ start: z.string(), run_distance_m: z.number(), trimp: z.number() })),
  last_upload: z.string().nullable(),
  reviewed_by: z.array(z.object({ coach_id: z.string(), coach_name: z.string(), reviewed_at: z.string() })),
  /** Notes on the week itself. */
  notes: z.array(WeekNoteSchema),
  /** Unread notes anywhere in this week (its own and its runs'). */
  unread_notes: z.number(),
});

export type RunnerWeek = z.infer<typeof RunnerWeekSchema>;
export type WeekDayRun = z.infer<typeof WeekDayRunSchema>;
export type WeekNote = z.infer<typeof WeekNoteSchema>;
export type WeekFuelTaken = z.infer<typeof WeekFuelTakenSchema>;
export type WeekCheckin = z.infer<typeof WeekCheckinSchema>;
