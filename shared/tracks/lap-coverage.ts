/**
 * A track that cannot be the activity its own device laps describe (issue #14, "times that go
 * backwards"): once the points whose time goes backwards are left out, a hand-edited or damaged TCX
 * can keep a second of track beside laps of several kilometres. Such a file is refused with a
 * sentence; a run of 0.00 mi is never shown beside laps of 4 mi.
 */
import { METRES_PER_MILE } from '../units.ts';
import { formatDuration } from './format.ts';
import type { CleaningReport, DeviceLap } from './types.ts';

/** The track must cover at least this share of its laps' time or of their distance (our choice: a tenth). */
export const LAP_COVERAGE_MIN = 0.1;
/** Laps are only weighed against the track when they record at least this much (5 min or 1 km). */
export const LAPS_WORTH_CHECKING = { seconds: 300, metres: 1000 } as const;

function distanceWords(metres: number): string {
  if (metres < 1000) return `${Math.round(metres)} m`;
  return `${(metres / 1000).toFixed(2)} km (${(metres / METRES_PER_MILE).toFixed(2)} mi)`;
}

/**
 * Null when the track may be imported; else the sentence that refuses it. The track (after
 * cleaning) covers `elapsed_s` and `distance_m`; the laps are the file's own, summed.
 */
export function lapCoverageProblem(
  track: { elapsed_s: number; distance_m: number },
  laps: readonly DeviceLap[],
  report: Pick<CleaningReport, 'dropped_backwards'>,
): string | null {
  const lapSeconds = laps.reduce((s, l) => s + (l.total_time_s !== null && l.total_time_s > 0 ? l.total_time_s : 0), 0);
  const lapMetres = laps.reduce((s, l) => s + (l.distance_m !== null && l.distance_m > 0 ? l.distance_m : 0), 0);
  const timeChecked = lapSeconds >= LAPS_WORTH_CHECKING.seconds;
  const distanceChecked = lapMetres >= LAPS_WORTH_CHECKING.metres;
  if (!timeChecked && !distanceChecked) return null;
  const timeShort = !timeChecked || track.elapsed_s < lapSeconds * LAP_COVERAGE_MIN;
  const distanceShort = !distanceChecked || track.distance_m < lapMetres * LAP_COVERAGE_MIN;
  if (!timeShort || !distanceShort) return null;
  const recorded = [timeChecked ? formatDuration(lapSeconds) : null, distanceChecked ? distanceWords(lapMetres) : null]
    .filter(Boolean)
    .join(' and ');
  const left = `${formatDuration(track.elapsed_s)} and ${distanceWords(track.distance_m)}`;
  const n = report.dropped_backwards;
  const cause =
    n > 0
      ? `Times in this file go backwards: ${n} ${n === 1 ? 'point' : 'points'} earlier than the one before ${n === 1 ? 'was' : 'were'} left out, and the track left covers only ${left}`
      : `This file's track covers only ${left}`;
  return `${cause}, while its device laps record ${recorded}. Nothing was imported: export the activity from the device again.`;
}
