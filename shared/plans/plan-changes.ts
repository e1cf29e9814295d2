/**
 * Words for the record of changes on a session ("moved from Sat 12 Dec to Sun 13 Dec; session
 * rewritten") and for the plan's byline ("written by Dana Whitlock · changed Tue").
 */

import { calendarDaysAgo, localDateTime } from '../runs/local-time.ts';

export type PlanChangeKind = 'added' | 'changed' | 'moved' | 'deleted';

/** The fields of a session a change can touch; `text` is the canonical shorthand. */
export interface PlanFields {
  date: string;
  title: string;
  notes: string;
  text: string;
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'] as const;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

/** 'Sat 12 Dec' for '2026-12-12' (a calendar date, no time zone involved). */
export function formatPlanDay(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  return `${WEEKDAYS[d.getUTCDay()]} ${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
}

/**
 * What changed between two versions of a session, as one kind and one sentence. A change of date
 * alone is a move; anything else is a change, listing each field ("title, notes and session
 * changed"). Returns null when nothing differs.
 */
export function describePlanChange(before: PlanFields, after: PlanFields): { kind: PlanChangeKind; summary: string } | null {
  const changed: string[] = [];
  if (before.title !== after.title) changed.push(`title "${before.title}" → "${after.title}"`);
  if (before.text !== after.text) changed.push(`session "${before.text}" → "${after.text}"`);
  if (before.notes !== after.notes) changed.push('notes');
  const moved = before.date !== after.date;
  if (!moved && changed.length === 0) return null;
  const move = moved ? `moved from ${formatPlanDay(before.date)} to ${formatPlanDay(after.date)}` : null;
  if (changed.length === 0) return { kind: 'moved', summary: `${capitalise(move!)}.` };
  const parts = [move, `changed ${changed.join('; ')}`].filter((p): p is string => p !== null);
  return { kind: 'changed', summary: `${capitalise(parts.join('; '))}.` };
}

/** "Added for Sat 12 Dec: 10 mi easy." / "Deleted from Sat 12 Dec: 10 mi easy." */
export function describePlanAddedOrDeleted(kind: 'added' | 'deleted', plan: PlanFields): string {
  return kind === 'added'
    ? `Added for ${formatPlanDay(plan.date)}: ${plan.text}.`
    : `Deleted from ${formatPlanDay(plan.date)}: ${plan.text}.`;
}

/**
 * When a change happened, said from `now` (both instants, shown in `timeZone`): "today", "yesterday",
 * the weekday within the last 6 days ("Tue"), else the date ("3 Nov"). The clock is passed in.
 */
export function formatChangedWhen(at: Date, now: Date, timeZone: string): string {
  const atDay = localDateTime(at.getTime(), timeZone).date;
  const diff = calendarDaysAgo(at.getTime(), timeZone, now.getTime());
  if (diff <= 0) return 'today';
  if (diff === 1) return 'yesterday';
  if (diff < 7) return WEEKDAYS[new Date(`${atDay}T00:00:00Z`).getUTCDay()]!;
  const d = new Date(`${atDay}T00:00:00Z`);
  return `${d.getUTCDate()} ${MONTHS[d.getUTCMonth()]}`;
}

/**
 * The session's byline: "written by Dana Whitlock · changed Tue by Ivy Calder" — the editor is named
 * only when it is not the author; "changed" is left out when the session was never edited.
 */
export function planByline(
  plan: { author_name: string | null; updated_by_name: string | null; created_at: string; updated_at: string },
  now: Date,
  timeZone: string,
): string {
  const author = `written by ${plan.author_name ?? 'a former account'}`;
  // Any later save is an edit: a session moved half a second after it was written has still changed.
  const edited = Date.parse(plan.updated_at) > Date.parse(plan.created_at);
  if (!edited) return author;
  const when = formatChangedWhen(new Date(plan.updated_at), now, timeZone);
  const by = plan.updated_by_name && plan.updated_by_name !== plan.author_name ? ` by ${plan.updated_by_name}` : '';
  return `${author} · changed ${when}${by}`;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
