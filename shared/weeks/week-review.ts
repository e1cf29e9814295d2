/**
 * The week review: one runner's week, plan against what was run, with load and flags.
 *
 * Flags describe; they do not diagnose. Each message says in plain words what was seen and ends by
 * leaving the decision to the coach; each names where its rule comes from.
 */
import { describeMarathonEffortRule, EASY_RULE } from '../race/training-ranges.ts';
import { formatDistanceIn, formatPaceIn } from '../runs/display.ts';
import { acuteChronicRatio, type AcuteChronic, type DailyLoad } from './load.ts';
import { dayOfWeek, isIsoDate, weekDates } from './weeks.ts';
import { crossTrainingSeconds, missedReasonOf, type WeekDayMark, type MissedReason } from './day-marks.ts';

/** A long run is at least this long by planned time (common practice, not a published threshold). */
export const LONG_RUN_MIN_DURATION_S = 90 * 60;
/** …or at least this share of the week's planned distance (common practice, not a published threshold). */
export const LONG_RUN_MIN_SHARE = 0.25;
/** Weekly distance may grow by this fraction before `volume-jump` (the "10 % rule", common practice). */
export const VOLUME_JUMP_FRACTION = 0.1;
/** Acute:chronic ratio above which `load-spike` is raised (Gabbett 2016; exactly 1.5 is not flagged). */
export const LOAD_SPIKE_RATIO = 1.5;

export type SessionVerdict = 'as planned' | 'partly' | 'missed' | 'unplanned';
export type DistanceUnit = 'km' | 'mi';
export type FlagCode = 'volume-jump' | 'load-spike' | 'easy-too-fast' | 'long-run-missed';

export interface WeekPlan {
  id: string;
  date: string;
  title: string;
  /** Metres over the parts given as a distance; null for a plan given only by time (not guessed from a pace). */
  planned_distance_m: number | null;
  /** Seconds over the parts given as a time; null when none. */
  planned_duration_s: number | null;
  is_long_run: boolean;
  /** Every part of the plan is easy running (so the whole run should sit in the easy range). */
  easy_only: boolean;
}

export interface WeekRun {
  id: string;
  date: string;
  distance_m: number;
  moving_s: number;
  /** Banister TRIMP, null without heart rate. */
  trimp: number | null;
  /** Session verdict of the plan check, null when not checked. */
  session_verdict: SessionVerdict | null;
  /** Mean moving pace, s per km. */
  pace_s_per_km: number | null;
  /** The plan this run was checked against, when known; otherwise runs are matched to plans by date. */
  plan_id?: string | null;
  /** Moving seconds spent in goal-pace parts, from the plan check (0 or absent when none). */
  goal_pace_s?: number;
}

export interface WeekReviewInput {
  /** First day of the week, `YYYY-MM-DD`. */
  start: string;
  /** The seven dates from `start`. */
  dates: string[];
  plans: WeekPlan[];
  runs: WeekRun[];
  previous_week_run_distance_m: number | null;
  /**
   * One entry per day (0 on rest days), covering at least the 28 days ending on the review date
   * (the week's last day, or `today` if earlier); more days are fine. See `acuteChronicRatio`.
   */
  daily_loads_last_28_days: DailyLoad[];
  /** The fast end of the runner's easy range, s per km, or null when unknown. */
  easy_pace_fastest_s_per_km: number | null;
  /** The runner's local date today. */
  today: string;
  /** Unit for distances and paces in flag messages; km by default. */
  unit?: DistanceUnit;
  /**
   * Who reads the flags: the runner themself (the default: "You ran …") or their coach, in which case the
   * messages name the runner ("Ivy ran …") and leave the decision to the coach reading them.
   */
  reader?: { role: 'runner' } | { role: 'coach'; runner_name: string };
  /** Days marked rest, ill, injured or cross-training (at most one per date); none by default. */
  day_marks?: WeekDayMark[];
}

export interface WeekFlag {
  code: FlagCode;
  message: string;
  source: string;
  /** The plan or run the flag is about, when it is about one. */
  plan_id?: string;
  run_id?: string;
}

