import { isClosingRecovery } from './closing-recovery.ts';
import type { ExpandedPart, ResolvedTarget } from './types.ts';

/**
 * The plan check: a run compared with its session plan, part by part.
 *
 * Alignment (documented in DEVELOPERS.md):
 * 1. Device laps are used as the part boundaries when there is one lap per expanded part and every
 *    lap's recorded distance (or time, for timed parts) is within `LAP_FIT` of the plan.
 * 2. Otherwise the run is cut part by part: each part starts at the previous part's refined end and
 *    is cut at its planned distance (or duration) from there, so a late start shifts everything after
 *    it. The cut is then moved to the sharpest pace change within a window that can absorb a few
 *    hundred metres — in the direction the plan expects (a rep after a jog should speed up).
 * 3. Part paces come from lightly smoothed distance (the stored series), never heavy smoothing, which
 *    blurs short reps by tens of seconds per km.
 * 4. A rep whose stretch was run at recovery pace rather than near its target is a skipped rep.
 */

/** A run's series as stored at import (shared/tracks): times in ms, cumulative distance in m. */
export interface CheckSeries {
  t: ArrayLike<number>;
  d: ArrayLike<number>;
  /** Heart rate per point, NaN where unknown; null without a heart-rate sensor. */
  hr: ArrayLike<number> | null;
  /**
   * 1 where interval i (point i − 1 to i) is moving time, as stored at import; absent for old
   * callers, when every interval counts as moving.
   */
  moving?: ArrayLike<number> | null;
}

export interface CheckLap {
  start_t: number;
  total_time_s: number | null;
  distance_m: number | null;
}

export type PartVerdict = 'on pace' | 'quick' | 'slow' | 'cut short' | 'extended' | 'missed' | 'by feel';
export type SessionVerdict = 'as planned' | 'partly' | 'missed' | 'unplanned';

export interface PartCheck {
  index: number;
  kind: ExpandedPart['kind'];
  planned: {
    distance_m?: number;
    duration_s?: number;
    pace_fast_s_per_km?: number;
    pace_slow_s_per_km?: number;
    hr_low_bpm?: number;
    hr_high_bpm?: number;
  };
  actual: {
    distance_m: number;
    /** Clock time of the part, s. */
    duration_s: number;
    /** Moving time of the part (stops left out), s; the pace uses it. Absent in results stored before issue #14. */
    moving_s?: number;
    /** Stops inside the part: how many and their total clock time, s. Absent as above. */
    stops?: { count: number; seconds: number };
    pace_s_per_km: number | null;
    avg_hr: number | null;
    start_t: number;
    end_t: number;
  };
  /** Seconds per km outside the target range (negative = quicker), 0 inside it; null without a pace target. */
  difference_s_per_km: number | null;
  verdict: PartVerdict;
  /** Why, in a few words, when the verdict is not simply from the pace (e.g. "run at recovery pace: rep skipped"). */
  note: string | null;
}

export interface PlanCheckResult {
  method: 'device laps' | 'planned amounts';
  parts: PartCheck[];
  session_verdict: SessionVerdict;
}

export type CheckedPart = ExpandedPart & { resolved: ResolvedTarget };

/** Default pace tolerance: ±2 % of the target pace (editable per runner). */
export const DEFAULT_TOLERANCE = 0.02;
/** Under 90 % of the planned amount is "cut short", over 110 % "extended" (product.md). */
export const CUT_SHORT_BELOW = 0.9;
export const EXTENDED_ABOVE = 1.1;
/** A device lap fits a part when its amount is within 15 % of the plan. */
export const LAP_FIT = 0.15;
/** The refinement window: a share of the shorter neighbouring part, capped in metres and seconds. */
export const REFINE_SHARE = 0.45;
export const REFINE_MAX_M = 400;
export const REFINE_MAX_S = 90;
/** Pace is measured over this much distance either side of a candidate boundary. */
export const CONTRAST_WINDOW_M = 60;
/** A rep run this much slower than its slowest target, and near the recovery pace, was skipped. */
export const SKIPPED_REP_SLOWER = 0.12;
export const SKIPPED_REP_NEAR_RECOVERY = 0.1;
/** Standing still for at least this long (s) counts as a stop in a part. */
export const MIN_STOP_S = 10;
/**
 * A cut moves to a pace change only when the change is at least this share of the speed around it:
 * on an even run there is no change to find, and noise must not move the cut (our margin).
 */
export const MIN_PACE_CHANGE = 0.04;

