/**
 * Banister TRIMP (training impulse) from heart rate.
 *
 * TRIMP = D(min) · x · a·e^(b·x), where x = (HR − HRrest) / (HRmax − HRrest) is the fraction of the
 * heart-rate reserve. Coefficients: men a = 0.64, b = 1.92; women a = 0.86, b = 1.67 (Banister 1991,
 * "Modeling elite athletic performance"; Morton, Fitz-Clarke & Banister 1990, J Appl Physiol
 * 69:1171–1177). TRIMP describes the load of a session; it is not a medical measure, and a qualified
 * coach or physician sets heart-rate limits for an individual.
 */

export type Sex = 'male' | 'female';

export interface TrimpCoefficients {
  a: number;
  b: number;
}

/** Banister's weighting coefficients per sex. Women use a = 0.86 (not 0.64 with only b changed). */
export const TRIMP_COEFFICIENTS: Readonly<Record<Sex, TrimpCoefficients>> = {
  male: { a: 0.64, b: 1.92 },
  female: { a: 0.86, b: 1.67 },
};

/**
 * Coefficients used when the runner's sex is unknown: the men's. Banister published only the two
 * sets; the men's give the lower weight at every clamped reserve fraction (they cross the women's
 * only at x ≈ 1.18), so an unknown sex does not inflate the load. Results say when they were assumed.
 */
export const UNKNOWN_SEX_COEFFICIENTS: Sex = 'male';

export interface TrimpResult {
  /** Banister TRIMP, arbitrary units (≈ minutes weighted by intensity). */
  trimp: number;
  /** Minutes that counted (moving, with a known heart rate). */
  minutes: number;
  /** Which coefficient set was used. */
  coefficients: Sex;
  /** True when the sex was unknown and the men's coefficients were assumed. */
  sex_assumed: boolean;
}

/**
 * Fraction of the heart-rate reserve, clamped to 0–1: a heart rate at or below resting gives 0 (no
 * training impulse); one above the stated maximum is treated as the maximum (x = 1), since the
 * maximum is an estimate that a hard effort can exceed. Null when a value is not finite or
 * `maxHr` is not above `restingHr`.
 */
export function heartRateReserveFraction(hr: number, restingHr: number, maxHr: number): number | null {
  if (!validHeartRates(restingHr, maxHr) || !Number.isFinite(hr)) return null;
  const x = (hr - restingHr) / (maxHr - restingHr);
  return Math.min(1, Math.max(0, x));
}

/** Banister's intensity weighting a·e^(b·x) for a reserve fraction `x` (unclamped). */
export function trimpWeight(x: number, sex: Sex): number {
  const { a, b } = TRIMP_COEFFICIENTS[sex];
  return a * Math.exp(b * x);
}

/**
 * TRIMP from a session's duration and mean heart rate (bpm). Because the weighting is convex, this
 * gives less than summing a varying heart rate interval by interval (see `trimpOfSeries`); use it
 * only when no heart-rate series exists. Null for a negative or non-finite duration, an unknown
 * mean heart rate, or `maxHr` not above `restingHr`.
 */
export function trimpOfSession(
  minutes: number,
  avgHr: number,
  restingHr: number,
  maxHr: number,
  sex: Sex | null,
): TrimpResult | null {
  if (!Number.isFinite(minutes) || minutes < 0) return null;
  const x = heartRateReserveFraction(avgHr, restingHr, maxHr);
  if (x === null) return null;
  const used = sex ?? UNKNOWN_SEX_COEFFICIENTS;
  return { trimp: minutes * x * trimpWeight(x, used), minutes, coefficients: used, sex_assumed: sex === null };
}

/**
 * TRIMP summed interval by interval over a heart-rate series, rather than computed once on the
 * session mean: the weighting is convex, so the two differ (30 min at 120 plus 30 min at 170 bpm,
 * rest 60, max 190, men: 103.9692 summed per minute, 88.1076 on the mean of 145).
 *
 * - `t`: sample times in ms, increasing; `hr`: bpm per sample, NaN when unknown; `moving`: 1/0 per
 *   sample for the interval ending at that sample (index 0 unused), or null to count every interval.
 * - Interval i runs from `t[i-1]` to `t[i]` and takes the heart rate recorded at its end (`hr[i]`),
 *   because a reading describes the beats just before it; when that is unknown it takes `hr[i-1]`;
 *   when both are unknown, or the interval is not moving, or its length is not positive, it is left
 *   out (and not counted in `minutes`).
 * - Each interval's heart rate is clamped as in `heartRateReserveFraction`.
 *
 * Null when the arrays differ in length or `maxHr` is not above `restingHr`. A series with no usable
 * interval gives TRIMP 0 over 0 minutes.
 */
export function trimpOfSeries(
  t: ArrayLike<number>,
  hr: ArrayLike<number>,
  moving: ArrayLike<number> | null,
  restingHr: number,
  maxHr: number,
  sex: Sex | null,
): TrimpResult | null {
  if (!validHeartRates(restingHr, maxHr)) return null;
  if (hr.length !== t.length || (moving !== null && moving.length !== t.length)) return null;
  const used = sex ?? UNKNOWN_SEX_COEFFICIENTS;
  let trimp = 0;
  let minutes = 0;
  for (let i = 1; i < t.length; i++) {
    if (moving !== null && !moving[i]) continue;
    const dtMin = ((t[i] as number) - (t[i - 1] as number)) / 60_000;
    if (!(dtMin > 0)) continue;
    const end = hr[i] as number;
    const beat = Number.isFinite(end) ? end : (hr[i - 1] as number);
    const x = heartRateReserveFraction(beat, restingHr, maxHr);
    if (x === null) continue;
    trimp += dtMin * x * trimpWeight(x, used);
    minutes += dtMin;
  }
  return { trimp, minutes, coefficients: used, sex_assumed: sex === null };
}

function validHeartRates(restingHr: number, maxHr: number): boolean {
  return Number.isFinite(restingHr) && Number.isFinite(maxHr) && restingHr >= 0 && maxHr > restingHr;
}
