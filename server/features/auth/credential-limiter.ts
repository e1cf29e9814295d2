import type { AppConfig } from '../../config.ts';
import { AppError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import { countFailuresSince, deleteFailures, deleteFailuresBefore, insertFailures } from './credential-failures.repository.ts';

/**
 * The one limiter in front of every password check (sign-in, token from a password, password
 * change, account deletion). It counts FAILED checks only, per account and per address, over a
 * sliding window (config.authRateLimit.windowMs, 15 minutes): a squad signing in from one club
 * network is never held up by its own successful sign-ins, while guessing stops after
 * `authRateLimit.max` wrong passwords from an address or `credentialFailuresPerAccount` against an
 * account. Rows live in PostgreSQL (`credential_failures`), so every server process sees them and
 * a restart does not forgive them.
 *
 * Each attempt is written down as a failure BEFORE the password is compared and struck out when it
 * succeeds: many guesses sent at once all see each other, so no burst gets past the limit.
 */

export interface CredentialKeys {
  /** The account the password is checked against: its e-mail address, lower-cased (known or not). */
  email: string;
  /** The caller's address (`req.ip`; behind a proxy only with TRUST_PROXY set). */
  address: string | undefined;
}

const PRUNE_EVERY_MS = 60_000;
let lastPrune = 0;

const accountKey = (email: string) => `account:${email.trim().toLowerCase()}`;
const addressKey = (address: string | undefined) => `address:${address ?? 'unknown'}`;

async function pruneOldFailures(windowStart: Date, now: number): Promise<void> {
  if (now - lastPrune < PRUNE_EVERY_MS) return;
  lastPrune = now;
  await deleteFailuresBefore(windowStart);
}

function tooMany(minutes: number): AppError {
  const wait = minutes <= 1 ? 'a minute' : `${minutes} minutes`;
  return new AppError(
    429,
    'too-many-attempts',
    `Too many wrong passwords for this account or from this address. Please wait ${wait} and try again, or choose a new password with “Forgot your password?”.`,
  );
}

/**
 * Runs `check` (which compares a password and throws when it does not match) under the limiter:
 * 429 without comparing anything once the account or the address has used up its failures.
 */
export async function limitPasswordCheck<T>(keys: CredentialKeys, config: AppConfig, check: () => Promise<T>): Promise<T> {
  const now = Date.now();
  const windowStart = new Date(now - config.authRateLimit.windowMs);
  const account = accountKey(keys.email);
  const address = addressKey(keys.address);
  await pruneOldFailures(windowStart, now).catch((err: unknown) => logger.warn({ err }, 'pruning credential failures failed'));
  const pendingIds = await insertFailures([account, address]);
  const strikeOut = () => deleteFailures(pendingIds);

  const counts = await countFailuresSince([account, address], windowStart);
  const limits: Record<string, number> = { [account]: config.credentialFailuresPerAccount, [address]: config.authRateLimit.max };
  const over = counts.filter((c) => c.n > limits[c.key]!);
  if (over.length > 0) {
    // A refused attempt is not a failure: it never reached a password, so it cannot prolong the wait.
    await strikeOut();
    const freeAt = Math.max(...over.map((c) => c.oldest.getTime() + config.authRateLimit.windowMs));
    throw tooMany(Math.ceil((freeAt - now) / 60_000));
  }
  let result: T;
  try {
    result = await check();
  } catch (err) {
    // Only a wrong password counts; anything else (a database error) is not the caller's failure.
    if (!(err instanceof AppError && err.status === 401)) await strikeOut();
    throw err;
  }
  await strikeOut();
  return result;
}