/** Linear interpolation of `ys` at `x` over increasing `xs`, from index `from` on; returns [value, index]. */
function interpolate(xs: ArrayLike<number>, ys: ArrayLike<number>, x: number, from = 0): [number, number] {
  const n = xs.length;
  if (x <= xs[0]!) return [ys[0]!, 0];
  if (x >= xs[n - 1]!) return [ys[n - 1]!, n - 1];
  let i = Math.max(1, from);
  while (i < n - 1 && xs[i]! < x) i++;
  while (i > 1 && xs[i - 1]! > x) i--;
  const x0 = xs[i - 1]!;
  const x1 = xs[i]!;
  const f = x1 === x0 ? 1 : (x - x0) / (x1 - x0);
  return [ys[i - 1]! + f * (ys[i]! - ys[i - 1]!), i];
}

/** Time (ms) at which cumulative distance first reaches `distanceM` (distance is non-decreasing). */
function timeAtDistance(series: CheckSeries, distanceM: number): number {
  const { t, d } = series;
  const n = t.length;
  if (distanceM <= d[0]!) return t[0]!;
  if (distanceM >= d[n - 1]!) return t[n - 1]!;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (d[mid]! < distanceM) lo = mid;
    else hi = mid;
  }
  const span = d[hi]! - d[lo]!;
  const f = span === 0 ? 0 : (distanceM - d[lo]!) / span;
  return t[lo]! + f * (t[hi]! - t[lo]!);
}

function distanceAtTime(series: CheckSeries, timeMs: number): number {
  return interpolate(series.t, series.d, timeMs)[0];
}

/** Moving seconds between two times (ms); clock seconds when the series has no moving flags. */
function movingSecondsBetween(series: CheckSeries, fromT: number, toT: number): number {
  const { t, moving } = series;
  if (!moving) return Math.max(0, (toT - fromT) / 1000);
  let total = 0;
  let lo = 1;
  let hi = t.length - 1;
  // First interval that ends after fromT.
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (t[mid]! <= fromT) lo = mid + 1;
    else hi = mid;
  }
  for (let i = lo; i < t.length && t[i - 1]! < toT; i++) {
    if (!moving[i]) continue;
    total += Math.max(0, Math.min(t[i]!, toT) - Math.max(t[i - 1]!, fromT));
  }
  return total / 1000;
}

/** Stops (runs of stopped intervals of at least `MIN_STOP_S`) inside a stretch: count and clock seconds. */
function stopsBetween(series: CheckSeries, fromT: number, toT: number): { count: number; seconds: number } {
  const { t, moving } = series;
  if (!moving) return { count: 0, seconds: 0 };
  let count = 0;
  let seconds = 0;
  let runStart = Number.NaN;
  const close = (end: number) => {
    const length = (end - runStart) / 1000;
    if (length >= MIN_STOP_S) {
      count++;
      seconds += length;
    }
    runStart = Number.NaN;
  };
  for (let i = 1; i < t.length; i++) {
    const a = Math.max(t[i - 1]!, fromT);
    const b = Math.min(t[i]!, toT);
    if (b <= a) {
      if (t[i - 1]! >= toT) break;
      continue;
    }
    if (!moving[i]) {
      if (Number.isNaN(runStart)) runStart = a;
    } else if (!Number.isNaN(runStart)) close(a);
  }
  if (!Number.isNaN(runStart)) close(Math.min(toT, t[t.length - 1]!));
  return { count, seconds };
}

/** Speed (m/s) over the stretch between two times, on moving time (a stop is no change of pace); 0 without any. */
function speedBetween(series: CheckSeries, fromT: number, toT: number): number {
  const dt = movingSecondsBetween(series, fromT, toT);
  return dt > 0 ? (distanceAtTime(series, toT) - distanceAtTime(series, fromT)) / dt : 0;
}

/** The target pace's middle in s/km, or null when the part has no pace target. */
function targetPace(part: CheckedPart | undefined): number | null {
  if (!part || part.resolved.type !== 'pace') return null;
  return (part.resolved.fast_s_per_km + part.resolved.slow_s_per_km) / 2;
}

/** Expected speed change at the end of `part` into `next`: +1 faster, −1 slower, 0 unknown. */
function expectedChange(part: CheckedPart, next: CheckedPart | undefined): number {
  const a = targetPace(part) ?? PACE_BY_KIND[part.kind];
  const b = targetPace(next) ?? (next ? PACE_BY_KIND[next.kind] : null);
  if (a === null || b === null || Math.abs(a - b) / Math.max(a, b) < 0.04) return 0;
  return b < a ? 1 : -1;
}

