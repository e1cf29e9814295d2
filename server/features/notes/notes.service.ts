import type { Actor } from '../../../shared/auth/permissions.ts';
import type { UnreadAnswer } from '../../../shared/notes/schemas.ts';
import { NotFoundError } from '../../lib/errors.ts';
import { assertCanReadRunner } from '../squads/index.ts';
import { findNoteById, insertNoteReads, listUnreadNotes } from './notes.repository.ts';

const NO_NOTE = 'There is no note with this id that you can read.';

/** The notes the other side wrote that the actor has not opened: a count and the newest first. */
export async function unreadOf(actor: Actor): Promise<UnreadAnswer> {
  const { count, items } = await listUnreadNotes(actor.id);
  return {
    count,
    items: items.map((n) => ({
      kind: n.kind,
      id: n.id,
      runner_id: n.runner_id,
      runner_time_zone: n.runner_time_zone,
      created_at: n.created_at.toISOString(),
      author_name: n.author_name,
      excerpt: n.excerpt,
      ...(n.run_id ? { run_id: n.run_id } : {}),
      ...(n.week_start ? { week_start: n.week_start } : {}),
    })),
  };
}

/**
 * Marks a note the actor may read as opened. A note about someone whose data the actor may not read
 * answers 404 and changes nothing; marking one's own note is a harmless no-op.
 */
export async function markNoteRead(actor: Actor, noteId: string): Promise<void> {
  const note = await findNoteById(noteId);
  if (!note) throw new NotFoundError(NO_NOTE);
  await assertCanReadRunner(actor, note.runner_id, NO_NOTE);
  if (note.author_id === actor.id) return;
  await insertNoteReads(actor.id, [note.id]);
}