export interface WeekReview {
  days: Array<{ date: string; plans: WeekPlan[]; runs: WeekRun[]; day_marks: WeekDayMark[] }>;
  /** Plans before today with no run that day; `reason` is the day's mark ("missed — ill"), null for a plain miss. */
  missed_plans: Array<{ plan_id: string; date: string; reason: MissedReason | null }>;
  totals: {
    /** Sum of the plans' planned distance; plans given only by time are left out (see `plans_without_distance`). */
    planned_distance_m: number;
    /** How many plans have no planned distance and so are not in `planned_distance_m`. */
    plans_without_distance: number;
    /** Sum of the time-based parts of the plans, seconds (not comparable to `moving_s` when plans mix). */
    planned_duration_s: number;
    run_distance_m: number;
    moving_s: number;
    /** Minutes of cross-training days, in seconds: time, not running distance. */
    cross_training_s: number;
    /** Running (moving) time plus cross-training. */
    time_s: number;
    /**
     * `missed` counts plain misses (including sessions the runs missed by verdict); `missed_with_reason`
     * counts plans missed on a day marked rest, ill, injured or cross-training.
     */
    sessions: { as_planned: number; partly: number; missed: number; missed_with_reason: number; unplanned: number };
    /** Plans dated up to `today` (the runner's local date): the sessions that could have been run by now. */
    sessions_due: number;
    /** Moving time of the runs on plans given only by time, to set against `planned_duration_s`. */
    moving_s_on_timed_plans: number;
    /** Moving seconds spent in goal-pace parts (plan check). */
    goal_pace_s: number;
    /** Sum of the runs' TRIMP; null when no run has one. */
    trimp: number | null;
    /** Runs with no TRIMP (no heart rate), so not in `trimp`. */
    runs_without_trimp: number;
  };
  long_run: { run_id: string; distance_m: number; share_of_week: number } | null;
  acute_chronic_ratio: AcuteChronic | null;
  flags: WeekFlag[];
}

const SOURCES: Record<FlagCode, string> = {
  'volume-jump':
    "Common practice (the '10 % rule'); no published source. A trial in novice runners (Buist et al. 2008) " +
    'found no fewer injuries with 10 % a week than with a faster build-up.',
  'load-spike':
    'Gabbett, T. J. (2016), Br J Sports Med 50:273–280: acute:chronic workload ratio, last 7 days against the ' +
    'mean week of the last 28 (coupled).',
  'easy-too-fast':
    `The runner's easy range: ${describeMarathonEffortRule(EASY_RULE)} (the pace @ MP resolves to, from the goal ` +
    'race or a recent result with the Daniels & Gilbert equations); the width of the range is our own choice.',
  'long-run-missed': "The runner's plan.",
};

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'] as const;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

type LongRunCandidate = Pick<WeekPlan, 'id' | 'date' | 'planned_distance_m' | 'planned_duration_s'>;

/**
 * The id of the week's long run plan, or null. Heuristic (common practice, not a published rule):
 * the plan with the most planned time, if that is at least 90 minutes; otherwise the plan with the
 * most planned distance, if that is at least 25 % of the week's planned distance. Time is tried
 * first because 90 minutes is an absolute mark while 25 % is relative (distance and time cannot be
 * compared without a pace). Ties go to the earlier date, then the earlier entry. Note that in a week
 * with one distance plan, that plan is 100 % of the week and so is the long run.
 */
export function longRunPlanId(weekPlans: readonly LongRunCandidate[]): string | null {
  const longestTime = maxBy(weekPlans, (p) => p.planned_duration_s ?? 0);
  if (longestTime && (longestTime.planned_duration_s ?? 0) >= LONG_RUN_MIN_DURATION_S) return longestTime.id;
  const weekDistance = weekPlans.reduce((sum, p) => sum + positive(p.planned_distance_m), 0);
  const longestDistance = maxBy(weekPlans, (p) => p.planned_distance_m ?? 0);
  if (longestDistance && weekDistance > 0 && positive(longestDistance.planned_distance_m) >= LONG_RUN_MIN_SHARE * weekDistance) {
    return longestDistance.id;
  }
  return null;
}

