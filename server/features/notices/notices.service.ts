import { randomUUID } from 'node:crypto';
import { batchDueAt, NOTICE_MAX_ATTEMPTS, retryDelaySeconds } from '../../../shared/notices/batching.ts';
import { NOTICE_KIND_INFO, type NoticeKind } from '../../../shared/notices/kinds.ts';
import {
  notesNotice,
  painAlert,
  squadLeaveNotice,
  uploadNotice,
  type NoticeMessage,
  type PainReport,
} from '../../../shared/notices/messages.ts';
import { formatLocalDate } from '../../../shared/runs/display.ts';
import type { AppConfig } from '../../config.ts';
import { inTransaction, type Db, type NoticeRow, type UserRow } from '../../lib/db.ts';
import { logger } from '../../lib/logger.ts';
import { escapeHtml, type Mailer, type OutgoingMail } from '../../lib/mailer.ts';
import { findReadNoteIds } from '../notes/index.ts';
import { findCoachIdsOfRunner } from '../squads/index.ts';
import { findUserById, findUsersByIds } from '../users/index.ts';
import {
  claimBatch,
  delayNotices,
  findAlertedNoteIds,
  findNotesForNotice,
  findRunnersCoachedBy,
  findRunsForNotice,
  insertNotices,
  listOpenBatches,
  markNotices,
  type NewNotice,
  type NoteForNotice,
} from './notices.repository.ts';
import { signUnsubscribeToken } from './unsubscribe-token.ts';

/**
 * Notice e-mails (issue 16). Events only record a row in `notices`; `sendDueNotices` merges the rows
 * of each batch into one e-mail when the batch is due (shared/notices/batching.ts) and sends it over
 * SMTP. Pain alerts and squad leaving are due at once and sent straight after they are recorded.
 * Whether a kind is switched on is read when the e-mail goes out, so switching off stops what is
 * already waiting.
 */

export interface NoticeDeps {
  mailer: Mailer;
  config: AppConfig;
}

// ── Recording ────────────────────────────────────────────────────────────────

/** Runs imported by a runner (one upload request, or one archive): queued for each of their coaches. */
export async function recordUploadNotice(runnerId: string, runIds: readonly string[], trx?: Db): Promise<void> {
  if (runIds.length === 0) return;
  const coaches = await findCoachIdsOfRunner(runnerId, trx);
  await insertNotices(
    coaches.map((coachId) => ({
      recipient_id: coachId,
      kind: 'import',
      batch_key: `import:${runnerId}`,
      payload: { runner_id: runnerId, run_ids: [...runIds] },
    })),
    trx,
  );
}

export interface WrittenNote {
  id: string;
  kind: 'run-note' | 'week-note';
  runner_id: string;
  author_id: string;
  concern: 'pain' | 'illness' | null;
}

/**
 * A new note reaches the other side: the runner's coaches when the runner wrote it, the runner when
 * a coach did. A note the runner marks as about pain or illness is also an alert to the coaches, sent at once.
 */
export async function recordNoteNotice(note: WrittenNote, deps: NoticeDeps): Promise<void> {
  const byRunner = note.author_id === note.runner_id;
  const recipients = byRunner ? await findCoachIdsOfRunner(note.runner_id) : [note.runner_id];
  const rows: NewNotice[] = recipients.map((id) => ({
    recipient_id: id,
    kind: 'note',
    batch_key: 'note',
    payload: { note_id: note.id, note_kind: note.kind, runner_id: note.runner_id },
  }));
  if (byRunner && note.concern) {
    rows.push(
      ...recipients.map((id) => ({
        recipient_id: id,
        kind: 'pain_alert' as const,
        batch_key: `pain_alert:${randomUUID()}`,
        payload: { source: 'note', note_id: note.id, note_kind: note.kind, runner_id: note.runner_id, concern: note.concern },
      })),
    );
  }
  await insertNotices(rows);
  if (byRunner && note.concern) await sendNoticesNow(deps, recipients, 'pain_alert');
}

