import type { SquadOverview, SquadOverviewRow } from '../../../shared/weeks/squad-overview.ts';
import { canReadRunnerData, type Actor } from '../../../shared/auth/permissions.ts';
import { expandParts } from '../../../shared/plans/expand.ts';
import { racePacesFor } from '../../../shared/plans/race-paces.ts';
import { plannedVolume } from '../../../shared/plans/weeks.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import { EASY_RULE, rangeFromMarathonEffort } from '../../../shared/race/training-ranges.ts';
import { todayIn } from '../../../shared/runs/local-time.ts';
import type { PartCheck } from '../../../shared/plans/plan-check.ts';
import type { TakenEntry } from '../../../shared/fuel/taken.ts';
import type { RunnerWeek, WeekFuelTaken } from '../../../shared/weeks/week-answer.ts';
import { repsLine, verdictReason } from '../../../shared/weeks/verdict-reason.ts';
import { HIGH_SORENESS } from '../../../shared/notices/batching.ts';
import { longRunPlanId, summariseWeek, type WeekPlan, type WeekRun } from '../../../shared/weeks/week-review.ts';
import { addDays, weekDates, weekStart } from '../../../shared/weeks/weeks.ts';
import type { FuelTakenRow, NoteConcern, SessionPlanRow, UserRow } from '../../lib/db.ts';
import { replicaReadContext } from '../../lib/db.ts';
import { NotFoundError, ValidationError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { recordNoteNotice, type NoticeDeps } from '../notices/index.ts';
import { findFuelTakenOf, findRunCheckinsOf } from '../fuel/index.ts';
import { plannedFuelTotalsOf } from '../fuel/index.ts';
import { findReadNoteIds } from '../notes/index.ts';
import { listRunNotesOf } from '../runs/index.ts';
import { findGoalRacesOf, listRaceResultsOf } from '../goals/index.ts';
import { listPlansOf, PLAN_CHECK_CODE_VERSION } from '../plans/index.ts';
import { listDayMarksOf } from '../plans/index.ts';
import { checkRuns, runnerCheckInputs, type RunnerCheckInputs } from '../plans/index.ts';
import { lastUploadsOf, listRunItemsOf, listRunLoadsOf, toRunListItem } from '../runs/index.ts';
import { assertCanReadRunner, squadCoachedBy } from '../squads/index.ts';
import { findCoachIdsOfRunner } from '../squads/index.ts';
import { findUserById } from '../users/index.ts';
import {
  keepAnswer,
  keptAnswer,
  keepWeek,
  keptWeek,
  readWeekCache,
  readyJson,
  storeWeeks,
  weekCacheKeyText,
  type ReadyAnswer,
} from '../week-cache/index.ts';
import {
  deleteWeekReview,
  findWeekReviewsOf,
  findWeekRunner,
  listSquadRunners,
  insertWeekNote,
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

/** The fast end of the runner's easy range, set from their marathon effort: the pace their plans' `@ MP` resolves to. */
function easyPaceFastest(inputs: RunnerCheckInputs, today: string): number | null {
  const marathonEffort = racePacesFor(inputs.goal, inputs.results, today).MP;
  return marathonEffort === undefined ? null : rangeFromMarathonEffort(EASY_RULE, marathonEffort).fast.s_per_km;
}

/** Who reads a week: their id decides unread markers and the flags' wording, their unit the reasons' unit. */
export interface WeekViewer {
  id: string;
  unit: 'km' | 'mi';
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
  const today = todayIn(runner.time_zone, now.getTime());
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
async function buildWeeks(frames: WeekFrame[], forReview: boolean, viewer: WeekViewer): Promise<RunnerWeek[]> {
  if (frames.length === 0) return [];
  const ids = frames.map((f) => f.runner.id);
  const weekFrom = earliest(frames.map((f) => f.start));
  const weekTo = latest(frames.map((f) => f.end));
  const [planRows, history, weekItems, goals, results, reviews, lastUploads, dayMarks] = await Promise.all([
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
    listDayMarksOf(ids, weekFrom, weekTo),
  ]);
  const marksOf = groupBy(dayMarks, (m) => m.runner_id);
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
  const [checks, notes, fuelTaken, checkins, runNotes] = await Promise.all([
    // Recomputed checks are charged to the reader (a coach's read never takes the runner's compute turn).
    checkRuns(weekRuns, inputsOf, viewer.id),
    forReview ? listWeekNotes(frames[0]!.runner.id, frames[0]!.start) : [],
    forReview ? findFuelTakenOf(weekRunIds) : [],
    findRunCheckinsOf(weekRunIds),
    listRunNotesOf(weekRunIds),
  ]);
  const fuelOf = new Map(fuelTaken.map((f) => [f.run_id, f]));
  const checkinOf = new Map(checkins.map((c) => [c.run_id, c]));
  const runNotesOf = groupBy(runNotes, (n) => n.run_id);
  const runsById = new Map(weekRuns.map((r) => [r.id, r]));
  const plannedFuel = new Map(
    await Promise.all(fuelTaken.map(async (f) => [f.run_id, await plannedFuelTotalsOf(runsById.get(f.run_id)!)] as const)),
  );
  // Unread markers are the viewer's alone: set by `withUnreadMarkers` after the week is built or read from the cache.
  const unread = () => false;

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
        goal_pace_s: goalPaceSeconds(check.result.parts),
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
      unit: viewer.unit,
      reader: viewer.id === runner.id ? { role: 'runner' } : { role: 'coach', runner_name: runner.name },
      day_marks: (marksOf.get(runner.id) ?? []).map((m) => ({ date: m.date, kind: m.kind, minutes: m.minutes, note: m.note })),
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
    // What the runner noted after each run, for the coach: fuel taken, the after-run check-in and the notes.
    const afterRun = (runId: string) => {
      const check = checks.get(runId)!;
      const fuel = forReview ? fuelOf.get(runId) : undefined;
      const checkin = checkinOf.get(runId);
      return {
        verdict_reason: verdictReason(check.result, viewer.unit),
        reps_line: repsLine(check.result.parts, viewer.unit),
        fuel_taken: fuel ? fuelTakenSummary(fuel, plannedFuel.get(runId) ?? null) : null,
        checkin: checkin ? { ...checkin, updated_at: checkin.updated_at.toISOString() } : null,
        notes: (runNotesOf.get(runId) ?? []).map((n) => ({
          id: n.id,
          text: n.text,
          created_at: n.created_at,
          author: n.author,
          concern: n.concern,
          unread: unread(),
        })),
      };
    };
    const weekNotes = notes.map((n) => ({
      id: n.id,
      text: n.text,
      created_at: n.created_at.toISOString(),
      author: { id: n.author_id, name: n.author_name, role: n.author_role },
      concern: n.concern,
      unread: unread(),
    }));
    const days = review.days.map((day) => {
      const dayRuns = day.runs.map((r) => ({ ...toRunListItem(itemsById.get(r.id)!), ...r, ...afterRun(r.id) }));
      return { ...day, runs: dayRuns, unread_notes: dayRuns.reduce((n, r) => n + r.notes.filter((x) => x.unread).length, 0) };
    });
    const lastUpload = lastUploads.get(runner.id) ?? null;
    return {
      ...review,
      days,
      runner_id: runner.id,
      runner: { id: runner.id, name: runner.name },
      start,
      end,
      today,
      time_zone: runner.time_zone,
      week_starts_on: runner.week_starts_on,
      trend,
      last_upload: lastUpload ? lastUpload.toISOString() : null,
      reviewed_by: (reviewsOf.get(`${runner.id}|${start}`) ?? []).map((r) => ({
        coach_id: r.coach_id,
        coach_name: r.coach_name,
        reviewed_at: r.reviewed_at.toISOString(),
      })),
      notes: weekNotes,
      unread_notes: weekNotes.filter((n) => n.unread).length + days.reduce((n, d) => n + d.unread_notes, 0),
    };
  });
}

/**
 * Changes to how a week is assembled (this file, shared/weeks) that stored weeks must not outlive: raise it with
 * such a change. The plan-check code's own version (a hash of its source) is part of the key as well.
 */
export const WEEK_ASSEMBLY_VERSION = 2;

function weekCodeVersion(): string | null {
  return PLAN_CHECK_CODE_VERSION === null ? null : `${WEEK_ASSEMBLY_VERSION}-${PLAN_CHECK_CODE_VERSION}`;
}

/** What a stored week was built for besides its runner and start: the page, the reader's side and unit. */
function variantOf(frame: WeekFrame, forReview: boolean, viewer: WeekViewer): string {
  return `${forReview ? 'review' : 'overview'}|${viewer.id === frame.runner.id ? 'runner' : 'coach'}|${viewer.unit}`;
}

/**
 * The weeks of `frames`, from the cache where a stored week is still valid (same counter, code version and
 * local date) and built in one set for the rest, which are then stored (server/features/week-cache/README.md).
 * The counters are read before anything the weeks are built from, so a week is never stored under a counter
 * newer than its data.
 */
async function cachedWeeks(
  frames: WeekFrame[],
  forReview: boolean,
  viewer: WeekViewer,
  /** The runners' counters when the caller has just read them (before any of the weeks' data). */
  knownCounters?: ReadonlyMap<string, string>,
): Promise<RunnerWeek[]> {
  const version = weekCodeVersion();
  if (version === null) return withUnreadMarkers(await buildWeeks(frames, forReview, viewer), viewer);
  const keys = frames.map((f) => ({ runner_id: f.runner.id, week_start: f.start, variant: variantOf(f, forReview, viewer) }));
  // Weeks this process keeps, still good for the runner's local date and this code.
  const kept = keys.map((k, i) => {
    const week = keptWeek(k);
    return week && week.codeVersion === version && week.today === frames[i]!.today ? week : undefined;
  });
  const allKeptNow = knownCounters !== undefined && keys.every((k, i) => kept[i]?.counter === knownCounters.get(k.runner_id));
  if (allKeptNow)
    return withUnreadMarkers(
      kept.map((w) => w!.body as RunnerWeek),
      viewer,
    );

  // Counters and stored weeks are read for the weeks not kept at the counters the caller just read.
  const keptNow = (i: number) => knownCounters !== undefined && kept[i]?.counter === knownCounters.get(keys[i]!.runner_id);
  const toRead = keys.filter((_, i) => !keptNow(i));
  const keptAt = new Map(keys.flatMap((k, i) => (kept[i] ? [[weekCacheKeyText(k), kept[i].counter] as const] : [])));
  const cache = await readWeekCache(toRead, version, keptAt);
  const entries = keys.map((k, i) => (keptNow(i) ? { counter: kept[i]!.counter, stored: null } : cache.get(weekCacheKeyText(k))));
  const fromKept = (i: number) => (kept[i] && kept[i].counter === entries[i]?.counter ? kept[i] : undefined);
  const lackingAt = frames.flatMap((f, i) => (!fromKept(i) && entries[i]?.stored?.today !== f.today ? [i] : []));
  const built = await buildOnce(
    lackingAt.map((i) => `${weekCacheKeyText(keys[i]!)}@${entries[i]?.counter ?? '0'}/${frames[i]!.today}`),
    async () => {
      const weeks = new Map(
        (
          await buildWeeks(
            lackingAt.map((i) => frames[i]!),
            forReview,
            viewer,
          )
        ).map((w) => [w.runner_id, w]),
      );
      // Stored once by the request that built them, under the counters read before their data.
      await storeWeeks(
        lackingAt.map((i) => ({
          ...keys[i]!,
          counter: entries[i]?.counter ?? '0',
          code_version: version,
          today: frames[i]!.today,
          body: weeks.get(frames[i]!.runner.id)!,
        })),
      ).catch((err: unknown) => logger.warn({ err }, 'storing assembled weeks failed'));
      return weeks;
    },
  );
  const weeks = frames.map((f, i) => {
    const week =
      built.get(f.runner.id) ?? (fromKept(i)?.body as RunnerWeek | undefined) ?? (entries[i]!.stored!.body as RunnerWeek);
    // Kept at the counter read before the week's data, as it is stored.
    keepWeek(keys[i]!, { counter: entries[i]?.counter ?? '0', codeVersion: version, today: f.today, body: week });
    return week;
  });
  return withUnreadMarkers(weeks, viewer);
}

/** Builds of weeks under way in this process, by the weeks, counters, dates and the database read. */
const weeksBuilding = new Map<string, Promise<Map<string, RunnerWeek>>>();

/**
 * Runs `build` once for requests arriving together that lack the same weeks at the same counters (a squad's
 * first read of a week sends many such at once): the others wait for that build instead of repeating it.
 */
function buildOnce(weeks: string[], build: () => Promise<Map<string, RunnerWeek>>): Promise<Map<string, RunnerWeek>> {
  if (weeks.length === 0) return Promise.resolve(new Map());
  const key = `${replicaReadContext.getStore() ? 'replica' : 'primary'}|${weeks.join(',')}`;
  let building = weeksBuilding.get(key);
  if (!building) {
    building = build().finally(() => weeksBuilding.delete(key));
    weeksBuilding.set(key, building);
  }
  return building;
}

/** Marks the notes the viewer has not read (written by someone else, no read row), with one query for all weeks. */
async function withUnreadMarkers(weeks: RunnerWeek[], viewer: WeekViewer): Promise<RunnerWeek[]> {
  const noteIds = weeks.flatMap((w) => [
    ...w.notes.map((n) => n.id),
    ...w.days.flatMap((d) => d.runs.flatMap((r) => r.notes.map((n) => n.id))),
  ]);
  const readIds = await findReadNoteIds(viewer.id, noteIds);
  const unread = (authorId: string, id: string) => authorId !== viewer.id && !readIds.has(id);
  return weeks.map((w) => {
    const notes = w.notes.map((n) => ({ ...n, unread: unread(n.author.id, n.id) }));
    const days = w.days.map((d) => {
      const runs = d.runs.map((r) => ({ ...r, notes: r.notes.map((n) => ({ ...n, unread: unread(n.author.id, n.id) })) }));
      return { ...d, runs, unread_notes: runs.reduce((n, r) => n + r.notes.filter((x) => x.unread).length, 0) };
    });
    return {
      ...w,
      notes,
      days,
      unread_notes: notes.filter((n) => n.unread).length + days.reduce((n, d) => n + d.unread_notes, 0),
    };
  });
}

/** Moving seconds in goal-pace parts that were run (plan check). */
function goalPaceSeconds(parts: readonly PartCheck[]): number {
  return parts.filter((p) => p.kind === 'goal pace' && p.verdict !== 'missed').reduce((s, p) => s + p.actual.duration_s, 0);
}

/** What was taken on a run, added up from its entries, beside the fuel plan's totals when there is one. */
function fuelTakenSummary(row: FuelTakenRow, planned: WeekFuelTaken['planned']): WeekFuelTaken {
  const entries = (Array.isArray(row.entries) ? row.entries : []) as TakenEntry[];
  const total = (key: 'carbohydrate_g' | 'fluid_ml' | 'sodium_mg' | 'caffeine_mg') =>
    Math.round(entries.reduce((s, e) => s + (Number(e[key]) || 0), 0) * 10) / 10;
  return {
    entries: entries.length,
    carbohydrate_g: total('carbohydrate_g'),
    fluid_ml: total('fluid_ml'),
    sodium_mg: total('sodium_mg'),
    caffeine_mg: total('caffeine_mg'),
    planned,
    stomach: row.stomach,
    energy: row.energy,
    notes: row.notes,
  };
}

/**
 * One runner's week for the runner, their coaches and admins: plans and runs side by side with plan-check
 * verdicts, totals, long run, load, flags (shared/weeks/week-review.ts), a 12-week trend, notes and reviews.
 */
export async function buildRunnerWeek(
  /** The reader: their row's unit when the caller has it (the signed-in user's row), else it is read. */
  actor: Actor & { unit?: 'km' | 'mi' },
  runnerId: string,
  requestedStart: string | undefined,
  now = new Date(),
): Promise<RunnerWeek> {
  // The runner, who coaches them and their counter in one query; the access rule is the one every read uses.
  const found = await findWeekRunner(runnerId, { id: actor.id, noteIds: [] });
  if (!canReadRunnerData(actor, runnerId, found?.coachIds ?? [])) throw new NotFoundError();
  if (!found) throw new NotFoundError();
  const { runner, counter } = found;
  const readerUnit = actor.unit ?? (actor.id === runnerId ? runner.unit : (await findUserById(actor.id))?.unit);
  const viewer = { id: actor.id, unit: readerUnit ?? runner.unit };
  const [week] = await cachedWeeks([frameOf(runner, requestedStart, now)], true, viewer, new Map([[runnerId, counter]]));
  return week!;
}

/** The notes of a week (on the week and on its runs) written by someone other than `viewerId`: the ones with read markers. */
function notesByOthers(week: RunnerWeek, viewerId: string): Array<{ id: string; unread: boolean }> {
  return [...week.notes, ...week.days.flatMap((d) => d.runs.flatMap((r) => r.notes))].filter((n) => n.author.id !== viewerId);
}

/**
 * The week review as ready JSON (server/features/week-cache/README.md, "Ready answers"): kept per reader, runner,
 * asked date and reader's unit, and served while its stamp holds: the runner's input counter, their local date
 * and the week the asked date falls in, the code version, and which of the week's notes by others the reader has
 * opened. Those are read with the access check in one query each time; the answer is built only when one moved.
 */
export async function readyRunnerWeek(
  actor: Actor & { unit: 'km' | 'mi' },
  runnerId: string,
  requestedStart: string | undefined,
  now = new Date(),
): Promise<ReadyAnswer> {
  const version = weekCodeVersion();
  const key = `week-review:${runnerId}:${actor.id}:${actor.unit}:${requestedStart ?? ''}`;
  const kept = version === null ? undefined : keptAnswer(key);
  const found = await findWeekRunner(runnerId, { id: actor.id, noteIds: kept?.extra ?? [] });
  if (!canReadRunnerData(actor, runnerId, found?.coachIds ?? [])) throw new NotFoundError();
  if (!found) throw new NotFoundError();
  const frame = frameOf(found.runner, requestedStart, now);
  const stampOf = (readNoteIds: readonly string[]) =>
    [found.counter, frame.today, frame.start, version, [...readNoteIds].sort().join(',')].join('|');
  if (kept && kept.stamp === stampOf(found.readNoteIds)) return kept;
  const viewer = { id: actor.id, unit: actor.unit };
  const [week] = await cachedWeeks([frame], true, viewer, new Map([[runnerId, found.counter]]));
  const ready = readyJson(week!);
  if (version !== null) {
    // Stamped with the read markers the answer shows (set after the counter was read, as the week's data was).
    const marked = notesByOthers(week!, actor.id);
    keepAnswer(
      key,
      stampOf(marked.filter((n) => !n.unread).map((n) => n.id)),
      ready,
      marked.map((n) => n.id),
    );
  }
  return ready;
}

/** The runner and their coaches write notes on a week; the other side reads them. */
export async function addWeekNote(
  actor: Actor,
  runnerId: string,
  start: string,
  text: string,
  concern: NoteConcern | null,
  notices: NoticeDeps,
) {
  await assertCanReadRunner(actor, runnerId);
  if (concern && actor.id !== runnerId)
    throw new ValidationError('Only the runner flags a note as about pain or illness.', [
      { field: 'concern', message: 'Only the runner flags a note as about pain or illness.' },
    ]);
  const id = await insertWeekNote(runnerId, start, actor.id, text, concern);
  await recordNoteNotice({ id, kind: 'week-note', runner_id: runnerId, author_id: actor.id, concern }, notices).catch(
    (err: unknown) => logger.error({ err, note: id }, 'recording a note notice failed'),
  );
  return { id, text, concern };
}

/** A coach of the runner marks the week reviewed (or not). */
export async function setWeekReviewed(actor: Actor, runnerId: string, start: string, reviewed: boolean): Promise<void> {
  await assertCanReadRunner(actor, runnerId);
  if (!(await findCoachIdsOfRunner(runnerId)).includes(actor.id))
    throw new NotFoundError('Only the runner’s coach marks a week reviewed.');
  if (reviewed) await upsertWeekReview(runnerId, start, actor.id);
  else await deleteWeekReview(runnerId, start, actor.id);
}

/** One squad runner's row of the overview: the answer's schema is `SquadOverviewRowSchema` in shared/weeks. */
export type OverviewRow = SquadOverviewRow;

function missedKeySessions(week: RunnerWeek): number {
  let missed = 0;
  for (const day of week.days) {
    const key = day.plans.filter((p) => !p.easy_only);
    if (day.date < week.today && day.runs.length === 0) missed += key.length;
    missed += day.runs.filter((r) => r.session_verdict === 'missed' && key.some((p) => p.id === r.plan_id)).length;
  }
  return missed;
}

/** One row per squad runner for the week containing `week` (each runner's own week start). */
export async function buildSquadOverview(
  /** The reader: their row's unit when the caller has it (the signed-in user's row), else it is read. */
  actor: Actor & { unit?: 'km' | 'mi' },
  squadId: string,
  week: string | undefined,
  now = new Date(),
): Promise<SquadOverview> {
  const squad = await squadCoachedBy(actor, squadId, { adminMayRead: true });
  // Every member's data is readable here: the actor coaches this squad or is an admin. Their rows and counters
  // come in one query, before any of the weeks' data.
  const members = await listSquadRunners(squadId);
  const frames = members.map((m) => frameOf(m.runner, week, now));
  const coachUnit = actor.unit ?? (await findUserById(actor.id))?.unit;
  const weeks = await cachedWeeks(
    frames,
    false,
    { id: actor.id, unit: coachUnit ?? 'km' },
    new Map(members.map((m) => [m.runner.id, m.counter])),
  );
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
      sessions_due: w.totals.sessions_due,
      planned_duration_s: w.totals.planned_duration_s,
      unread_notes: w.unread_notes,
      high_soreness: w.days.reduce((n, d) => n + d.runs.filter((r) => (r.checkin?.soreness ?? 0) >= HIGH_SORENESS).length, 0),
      missed_key_sessions: missedKeySessions(w),
      flags: w.flags.map((f) => ({ code: f.code, message: f.message })),
      last_upload: w.last_upload,
      // Read from the assembled week (no query of its own): its days and today are counted in this zone.
      time_zone: w.time_zone,
      reviewed: w.reviewed_by.some((r) => r.coach_id === squad.coach_id),
      volume_12_weeks: w.trend.map((t) => t.run_distance_m),
    };
  });
  return { squad: { id: squad.id, name: squad.name }, week: week ?? null, rows };
}
