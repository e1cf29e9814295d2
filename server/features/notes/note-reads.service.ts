// What other features read of notes: the functions the face (index.ts) offers. The queries stay in
// the repository, which is private to this feature (server/features/README.md).

import type { Db } from '../../lib/db.ts';
import * as notes from './notes.repository.ts';

/** Which of these notes the user has opened (the "new" markers); a replica may serve it. */
export function findReadNoteIds(userId: string, noteIds: readonly string[], trx?: Db): Promise<Set<string>> {
  return notes.findReadNoteIds(userId, noteIds, trx);
}
