import { EQUIVALENT_DISTANCES_M } from './distances.ts';

/**
 * Race equivalence by two published methods (REFERENCES.md §3):
 * - Riegel (1981), American Scientist 69(3): the power law T₂ = T₁ · (D₂/D₁)^b, b = 1.06 as usually quoted.
 * - Daniels & Gilbert (1979), "Oxygen Power": the oxygen cost of running at a speed and the fraction of
 *   VO₂max a runner can sustain for a duration. Their ratio for one performance is the Daniels & Gilbert
 *   index (an effective VO₂max, ml·kg⁻¹·min⁻¹); an equivalent performance has the same index.
 */

/** Riegel's exponent as usually quoted (REFERENCES.md §3.1). */
export const RIEGEL_EXPONENT = 1.06;

/**
 * Riegel (1981): the time for `d2M` metres equivalent to `t1S` seconds over `d1M` metres,
 * T₂ = T₁ · (D₂/D₁)^exponent. Seconds in, seconds out. Throws a RangeError on a non-positive
 * or non-finite input (the power law has no meaning there).
 * Example: riegelTime(5100, 21097.5, 42195) = 10 633.151 s (half 1:25:00 → marathon 2:57:13).
 */
export function riegelTime(t1S: number, d1M: number, d2M: number, exponent: number = RIEGEL_EXPONENT): number {
  assertPositive(t1S, 'time');
  assertPositive(d1M, 'distance');
  assertPositive(d2M, 'target distance');
  if (!Number.isFinite(exponent)) throw new RangeError('The exponent must be a finite number.');
  return t1S * (d2M / d1M) ** exponent;
}

/**
 * Daniels & Gilbert (1979) oxygen cost of running at `vMPerMin` metres per minute, in ml O₂ per kg per minute:
 * VO₂(v) = −4.60 + 0.182258·v + 0.000104·v² (REFERENCES.md §3.2). Example: VO₂(200) = 36.0116.
 * Negative below about 25 m/min, where the fit describes no running.
 */
export function oxygenCost(vMPerMin: number): number {
  return -4.6 + 0.182258 * vMPerMin + 0.000104 * vMPerMin * vMPerMin;
}

/**
 * The speed in metres per minute whose Daniels & Gilbert oxygen cost is `vo2` ml·kg⁻¹·min⁻¹: the positive
 * root of 0.000104·v² + 0.182258·v − (4.60 + vo2) = 0, the inverse of `oxygenCost`. Example: 36.0116 → 200.
 * Throws a RangeError when `vo2` is not finite or at or below the cost of standing still (−4.60).
 */
export function speedForOxygenCost(vo2: number): number {
  if (!Number.isFinite(vo2) || vo2 <= -4.6) throw new RangeError('The oxygen cost must be a finite number above -4.6.');
  const a = 0.000104;
  const b = 0.182258;
  const c = -4.6 - vo2;
  return (-b + Math.sqrt(b * b - 4 * a * c)) / (2 * a);
}

/**
 * Daniels & Gilbert (1979) fraction of VO₂max sustainable for `tMin` minutes (dimensionless):
 * F(t) = 0.8 + 0.1894393·e^(−0.012778·t) + 0.2989558·e^(−0.1932605·t) (REFERENCES.md §3.2).
 * Above 1 for t < 11.03 min. Example: F(10) = 1.009995, F(60) = 0.888007.
 */
export function sustainableFraction(tMin: number): number {
  // Each term is coefficient × exp(rate × t). A transcription seen in public code writes
  // pow(0.1894393, …) instead, which gives wrong values (REFERENCES.md §3.2, pitfall).
  return 0.8 + 0.1894393 * Math.exp(-0.012778 * tMin) + 0.2989558 * Math.exp(-0.1932605 * tMin);
}

/**
 * Daniels & Gilbert index of a performance: `dM` metres in `tS` seconds, X = VO₂(d/t) / F(t) with t in minutes.
 * ml·kg⁻¹·min⁻¹. Example: half marathon in 5100 s → 54.4535. Throws a RangeError on non-positive input.
 */
export function performanceIndex(dM: number, tS: number): number {
  assertPositive(dM, 'distance');
  assertPositive(tS, 'time');
  const tMin = tS / 60;
  return oxygenCost(dM / tMin) / sustainableFraction(tMin);
}

/**
 * The time in seconds, at `dM` metres, of a performance with Daniels & Gilbert index `index`: the root t of
 * VO₂(d/t) − X·F(t) = 0, found by bisection. The bracket starts at t ∈ [0.5, 2000] min as in
 * REFERENCES.md §3.2 and widens when the root lies outside it (very long or very slow races).
 * Example: equivalentTime(50, 42195) = 11 439.74 s. Throws a RangeError when the index is not positive.
 */
export function equivalentTime(index: number, dM: number): number {
  assertPositive(index, 'index');
  assertPositive(dM, 'distance');
  // g falls from positive (too fast to hold) to negative (slower than needed) as t grows.
  const g = (tMin: number): number => oxygenCost(dM / tMin) - index * sustainableFraction(tMin);
  let lo = 0.5;
  let hi = 2000;
  for (let i = 0; g(lo) <= 0; i++) {
    if (i > 60) throw new RangeError('No equivalent time: the index is out of range for this distance.');
    lo /= 2;
  }
  for (let i = 0; g(hi) >= 0; i++) {
    if (i > 60) throw new RangeError('No equivalent time: the index is out of range for this distance.');
    hi *= 2;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (g(mid) > 0) lo = mid;
    else hi = mid;
  }
  return ((lo + hi) / 2) * 60;
}

/** One row of the race equivalents table (api-contract.md), all in metres and seconds. */
export interface RaceEquivalent {
  distance_m: number;
  /** Riegel (1981), b = 1.06, seconds rounded to the millisecond. */
  riegel_s: number;
  /** Daniels & Gilbert (1979), same index as the result, seconds rounded to the millisecond. */
  daniels_gilbert_s: number;
}

/**
 * Equivalent times for a result of `distanceM` metres in `timeS` seconds at 1500 m, the mile, 3000 m, 5K, 10K,
 * 15K, the half and the marathon, by Riegel and by Daniels & Gilbert side by side. Times are seconds rounded
 * to the millisecond. The row for the result's own distance gives back the result (both methods).
 */
export function raceEquivalents(distanceM: number, timeS: number): RaceEquivalent[] {
  return EQUIVALENT_DISTANCES_M.map((d) => raceEquivalentAt(distanceM, timeS, d));
}

/**
 * One row of the race equivalents table: the times at `targetM` metres equivalent to `distanceM` metres in `timeS`
 * seconds, by Riegel and by Daniels & Gilbert, rounded to the millisecond; at the result's own distance, the result.
 * Training ranges and the plans' race-named paces read their race efforts from here, so all three agree.
 */
export function raceEquivalentAt(distanceM: number, timeS: number, targetM: number): RaceEquivalent {
  return {
    distance_m: targetM,
    riegel_s: roundMs(riegelTime(timeS, distanceM, targetM)),
    daniels_gilbert_s: roundMs(targetM === distanceM ? timeS : equivalentTime(performanceIndex(distanceM, timeS), targetM)),
  };
}

function roundMs(seconds: number): number {
  return Math.round(seconds * 1000) / 1000;
}

function assertPositive(value: number, what: string): void {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`The ${what} must be a positive finite number.`);
}
