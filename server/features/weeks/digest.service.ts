import type { Actor } from '../../../shared/auth/permissions.ts';
import { groupForDigest } from '../../../shared/weeks/csv.ts';
import type { Unit } from '../../../shared/users/schemas.ts';
import type { DigestReceipt } from '../../../shared/weeks/squad-overview.ts';
import { formatDistanceIn } from '../../../shared/runs/display.ts';
import { todayIn } from '../../../shared/runs/local-time.ts';
import { addDays } from '../../../shared/weeks/weeks.ts';
import type { AppConfig } from '../../config.ts';
import { escapeHtml, type Mailer } from '../../lib/mailer.ts';
import { NOTICE_KIND_INFO } from '../../../shared/notices/kinds.ts';
import { unsubscribeHeaders, unsubscribeLinks } from '../notices/index.ts';
import { listSquadsWithCoach, squadCoachedBy } from '../squads/index.ts';
import { findUserById } from '../users/index.ts';
import { buildSquadOverview, type OverviewRow } from './weeks.service.ts';

const HEADINGS = {
  flagged: 'To look at',
  no_upload: 'No run uploaded this week',
  no_plan: 'Running without a plan this week',
  on_plan: 'On plan',
} as const;

function hoursMinutes(seconds: number): string {
  const minutes = Math.round(seconds / 60);
  return `${Math.floor(minutes / 60)}:${String(minutes % 60).padStart(2, '0')} h`;
}

/** One runner's line, in the coach's unit, with what to look at; the flags are already worded for the coach. */
function line(row: OverviewRow, unit: Unit): string {
  const planned = [
    row.planned_distance_m > 0 && formatDistanceIn(row.planned_distance_m, unit),
    row.planned_duration_s > 0 && hoursMinutes(row.planned_duration_s),
  ].filter(Boolean);
  const volume =
    row.sessions_planned === 0
      ? `${formatDistanceIn(row.run_distance_m, unit)} run, nothing planned`
      : `${formatDistanceIn(row.run_distance_m, unit)} (${hoursMinutes(row.moving_s)} moving) of ${planned.join(' + ') || 'no amount'} planned, ` +
        `${row.sessions_as_planned} of ${row.sessions_due} sessions due so far as planned`;
  const extras = [
    row.missed_key_sessions > 0 &&
      `${row.missed_key_sessions} key ${row.missed_key_sessions === 1 ? 'session' : 'sessions'} missed`,
    row.high_soreness > 0 && `soreness 4–5 after ${row.high_soreness} ${row.high_soreness === 1 ? 'run' : 'runs'}`,
    row.unread_notes > 0 && `${row.unread_notes} unread ${row.unread_notes === 1 ? 'note' : 'notes'}`,
  ].filter(Boolean);
  const flags = row.flags.length ? ` — ${row.flags.map((f) => f.message).join(' ')}` : '';
  return `${row.runner.name}: ${volume}${extras.length ? `; ${extras.join('; ')}` : ''}${flags}`;
}

