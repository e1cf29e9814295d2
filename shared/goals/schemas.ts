import { z } from 'zod';
import { calendarDateSchema } from '../api/calendar-date.ts';

const PlanDateSchema = calendarDateSchema('2026-10-18');

/** Race distances in metres: 400 m to 250 km. */
export const RaceDistanceSchema = z
  .number({ error: 'Distance must be a number of metres.' })
  .positive('Distance must be more than 0.')
  .min(400, 'Races start at 400 m.')
  .max(250_000, 'Races up to 250 km are supported.');

/** Race times in seconds: 1 minute to 100 hours. */
export const RaceTimeSchema = z
  .number({ error: 'Time must be a number of seconds.' })
  .min(60, 'A race time is at least a minute.')
  .max(100 * 3600, 'A race time is at most 100 hours.');

export const GoalRaceInputSchema = z
  .object({
    name: z.string({ error: 'Name the race.' }).trim().min(1, 'Name the race.').max(120, 'Keep the name under 120 characters.'),
    date: PlanDateSchema,
    distance_m: RaceDistanceSchema,
    goal_time_s: RaceTimeSchema,
  })
  .strict()
  .refine((g) => g.distance_m / g.goal_time_s <= 11, {
    message: 'That goal is faster than any human has run.',
    path: ['goal_time_s'],
  });
export type GoalRaceInput = z.infer<typeof GoalRaceInputSchema>;

export const GoalRaceSchema = z.object({
  name: z.string(),
  date: z.string(),
  distance_m: z.number(),
  goal_time_s: z.number(),
  updated_at: z.string(),
});
export type GoalRace = z.infer<typeof GoalRaceSchema>;

export const RaceResultInputSchema = z
  .object({
    name: z.string().trim().max(120, 'Keep the name under 120 characters.').optional(),
    date: PlanDateSchema,
    distance_m: RaceDistanceSchema,
    time_s: RaceTimeSchema,
  })
  .strict()
  .refine((r) => r.distance_m / r.time_s <= 11, { message: 'That time is faster than any human has run.', path: ['time_s'] });
export type RaceResultInput = z.infer<typeof RaceResultInputSchema>;

export const RaceResultSchema = z.object({
  id: z.string(),
  name: z.string().nullable(),
  date: z.string(),
  distance_m: z.number(),
  time_s: z.number(),
});
export type RaceResult = z.infer<typeof RaceResultSchema>;

/** `GET /api/me/goal-race`: the goal race, or null when none is set. */
export const GoalRaceAnswerSchema = z.object({ goal_race: GoalRaceSchema.nullable() });
export type GoalRaceAnswer = z.infer<typeof GoalRaceAnswerSchema>;
/** `PUT /api/me/goal-race`: the goal race now stored. */
export const SavedGoalRaceAnswerSchema = z.object({ goal_race: GoalRaceSchema });
export type SavedGoalRaceAnswer = z.infer<typeof SavedGoalRaceAnswerSchema>;
/** `GET /api/me/race-results`: the runner's race results. */
export const RaceResultListAnswerSchema = z.object({ results: z.array(RaceResultSchema) });
export type RaceResultListAnswer = z.infer<typeof RaceResultListAnswerSchema>;
/** `POST /api/me/race-results`: the result added. */
export const RaceResultAnswerSchema = z.object({ result: RaceResultSchema });
export type RaceResultAnswer = z.infer<typeof RaceResultAnswerSchema>;
