import { NOTICE_KIND_INFO, NOTICE_KINDS } from '../../../shared/notices/kinds.ts';
import { recordSwitchChanges } from '../notices/index.ts';
import type { Db } from '../../lib/db.ts';
import { NotFoundError, ValidationError } from '../../lib/errors.ts';
import {
  findUserById,
  listUsers,
  toAdminUser,
  toProfile,
  toUser,
  updateUserProfile,
  updatePasswordHash,
  updateUserRole,
} from './users.repository.ts';
import type { AdminUser, Profile, Role, UpdateProfileInput, User } from '../../../shared/users/schemas.ts';

export async function updateProfile(userId: string, changes: UpdateProfileInput): Promise<Profile> {
  const current = await findUserById(userId);
  if (!current) throw new NotFoundError();
  // The schema checks the pair when both are sent; here the stored value fills in the missing one.
  const resting = changes.resting_hr === undefined ? current.resting_hr : changes.resting_hr;
  const max = changes.max_hr === undefined ? current.max_hr : changes.max_hr;
  if (resting != null && max != null && resting >= max) {
    const message = 'Resting heart rate must be below maximum heart rate.';
    throw new ValidationError(message, [{ field: changes.resting_hr === undefined ? 'max_hr' : 'resting_hr', message }]);
  }
  const row = await updateUserProfile(userId, changes);
  if (!row) throw new NotFoundError();
  // A notice switch changed here too makes older unsubscribe links for it stale (issue 16).
  const switched = NOTICE_KINDS.filter((kind) => current[NOTICE_KIND_INFO[kind].column] !== row[NOTICE_KIND_INFO[kind].column]);
  await recordSwitchChanges(userId, switched, new Date());
  return toProfile(row);
}

export async function listAllUsers(): Promise<AdminUser[]> {
  return (await listUsers()).map(toAdminUser);
}

export async function changeRole(userId: string, role: Role): Promise<User> {
  const row = await updateUserRole(userId, role);
  if (!row) throw new NotFoundError('There is no user with this id.');
  return toUser(row);
}

/**
 * Stores a new password hash (auth decides when and checks the password). `expected` makes it
 * conditional on the stored hash; `updatedAt` stamps the change (a rehash at sign-in leaves it).
 */
export async function setPasswordHash(
  userId: string,
  passwordHash: string,
  options: { expected?: string; updatedAt?: Date } = {},
  trx?: Db,
): Promise<void> {
  await updatePasswordHash(userId, passwordHash, options, trx);
}
