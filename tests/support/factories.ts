import bcrypt from 'bcryptjs';
import { randomUUID } from 'node:crypto';
import { db, type UserRow } from '../../server/lib/db.ts';
import type { Role } from '../../shared/users/schemas.ts';

export const DEFAULT_PASSWORD = 'correct horse battery';

/** Inserts a user directly (cheap bcrypt cost); returns the row and the plain password. */
export async function createUser(overrides: Partial<{ email: string; name: string; role: Role; password: string }> = {}) {
  const password = overrides.password ?? DEFAULT_PASSWORD;
  const [row] = await db('users')
    .insert({
      email: overrides.email ?? `user-${randomUUID().slice(0, 8)}@example.test`,
      name: overrides.name ?? 'Test Runner',
      role: overrides.role ?? 'runner',
      password_hash: await bcrypt.hash(password, 4),
    })
    .returning('*');
  return { user: row as UserRow, password };
}