/** Whether `plan` is the long run of the week `weekPlans` (which includes it); see `longRunPlanId`. */
export function isLongRunPlan(plan: LongRunCandidate, weekPlans: readonly LongRunCandidate[]): boolean {
  return longRunPlanId(weekPlans) === plan.id;
}

/**
 * Summarise one runner's week. Plans and runs dated outside the week are ignored.
 *
 * - Sessions: runs are counted by their session verdict; a plan dated before `today` with no run that
 *   day also counts as missed (when a day has runs, its plans are not counted missed here).
 * - Long run: the longest run of the week by distance, with its share of the week's run distance.
 * - Acute:chronic ratio: coupled, on the week's last day or on `today` if earlier; null for a week
 *   that starts after `today`.
 * - Flags: `volume-jump` (run distance more than 10 % above the previous week's; exactly 10 % is not a
 *   jump; no flag without a previous week), `load-spike` (ratio above 1.5; exactly 1.5 is not),
 *   `easy-too-fast` (a run whose plan is easy-only, with a mean pace faster than the fast end of the
 *   easy range), `long-run-missed` (a long-run plan before `today` with no run that day).
 *
 * Throws RangeError when `dates` are not the seven days from `start` or a date is invalid.
 */
export function summariseWeek(input: WeekReviewInput): WeekReview {
  const dates = weekDates(input.start);
  if (input.dates.length !== 7 || input.dates.some((d, i) => d !== dates[i])) {
    throw new RangeError(`dates must be the seven days from ${input.start}`);
  }
  if (!isIsoDate(input.today)) throw new RangeError(`today is not a calendar date YYYY-MM-DD: '${input.today}'`);
  const unit = input.unit ?? 'km';
  const inWeek = new Set(dates);
  const plans = input.plans.filter((p) => inWeek.has(p.date));
  const runs = input.runs.filter((r) => inWeek.has(r.date));
  const runDates = new Set(runs.map((r) => r.date));

  const marks = (input.day_marks ?? []).filter((m) => inWeek.has(m.date));
  const days = dates.map((date) => ({
    date,
    plans: plans.filter((p) => p.date === date),
    runs: runs.filter((r) => r.date === date),
    day_marks: marks.filter((m) => m.date === date),
  }));

  const missedPlans = plans.filter((p) => p.date < input.today && !runDates.has(p.date));
  const missed_plans = missedPlans.map((p) => ({ plan_id: p.id, date: p.date, reason: missedReasonOf(p.date, marks) }));
  const withReason = missed_plans.filter((m) => m.reason !== null).length;
  const sessions = {
    as_planned: 0,
    partly: 0,
    missed: missedPlans.length - withReason,
    missed_with_reason: withReason,
    unplanned: 0,
  };
  for (const r of runs) {
    if (r.session_verdict === 'as planned') sessions.as_planned++;
    else if (r.session_verdict === 'partly') sessions.partly++;
    else if (r.session_verdict === 'missed') sessions.missed++;
    else if (r.session_verdict === 'unplanned') sessions.unplanned++;
  }

  const withTrimp = runs.filter((r) => r.trimp !== null);
  const runDistance = sum(runs.map((r) => r.distance_m));
  const totals: WeekReview['totals'] = {
    planned_distance_m: sum(plans.map((p) => p.planned_distance_m ?? 0)),
    plans_without_distance: plans.filter((p) => p.planned_distance_m === null).length,
    planned_duration_s: sum(plans.map((p) => p.planned_duration_s ?? 0)),
    run_distance_m: runDistance,
    moving_s: sum(runs.map((r) => r.moving_s)),
    cross_training_s: crossTrainingSeconds(marks),
    time_s: sum(runs.map((r) => r.moving_s)) + crossTrainingSeconds(marks),
    sessions,
    sessions_due: plans.filter((p) => p.date <= input.today).length,
    moving_s_on_timed_plans: sum(runs.filter((r) => timedPlanOf(r, plans)).map((r) => r.moving_s)),
    goal_pace_s: sum(runs.map((r) => r.goal_pace_s ?? 0)),
    trimp: withTrimp.length > 0 ? sum(withTrimp.map((r) => r.trimp ?? 0)) : null,
    runs_without_trimp: runs.length - withTrimp.length,
  };

  const longest = maxBy(runs, (r) => r.distance_m);
  const long_run =
    longest && runDistance > 0
      ? { run_id: longest.id, distance_m: longest.distance_m, share_of_week: longest.distance_m / runDistance }
      : null;

  const weekEnd = dates[6] as string;
  const acute_chronic_ratio =
    input.today < input.start
      ? null
      : acuteChronicRatio(input.daily_loads_last_28_days, input.today < weekEnd ? input.today : weekEnd);

  const flags: WeekFlag[] = [];
  const voice = voiceOf(input.reader);
  const previous = input.previous_week_run_distance_m;
  if (previous !== null && previous > 0 && exceeds(runDistance, previous * (1 + VOLUME_JUMP_FRACTION))) {
    flags.push(volumeJumpFlag(runDistance, previous, unit, voice));
  }
  const ratio = acute_chronic_ratio?.ratio ?? null;
  if (ratio !== null && exceeds(ratio, LOAD_SPIKE_RATIO)) flags.push(loadSpikeFlag(ratio, voice));
  const easyFastest = input.easy_pace_fastest_s_per_km;
  if (easyFastest !== null && easyFastest > 0) {
    for (const run of runs) {
      if (run.pace_s_per_km === null || !(run.pace_s_per_km > 0) || run.pace_s_per_km >= easyFastest) continue;
      const plan = easyOnlyPlanOf(run, plans);
      if (plan) flags.push(easyTooFastFlag(run, plan, easyFastest, unit, voice));
    }
  }
  for (const plan of missedPlans) {
    if (plan.is_long_run) flags.push(longRunMissedFlag(plan, unit, voice, missedReasonOf(plan.date, marks)));
  }

  return { days, missed_plans, totals, long_run, acute_chronic_ratio, flags };
}

