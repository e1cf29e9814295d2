/**
 * Run, ride or hike (issue #14): decided at import from the file's own sport (TCX `Activity Sport`,
 * GPX `<type>`) and its speeds, and changeable by the runner. Only runs count in running totals,
 * the week review and plan checks.
 */
import { z } from 'zod';

export const ACTIVITY_KINDS = ['run', 'ride', 'hike'] as const;
export const ActivityKindSchema = z.enum(ACTIVITY_KINDS, { error: "The kind is 'run', 'ride' or 'hike'." });
export type ActivityKind = (typeof ACTIVITY_KINDS)[number];

/**
 * Moving speed above this (m/s, 2:34/km) over at least `SPEED_JUDGED_S` is no run: faster than the
 * men's 10 000 m world record pace (26:11.00, 6.37 m/s; from memory, unconfirmed), so a ride.
 */
export const RIDE_SPEED_MPS = 6.5;
/**
 * Moving speed below this (m/s, 4.5 km/h, 13:20/km) over at least `HIKE_MIN_MOVING_S` is walking
 * pace: a hike, unless the file says it is a run (a long run-walk). Our choice, a rule of thumb.
 */
export const HIKE_SPEED_MPS = 1.25;
export const HIKE_MIN_MOVING_S = 3600;
/** Shorter activities are not judged by speed (a GPS glitch on a short file is no ride). */
export const SPEED_JUDGED_S = 300;

const RIDE_WORDS = /bik|cycl|ride|velo|mtb/i;
const HIKE_WORDS = /hik|walk|trek/i;
const RUN_WORDS = /run|jog/i;

/**
 * The kind of an imported activity. The file's sport word wins for a ride or hike; a moving speed
 * no runner can hold makes a ride even of a file that says "Running"; a long walk-pace file that
 * does not say it is a run is a hike; anything else is a run.
 */
export function activityKindOf(sport: string | null, summary: { distance_m: number; moving_s: number }): ActivityKind {
  const word = sport ?? '';
  if (RIDE_WORDS.test(word)) return 'ride';
  if (HIKE_WORDS.test(word)) return 'hike';
  const speed = summary.moving_s > 0 ? summary.distance_m / summary.moving_s : 0;
  if (summary.moving_s >= SPEED_JUDGED_S && speed > RIDE_SPEED_MPS) return 'ride';
  if (RUN_WORDS.test(word)) return 'run';
  if (summary.moving_s >= HIKE_MIN_MOVING_S && speed > 0 && speed < HIKE_SPEED_MPS) return 'hike';
  return 'run';
}

/** The mark shown beside a ride or a hike (a run has none). */
export const ACTIVITY_KIND_LABELS: Readonly<Record<ActivityKind, string>> = { run: 'Run', ride: 'Ride', hike: 'Hike' };
