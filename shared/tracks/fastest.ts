import { METRES_PER_MILE } from '../units.ts';
import { BLOCK } from './blocks.ts';
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
  return fastestSectionsOf(series, [distanceM])[0] ?? null;
}

/** Fastest sections for every standard distance the run covers, shortest first. */
export function computeFastestSections(
  series: TrackSeries,
  distancesM: readonly number[] = FASTEST_SECTION_DISTANCES_M,
): FastestSection[] {
  const out: FastestSection[] = [];
  for (const section of fastestSectionsOf(series, distancesM)) if (section) out.push(section);
  return out;
}

/**
 * `fastestSection` for several distances in the same two sweeps over the points (one pointer and one best
 * per distance, each visiting the points in the same order as a sweep of its own, so the same result).
 */
function fastestSectionsOf(series: TrackSeries, distancesM: readonly number[]): (FastestSection | null)[] {
  const { t, d } = series;
  const n = t.length;
  const m = distancesM.length;
  const distance = Float64Array.from(distancesM);
  // Distances this run covers; the others stay null.
  const covered = new Uint8Array(m);
  for (let k = 0; k < m; k++) {
    const D = distance[k] as number;
    covered[k] = n >= 2 && D > 0 && (d[n - 1] as number) - (d[0] as number) >= D ? 1 : 0;
  }
  // The best so far per distance in plain numbers (no object or closure per point).
  const found = new Uint8Array(m);
  const bestTime = new Float64Array(m);
  const bestStartT = new Float64Array(m);
  const bestEndT = new Float64Array(m);
  const bestStartD = new Float64Array(m);
  const pointer = new Int32Array(m);

  // The sweeps take the arrays one by one: an object made per call deoptimised their compiled code on a
  // long run's first analysis ("code dependencies", tests/bench/README.md, "Session 10").
  // Ends on a point j: start where distance d[j] − D was last held.
  for (let j = 1; j < n; j += BLOCK)
    endingSweep(t, d, distance, covered, found, bestTime, bestStartT, bestEndT, bestStartD, pointer, j, Math.min(n, j + BLOCK));

  // Starts on a point s (as it leaves it): end where distance d[s] + D is first reached.
  pointer.fill(1);
  for (let s = 0; s + 1 < n; s += BLOCK)
    startingSweep(
      t,
      d,
      distance,
      covered,
      found,
      bestTime,
      bestStartT,
      bestEndT,
      bestStartD,
      pointer,
      s,
      Math.min(n - 1, s + BLOCK),
    );

  const out: (FastestSection | null)[] = [];
  for (let k = 0; k < m; k++) {
    const D = distance[k] as number;
    out.push(
      found[k]
        ? {
            distance_m: distancesM[k] as number,
            time_s: bestTime[k] as number,
            pace_s_per_km: (bestTime[k] as number) / (D / 1000),
            start_t: bestStartT[k] as number,
            end_t: bestEndT[k] as number,
            start_distance_m: bestStartD[k] as number,
          }
        : null,
    );
  }
  return out;
}

/** The sweep of sections ending on points j ∈ [from, to). */
function endingSweep(
  t: ArrayLike<number>,
  d: ArrayLike<number>,
  distance: Float64Array,
  covered: Uint8Array,
  found: Uint8Array,
  bestTime: Float64Array,
  bestStartT: Float64Array,
  bestEndT: Float64Array,
  bestStartD: Float64Array,
  pointer: Int32Array,
  from: number,
  to: number,
): void {
  const m = distance.length;
  const d0 = d[0] as number;
  for (let j = from; j < to; j++) {
    const dj = d[j] as number;
    if (dj === (d[j - 1] as number)) continue; // the earliest arrival at d[j] is earlier
    const endT = t[j] as number;
    for (let k = 0; k < m; k++) {
      if (!covered[k]) continue;
      const target = dj - (distance[k] as number);
      if (target < d0) continue;
      let i = pointer[k] as number;
      while (i + 1 < j && (d[i + 1] as number) <= target) i++;
      pointer[k] = i;
      const startT = timeAtDistance(d, t, i, target);
      const time = (endT - startT) / 1000;
      if (!found[k] || time < (bestTime[k] as number)) {
        found[k] = 1;
        bestTime[k] = time;
        bestStartT[k] = startT;
        bestEndT[k] = endT;
        bestStartD[k] = target;
      }
    }
  }
}

/** The sweep of sections starting on points s ∈ [from, to) (to ≤ n − 1). */
function startingSweep(
  t: ArrayLike<number>,
  d: ArrayLike<number>,
  distance: Float64Array,
  covered: Uint8Array,
  found: Uint8Array,
  bestTime: Float64Array,
  bestStartT: Float64Array,
  bestEndT: Float64Array,
  bestStartD: Float64Array,
  pointer: Int32Array,
  from: number,
  to: number,
): void {
  const m = distance.length;
  const last = d[d.length - 1] as number;
  for (let s = from; s < to; s++) {
    const ds = d[s] as number;
    if ((d[s + 1] as number) === ds) continue; // still standing: a later start is faster
    const startT = t[s] as number;
    for (let k = 0; k < m; k++) {
      if (!covered[k]) continue;
      const target = ds + (distance[k] as number);
      // Past the end for this distance: so for every later start too.
      if (target > last) {
        covered[k] = 2;
        continue;
      }
      if (covered[k] === 2) continue;
      let j = pointer[k] as number;
      if (j <= s) j = s + 1;
      while ((d[j] as number) < target) j++;
      pointer[k] = j;
      const endT = timeAtDistance(d, t, j - 1, target);
      const time = (endT - startT) / 1000;
      if (!found[k] || time < (bestTime[k] as number)) {
        found[k] = 1;
        bestTime[k] = time;
        bestStartT[k] = startT;
        bestEndT[k] = endT;
        bestStartD[k] = ds;
      }
    }
  }
}

/** The time `target` metres were reached between points i and i + 1, by linear interpolation (the earlier time where they do not move). */
function timeAtDistance(d: ArrayLike<number>, t: ArrayLike<number>, i: number, target: number): number {
  const da = d[i] as number;
  const db = d[i + 1] as number;
  const ta = t[i] as number;
  return db > da ? ta + ((target - da) / (db - da)) * ((t[i + 1] as number) - ta) : ta;
}
