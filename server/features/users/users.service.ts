import { NOTICE_KIND_INFO, NOTICE_KINDS } from '../../../shared/notices/kinds.ts';
import { recordSwitchChanges } from '../notices/index.ts';
import type { Db, UserRow } from '../../lib/db.ts';
import { NotFoundError, ValidationError } from '../../lib/errors.ts';
import {
  insertUserRow,
  listUsers,
  selectUserByEmail,
  selectUserById,
  selectUsersByIds,
  type NewUser,
  updatePasswordHash,
  updateUserProfile,
  updateUserRole,
} from './users.repository.ts';
import type { AdminUser, Profile, Role, UpdateProfileInput, User } from '../../../shared/users/schemas.ts';

// ── The face: what other features read and write of a user (server/features/README.md) ──

export function toUser(row: UserRow): User {
  return { id: row.id, email: row.email, name: row.name, role: row.role };
}

export function toProfile(row: UserRow): Profile {
  return {
    ...toUser(row),
    unit: row.unit,
    birth_year: row.birth_year,
    resting_hr: row.resting_hr,
    max_hr: row.max_hr,
    weight_kg: row.weight_kg,
    time_zone: row.time_zone,
    pace_tolerance: row.pace_tolerance,
    notify_on_import: row.notify_on_import,
    notify_on_plan_change: row.notify_on_plan_change,
    week_starts_on: row.week_starts_on,
    sex: row.sex,
    created_at: row.created_at.toISOString(),
  };
}

export function toAdminUser(row: UserRow): AdminUser {
  return { ...toUser(row), created_at: row.created_at.toISOString() };
}

/** The user with this id; a read a streaming replica may serve unless `trx` is given. */
export function findUserById(id: string, trx?: Db): Promise<UserRow | undefined> {
  return selectUserById(id, trx);
}

export function findUsersByIds(ids: readonly string[], trx?: Db): Promise<UserRow[]> {
  return selectUsersByIds(ids, trx);
}

/** The user with this e-mail address, whatever its case. */
export function findUserByEmail(email: string, trx?: Db): Promise<UserRow | undefined> {
  return selectUserByEmail(email, trx);
}

/** A new account (auth has checked the address and hashed the password); 409 with a sentence when the address is taken. */
export function createUser(user: NewUser, trx?: Db): Promise<UserRow> {
  return insertUserRow(user, trx);
}

/** The runner's pace tolerance for the plan check (plans decides who may set it). */
export async function storePaceTolerance(userId: string, tolerance: number): Promise<void> {
  await updateUserProfile(userId, { pace_tolerance: tolerance });
}

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
