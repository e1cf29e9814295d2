import { db, type Db, type NoteConcern, readDb } from '../../lib/db.ts';
import { bumpWeekInputsOfRuns } from '../week-cache/index.ts';
import type { RunNote } from '../../../shared/runs/schemas.ts';

interface NoteWithAuthor {
  id: string;
  run_id: string;
  text: string;
  created_at: Date;
  author_id: string;
  author_name: string;
  author_role: string;
  concern: NoteConcern | null;
}

function toRunNote(row: NoteWithAuthor): RunNote {
  return {
    concern: row.concern,
    unread: false,
    id: row.id,
    run_id: row.run_id,
    author: { id: row.author_id, name: row.author_name, role: row.author_role },
    text: row.text,
    created_at: row.created_at.toISOString(),
  };
}

function notesWithAuthors(trx: Db) {
  return trx('run_notes')
    .join('users', 'users.id', 'run_notes.author_id')
    .select<NoteWithAuthor[]>(
      'run_notes.id',
      'run_notes.run_id',
      'run_notes.text',
      'run_notes.created_at',
      'run_notes.concern',
      'run_notes.author_id',
      'users.name as author_name',
      'users.role as author_role',
    );
}

export async function insertRunNote(
  runId: string,
  authorId: string,
  text: string,
  concern: NoteConcern | null = null,
  trx: Db = db,
): Promise<RunNote> {
  const [{ id }] = (await trx('run_notes').insert({ run_id: runId, author_id: authorId, text, concern }).returning('id')) as [
    { id: string },
  ];
  await bumpWeekInputsOfRuns([runId], trx);
  const row = await notesWithAuthors(trx).where('run_notes.id', id).first();
  return toRunNote(row as NoteWithAuthor);
}

export async function listRunNotes(runId: string, trx: Db = db): Promise<RunNote[]> {
  return (await notesWithAuthors(trx).where('run_notes.run_id', runId).orderBy('run_notes.created_at', 'asc')).map(toRunNote);
}

/** Notes on several runs, oldest first. */
export async function listRunNotesOf(runIds: readonly string[], trx: Db = readDb()): Promise<RunNote[]> {
  if (runIds.length === 0) return [];
  return (await notesWithAuthors(trx).whereIn('run_notes.run_id', runIds).orderBy('run_notes.created_at', 'asc')).map(toRunNote);
}
