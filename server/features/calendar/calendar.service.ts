import { createHash, randomBytes } from 'node:crypto';
import ical from 'ical-generator';
import type { Actor } from '../../../shared/auth/permissions.ts';
import { feedEventOf, type FeedPlan } from '../../../shared/calendar/feed-events.ts';
import { formatShorthand } from '../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../shared/plans/types.ts';
import { mondayOf } from '../../../shared/plans/weeks.ts';
import { addDays } from '../../../shared/weeks/weeks.ts';
import { NotFoundError } from '../../lib/errors.ts';
import {
  deleteCalendarFeed,
  findCalendarFeedCreatedAt,
  findFeedOwner,
  findSquadRunnerIds,
  listFeedPlans,
  replaceCalendarFeed,
} from './calendar.repository.ts';

/** The feed holds sessions from this many days back to this many days ahead of today (UTC). */
export const FEED_DAYS_BACK = 90;
export const FEED_DAYS_AHEAD = 366;

const TOKEN_PATTERN = /^cal_[A-Za-z0-9_-]{43}$/;

function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** A new secret feed address for the user; any earlier one stops working at once. Shown once: only its hash is kept. */
export async function createCalendarFeed(actor: Actor, publicUrl: string): Promise<string> {
  const token = `cal_${randomBytes(32).toString('base64url')}`;
  await replaceCalendarFeed(actor.id, hashToken(token));
  return `${publicUrl}/api/calendar/${token}.ics`;
}

export async function calendarFeedStatus(actor: Actor): Promise<{ on: boolean; since: string | null }> {
  const createdAt = await findCalendarFeedCreatedAt(actor.id);
  return { on: createdAt !== undefined, since: createdAt?.toISOString() ?? null };
}

export async function removeCalendarFeed(actor: Actor): Promise<void> {
  await deleteCalendarFeed(actor.id);
}

interface StoredFuel {
  schedule?: { intakes?: Array<{ clock?: string; distance_mi?: number; distance_km?: number; label?: string }> };
}

/**
 * The iCalendar text of a feed: the owner's sessions, and for a coach also every session of the runners
 * of their squads now. A revoked, replaced or made-up token answers 404.
 */
export async function renderCalendarFeed(tokenWithSuffix: string, publicUrl: string, now = new Date()): Promise<string> {
  const token = tokenWithSuffix.replace(/\.ics$/, '');
  if (!TOKEN_PATTERN.test(token)) throw new NotFoundError('There is no calendar at this address.');
  const owner = await findFeedOwner(hashToken(token));
  if (!owner) throw new NotFoundError('There is no calendar at this address.');
  const squad = owner.role === 'coach' ? await findSquadRunnerIds(owner.id) : [];
  const runnerIds = [owner.id, ...squad.filter((id) => id !== owner.id)];
  const today = now.toISOString().slice(0, 10);
  const rows = await listFeedPlans(runnerIds, addDays(today, -FEED_DAYS_BACK), addDays(today, FEED_DAYS_AHEAD));
  const unit = owner.unit;
  const calendar = ical({ name: owner.role === 'coach' ? `Pacewright: ${owner.name} and squad` : `Pacewright: ${owner.name}` });
  calendar.prodId({ company: 'Pacewright', product: 'plan feed', language: 'EN' });
  for (const row of rows) {
    const fuel = (row.fuel_schedule as StoredFuel | null)?.schedule?.intakes ?? [];
    const plan: FeedPlan = {
      id: row.id,
      runner_name: row.runner_name,
      date: row.date,
      title: row.title,
      notes: row.notes,
      text: formatShorthand(row.items as PlanItem[]),
      sequence: row.sequence,
      updated_at: row.updated_at,
      intakes: fuel.map((i) => ({
        clock: i.clock ?? '',
        distance: `${(unit === 'mi' ? (i.distance_mi ?? 0) : (i.distance_km ?? 0)).toFixed(1)} ${unit}`,
        label: i.label ?? '',
      })),
    };
    const mine = row.runner_id === owner.id;
    const event = feedEventOf(plan, !mine, (p) =>
      mine
        ? `${publicUrl}/plan?week=${mondayOf(p.date)}`
        : `${publicUrl}/squad/${encodeURIComponent(row.runner_id)}/plan?week=${mondayOf(p.date)}`,
    );
    calendar.createEvent({
      id: event.uid,
      start: new Date(`${event.date}T00:00:00Z`),
      allDay: true,
      summary: event.summary,
      description: event.description,
      url: event.url,
      sequence: event.sequence,
      lastModified: event.last_modified,
      stamp: event.last_modified,
      created: row.created_at,
    });
  }
  return calendar.toString();
}
