import type { Actor } from '../../../shared/auth/permissions.ts';
import { expandParts } from '../../../shared/plans/expand.ts';
import { racePacesFor } from '../../../shared/plans/race-paces.ts';
import { plannedVolume } from '../../../shared/plans/weeks.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import { EASY_RULE, rangeFromMarathonEffort } from '../../../shared/race/training-ranges.ts';
import { localDateTime } from '../../../shared/runs/local-time.ts';
import { longRunPlanId, summariseWeek, type WeekPlan, type WeekReview, type WeekRun } from '../../../shared/weeks/week-review.ts';
import { addDays, weekDates, weekStart } from '../../../shared/weeks/weeks.ts';
import type { SessionPlanRow, UserRow } from '../../lib/db.ts';
import { NotFoundError } from '../../lib/errors.ts';
import { findFuelTakenOf, findRunCheckinsOf } from '../fuel/fuel.repository.ts';
import { findGoalRacesOf, listRaceResultsOf } from '../goals/goals.repository.ts';
import { listPlansOf } from '../plans/plans.repository.ts';
import { checkRuns, runnerCheckInputs, type RunnerCheckInputs } from '../plans/plans.service.ts';
import { toRunListItem } from '../runs/runs.repository.ts';
import { assertCanReadRunner } from '../squads/runner-access.ts';
import { findCoachIdsOfRunner, findSquadById, listMembers } from '../squads/squads.repository.ts';
import { findUserById, findUsersByIds } from '../users/users.repository.ts';
import {
  deleteWeekReview,
  findWeekReviewsOf,
  insertWeekNote,
  lastUploadsOf,
  listRunItemsOf,
  listRunLoadsOf,
  listWeekNotes,
  upsertWeekReview,
} from './weeks.repository.ts';

const EASY_KINDS = new Set(['easy', 'recovery jog', 'warm-up', 'cool-down']);
const TREND_WEEKS = 12;

/** Rows grouped by `key`, each group in the rows' order. */
function groupBy<T>(rows: readonly T[], key: (row: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const row of rows) {
    const k = key(row);
    const group = groups.get(k);
    if (group) group.push(row);
    else groups.set(k, [row]);
  }
  return groups;
}

function weekPlansOf(rows: SessionPlanRow[]): WeekPlan[] {
  const plans = rows.map((row) => {
    const parts = expandParts(row.items as PlanItem[]);
    const { distance_m: distance, duration_s: duration } = plannedVolume(row.items as PlanItem[]);
    return {
      id: row.id,
      date: row.date,
      title: row.title,
      planned_distance_m: distance > 0 ? distance : null,
      planned_duration_s: duration > 0 ? duration : null,
      is_long_run: false,
      easy_only: parts.length > 0 && parts.every((p) => EASY_KINDS.has(p.kind)),
    };
  });
  const longRun = longRunPlanId(plans);
  return plans.map((p) => ({ ...p, is_long_run: p.id === longRun }));
}

/** The runner's local date now. */
function todayOf(runner: UserRow, now: Date): string {
  return localDateTime(now.getTime(), runner.time_zone).date;
}

/** The fast end of the runner's easy range, set from their marathon effort: the pace their plans' `@ MP` resolves to. */
function easyPaceFastest(inputs: RunnerCheckInputs, today: string): number | null {
  const marathonEffort = racePacesFor(inputs.goal, inputs.results, today).MP;
  return marathonEffort === undefined ? null : rangeFromMarathonEffort(EASY_RULE, marathonEffort).fast.s_per_km;
}

export interface RunnerWeek extends WeekReview {
  runner_id: string;
  runner: { id: string; name: string };
  start: string;
  end: string;
  today: string;
  week_starts_on: number;
  trend: Array<{ start: string; run_distance_m: number; trimp: number }>;
  last_upload: string | null;
  reviewed_by: Array<{ coach_id: string; coach_name: string; reviewed_at: string }>;
  notes: Array<{ id: string; text: string; created_at: string; author: { id: string; name: string; role: string } }>;
}

/** The dates one runner's week review covers: the week itself, the 12-week trend and the 28 days of load. */
interface WeekFrame {
  runner: UserRow;
  today: string;
  start: string;
  dates: string[];
  end: string;
  trendStart: string;
  loadStart: string;
  historyFrom: string;
}

function frameOf(runner: UserRow, requestedStart: string | undefined, now: Date): WeekFrame {
  const today = todayOf(runner, now);
  const start = weekStart(requestedStart ?? today, runner.week_starts_on);
  const dates = weekDates(start);
  const end = dates[6]!;
  const trendStart = addDays(start, -7 * (TREND_WEEKS - 1));
  const loadStart = addDays(end, -27);
  const historyFrom = trendStart < loadStart ? trendStart : loadStart;
  return { runner, today, start, dates, end, trendStart, loadStart, historyFrom };
}

const earliest = (dates: string[]) => dates.reduce((a, b) => (b < a ? b : a));
const latest = (dates: string[]) => dates.reduce((a, b) => (b > a ? b : a));

