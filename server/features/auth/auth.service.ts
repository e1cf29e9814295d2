import bcrypt from 'bcryptjs';
import type { AppConfig } from '../../config.ts';
import type { UserRow } from '../../lib/db.ts';
import { UnauthorizedError } from '../../lib/errors.ts';
import { findUserByEmail, insertUser } from '../users/users.repository.ts';
import type { LoginInput, RegisterInput } from '../../../shared/auth/schemas.ts';

const WRONG_CREDENTIALS = 'That e-mail and password do not match an account.';

// Compared against when the e-mail is unknown, so both failures take the same time.
let dummyHash: string | undefined;

export async function hashPassword(password: string, config: AppConfig): Promise<string> {
  return bcrypt.hash(password, config.bcryptCost);
}

export async function registerUser(input: RegisterInput, config: AppConfig): Promise<UserRow> {
  const passwordHash = await hashPassword(input.password, config);
  return insertUser({ email: input.email, passwordHash, name: input.name, role: input.role });
}

/** The user with these credentials; the same 401 for an unknown e-mail and a wrong password. */
export async function checkCredentials(input: LoginInput, config: AppConfig): Promise<UserRow> {
  const user = await findUserByEmail(input.email);
  dummyHash ??= await bcrypt.hash('not-a-real-password', config.bcryptCost);
  const matches = await bcrypt.compare(input.password, user?.password_hash ?? dummyHash);
  if (!user || !matches) throw new UnauthorizedError(WRONG_CREDENTIALS, 'wrong-credentials');
  return user;
}
