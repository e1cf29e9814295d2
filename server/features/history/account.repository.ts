import type { Db } from '../../lib/db.ts';
import { forgetWeeksNaming } from '../week-cache/index.ts';
import { deleteImportJobs } from './imports.repository.ts';

export interface AccountRemains {
  storageKeys: string[];
  importIds: string[];
}

/**
 * Deletes a user and everything of theirs in one transaction. Foreign keys cascade from `users`
 * to every table holding a user id (runs and their parts, files, notes, plans, squads they coach
 * with their memberships and invitations, fuel, imports, tokens); plans and fuel plans a coach
 * wrote for other runners keep existing with their author cleared. What the keys cannot reach is
 * removed by address: invitations sent to the user's e-mail and development mail caught for it; the
 * queue's job rows naming the user's imports are removed by import id.
 * The user row is locked first so an import finishing at the same moment either commits before
 * (and its file is listed here) or fails afterwards. Returns what the caller removes from storage.
 */
export async function deleteUserEverywhere(userId: string, email: string, trx: Db): Promise<AccountRemains> {
  await trx('users').where({ id: userId }).forUpdate().first();
  const [files, imports] = await Promise.all([
    trx('source_files').where({ user_id: userId }).select('storage_key'),
    trx('imports').where({ user_id: userId }).select('id'),
  ]);
  await trx('invitations').whereRaw('lower(email) = lower(?)', [email]).delete();
  await trx('dev_outbox').whereRaw('lower("to") = lower(?)', [email]).delete();
  await deleteImportJobs(
    imports.map((i) => i.id),
    trx,
  );
  await forgetWeeksNaming(userId, trx);
  await trx('users').where({ id: userId }).delete();
  return { storageKeys: files.map((f) => f.storage_key), importIds: imports.map((i) => i.id) };
}