/**
 * The weeks of several runners (each in their own week and time zone), read with a few queries for
 * all of them rather than a few per runner. `forReview` adds what only the week review shows: notes
 * and, per run, fuel taken and the after-run check-in.
 */
async function buildWeeks(frames: WeekFrame[], forReview: boolean): Promise<RunnerWeek[]> {
  if (frames.length === 0) return [];
  const ids = frames.map((f) => f.runner.id);
  const weekFrom = earliest(frames.map((f) => f.start));
  const weekTo = latest(frames.map((f) => f.end));
  const [planRows, history, weekItems, goals, results, reviews, lastUploads] = await Promise.all([
    listPlansOf(ids, weekFrom, weekTo),
    listRunLoadsOf(ids, earliest(frames.map((f) => f.historyFrom)), weekTo),
    listRunItemsOf(ids, weekFrom, weekTo),
    findGoalRacesOf(ids),
    listRaceResultsOf(ids),
    findWeekReviewsOf(
      ids,
      frames.map((f) => f.start),
    ),
    lastUploadsOf(ids),
  ]);
  const goalOf = new Map(goals.map((g) => [g.user_id, g]));
  const resultsOf = groupBy(results, (r) => r.user_id);
  const inputsOf = new Map(
    frames.map((f) => [f.runner.id, runnerCheckInputs(f.runner, goalOf.get(f.runner.id), resultsOf.get(f.runner.id) ?? [])]),
  );
  const historyOf = groupBy(history, (r) => r.user_id);
  const itemsOf = groupBy(weekItems, (r) => r.user_id);
  const plansOf = groupBy(planRows, (p) => p.runner_id);
  const reviewsOf = groupBy(reviews, (r) => `${r.runner_id}|${r.week_start}`);
  const weekRunsOf = new Map(
    frames.map((f) => [
      f.runner.id,
      (itemsOf.get(f.runner.id) ?? []).filter((r) => r.local_date >= f.start && r.local_date <= f.end),
    ]),
  );
  const weekRuns = [...weekRunsOf.values()].flat();
  const weekRunIds = weekRuns.map((r) => r.id);
  const [checks, notes, fuelTaken, checkins] = await Promise.all([
    checkRuns(weekRuns, inputsOf),
    forReview ? listWeekNotes(frames[0]!.runner.id, frames[0]!.start) : [],
    forReview ? findFuelTakenOf(weekRunIds) : [],
    forReview ? findRunCheckinsOf(weekRunIds) : [],
  ]);
  const fuelOf = new Map(fuelTaken.map((f) => [f.run_id, f]));
  const checkinOf = new Map(checkins.map((c) => [c.run_id, c]));

  return frames.map((frame) => {
    const { runner, today, start, dates, end, trendStart, loadStart, historyFrom } = frame;
    // In the order the runs started, as the first run of the history is the earliest started.
    const mine = (historyOf.get(runner.id) ?? []).filter((r) => r.local_date >= historyFrom && r.local_date <= end);
    const items = weekRunsOf.get(runner.id)!;
    const runs: WeekRun[] = items.map((run) => {
      const check = checks.get(run.id)!;
      return {
        id: run.id,
        date: run.local_date,
        distance_m: run.distance_m,
        moving_s: run.moving_s,
        trimp: run.trimp,
        session_verdict: check.result.session_verdict,
        pace_s_per_km: run.moving_s > 0 && run.distance_m > 0 ? run.moving_s / (run.distance_m / 1000) : null,
        plan_id: check.plan?.id ?? null,
      };
    });

    const byDate = groupBy(mine, (r) => r.local_date);
    const firstRunDate = mine[0]?.local_date;
    const dailyLoads: Array<{ date: string; load: number }> = [];
    for (let d = loadStart; d <= end; d = addDays(d, 1)) {
      if (firstRunDate === undefined || d < firstRunDate) continue; // history starts with the first run
      dailyLoads.push({ date: d, load: (byDate.get(d) ?? []).reduce((sum, r) => sum + (r.trimp ?? 0), 0) });
    }
    const previousStart = addDays(start, -7);
    const previous = mine.filter((r) => r.local_date >= previousStart && r.local_date < start);

    const review = summariseWeek({
      start,
      dates,
      plans: weekPlansOf((plansOf.get(runner.id) ?? []).filter((p) => p.date >= start && p.date <= end)),
      runs,
      previous_week_run_distance_m: previous.length ? previous.reduce((sum, r) => sum + r.distance_m, 0) : null,
      daily_loads_last_28_days: dailyLoads,
      easy_pace_fastest_s_per_km: easyPaceFastest(inputsOf.get(runner.id)!, today),
      today,
      unit: runner.unit,
    });

    const trend = Array.from({ length: TREND_WEEKS }, (_, k) => {
      const from = addDays(trendStart, 7 * k);
      const to = addDays(from, 6);
      const inWeek = mine.filter((r) => r.local_date >= from && r.local_date <= to);
      return {
        start: from,
        run_distance_m: inWeek.reduce((s, r) => s + r.distance_m, 0),
        trimp: inWeek.reduce((s, r) => s + (r.trimp ?? 0), 0),
      };
    });

    const itemsById = new Map(items.map((r) => [r.id, r]));
    // What the runner noted after each run, for the coach: fuel taken and the after-run check-in.
    const afterRun = (runId: string) => {
      if (!forReview) return {};
      const fuel = fuelOf.get(runId);
      const checkin = checkinOf.get(runId);
      return {
        fuel_taken: fuel
          ? {
              entries: Array.isArray(fuel.entries) ? fuel.entries.length : 0,
              stomach: fuel.stomach,
              energy: fuel.energy,
              notes: fuel.notes,
            }
          : null,
        checkin: checkin ? { ...checkin, updated_at: checkin.updated_at.toISOString() } : null,
      };
    };
    const lastUpload = lastUploads.get(runner.id) ?? null;
    return {
      ...review,
      days: review.days.map((day) => ({
        ...day,
        runs: day.runs.map((r) => ({ ...r, ...toRunListItem(itemsById.get(r.id)!), ...afterRun(r.id) })),
      })),
      runner_id: runner.id,
      runner: { id: runner.id, name: runner.name },
      start,
      end,
      today,
      week_starts_on: runner.week_starts_on,
      trend,
      last_upload: lastUpload ? lastUpload.toISOString() : null,
      reviewed_by: (reviewsOf.get(`${runner.id}|${start}`) ?? []).map((r) => ({
        coach_id: r.coach_id,
        coach_name: r.coach_name,
        reviewed_at: r.reviewed_at.toISOString(),
      })),
      notes: notes.map((n) => ({
        id: n.id,
        text: n.text,
        created_at: n.created_at.toISOString(),
        author: { id: n.author_id, name: n.author_name, role: n.author_role },
      })),
    };
  });
}