/** The run's plan when it is given only by time (no distance part): its `plan_id`, else a plan of its date. */
function timedPlanOf(run: WeekRun, plans: readonly WeekPlan[]): WeekPlan | null {
  const timed = (p: WeekPlan | undefined) => (p && p.planned_distance_m === null && p.planned_duration_s !== null ? p : null);
  if (run.plan_id != null) return timed(plans.find((p) => p.id === run.plan_id));
  return timed(plans.find((p) => p.date === run.date));
}

/** The run's plan when it is easy-only: its `plan_id` when given, else the plans of its date when all are easy-only. */
function easyOnlyPlanOf(run: WeekRun, plans: readonly WeekPlan[]): WeekPlan | null {
  if (run.plan_id != null) {
    const plan = plans.find((p) => p.id === run.plan_id);
    return plan?.easy_only ? plan : null;
  }
  const sameDay = plans.filter((p) => p.date === run.date);
  return sameDay.length > 0 && sameDay.every((p) => p.easy_only) ? (sameDay[0] as WeekPlan) : null;
}

/** How a flag addresses its reader: the runner ("you") or the coach (the runner by name). */
interface Voice {
  /** "You" / "Ivy" at the start of a sentence. */
  who: string;
  /** "Your" / "Ivy's" at the start of a sentence. */
  whose: string;
  /** "your" / "Ivy's" inside a sentence. */
  whoseInner: string;
  /** The closing words that leave the decision to the coach. */
  lastWord: (about: string) => string;
}

function voiceOf(reader: WeekReviewInput['reader']): Voice {
  if (reader?.role === 'coach') {
    const name = reader.runner_name.trim() || 'The runner';
    return {
      who: name,
      whose: `${name}’s`,
      whoseInner: `${name}’s`,
      lastWord: (about) => `As the coach, you have the last word on ${about}.`,
    };
  }
  return { who: 'You', whose: 'Your', whoseInner: 'your', lastWord: (about) => `Your coach has the last word on ${about}.` };
}

