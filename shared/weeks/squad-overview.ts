import { z } from 'zod';

/** One squad runner's week in the coach's overview (`GET /api/squads/:id/overview`). */
export const SquadOverviewRowSchema = z.object({
  runner: z.object({ id: z.string(), name: z.string() }),
  /** The runner's own first day of the week, `YYYY-MM-DD`. */
  start: z.string(),
  planned_distance_m: z.number(),
  run_distance_m: z.number(),
  moving_s: z.number(),
  sessions_planned: z.number(),
  sessions_as_planned: z.number(),
  /** Plans dated up to the runner's today: the denominator of "sessions as planned". */
  sessions_due: z.number(),
  /** Time-based parts of the week's plans, seconds (plans given by time have no distance). */
  planned_duration_s: z.number(),
  flags: z.array(z.object({ code: z.string(), message: z.string() })),
  last_upload: z.string().nullable(),
  /**
   * The runner's profile zone (IANA), the one their week and today are read in: "last upload" counts the
   * runner's calendar days in it, not the coach's (client/README.md, "Whose clock"). Added in session 10.
   */
  time_zone: z.string(),
  reviewed: z.boolean(),
  /** Metres per week, oldest first; the last is this week. */
  volume_12_weeks: z.array(z.number()),
  /** Notes on the week's runs the coach has not opened. */
  unread_notes: z.number(),
  /** Runs this week with a check-in of soreness 4 or 5. */
  high_soreness: z.number(),
  /** Sessions other than easy running planned before today and not run, or run and judged missed. */
  missed_key_sessions: z.number(),
});
export type SquadOverviewRow = z.infer<typeof SquadOverviewRowSchema>;

/** `GET /api/squads/:id/overview` */
export const SquadOverviewSchema = z.object({
  squad: z.object({ id: z.string(), name: z.string() }),
  week: z.string().nullable(),
  rows: z.array(SquadOverviewRowSchema),
});
export type SquadOverview = z.infer<typeof SquadOverviewSchema>;

/** `POST /api/squads/:id/digest`: who the digest went to and which runner stands under which heading. */
export const DigestReceiptSchema = z.object({
  sent_to: z.string(),
  week_start: z.string(),
  /** Heading → runner names, in the e-mail's order. */
  groups: z.record(z.string(), z.array(z.string())),
});
export type DigestReceipt = z.infer<typeof DigestReceiptSchema>;
