import { METRES_PER_MILE } from '../units.ts';
import type { FastestSection, TrackSeries } from './types.ts';

/** The distances of fastest sections, metres: 400 m, 1 km, 1 mile, 5 km, 10 km, half, marathon. */
export const FASTEST_SECTION_DISTANCES_M: readonly number[] = [400, 1000, METRES_PER_MILE, 5000, 10000, 21097.5, 42195];

/**
 * The fastest stretch (least clock time) covering exactly `distanceM` metres of the run, or null
 * when the run is shorter. Time along the run is piecewise linear in distance, so the optimum has
 * one end on a recorded point: one two-pointer sweep tries every point as the end (start
 * interpolated, at the latest moment the runner was at that distance, i.e. leaving a stop) and
 * another every point as the start (end interpolated at the first moment it is reached).
 * Linear time in the number of points.
 */
export function fastestSection(series: TrackSeries, distanceM: number): FastestSection | null {
  const { t, d } = series;
  const n = t.length;
  if (n < 2 || !(distanceM > 0) || (d[n - 1] as number) - (d[0] as number) < distanceM) return null;
  // The best so far in plain numbers (no object or closure per point): time, start, end, start distance.
  let found = false;
  let bestTime = 0;
  let bestStartT = 0;
  let bestEndT = 0;
  let bestStartD = 0;

  // Ends on a point j: start where distance d[j] − D was last held.
  let i = 0;
  for (let j = 1; j < n; j++) {
    const dj = d[j] as number;
    const target = dj - distanceM;
    if (target < (d[0] as number)) continue;
    if (dj === (d[j - 1] as number)) continue; // the earliest arrival at d[j] is earlier
    while (i + 1 < j && (d[i + 1] as number) <= target) i++;
    const d0 = d[i] as number;
    const d1 = d[i + 1] as number;
    const t0 = t[i] as number;
    const startT = d1 > d0 ? t0 + ((target - d0) / (d1 - d0)) * ((t[i + 1] as number) - t0) : t0;
    const endT = t[j] as number;
    const time = (endT - startT) / 1000;
    if (!found || time < bestTime) {
      found = true;
      bestTime = time;
      bestStartT = startT;
      bestEndT = endT;
      bestStartD = target;
    }
  }

  // Starts on a point s (as it leaves it): end where distance d[s] + D is first reached.
  let j = 1;
  for (let s = 0; s + 1 < n; s++) {
    const ds = d[s] as number;
    if ((d[s + 1] as number) === ds) continue; // still standing: a later start is faster
    const target = ds + distanceM;
    if (target > (d[n - 1] as number)) break;
    if (j <= s) j = s + 1;
    while ((d[j] as number) < target) j++;
    const d0 = d[j - 1] as number;
    const d1 = d[j] as number;
    const t0 = t[j - 1] as number;
    const endT = d1 > d0 ? t0 + ((target - d0) / (d1 - d0)) * ((t[j] as number) - t0) : t0;
    const startT = t[s] as number;
    const time = (endT - startT) / 1000;
    if (!found || time < bestTime) {
      found = true;
      bestTime = time;
      bestStartT = startT;
      bestEndT = endT;
      bestStartD = ds;
    }
  }
  if (!found) return null;
  return {
    distance_m: distanceM,
    time_s: bestTime,
    pace_s_per_km: bestTime / (distanceM / 1000),
    start_t: bestStartT,
    end_t: bestEndT,
    start_distance_m: bestStartD,
  };
}

/** Fastest sections for every standard distance the run covers, shortest first. */
export function computeFastestSections(
  series: TrackSeries,
  distancesM: readonly number[] = FASTEST_SECTION_DISTANCES_M,
): FastestSection[] {
  const out: FastestSection[] = [];
  for (const distance of distancesM) {
    const section = fastestSection(series, distance);
    if (section) out.push(section);
  }
  return out;
}
