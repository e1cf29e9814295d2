/**
 * What one calendar event of a planned session says (RFC 5545 VEVENT fields, before an iCalendar
 * library writes them): all-day on the session's date, a stable UID from the plan id, SEQUENCE and
 * LAST-MODIFIED from the plan, the shorthand and the fuel plan's intakes in the description.
 */

export interface FeedPlan {
  id: string;
  runner_name: string;
  date: string;
  title: string;
  notes: string;
  /** Canonical shorthand of the session. */
  text: string;
  sequence: number;
  updated_at: Date;
  /** The fuel plan's intakes, when there is one: "0:36 · 4.5 mi · energy gel ×1". */
  intakes: Array<{ clock: string; distance: string; label: string }>;
}

export interface FeedEvent {
  uid: string;
  date: string;
  summary: string;
  description: string;
  url: string;
  sequence: number;
  last_modified: Date;
}

/** The domain part of every event UID: the id alone is unique, the suffix makes it globally so (RFC 5545 §3.8.4.7). */
export const UID_DOMAIN = 'pacewright.invalid';

/**
 * One event per session. `withRunnerName` prefixes the runner's name (a coach's squad feed);
 * `linkOf` builds the link back to the session's week.
 */
export function feedEventOf(plan: FeedPlan, withRunnerName: boolean, linkOf: (plan: FeedPlan) => string): FeedEvent {
  const title = plan.title || plan.text;
  const lines = [plan.text];
  if (plan.notes) lines.push(plan.notes);
  if (plan.intakes.length > 0) {
    lines.push('', 'Fuel plan:');
    for (const i of plan.intakes) lines.push(`${i.clock} · ${i.distance} · ${i.label}`);
  }
  const url = linkOf(plan);
  lines.push('', url);
  return {
    uid: `${plan.id}@${UID_DOMAIN}`,
    date: plan.date,
    summary: withRunnerName ? `${plan.runner_name}: ${title}` : title,
    description: lines.join('\n'),
    url,
    sequence: plan.sequence,
    last_modified: plan.updated_at,
  };
}