/** How hard each kind without a pace target is usually run, as a rough pace in s/km (only the order matters). */
const PACE_BY_KIND: Record<ExpandedPart['kind'], number | null> = {
  'warm-up': 400,
  easy: 380,
  steady: 340,
  tempo: 300,
  'goal pace': 310,
  rep: 260,
  'recovery jog': 420,
  'cool-down': 400,
  strides: 220,
};

function plannedEnd(series: CheckSeries, part: CheckedPart, startT: number): number {
  if (part.amount.type === 'duration') return startT + part.amount.duration_s * 1000;
  return timeAtDistance(series, distanceAtTime(series, startT) + part.amount.distance_m);
}

/**
 * Moves a cut to the sharpest pace change near it: the time maximising (speed after − speed before)
 * in the expected direction, each speed measured over `CONTRAST_WINDOW_M` (or 20 s) of the series.
 */
function refineBoundary(
  series: CheckSeries,
  candidateT: number,
  startT: number,
  part: CheckedPart,
  next: CheckedPart,
  endT: number,
): number {
  const direction = expectedChange(part, next);
  if (direction === 0) return candidateT;
  const partLength = part.amount.type === 'distance' ? part.amount.distance_m : null;
  const nextLength = next.amount.type === 'distance' ? next.amount.distance_m : null;
  const dAtCandidate = distanceAtTime(series, candidateT);
  let fromT: number;
  let toT: number;
  if (partLength !== null || nextLength !== null) {
    const shorter = Math.min(partLength ?? Infinity, nextLength ?? Infinity);
    const reach = Math.min(REFINE_MAX_M, REFINE_SHARE * shorter);
    fromT = timeAtDistance(series, dAtCandidate - reach);
    toT = timeAtDistance(series, dAtCandidate + reach);
  } else {
    const shorter = Math.min(
      (part.amount as { duration_s: number }).duration_s,
      (next.amount as { duration_s: number }).duration_s,
    );
    const reach = Math.min(REFINE_MAX_S, REFINE_SHARE * shorter) * 1000;
    fromT = candidateT - reach;
    toT = candidateT + reach;
  }
  // Never move before the part's own start or past the run.
  fromT = Math.max(fromT, startT + 1000);
  toT = Math.min(toT, endT - 1000);
  if (toT <= fromT) return candidateT;
  let best = candidateT;
  let bestScore = -Infinity;
  let bestRaw = 0;
  const { t } = series;
  for (let i = 0; i < t.length; i++) {
    const ti = t[i]!;
    if (ti < fromT) continue;
    if (ti > toT) break;
    const di = series.d[i]!;
    const beforeT = Math.min(timeAtDistance(series, di - CONTRAST_WINDOW_M), ti - 5000);
    const afterT = Math.max(timeAtDistance(series, di + CONTRAST_WINDOW_M), ti + 5000);
    const score = direction * (speedBetween(series, ti, afterT) - speedBetween(series, beforeT, ti));
    // Prefer the cut nearest the plan among equally sharp changes.
    const penalty = Math.abs(ti - candidateT) / 1e7;
    if (score - penalty > bestScore) {
      bestScore = score - penalty;
      bestRaw = score;
      best = ti;
    }
  }
  const around = speedBetween(series, fromT, toT);
  return bestRaw >= MIN_PACE_CHANGE * around ? best : candidateT;
}

function lapsFit(parts: readonly CheckedPart[], laps: readonly CheckLap[]): boolean {
  if (laps.length !== parts.length || laps.length === 0) return false;
  return parts.every((part, i) => {
    const lap = laps[i]!;
    if (part.amount.type === 'distance') {
      return lap.distance_m !== null && Math.abs(lap.distance_m / part.amount.distance_m - 1) <= LAP_FIT;
    }
    return lap.total_time_s !== null && Math.abs(lap.total_time_s / part.amount.duration_s - 1) <= LAP_FIT;
  });
}

function averageHeartRate(series: CheckSeries, fromT: number, toT: number): number | null {
  if (!series.hr) return null;
  let sum = 0;
  let weight = 0;
  const { t, hr } = series;
  for (let i = 1; i < t.length; i++) {
    const a = Math.max(t[i - 1]!, fromT);
    const b = Math.min(t[i]!, toT);
    if (b <= a) continue;
    const h = (hr[i - 1]! + hr[i]!) / 2;
    if (!Number.isFinite(h)) continue;
    sum += h * (b - a);
    weight += b - a;
  }
  return weight > 0 ? sum / weight : null;
}