/**
 * One runner's week for the runner, their coaches and admins: plans and runs side by side with plan-check
 * verdicts, totals, long run, load, flags (shared/weeks/week-review.ts), a 12-week trend, notes and reviews.
 */
export async function buildRunnerWeek(
  actor: Actor,
  runnerId: string,
  requestedStart: string | undefined,
  now = new Date(),
): Promise<RunnerWeek> {
  await assertCanReadRunner(actor, runnerId);
  const runner = await findUserById(runnerId);
  if (!runner) throw new NotFoundError();
  const [week] = await buildWeeks([frameOf(runner, requestedStart, now)], true);
  return week!;
}

/** The runner and their coaches write notes on a week; the other side reads them. */
export async function addWeekNote(actor: Actor, runnerId: string, start: string, text: string) {
  await assertCanReadRunner(actor, runnerId);
  const id = await insertWeekNote(runnerId, start, actor.id, text);
  return { id, text };
}

/** A coach of the runner marks the week reviewed (or not). */
export async function setWeekReviewed(actor: Actor, runnerId: string, start: string, reviewed: boolean): Promise<void> {
  await assertCanReadRunner(actor, runnerId);
  if (!(await findCoachIdsOfRunner(runnerId)).includes(actor.id))
    throw new NotFoundError('Only the runner’s coach marks a week reviewed.');
  if (reviewed) await upsertWeekReview(runnerId, start, actor.id);
  else await deleteWeekReview(runnerId, start, actor.id);
}

export interface OverviewRow {
  runner: { id: string; name: string };
  start: string;
  planned_distance_m: number;
  run_distance_m: number;
  moving_s: number;
  sessions_planned: number;
  sessions_as_planned: number;
  flags: Array<{ code: string; message: string }>;
  last_upload: string | null;
  reviewed: boolean;
  volume_12_weeks: number[];
}

/** One row per squad runner for the week containing `week` (each runner's own week start). */
export async function buildSquadOverview(actor: Actor, squadId: string, week: string | undefined, now = new Date()) {
  const squad = await findSquadById(squadId);
  if (!squad || (squad.coach_id !== actor.id && actor.role !== 'admin'))
    throw new NotFoundError('There is no squad of yours with this id.');
  // Every member's data is readable here: the actor coaches this squad or is an admin.
  const members = await listMembers(squadId);
  const users = new Map((await findUsersByIds(members.map((m) => m.id))).map((u) => [u.id, u]));
  const frames = members.flatMap((m) => {
    const user = users.get(m.id);
    return user ? [frameOf(user, week, now)] : [];
  });
  const weeks = await buildWeeks(frames, false);
  const rows: OverviewRow[] = weeks.map((w) => {
    const s = w.totals.sessions;
    return {
      runner: w.runner,
      start: w.start,
      planned_distance_m: w.totals.planned_distance_m,
      run_distance_m: w.totals.run_distance_m,
      moving_s: w.totals.moving_s,
      sessions_planned: w.days.reduce((n, d) => n + d.plans.length, 0),
      sessions_as_planned: s.as_planned,
      flags: w.flags.map((f) => ({ code: f.code, message: f.message })),
      last_upload: w.last_upload,
      reviewed: w.reviewed_by.some((r) => r.coach_id === squad.coach_id),
      volume_12_weeks: w.trend.map((t) => t.run_distance_m),
    };
  });
  return { squad: { id: squad.id, name: squad.name }, week: week ?? null, rows };
}