/** A check-in's soreness rose to 4 or 5 (common practice: the top two steps of a 1–5 scale call for attention). */
export async function recordSorenessAlert(
  runnerId: string,
  run: { id: string; name: string; local_date: string },
  soreness: number,
  deps: NoticeDeps,
): Promise<void> {
  const coaches = await findCoachIdsOfRunner(runnerId);
  await insertNotices(
    coaches.map((id) => ({
      recipient_id: id,
      kind: 'pain_alert',
      batch_key: `pain_alert:${randomUUID()}`,
      payload: {
        source: 'checkin',
        runner_id: runnerId,
        run_id: run.id,
        run_name: run.name,
        local_date: run.local_date,
        soreness,
      },
    })),
  );
  await sendNoticesNow(deps, coaches, 'pain_alert');
}

/** A runner left a squad of their own accord: its coach is told at once. */
export async function recordSquadLeave(
  squad: { id: string; name: string; coach_id: string },
  runner: { id: string; name: string },
  leftOn: string,
  deps: NoticeDeps,
): Promise<void> {
  await insertNotices([
    {
      recipient_id: squad.coach_id,
      kind: 'squad_leave',
      batch_key: `squad_leave:${randomUUID()}`,
      payload: { squad_id: squad.id, squad_name: squad.name, runner_name: runner.name, left_on: leftOn },
    },
  ]);
  await sendNoticesNow(deps, [squad.coach_id], 'squad_leave');
}

/** Sends what is due for these recipients now; a failure is logged and left for the sweep to retry. */
async function sendNoticesNow(deps: NoticeDeps, recipients: readonly string[], kind: NoticeRow['kind']): Promise<void> {
  if (recipients.length === 0) return;
  try {
    await sendDueNotices(deps, new Date(), { recipients, kind });
  } catch (err) {
    logger.warn({ err, kind }, 'a notice could not be sent at once; the notice sweep tries again');
  }
}

// ── Sending ──────────────────────────────────────────────────────────────────

export interface SweepResult {
  /** E-mails sent. */
  sent: number;
  /** Batches closed without an e-mail (switched off, or nothing left to tell). */
  dropped: number;
  failed: number;
}

/**
 * Sends every batch that is due at `now`, one e-mail per batch. Safe to run in several processes at
 * once: each batch's rows are locked while it is sent, and rows another sender holds are skipped.
 */
export async function sendDueNotices(
  deps: NoticeDeps,
  now: Date = new Date(),
  only?: { recipients: readonly string[]; kind: NoticeRow['kind'] },
): Promise<SweepResult> {
  const result: SweepResult = { sent: 0, dropped: 0, failed: 0 };
  const batches = (await listOpenBatches(now)).filter(
    (b) =>
      batchDueAt(b.kind, b.created_at) <= now && (!only || (only.kind === b.kind && only.recipients.includes(b.recipient_id))),
  );
  for (const batch of batches) {
    await inTransaction(async (trx) => {
      const rows = await claimBatch(trx, batch);
      if (rows.length === 0) return;
      const ids = rows.map((r) => r.id);
      const recipient = await findUserById(batch.recipient_id, trx);
      if (!recipient || !recipient[NOTICE_KIND_INFO[batch.kind].column]) {
        await markNotices(trx, ids, 'switched-off', now);
        result.dropped++;
        return;
      }
      const message = await composeBatch(recipient, batch.kind, rows, deps.config, trx);
      if (!message) {
        await markNotices(trx, ids, 'nothing-left', now);
        result.dropped++;
        return;
      }
      try {
        // The link is dated by the real clock (a test may sweep at a later `now`): it must predate any later switch change.
        await deps.mailer.send(withUnsubscribe(message, recipient, batch.kind, deps.config, new Date()));
        await markNotices(trx, ids, 'sent', now);
        result.sent++;
      } catch (err) {
        const attempts = Math.max(...rows.map((r) => r.attempts)) + 1;
        logger.warn({ err, kind: batch.kind, recipient: recipient.id, attempts }, 'a notice e-mail could not be sent');
        if (attempts >= NOTICE_MAX_ATTEMPTS) await markNotices(trx, ids, 'failed', now);
        else await delayNotices(trx, ids, attempts, new Date(now.getTime() + retryDelaySeconds(attempts) * 1000));
        result.failed++;
      }
    });
  }
  return result;
}

