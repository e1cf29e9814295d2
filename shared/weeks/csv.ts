/** The week review and the squad overview as CSV, by the app's one CSV writer (shared/csv/csv-writer.ts). */
import { toCsv, type CsvValue } from '../csv/csv-writer.ts';

export interface WeekCsvDay {
  date: string;
  plans: ReadonlyArray<{ title: string; planned_distance_m: number | null; planned_duration_s: number | null }>;
  runs: ReadonlyArray<{
    name?: string;
    distance_m: number;
    moving_s: number;
    session_verdict: string | null;
    trimp: number | null;
  }>;
}

/** One row per plan or run of the week: date, what, planned and run figures, verdict. */
export function weekToCsv(days: readonly WeekCsvDay[]): string {
  const rows: CsvValue[][] = [];
  for (const day of days) {
    for (const p of day.plans)
      rows.push([
        day.date,
        'plan',
        p.title,
        p.planned_distance_m === null ? null : Math.round(p.planned_distance_m),
        p.planned_duration_s,
        null,
        null,
        null,
        null,
      ]);
    for (const r of day.runs)
      rows.push([
        day.date,
        'run',
        r.name ?? '',
        null,
        null,
        Math.round(r.distance_m),
        Math.round(r.moving_s),
        r.session_verdict,
        r.trimp === null ? null : Math.round(r.trimp),
      ]);
  }
  return toCsv(
    ['date', 'entry', 'title', 'planned_distance_m', 'planned_duration_s', 'run_distance_m', 'moving_s', 'verdict', 'trimp'],
    rows,
  );
}

export interface OverviewCsvRow {
  runner: { name: string };
  start: string;
  planned_distance_m: number;
  run_distance_m: number;
  moving_s: number;
  sessions_planned: number;
  sessions_as_planned: number;
  flags: ReadonlyArray<{ code: string }>;
  last_upload: string | null;
  reviewed: boolean;
}

export function overviewToCsv(rows: readonly OverviewCsvRow[]): string {
  return toCsv(
    [
      'runner',
      'week_start',
      'planned_distance_m',
      'run_distance_m',
      'moving_s',
      'sessions_planned',
      'sessions_as_planned',
      'flags',
      'last_upload',
      'reviewed',
    ],
    rows.map((r) => [
      r.runner.name,
      r.start,
      Math.round(r.planned_distance_m),
      Math.round(r.run_distance_m),
      Math.round(r.moving_s),
      r.sessions_planned,
      r.sessions_as_planned,
      r.flags.map((f) => f.code).join(' '),
      r.last_upload,
      r.reviewed ? 'yes' : 'no',
    ]),
  );
}

export interface DigestGroups<T> {
  on_plan: T[];
  flagged: T[];
  no_upload: T[];
  no_plan: T[];
}

/** What the digest reads of an overview row to place it. */
export interface DigestRowFacts {
  run_distance_m: number;
  flags: ReadonlyArray<unknown>;
  /** Sessions planned in the week (any amount, by distance or by time). */
  sessions_planned: number;
  /** Runs with a check-in of soreness 4 or 5 this week. */
  high_soreness?: number;
  /** Sessions other than easy running planned before today and not run (or run and judged missed). */
  missed_key_sessions?: number;
}

/**
 * Sorts overview rows into the digest's headings, each runner under one only, checked in this order: no run
 * this week → "no upload"; anything to look at (a flag, a check-in with high soreness, a missed key session)
 * → "flagged"; nothing planned this week → "no plan" (running without a plan is not "on plan"); otherwise
 * "on plan".
 */
export function groupForDigest<T extends DigestRowFacts>(rows: readonly T[]): DigestGroups<T> {
  const groups: DigestGroups<T> = { on_plan: [], flagged: [], no_upload: [], no_plan: [] };
  for (const row of rows) {
    if (row.run_distance_m <= 0) groups.no_upload.push(row);
    else if (row.flags.length > 0 || (row.high_soreness ?? 0) > 0 || (row.missed_key_sessions ?? 0) > 0) groups.flagged.push(row);
    else if (row.sessions_planned === 0) groups.no_plan.push(row);
    else groups.on_plan.push(row);
  }
  return groups;
}