function planned(part: CheckedPart): PartCheck['planned'] {
  const out: PartCheck['planned'] = {};
  if (part.amount.type === 'distance') out.distance_m = part.amount.distance_m;
  else out.duration_s = part.amount.duration_s;
  if (part.resolved.type === 'pace') {
    out.pace_fast_s_per_km = part.resolved.fast_s_per_km;
    out.pace_slow_s_per_km = part.resolved.slow_s_per_km;
  } else if (part.resolved.type === 'heart_rate') {
    out.hr_low_bpm = part.resolved.low_bpm;
    out.hr_high_bpm = part.resolved.high_bpm;
  }
  return out;
}

/** The verdict of one stretch against its part (amount first, then pace or heart rate). */
export function judgePart(
  part: CheckedPart,
  actual: PartCheck['actual'],
  tolerance: number,
  slack?: ExpandedPart['amount'],
): { verdict: PartVerdict; difference: number | null } {
  // A timed part is complete when its clock time or its moving time is (stops inside it are shown
  // apart and never make it short); a distance part by its distance.
  const run = part.amount.type === 'distance' ? actual.distance_m : Math.max(actual.duration_s, actual.moving_s ?? 0);
  const plannedAmount = part.amount.type === 'distance' ? part.amount.distance_m : part.amount.duration_s;
  // `slack`: a recovery the plan did not write just before this part (see isClosingRecovery) may be in it.
  const extra = slack && slack.type === part.amount.type ? (slack.type === 'distance' ? slack.distance_m : slack.duration_s) : 0;
  const amountRatio = run > plannedAmount * EXTENDED_ABOVE ? run / (plannedAmount + extra) : run / plannedAmount;
  let difference: number | null = null;
  if (part.resolved.type === 'pace' && actual.pace_s_per_km !== null) {
    const fast = part.resolved.fast_s_per_km * (1 - tolerance);
    const slow = part.resolved.slow_s_per_km * (1 + tolerance);
    const pace = actual.pace_s_per_km;
    difference =
      pace < part.resolved.fast_s_per_km
        ? pace - part.resolved.fast_s_per_km
        : pace > part.resolved.slow_s_per_km
          ? pace - part.resolved.slow_s_per_km
          : 0;
    if (amountRatio < CUT_SHORT_BELOW) return { verdict: 'cut short', difference };
    if (amountRatio > EXTENDED_ABOVE) return { verdict: 'extended', difference };
    if (pace < fast) return { verdict: 'quick', difference };
    if (pace > slow) return { verdict: 'slow', difference };
    return { verdict: 'on pace', difference };
  }
  if (amountRatio < CUT_SHORT_BELOW) return { verdict: 'cut short', difference };
  if (amountRatio > EXTENDED_ABOVE) return { verdict: 'extended', difference };
  if (part.resolved.type === 'heart_rate' && actual.avg_hr !== null) {
    // A heart rate above the range means the part was run harder than prescribed.
    if (actual.avg_hr > part.resolved.high_bpm * (1 + tolerance)) return { verdict: 'quick', difference };
    if (actual.avg_hr < part.resolved.low_bpm * (1 - tolerance)) return { verdict: 'slow', difference };
  }
  // An effort-only part has no pace to be on: it was run, by feel (its heart rate is shown beside it).
  if (part.resolved.type === 'effort') return { verdict: 'by feel', difference };
  return { verdict: 'on pace', difference };
}

/** The session verdict from its parts: all on pace → as planned; nothing on pace and most missed or cut → missed; else partly. */
export function sessionVerdict(parts: readonly PartCheck[]): SessionVerdict {
  if (parts.length === 0) return 'unplanned';
  const onPace = parts.filter((p) => p.verdict === 'on pace' || p.verdict === 'by feel').length;
  if (onPace === parts.length) return 'as planned';
  const lost = parts.filter((p) => p.verdict === 'missed' || p.verdict === 'cut short').length;
  if (onPace === 0 && lost * 2 >= parts.length) return 'missed';
  return 'partly';
}

/**
 * Compares a run's series with the expanded, resolved parts of its plan. `tolerance` is the share of
 * the target pace allowed either side (0.02 = ±2 %). The series needs at least two points.
 */