/** The one e-mail of a batch, or null when nothing in it is still worth telling. */
async function composeBatch(
  recipient: UserRow,
  kind: NoticeRow['kind'],
  rows: readonly NoticeRow[],
  config: AppConfig,
  trx: Db,
): Promise<NoticeMessage | null> {
  const url = (path: string) => `${config.publicUrl}${path}`;
  const payloads = rows.map((r) => r.payload);
  switch (kind) {
    case 'import': {
      const runnerId = String(payloads[0]!.runner_id);
      // A runner who left the squad meanwhile is no longer the coach's to read about.
      if (!(await findCoachIdsOfRunner(runnerId, trx)).includes(recipient.id)) return null;
      const runner = await findUserById(runnerId, trx);
      const runIds = [...new Set(payloads.flatMap((p) => p.run_ids as string[]))];
      const runs = (await findRunsForNotice(runIds, trx)).filter((r) => r.user_id === runnerId);
      if (!runner || runs.length === 0) return null;
      return uploadNotice(
        runner.name,
        runs.map((r) => ({ ...r, href: url(`/runs/${r.id}`) })),
        recipient.unit,
        url(`/squad/${runnerId}/week/${runs[runs.length - 1]!.local_date}`),
      );
    }
    case 'note': {
      const noteIds = [...new Set(payloads.map((p) => String(p.note_id)))];
      const [notes, read, alerted, readable] = await Promise.all([
        findNotesForNotice(noteIds, trx),
        findReadNoteIds(recipient.id, noteIds, trx),
        findAlertedNoteIds(recipient.id, noteIds, trx),
        readableRunners(recipient, trx),
      ]);
      // Notes already opened in the app, or already sent as a pain alert, are not news.
      const news = notes.filter((n) => !read.has(n.id) && !alerted.has(n.id) && readable(n.runner_id));
      if (news.length === 0) return null;
      const people = new Map(
        (await findUsersByIds([...new Set(news.flatMap((n) => [n.author_id, n.runner_id]))], trx)).map((u) => [u.id, u]),
      );
      const readerIsRunner = recipient.role === 'runner';
      return notesNotice(
        news.map((n) => ({
          author_name: people.get(n.author_id)?.name ?? 'Someone',
          runner_name: people.get(n.runner_id)?.name ?? 'a runner',
          about: noteAbout(n),
          excerpt: excerpt(n.text),
          href: url(noteHref(n, readerIsRunner)),
        })),
        readerIsRunner,
      );
    }
    case 'pain_alert': {
      const p = payloads[0]!;
      const runnerId = String(p.runner_id);
      if (!(await findCoachIdsOfRunner(runnerId, trx)).includes(recipient.id)) return null;
      const runner = await findUserById(runnerId, trx);
      if (!runner) return null;
      if (p.source === 'checkin') {
        const report: PainReport = {
          source: 'checkin',
          soreness: Number(p.soreness),
          run_name: String(p.run_name),
          local_date: String(p.local_date),
        };
        return painAlert(runner.name, report, url(`/runs/${String(p.run_id)}`));
      }
      const [note] = await findNotesForNotice([String(p.note_id)], trx);
      if (!note) return null;
      const concern = p.concern === 'illness' ? 'illness' : 'pain';
      return painAlert(
        runner.name,
        { source: 'note', concern, about: noteAbout(note), excerpt: excerpt(note.text) },
        url(noteHref(note, false)),
      );
    }
    case 'squad_leave': {
      const p = payloads[0]!;
      return squadLeaveNotice(String(p.runner_name), String(p.squad_name), String(p.left_on), url('/squad'));
    }
  }
}

function readableRunnersFor(recipient: UserRow, coached: readonly string[]) {
  const set = new Set(coached);
  return (runnerId: string) => runnerId === recipient.id || set.has(runnerId);
}

async function readableRunners(recipient: UserRow, trx: Db) {
  return readableRunnersFor(recipient, await findRunnersCoachedBy(recipient.id, trx));
}

/** At most this many characters of a note are quoted in an e-mail; the rest is on the page. */
const NOTE_QUOTE_MAX = 280;
function excerpt(text: string): string {
  const flat = text.replace(/\s+/g, ' ').trim();
  return flat.length > NOTE_QUOTE_MAX ? `${flat.slice(0, NOTE_QUOTE_MAX - 1)}…` : flat;
}

function noteAbout(n: NoteForNotice): string {
  return n.kind === 'run-note'
    ? `run “${n.run_name ?? ''}” of ${formatLocalDate(n.run_date ?? '')}`
    : `week of ${formatLocalDate(n.week_start ?? '')}`;
}

