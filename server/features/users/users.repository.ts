import { db, isUniqueViolation, type Db, type UserRow, readDb } from '../../lib/db.ts';
import { bumpWeekInputs, bumpWeekInputsOfCoachedRunners } from '../week-cache/index.ts';
import { ConflictError } from '../../lib/errors.ts';
import type { Role, UpdateProfileInput } from '../../../shared/users/schemas.ts';

export async function selectUserById(id: string, trx: Db = readDb()): Promise<UserRow | undefined> {
  return trx('users').where({ id }).first();
}

export async function selectUsersByIds(ids: readonly string[], trx: Db = readDb()): Promise<UserRow[]> {
  if (ids.length === 0) return [];
  return trx('users').whereIn('id', ids);
}

export async function selectUserByEmail(email: string, trx: Db = db): Promise<UserRow | undefined> {
  return trx('users').whereRaw('lower(email) = lower(?)', [email]).first();
}

export interface NewUser {
  /** Set when the id was already answered (a sign-up confirmed by its e-mailed link); otherwise PostgreSQL makes one. */
  id?: string;
  email: string;
  passwordHash: string;
  name: string;
  role: Role;
  timeZone?: string;
}

export async function insertUserRow(user: NewUser, trx: Db = db): Promise<UserRow> {
  try {
    const [row] = await trx('users')
      .insert({
        ...(user.id ? { id: user.id } : {}),
        email: user.email,
        password_hash: user.passwordHash,
        name: user.name,
        role: user.role,
        time_zone: user.timeZone ?? 'UTC',
      })
      .returning('*');
    return row as UserRow;
  } catch (err) {
    if (isUniqueViolation(err)) throw new ConflictError('An account with this e-mail address already exists.', 'email-taken');
    throw err;
  }
}

export async function updateUserProfile(id: string, changes: UpdateProfileInput, trx: Db = db): Promise<UserRow | undefined> {
  const [row] = await trx('users')
    .where({ id })
    .update({ ...changes, updated_at: new Date() })
    .returning('*');
  // The profile (time zone, week start, tolerance, name…) feeds the user's weeks; a coach's name is in their runners'.
  await bumpWeekInputs([id], trx);
  await bumpWeekInputsOfCoachedRunners(id, trx);
  return row as UserRow | undefined;
}

export async function updateUserRole(id: string, role: Role, trx: Db = db): Promise<UserRow | undefined> {
  const [row] = await trx('users').where({ id }).update({ role, updated_at: new Date() }).returning('*');
  return row as UserRow | undefined;
}

export async function listUsers(trx: Db = db): Promise<UserRow[]> {
  return trx('users').orderBy('created_at', 'asc');
}

/**
 * Stores a new password hash. `expected` makes it conditional on the stored hash (a rehash at
 * sign-in never undoes a password change made meanwhile); `updatedAt` is left alone when absent.
 */
export async function updatePasswordHash(
  id: string,
  passwordHash: string,
  options: { expected?: string; updatedAt?: Date } = {},
  trx: Db = db,
): Promise<void> {
  const where = options.expected === undefined ? { id } : { id, password_hash: options.expected };
  await trx('users')
    .where(where)
    .update({ password_hash: passwordHash, ...(options.updatedAt ? { updated_at: options.updatedAt } : {}) });
}
