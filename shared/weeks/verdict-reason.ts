/**
 * The one-line reason beside a day's verdict in the week review ("goal-pace part +65 s/mi slow",
 * "rep 4 missed"), and the reps of an interval session on one line, both from the plan-check result.
 */
import type { PartCheck, SessionVerdict } from '../plans/plan-check.ts';
import { METRES_PER_KM, METRES_PER_MILE } from '../units.ts';

export type ReasonUnit = 'km' | 'mi';

/** At most this many parts are named in one reason; the rest are counted ("and 2 more"). */
export const REASON_MAX_PARTS = 2;

type CheckedPart = Pick<PartCheck, 'index' | 'kind' | 'planned' | 'actual' | 'verdict'>;

const KIND_LABEL: Record<PartCheck['kind'], string> = {
  'warm-up': 'warm-up',
  easy: 'easy part',
  steady: 'steady part',
  tempo: 'tempo part',
  'goal pace': 'goal-pace part',
  rep: 'rep',
  'recovery jog': 'recovery',
  'cool-down': 'cool-down',
  strides: 'strides',
};

/** How far from the plan a part is, for ordering: missed first, then the biggest pace miss. */
function severity(part: CheckedPart): number {
  if (part.verdict === 'missed') return 1e9;
  if (part.verdict === 'cut short' || part.verdict === 'extended') return 1e6;
  return paceGap(part) ?? 0;
}

/** Seconds per km outside the target range (positive), or null without a pace or a range. */
function paceGap(part: CheckedPart): number | null {
  const pace = part.actual.pace_s_per_km;
  if (pace === null) return null;
  if (part.verdict === 'slow' && part.planned.pace_slow_s_per_km !== undefined) return pace - part.planned.pace_slow_s_per_km;
  if (part.verdict === 'quick' && part.planned.pace_fast_s_per_km !== undefined) return part.planned.pace_fast_s_per_km - pace;
  return null;
}

/** Seconds per km → whole seconds per `unit` (the international mile is 1609.344 m, NIST SP 811). */
function perUnit(secondsPerKm: number, unit: ReasonUnit): number {
  return Math.round((secondsPerKm * (unit === 'mi' ? METRES_PER_MILE : METRES_PER_KM)) / 1000);
}

function clock(seconds: number): string {
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const ss = String(s % 60).padStart(2, '0');
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${ss}` : `${m}:${ss}`;
}

function amount(part: CheckedPart, unit: ReasonUnit): string {
  if (part.planned.distance_m !== undefined) {
    const per = unit === 'mi' ? METRES_PER_MILE : METRES_PER_KM;
    return `${(part.actual.distance_m / per).toFixed(1)} of ${(part.planned.distance_m / per).toFixed(1)} ${unit}`;
  }
  if (part.planned.duration_s !== undefined) return `${clock(part.actual.duration_s)} of ${clock(part.planned.duration_s)}`;
  return '';
}

/** Names each part as a reader counts them: "rep 4", "tempo part 2" when there are several tempo parts. */
function labels(parts: readonly CheckedPart[]): Map<number, string> {
  const total = new Map<string, number>();
  for (const p of parts) total.set(p.kind, (total.get(p.kind) ?? 0) + 1);
  const seen = new Map<string, number>();
  const out = new Map<number, string>();
  for (const p of parts) {
    const n = (seen.get(p.kind) ?? 0) + 1;
    seen.set(p.kind, n);
    const label = KIND_LABEL[p.kind];
    out.set(p.index, p.kind === 'rep' || (total.get(p.kind) ?? 0) > 1 ? `${label} ${n}` : label);
  }
  return out;
}

function phrase(part: CheckedPart, label: string, unit: ReasonUnit): string {
  switch (part.verdict) {
    case 'missed':
      return `${label} missed`;
    case 'slow':
    case 'quick': {
      const gap = paceGap(part);
      if (gap === null) return `${label} ${part.verdict}`;
      const seconds = perUnit(gap, unit);
      return `${label} ${part.verdict === 'slow' ? '+' : '−'}${seconds} s/${unit} ${part.verdict}`;
    }
    case 'cut short':
    case 'extended': {
      const how = amount(part, unit);
      return how ? `${label} ${part.verdict} (${how})` : `${label} ${part.verdict}`;
    }
    default:
      return `${label} ${part.verdict}`;
  }
}

/**
 * Why a session is not "as planned", in one line: the parts off the plan, missed parts first, then by
 * how far their pace is outside the target range, at most `REASON_MAX_PARTS` named. Recovery jogs are
 * named only when nothing else is off. Null for "as planned", "unplanned" and a check with no parts.
 */
export function verdictReason(
  check: { session_verdict: SessionVerdict; parts: readonly CheckedPart[] },
  unit: ReasonUnit,
): string | null {
  if (check.session_verdict === 'as planned' || check.session_verdict === 'unplanned') return null;
  const names = labels(check.parts);
  // 'by feel' is how an effort-only part is run as written, not a miss.
  const off = check.parts.filter((p) => p.verdict !== 'on pace' && p.verdict !== 'by feel');
  const main = off.filter((p) => p.kind !== 'recovery jog');
  const chosen = (main.length > 0 ? main : off).slice().sort((a, b) => severity(b) - severity(a) || a.index - b.index);
  if (chosen.length === 0) return null;
  const named = chosen.slice(0, REASON_MAX_PARTS).map((p) => phrase(p, names.get(p.index) ?? KIND_LABEL[p.kind], unit));
  const more = chosen.length - named.length;
  return more > 0 ? `${named.join('; ')} and ${more} more` : named.join('; ');
}

/**
 * The reps of an interval session on one line: each rep's pace, their mean (by time over distance,
 * so a longer rep weighs more), and the change from the first to the last rep run. Null without
 * at least two reps run. "6 reps: 3:12 3:10 3:09 3:08 3:06 3:05 /km · avg 3:08 · first→last −7 s".
 */
export function repsLine(parts: readonly CheckedPart[], unit: ReasonUnit): string | null {
  const reps = parts.filter((p) => p.kind === 'rep');
  const run = reps.filter((p) => p.verdict !== 'missed' && p.actual.pace_s_per_km !== null && p.actual.distance_m > 0);
  if (run.length < 2) return null;
  const paces = run.map((p) => perUnit(p.actual.pace_s_per_km!, unit));
  const time = run.reduce((s, p) => s + p.actual.duration_s, 0);
  const distance = run.reduce((s, p) => s + p.actual.distance_m, 0);
  const mean = perUnit(time / (distance / 1000), unit);
  const change = paces[paces.length - 1]! - paces[0]!;
  const sign = change > 0 ? '+' : change < 0 ? '−' : '±';
  const missed = reps.length - run.length;
  return (
    `${reps.length} reps: ${paces.map(clock).join(' ')} /${unit} · avg ${clock(mean)} · first→last ${sign}${Math.abs(change)} s` +
    (missed > 0 ? ` · ${missed} not run` : '')
  );
}