export function checkRunAgainstPlan(
  plannedParts: readonly CheckedPart[],
  series: CheckSeries,
  laps: readonly CheckLap[],
  tolerance = DEFAULT_TOLERANCE,
): PlanCheckResult {
  if (plannedParts.length === 0) return { method: 'planned amounts', parts: [], session_verdict: 'unplanned' };
  // A recovery closing a repeat's last round was not written ("6 x 800 m w/ 400 m jog" has five):
  // it gets no row. One that ends the plan stays for the alignment only, so the last rep ends at its
  // planned amount and the running after it is not judged.
  const unwritten = new Set(plannedParts.filter((_, i) => isClosingRecovery(plannedParts, i)));
  const withoutUnwritten = plannedParts.filter((part, i) => !unwritten.has(part) || i === plannedParts.length - 1);
  // Device laps may mark the unwritten recovery too (a watch runs the unrolled list): then they align with all of it.
  const parts = lapsFit(plannedParts, laps) ? plannedParts : withoutUnwritten;
  const n = series.t.length;
  const runStart = series.t[0]!;
  const runEnd = series.t[n - 1]!;
  const useLaps = lapsFit(parts, laps);
  const bounds: number[] = [runStart];
  if (useLaps) {
    for (let i = 1; i < laps.length; i++) bounds.push(Math.min(Math.max(laps[i]!.start_t, bounds[i - 1]!), runEnd));
    bounds.push(runEnd);
  } else {
    for (let i = 0; i < parts.length; i++) {
      const start = bounds[i]!;
      if (i === parts.length - 1) {
        bounds.push(runEnd); // the last part takes what is left: a longer cool-down shows as extended
        break;
      }
      const candidate = Math.min(plannedEnd(series, parts[i]!, start), runEnd);
      bounds.push(candidate >= runEnd ? runEnd : refineBoundary(series, candidate, start, parts[i]!, parts[i + 1]!, runEnd));
    }
  }

  const checks: PartCheck[] = parts.map((part, i) => {
    const start = bounds[i]!;
    const end = bounds[i + 1]!;
    const distance = distanceAtTime(series, end) - distanceAtTime(series, start);
    const duration = (end - start) / 1000;
    const movingS = movingSecondsBetween(series, start, end);
    const actual = {
      distance_m: distance,
      duration_s: duration,
      moving_s: movingS,
      stops: stopsBetween(series, start, end),
      // Pace from moving time, as splits are (api-contract.md "Splits").
      pace_s_per_km: distance > 1 && movingS > 0 ? movingS / (distance / 1000) : null,
      avg_hr: averageHeartRate(series, start, end),
      start_t: start,
      end_t: end,
    };
    if (duration <= 0 || distance <= 0) {
      return {
        index: part.index,
        kind: part.kind,
        planned: planned(part),
        actual,
        difference_s_per_km: null,
        verdict: 'missed',
        note: 'the run ended before this part',
      };
    }
    const before = plannedParts[plannedParts.indexOf(part) - 1];
    const slack = before && unwritten.has(before) ? before.amount : undefined;
    const { verdict, difference } = judgePart(part, actual, tolerance, slack);
    return {
      index: part.index,
      kind: part.kind,
      planned: planned(part),
      actual,
      difference_s_per_km: difference,
      verdict,
      note: null,
    };
  });

  markSkippedReps(parts, checks);
  const written = checks.filter((_, i) => !unwritten.has(parts[i]!));
  // A written recovery after the last rep that ends the session is optional (api-contract.md): dropped when not run.
  const last = written.at(-1);
  const kept =
    last && last.kind === 'recovery jog' && last.actual.duration_s <= 0 && written.length > 1 ? written.slice(0, -1) : written;
  return { method: useLaps ? 'device laps' : 'planned amounts', parts: kept, session_verdict: sessionVerdict(kept) };
}

/** A rep run far slower than its target and about as slow as the recoveries around it was skipped. */
function markSkippedReps(parts: readonly CheckedPart[], checks: PartCheck[]): void {
  const recoveryPaces = checks
    .filter((c, i) => parts[i]!.kind === 'recovery jog' && c.actual.pace_s_per_km !== null)
    .map((c) => c.actual.pace_s_per_km!);
  if (recoveryPaces.length === 0) return;
  const sorted = [...recoveryPaces].sort((a, b) => a - b);
  const recovery = sorted[Math.floor(sorted.length / 2)]!;
  checks.forEach((check, i) => {
    const part = parts[i]!;
    const pace = check.actual.pace_s_per_km;
    if (part.kind !== 'rep' || part.resolved.type !== 'pace' || pace === null) return;
    const tooSlow = pace > part.resolved.slow_s_per_km * (1 + SKIPPED_REP_SLOWER);
    const likeRecovery = Math.abs(pace / recovery - 1) <= SKIPPED_REP_NEAR_RECOVERY;
    if (tooSlow && likeRecovery) {
      check.verdict = 'missed';
      check.note = 'run at recovery pace: rep skipped';
    }
  });
}
