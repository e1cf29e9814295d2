import { NOTICE_KIND_INFO, NOTICE_KINDS, type NoticeKind } from '../../../shared/notices/kinds.ts';
import type { NoticeSwitches } from '../../../shared/notices/schemas.ts';
import { db, type Db, type NoticeRow, type UserRow } from '../../lib/db.ts';

export type NewNotice = Pick<NoticeRow, 'recipient_id' | 'kind' | 'batch_key' | 'payload'>;

export async function insertNotices(notices: readonly NewNotice[], trx: Db = db): Promise<void> {
  if (notices.length === 0) return;
  await trx('notices').insert(
    notices.map((n) => ({ ...n, payload: JSON.stringify(n.payload) as unknown as NoticeRow['payload'] })),
  );
}

export interface OpenBatch {
  recipient_id: string;
  kind: NoticeRow['kind'];
  batch_key: string;
  created_at: Date[];
}

/** Every batch with unsent notices that is not waiting for a retry at `now`. */
export async function listOpenBatches(now: Date, trx: Db = db): Promise<OpenBatch[]> {
  const rows = await trx('notices')
    .whereNull('sent_at')
    .andWhere((q) => q.whereNull('retry_at').orWhere('retry_at', '<=', now))
    .groupBy('recipient_id', 'kind', 'batch_key')
    .select<Array<{ recipient_id: string; kind: NoticeRow['kind']; batch_key: string; created_at: Date[] }>>(
      'recipient_id',
      'kind',
      'batch_key',
      trx.raw('array_agg(created_at order by created_at) as created_at'),
    );
  return rows;
}

/** Locks a batch's unsent rows for this transaction; rows another sender holds are skipped (never sent twice). */
export async function claimBatch(trx: Db, batch: Pick<OpenBatch, 'recipient_id' | 'kind' | 'batch_key'>): Promise<NoticeRow[]> {
  return trx('notices')
    .where({ recipient_id: batch.recipient_id, kind: batch.kind, batch_key: batch.batch_key })
    .whereNull('sent_at')
    .orderBy('created_at')
    .forUpdate()
    .skipLocked();
}

export async function markNotices(
  trx: Db,
  ids: readonly string[],
  outcome: NonNullable<NoticeRow['outcome']>,
  now: Date,
): Promise<void> {
  await trx('notices').whereIn('id', ids).update({ sent_at: now, outcome });
}

export async function delayNotices(trx: Db, ids: readonly string[], attempts: number, retryAt: Date): Promise<void> {
  await trx('notices').whereIn('id', ids).update({ attempts, retry_at: retryAt });
}

/** Ids of notes whose pain alert to `recipientId` went out (they need not be listed again). */
export async function findAlertedNoteIds(recipientId: string, noteIds: readonly string[], trx: Db = db): Promise<Set<string>> {
  if (noteIds.length === 0) return new Set();
  const rows = await trx('notices')
    .where({ recipient_id: recipientId, kind: 'pain_alert', outcome: 'sent' })
    .whereRaw("payload->>'note_id' = any(?)", [noteIds as string[]])
    .select<Array<{ note_id: string }>>(trx.raw("payload->>'note_id' as note_id"));
  return new Set(rows.map((r) => r.note_id));
}

export function toNoticeSwitches(user: UserRow): NoticeSwitches {
  return Object.fromEntries(NOTICE_KINDS.map((kind) => [kind, user[NOTICE_KIND_INFO[kind].column]])) as NoticeSwitches;
}

/** Sets switches and records when each one that changed did, in one transaction. */
export async function updateNoticeSwitches(
  userId: string,
  changes: Partial<Record<NoticeKind, boolean>>,
  now: Date,
  trx: Db = db,
): Promise<UserRow | undefined> {
  const run = async (t: Db) => {
    const before = await t('users').where('id', userId).forUpdate().first();
    if (!before) return undefined;
    const changed = (Object.keys(changes) as NoticeKind[]).filter(
      (kind) => changes[kind] !== undefined && before[NOTICE_KIND_INFO[kind].column] !== changes[kind],
    );
    if (changed.length === 0) return before;
    const [after] = await t('users')
      .where('id', userId)
      .update(Object.fromEntries(changed.map((kind) => [NOTICE_KIND_INFO[kind].column, changes[kind]])))
      .returning('*');
    await insertSwitchChanges(userId, changed, now, t);
    return after;
  };
  return trx === db ? db.transaction(run) : run(trx);
}

export async function insertSwitchChanges(userId: string, kinds: readonly NoticeKind[], now: Date, trx: Db = db): Promise<void> {
  if (kinds.length === 0) return;
  await trx('notice_switch_changes')
    .insert(kinds.map((kind) => ({ user_id: userId, kind, changed_at: now })))
    .onConflict(['user_id', 'kind'])
    .merge(['changed_at']);
}

export async function findSwitchChangedAt(userId: string, kind: NoticeKind, trx: Db = db): Promise<Date | undefined> {
  const row = await trx('notice_switch_changes').where({ user_id: userId, kind }).first('changed_at');
  return row?.changed_at;
}

/** The runs of an upload batch that still exist, oldest first. */
export async function findRunsForNotice(runIds: readonly string[], trx: Db = db) {
  if (runIds.length === 0) return [];
  return trx('runs')
    .whereIn('id', runIds)
    .orderBy([{ column: 'local_date' }, { column: 'created_at' }])
    .select<Array<{ id: string; user_id: string; name: string; local_date: string; distance_m: number }>>(
      'id',
      'user_id',
      'name',
      'local_date',
      'distance_m',
    );
}

export interface NoteForNotice {
  id: string;
  kind: 'run-note' | 'week-note';
  runner_id: string;
  author_id: string;
  text: string;
  created_at: Date;
  run_id: string | null;
  run_name: string | null;
  run_date: string | null;
  week_start: string | null;
}

/** The notes (of either table) that still exist, oldest first. */
export async function findNotesForNotice(noteIds: readonly string[], trx: Db = db): Promise<NoteForNotice[]> {
  if (noteIds.length === 0) return [];
  const runNotes = await trx('run_notes')
    .join('runs', 'runs.id', 'run_notes.run_id')
    .whereIn('run_notes.id', noteIds)
    .select<NoteForNotice[]>(
      'run_notes.id',
      trx.raw("'run-note' as kind"),
      'runs.user_id as runner_id',
      'run_notes.author_id',
      'run_notes.text',
      'run_notes.created_at',
      'runs.id as run_id',
      'runs.name as run_name',
      'runs.local_date as run_date',
      trx.raw('null as week_start'),
    );
  const weekNotes = await trx('week_notes')
    .whereIn('id', noteIds)
    .select<NoteForNotice[]>(
      'id',
      trx.raw("'week-note' as kind"),
      'runner_id',
      'author_id',
      'text',
      'created_at',
      trx.raw('null as run_id'),
      trx.raw('null as run_name'),
      trx.raw('null as run_date'),
      'week_start',
    );
  return [...runNotes, ...weekNotes].sort((a, b) => a.created_at.getTime() - b.created_at.getTime());
}

/** The runners in every squad the user coaches (whose notes a notice may quote to them). */
export async function findRunnersCoachedBy(coachId: string, trx: Db = db): Promise<string[]> {
  const rows = await trx('squads')
    .join('squad_members', 'squad_members.squad_id', 'squads.id')
    .where('squads.coach_id', coachId)
    .distinct<Array<{ runner_id: string }>>('squad_members.runner_id');
  return rows.map((r) => r.runner_id);
}
