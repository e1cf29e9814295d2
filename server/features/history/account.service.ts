import { rm } from 'node:fs/promises';
import { inTransaction, type UserRow } from '../../lib/db.ts';
import type { AppConfig } from '../../config.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import { deleteUserEverywhere } from './account.repository.ts';
import { archivePath } from './imports.service.ts';
import { confirmOwnPassword } from '../auth/index.ts';

/**
 * Deletes the account of `user` after checking their password: every row (see
 * `deleteUserEverywhere`), then every original file and waiting import archive. A coach's squads
 * go with them; their runners simply stop being in that squad and keep all their own data.
 */
export async function deleteAccount(
  user: UserRow,
  password: string,
  store: FileStore,
  config: AppConfig,
  address: string | undefined,
): Promise<void> {
  // The credential limiter counts wrong passwords here like at sign-in (issue 13 #6).
  await confirmOwnPassword(user, password, config, address, 'That password does not match your account, so nothing was deleted.');
  const dataDir = config.dataDir;
  const remains = await inTransaction((trx) => deleteUserEverywhere(user.id, user.email, trx));
  // After the commit: a failed file deletion leaves an unreachable file (logged), never a run without its file.
  const removals = [
    ...remains.storageKeys.map((key) =>
      store.delete(key).catch((err: unknown) => logger.error({ err, key }, 'deleting a file failed')),
    ),
    ...remains.importIds.map((id) => rm(archivePath(dataDir, id), { force: true })),
  ];
  await Promise.all(removals);
}