function volumeJumpFlag(runDistance: number, previous: number, unit: DistanceUnit, v: Voice): WeekFlag {
  const up = Math.round((runDistance / previous - 1) * 100);
  return {
    code: 'volume-jump',
    message:
      `${v.who} ran ${formatDistanceIn(runDistance, unit)} this week, ${up} % more than the ${formatDistanceIn(previous, unit)} ` +
      'of the week before. A common rule of thumb keeps weekly increases to about 10 %, though studies have not ' +
      `shown that it prevents injury. ${v.lastWord('how fast to build up')}`,
    source: SOURCES['volume-jump'],
  };
}

function loadSpikeFlag(ratio: number, v: Voice): WeekFlag {
  return {
    code: 'load-spike',
    message:
      `${v.whose} training load over the last 7 days is ${ratio.toFixed(2)} times the average week over the last 4 weeks. ` +
      'Gabbett (2016) linked ratios of 1.5 and above with more injuries in team-sport athletes; later studies ' +
      'question that link, so read it as a sign that the load rose quickly, not as a prediction. ' +
      v.lastWord('whether to ease off'),
    source: SOURCES['load-spike'],
  };
}

function easyTooFastFlag(run: WeekRun, plan: WeekPlan, easyFastest: number, unit: DistanceUnit, v: Voice): WeekFlag {
  return {
    code: 'easy-too-fast',
    message:
      `${v.whose} run on ${formatDay(run.date)} ("${plan.title}") averaged ${formatPaceIn(run.pace_s_per_km ?? 0, unit)}, ` +
      `quicker than the fast end of ${v.whoseInner} easy range (${formatPaceIn(easyFastest, unit)}). Easy days kept easy ` +
      `leave the legs fresh for the hard ones. ${v.lastWord('the paces')}`,
    source: SOURCES['easy-too-fast'],
    plan_id: plan.id,
    run_id: run.id,
  };
}

function longRunMissedFlag(plan: WeekPlan, unit: DistanceUnit, v: Voice, reason: MissedReason | null): WeekFlag {
  const amount = plan.planned_distance_m !== null ? ` of ${formatDistanceIn(plan.planned_distance_m, unit)}` : '';
  const marked = reason ? ` The day is marked ${reason}.` : '';
  return {
    code: 'long-run-missed',
    message:
      `The long run${amount} planned for ${formatDay(plan.date)} ("${plan.title}") has no run recorded that day.${marked} ` +
      `If it was moved or cut short, ${v
        .lastWord('how to fit it into the coming weeks')
        .replace(/\.$/, '')
        .replace(/^As the coach, you have the last word on /, 'you decide, as the coach, ')
        .replace(/^Your coach has the last word on /, 'your coach can decide ')}.`,
    source: SOURCES['long-run-missed'],
    plan_id: plan.id,
  };
}

/** 'Sun 18 Oct' */
function formatDay(date: string): string {
  const month = Number(date.slice(5, 7));
  return `${WEEKDAYS[dayOfWeek(date)]} ${Number(date.slice(8, 10))} ${MONTHS[month - 1]}`;
}

/**
 * `value` above `limit` by more than rounding: sums of fractional loads and distances can land a hair
 * above a limit they equal (30 000 m · 1.1 is 33 000.000000000004), and a boundary must not flag.
 */
function exceeds(value: number, limit: number): boolean {
  return value > limit * (1 + 1e-9);
}

function sum(values: readonly number[]): number {
  return values.reduce((a, b) => a + b, 0);
}

function positive(value: number | null): number {
  return value !== null && value > 0 ? value : 0;
}

/** The item with the largest positive key, or null; among equals the earliest date, then the first listed. */
function maxBy<T extends { date: string }>(items: readonly T[], key: (item: T) => number): T | null {
  let best: T | null = null;
  for (const item of items) {
    const k = key(item);
    if (!(k > 0)) continue;
    if (best === null || k > key(best) || (k === key(best) && item.date < best.date)) best = item;
  }
  return best;
}
