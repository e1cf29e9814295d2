import bcrypt from 'bcryptjs';
import type { AppConfig } from '../../config.ts';
import { inTransaction, type UserRow } from '../../lib/db.ts';
import { UnauthorizedError } from '../../lib/errors.ts';
import { endApiTokensOf } from '../tokens/index.ts';
import { findUserByEmail, setPasswordHash } from '../users/index.ts';
import type { LoginInput } from '../../../shared/auth/schemas.ts';
import { limitPasswordCheck } from './credential-limiter.ts';
import { useUpResetsOf } from './password-resets.repository.ts';
import { compareInThread, hashInThread } from './password-pool.ts';
import { endSessionsOf } from './sessions.service.ts';

const WRONG_CREDENTIALS = 'That e-mail and password do not match an account.';

// Compared against when the e-mail is unknown, so both failures take the same time; made at the
// configured cost, the cost every stored hash is brought to at its next sign-in. Every hash and
// compare runs in the password threads (password-pool.ts), never on the event loop.
const dummyHashes = new Map<number, Promise<string>>();
function dummyHash(cost: number): Promise<string> {
  let hash = dummyHashes.get(cost);
  if (!hash) {
    hash = hashInThread('not-a-real-password', cost);
    dummyHashes.set(cost, hash);
    // A refused or failed attempt is not remembered: the next sign-in makes it again.
    hash.catch(() => dummyHashes.delete(cost));
  }
  return hash;
}

export async function hashPassword(password: string, config: AppConfig): Promise<string> {
  return hashInThread(password, config.bcryptCost);
}

/** A hash made at another cost than the configured one is made again now that the password is known. */
async function rehashIfOutdated(user: UserRow, password: string, config: AppConfig): Promise<void> {
  if (bcrypt.getRounds(user.password_hash) === config.bcryptCost) return;
  const passwordHash = await hashPassword(password, config);
  await setPasswordHash(user.id, passwordHash, { expected: user.password_hash });
}

/**
 * The user with these credentials; the same 401 for an unknown e-mail and a wrong password, with
 * the same bcrypt work. Guarded by the credential limiter (failures per account and address).
 */
export async function checkCredentials(input: LoginInput, config: AppConfig, address: string | undefined): Promise<UserRow> {
  return limitPasswordCheck({ email: input.email, address }, config, async () => {
    const user = await findUserByEmail(input.email);
    const matches = await compareInThread(input.password, user?.password_hash ?? (await dummyHash(config.bcryptCost)));
    if (!user || !matches) throw new UnauthorizedError(WRONG_CREDENTIALS, 'wrong-credentials');
    await rehashIfOutdated(user, input.password, config);
    return user;
  });
}

/** Checks the signed-in user's own password (account deletion, password change) under the same limiter. */
export async function confirmOwnPassword(
  user: UserRow,
  password: string,
  config: AppConfig,
  address: string | undefined,
  wrongMessage: string,
): Promise<void> {
  await limitPasswordCheck({ email: user.email, address }, config, async () => {
    if (!(await compareInThread(password, user.password_hash))) throw new UnauthorizedError(wrongMessage, 'wrong-password');
  });
}

/**
 * A signed-in user chooses a new password: every other session and every API token ends (they
 * were opened with the old password), the session asking stays signed in.
 */
export async function changePassword(
  user: UserRow,
  sessionId: string,
  input: { current_password: string; new_password: string },
  config: AppConfig,
  address: string | undefined,
): Promise<void> {
  await confirmOwnPassword(
    user,
    input.current_password,
    config,
    address,
    'That is not your current password, so it was not changed.',
  );
  const passwordHash = await hashPassword(input.new_password, config);
  await inTransaction(async (trx) => {
    await setPasswordHash(user.id, passwordHash, { updatedAt: new Date() }, trx);
    await endSessionsOf(user.id, { keep: sessionId, trx });
    await endApiTokensOf(user.id, trx);
    // A reset link asked for before the change must not undo it.
    await useUpResetsOf(user.id, new Date(), trx);
  });
}
