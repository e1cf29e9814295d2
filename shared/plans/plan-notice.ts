import { weekStart } from '../weeks/weeks.ts';
import { formatPlanDay, type PlanChangeKind } from './plan-changes.ts';

/**
 * The e-mail a runner gets once a coach has finished a burst of changes to their plan (issue 15):
 * "Dana Whitlock changed 3 sessions in your week of 7 Dec", then every change, week by week.
 */

/** A burst ends when nobody has changed the runner's plan for this long (a rule of our own; documented in the plans README). */
export const PLAN_NOTICE_QUIET_MINUTES = 10;

/** One recorded change, as `plan_changes` keeps it. */
export interface NoticedChange {
  plan_id: string;
  actor_name: string;
  kind: PlanChangeKind;
  summary: string;
  /** The session's date after the change (its old date for a deletion). */
  plan_date: string;
}

export interface PlanNotice {
  subject: string;
  /** The first sentence (the subject, with a full stop). */
  intro: string;
  /** One line per change, grouped under a line per week, oldest change first within a week. */
  lines: string[];
  /** The first day of the earliest week touched: where the message's link opens the plan. */
  first_week: string;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

/** '7 Dec' for '2026-12-07'. */
function dayMonth(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
}

/** 'a', 'a and b', 'a, b and c'. */
function listWords(words: readonly string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words.at(-1)}`;
}

/**
 * The notice for a burst of changes (in the order they were made), for a runner whose weeks start on
 * `weekStartsOn` (0 = Sunday … 6 = Saturday). Sessions are counted once however often they changed.
 * Throws when there is nothing to tell.
 */
export function planChangeNotice(changes: readonly NoticedChange[], weekStartsOn: number): PlanNotice {
  if (changes.length === 0) throw new RangeError('planChangeNotice: no changes');
  const editors = [...new Set(changes.map((c) => c.actor_name))];
  const sessions = new Set(changes.map((c) => c.plan_id)).size;
  const byWeek = new Map<string, NoticedChange[]>();
  for (const change of changes) {
    const week = weekStart(change.plan_date, weekStartsOn);
    byWeek.set(week, [...(byWeek.get(week) ?? []), change]);
  }
  const weeks = [...byWeek.keys()].sort();
  const where =
    weeks.length === 1
      ? `your week of ${dayMonth(weeks[0]!)}`
      : weeks.length === 2
        ? `your weeks of ${dayMonth(weeks[0]!)} and ${dayMonth(weeks[1]!)}`
        : `${weeks.length} weeks of your plan, from ${dayMonth(weeks[0]!)}`;
  const subject = `${listWords(editors)} changed ${sessions === 1 ? '1 session' : `${sessions} sessions`} in ${where}`;
  const lines = weeks.flatMap((week) => [
    `Week of ${dayMonth(week)}:`,
    ...byWeek.get(week)!.map((c) => {
      // "Added for …", "Moved from … to …" and "Deleted from …" name the day; a plain change does not.
      const line =
        c.kind === 'changed' && !c.summary.startsWith('Moved') ? `${formatPlanDay(c.plan_date)}: ${c.summary}` : c.summary;
      return `- ${line}${editors.length > 1 ? ` (${c.actor_name})` : ''}`;
    }),
  ]);
  return { subject, intro: `${subject}.`, lines, first_week: weeks[0]! };
}