function noteHref(n: NoteForNotice, readerIsRunner: boolean): string {
  if (n.kind === 'run-note') return `/runs/${n.run_id}`;
  return readerIsRunner ? `/week/${n.week_start}` : `/squad/${n.runner_id}/week/${n.week_start}`;
}

// ── The message itself ───────────────────────────────────────────────────────

/** The address a mail program POSTs to (RFC 8058) and the page a person opens from the footer. */
export function unsubscribeLinks(
  config: Pick<AppConfig, 'publicUrl' | 'jwtSecret'>,
  userId: string,
  kind: NoticeKind,
  now: Date,
) {
  const token = signUnsubscribeToken(config.jwtSecret, { userId, kind, issuedAt: now });
  return { oneClick: `${config.publicUrl}/api/notices/unsubscribe/${token}`, page: `${config.publicUrl}/notices/off/${token}` };
}

/**
 * The List-Unsubscribe pair of RFC 8058 §3.1: a mail program offers "unsubscribe" and POSTs
 * `List-Unsubscribe=One-Click` to the address, which turns off this kind of notice only.
 */
export function unsubscribeHeaders(
  config: Pick<AppConfig, 'publicUrl' | 'jwtSecret'>,
  userId: string,
  kind: NoticeKind,
  now: Date,
): Record<string, string> {
  return {
    'List-Unsubscribe': `<${unsubscribeLinks(config, userId, kind, now).oneClick}>`,
    'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click',
  };
}

/** A notice as an e-mail: text and HTML, a footer saying why it came and how to stop it, and the RFC 8058 headers. */
export function withUnsubscribe(
  message: NoticeMessage,
  recipient: UserRow,
  kind: NoticeKind,
  config: AppConfig,
  now: Date,
): OutgoingMail {
  const links = unsubscribeLinks(config, recipient.id, kind, now);
  const why = `You get this e-mail because “${NOTICE_KIND_INFO[kind].label}” is on in your profile.`;
  const text = [
    message.title,
    '',
    ...message.paragraphs.flatMap((p) => [p, '']),
    ...message.items.map((i) => `- ${i.text}${i.href ? `\n  ${i.href}` : ''}`),
    ...(message.items.length ? [''] : []),
    ...(message.link ? [`${message.link.label}: ${message.link.href}`, ''] : []),
    '--',
    why,
    `Turn these e-mails off: ${links.page}`,
    `All your notices: ${config.publicUrl}/profile`,
    '',
  ].join('\n');
  const item = (i: NoticeMessage['items'][number]) =>
    `<li style="margin:0 0 6px">${i.href ? `<a href="${escapeHtml(i.href)}" style="color:#0f5c5c">${escapeHtml(i.text)}</a>` : escapeHtml(i.text)}</li>`;
  const html = `<!doctype html><html><body style="background:#f6f4ef;color:#1d2330;font-family:'Source Sans 3',Arial,sans-serif;padding:24px"><div style="max-width:560px;margin:auto;background:#fffdf9;border:1px solid #ddd7ca;padding:24px"><p style="font-weight:700;margin:0 0 16px">Pacewright</p><h1 style="font-size:20px;margin:0 0 16px">${escapeHtml(message.title)}</h1>${message.paragraphs
    .map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`)
    .join(
      '',
    )}${message.items.length ? `<ul style="margin:0 0 12px;padding-left:20px">${message.items.map(item).join('')}</ul>` : ''}${
    message.link
      ? `<p style="margin:16px 0"><a href="${escapeHtml(message.link.href)}" style="background:#0f5c5c;color:#ffffff;padding:10px 16px;border-radius:4px;text-decoration:none">${escapeHtml(message.link.label)}</a></p>`
      : ''
  }<p style="font-size:13px;color:#545b69;margin:24px 0 0">${escapeHtml(why)} <a href="${escapeHtml(links.page)}" style="color:#545b69">Turn these e-mails off</a> · <a href="${escapeHtml(`${config.publicUrl}/profile`)}" style="color:#545b69">All your notices</a></p></div></body></html>`;
  return {
    to: recipient.email,
    subject: message.subject,
    text,
    html,
    headers: unsubscribeHeaders(config, recipient.id, kind, now),
  };
}
