import { z } from 'zod';
import { parseClockTime } from '../race/clock-time.ts';
import { HALF_MARATHON_M, MARATHON_M } from '../units.ts';
import { GoalRaceInputSchema, RaceResultInputSchema, type GoalRaceInput, type RaceResultInput } from './schemas.ts';
import { goalRaceTenseProblem, raceResultTenseProblem } from './tense.ts';

/**
 * The profile's goal race and race result forms: a distance picked from a list (or typed in metres)
 * and a time written h:mm:ss, turned into the API inputs and checked by the same schemas the server
 * uses. Form controls carry the schema's field names (`distance_m`, `goal_time_s`, `time_s`), so the
 * server's field errors land beside the same controls; a custom distance's problems go to `custom_distance_m`.
 */

/** The select's value for "another distance, in metres". */
export const CUSTOM_RACE_DISTANCE = 'custom';

/** The distances the profile offers, with the words the select shows. */
export const GOAL_DISTANCE_CHOICES = [
  { id: '5k', label: '5K', distance_m: 5000 },
  { id: '10k', label: '10K', distance_m: 10_000 },
  { id: 'half', label: 'Half marathon (21.0975 km)', distance_m: HALF_MARATHON_M },
  { id: 'marathon', label: 'Marathon (42.195 km)', distance_m: MARATHON_M },
] as const;

/** The select's value for a stored distance: a listed race's id, or custom. */
export function distanceChoiceFor(distanceM: number): string {
  return GOAL_DISTANCE_CHOICES.find((c) => c.distance_m === distanceM)?.id ?? CUSTOM_RACE_DISTANCE;
}

/** Seconds as h:mm:ss, the way the forms show a stored time: 11100 → "3:05:00", 1196 → "0:19:56". */
export function formatRaceTime(seconds: number): string {
  const total = Math.round(seconds);
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const s = total % 60;
  return `${h}:${String(m).padStart(2, '0')}:${String(s).padStart(2, '0')}`;
}

const text = z.string().optional();
const RaceFormFieldsSchema = z.object({
  name: text,
  date: text,
  distance_m: text,
  custom_distance_m: text,
  goal_time_s: text,
  time_s: text,
});
type RaceFormFields = z.infer<typeof RaceFormFieldsSchema>;

const TIME_MESSAGE = 'Enter the time as h:mm:ss, e.g. 3:05:00, or m:ss, e.g. 19:56.';
const CUSTOM_MESSAGE = 'Enter the distance in metres, e.g. 30000.';

/** Metres from the select and the custom field; null (with an issue) when they say nothing usable. */
function readDistance(fields: RaceFormFields, ctx: z.RefinementCtx): number | null {
  if (fields.distance_m === CUSTOM_RACE_DISTANCE) {
    const metres = Number(fields.custom_distance_m?.trim().replace(',', '.') || Number.NaN);
    if (Number.isFinite(metres)) return metres;
    ctx.addIssue({ code: 'custom', message: CUSTOM_MESSAGE, path: ['custom_distance_m'] });
    return null;
  }
  const choice = GOAL_DISTANCE_CHOICES.find((c) => c.id === fields.distance_m);
  if (choice) return choice.distance_m;
  ctx.addIssue({ code: 'custom', message: 'Pick a distance.', path: ['distance_m'] });
  return null;
}

/**
 * Checks `input` with `schema`, copying its issues to the form (a custom distance's to `custom_distance_m`)
 * and leaving out those about fields whose text was already refused here.
 */
function checkWith<T>(
  schema: z.ZodType<T>,
  input: Record<string, unknown>,
  refused: ReadonlySet<string>,
  customDistance: boolean,
  ctx: z.RefinementCtx,
): T {
  const result = schema.safeParse(input);
  if (result.success && refused.size === 0) return result.data;
  for (const issue of result.success ? [] : result.error.issues) {
    const field = String(issue.path[0] ?? '');
    if (refused.has(field)) continue;
    const path = field === 'distance_m' && customDistance ? ['custom_distance_m'] : issue.path.map(String);
    ctx.addIssue({ code: 'custom', message: issue.message, path });
  }
  return z.NEVER;
}

function readRace(fields: RaceFormFields, timeField: 'goal_time_s' | 'time_s', ctx: z.RefinementCtx) {
  const refused = new Set<string>();
  const distance = readDistance(fields, ctx);
  if (distance === null) refused.add('distance_m');
  const time = parseClockTime(fields[timeField] ?? '');
  if (time === null) {
    ctx.addIssue({ code: 'custom', message: TIME_MESSAGE, path: [timeField] });
    refused.add(timeField);
  }
  // Placeholders for refused fields keep the schema's other checks (name, date) running: the shortest
  // distance and the longest time allowed, so the speed check cannot fire because of a placeholder.
  return { refused, distance_m: distance ?? 400, time: time ?? 100 * 3600 };
}

/** The goal race form → `PUT /api/me/goal-race` input (GoalRaceInputSchema). */
export const GoalRaceFormSchema = RaceFormFieldsSchema.transform((fields, ctx): GoalRaceInput => {
  const { refused, distance_m, time } = readRace(fields, 'goal_time_s', ctx);
  const input = { name: fields.name ?? '', date: fields.date ?? '', distance_m, goal_time_s: time };
  return checkWith(GoalRaceInputSchema, input, refused, fields.distance_m === CUSTOM_RACE_DISTANCE, ctx);
});

/** The race result form → `POST /api/me/race-results` input (RaceResultInputSchema); the name is optional. */
export const RaceResultFormSchema = RaceFormFieldsSchema.transform((fields, ctx): RaceResultInput => {
  const { refused, distance_m, time } = readRace(fields, 'time_s', ctx);
  const name = fields.name?.trim();
  const input = { ...(name ? { name } : {}), date: fields.date ?? '', distance_m, time_s: time };
  return checkWith(RaceResultInputSchema, input, refused, fields.distance_m === CUSTOM_RACE_DISTANCE, ctx);
});

/** The goal race form checked as the server does, today included: a date already past is refused at the date field. */
export function goalRaceFormFor(today: string) {
  return GoalRaceFormSchema.superRefine((input, ctx) => {
    const problem = goalRaceTenseProblem(input.date, today);
    if (problem) ctx.addIssue({ code: 'custom', message: problem, path: ['date'] });
  });
}

/** The race result form checked as the server does, today included: a date still to come is refused at the date field. */
export function raceResultFormFor(today: string) {
  return RaceResultFormSchema.superRefine((input, ctx) => {
    const problem = raceResultTenseProblem(input.date, today);
    if (problem) ctx.addIssue({ code: 'custom', message: problem, path: ['date'] });
  });
}