/** Builds and sends the weekly digest of one squad to its coach. Returns the headings with the runners under them. */
export async function sendSquadDigest(
  actor: Actor,
  squadId: string,
  week: string | undefined,
  mailer: Mailer,
  config: AppConfig,
  now = new Date(),
): Promise<DigestReceipt> {
  const squad = await squadCoachedBy(actor, squadId);
  const coach = (await findUserById(squad.coach_id))!;
  const overview = await buildSquadOverview(actor, squadId, week, now);
  const groups = groupForDigest(overview.rows);
  const weekOf = overview.rows[0]?.start ?? week ?? now.toISOString().slice(0, 10);
  const sections = (Object.keys(HEADINGS) as Array<keyof typeof HEADINGS>).map((key) => ({
    heading: HEADINGS[key],
    rows: groups[key],
  }));
  const closing = 'Flags describe what the numbers show; you know the runner — the decision is yours.';
  const link = `${config.publicUrl}/squad`;
  const off = unsubscribeLinks(config, coach.id, 'digest', now);
  const text = [
    `${squad.name} — week of ${weekOf}`,
    '',
    ...sections.flatMap((s) => [
      `${s.heading} (${s.rows.length})`,
      ...(s.rows.length ? s.rows.map((r) => `- ${line(r, coach.unit)}`) : ['- nobody']),
      '',
    ]),
    closing,
    `Open the squad: ${link}`,
    '',
    '--',
    `You get this e-mail because “${NOTICE_KIND_INFO.digest.label}” is on in your profile.`,
    `Turn these e-mails off: ${off.page}`,
    '',
  ].join('\n');
  const html = `<!doctype html><html><body style="background:#f6f4ef;color:#1d2330;font-family:'Source Sans 3',Arial,sans-serif;padding:24px"><div style="max-width:620px;margin:auto;background:#fffdf9;border:1px solid #ddd7ca;padding:24px"><p style="font-weight:700;margin:0 0 8px">Pacewright</p><h1 style="font-size:20px;margin:0 0 16px">${escapeHtml(squad.name)} — week of ${escapeHtml(weekOf)}</h1>${sections
    .map(
      (s) =>
        `<h2 style="font-size:16px;margin:16px 0 6px">${escapeHtml(s.heading)} (${s.rows.length})</h2><ul style="margin:0;padding-left:20px">${s.rows.length ? s.rows.map((r) => `<li>${escapeHtml(line(r, coach.unit))}</li>`).join('') : '<li>nobody</li>'}</ul>`,
    )
    .join(
      '',
    )}<p style="margin-top:16px">${escapeHtml(closing)}</p><p><a href="${escapeHtml(link)}" style="color:#0f5c5c">Open the squad</a></p><p style="font-size:13px;color:#545b69;margin:24px 0 0">You get this e-mail because “${escapeHtml(NOTICE_KIND_INFO.digest.label)}” is on in your profile. <a href="${escapeHtml(off.page)}" style="color:#545b69">Turn these e-mails off</a></p></div></body></html>`;
  await mailer.send({
    to: coach.email,
    subject: `${squad.name}: week of ${weekOf}`,
    text,
    html,
    headers: unsubscribeHeaders(config, coach.id, 'digest', now),
  });
  return {
    sent_to: coach.email,
    week_start: weekOf,
    groups: Object.fromEntries(sections.map((s) => [s.heading, s.rows.map((r) => r.runner.name)])),
  };
}

/** What the round did for one squad, for the command's output and the job's log. */
export type DigestRoundLine =
  | { squad: string; outcome: 'sent'; week_start: string; sent_to: string }
  | { squad: string; outcome: 'off' }
  | { squad: string; outcome: 'failed'; error: string };

/**
 * Which week a round sends: a day in it, or `'last'` for the week holding yesterday in the coach's time zone (the
 * scheduled round: sent early on a Monday it reports the week just ended, not the one just begun).
 */
export type DigestRoundWeek = string | 'last' | undefined;

/**
 * The weekly digest of every squad to its coach (`npm run digest` and the scheduled job, server/features/jobs). A
 * coach who switched the digest off is skipped ("send now" on the squad page still works); one squad's failure
 * (mail server down) is reported and the round goes on.
 */
export async function sendDigestRound(
  week: DigestRoundWeek,
  mailer: Mailer,
  config: AppConfig,
  now = new Date(),
): Promise<DigestRoundLine[]> {
  const lines: DigestRoundLine[] = [];
  for (const squad of await listSquadsWithCoach()) {
    if (!squad.notify_on_digest) {
      lines.push({ squad: squad.name, outcome: 'off' });
      continue;
    }
    const day = week === 'last' ? addDays(todayIn(squad.time_zone, now.getTime()), -1) : week;
    try {
      const sent = await sendSquadDigest({ id: squad.coach_id, role: squad.role }, squad.id, day, mailer, config, now);
      lines.push({ squad: squad.name, outcome: 'sent', week_start: sent.week_start, sent_to: sent.sent_to });
    } catch (err) {
      lines.push({ squad: squad.name, outcome: 'failed', error: (err as Error).message });
    }
  }
  return lines;
}
