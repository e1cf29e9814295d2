import { createHash, randomBytes } from 'node:crypto';
import type { AppConfig } from '../../config.ts';
import { ConflictError, NotFoundError } from '../../lib/errors.ts';
import { inTransaction, type Db, type UserRow } from '../../lib/db.ts';
import {
  countLiveApiTokens,
  deleteApiToken,
  deleteApiTokensOf,
  findLiveApiTokenUser,
  insertApiToken,
  listApiTokens,
  lockTokenOwner,
  markApiTokenUsed,
  toApiToken,
} from './tokens.repository.ts';
import { MAX_API_TOKENS_PER_USER, type ApiToken } from '../../../shared/auth/schemas.ts';

const TOKEN_PREFIX = 'pw_';

export function hashApiToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/**
 * Issues a new bearer token. The plain token is returned once and only its hash is stored. An
 * account holds at most MAX_API_TOKENS_PER_USER live tokens (409 beyond, with a sentence).
 */
export async function issueApiToken(
  userId: string,
  name: string,
  config: AppConfig,
  now = new Date(),
): Promise<{ token: string; expires_at: string; id: string; name: string }> {
  const token = TOKEN_PREFIX + randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + config.apiTokenDays * 24 * 3600 * 1000);
  const row = await inTransaction(async (trx) => {
    // The user's row is locked so two requests at once cannot both take the last place.
    await lockTokenOwner(userId, trx);
    if ((await countLiveApiTokens(userId, now, trx)) >= MAX_API_TOKENS_PER_USER)
      throw new ConflictError(
        `You already have ${MAX_API_TOKENS_PER_USER} API tokens, the most one account can hold. Revoke one you no longer use on your profile page, then create the new one.`,
        'too-many-tokens',
      );
    return insertApiToken({ userId, name, tokenHash: hashApiToken(token), expiresAt }, trx);
  });
  return { token, expires_at: row.expires_at.toISOString(), id: row.id, name: row.name };
}

/**
 * How often a token's `last_used_at` is written: at its first use, then at most once a minute. A script
 * sending many requests at once would otherwise queue every one of them on the same row's lock.
 */
const LAST_USED_RESOLUTION_MS = 60_000;

/**
 * The user behind a bearer token and their input counter (the change counter of their runs, plans and weeks,
 * server/features/week-cache), or null when the token is unknown, revoked or expired.
 */
export async function resolveApiToken(token: string, now = new Date()): Promise<{ user: UserRow; inputsCounter: string } | null> {
  if (!token.startsWith(TOKEN_PREFIX)) return null;
  const found = await findLiveApiTokenUser(hashApiToken(token), now);
  if (!found) return null;
  const since = new Date(now.getTime() - LAST_USED_RESOLUTION_MS);
  if (!found.lastUsedAt || found.lastUsedAt < since) await markApiTokenUsed(found.tokenId, now, since);
  return { user: found.user, inputsCounter: found.inputsCounter };
}

/** The user behind a bearer token, or null when it is unknown, revoked or expired. */
export async function resolveApiTokenUser(token: string, now = new Date()): Promise<UserRow | null> {
  return (await resolveApiToken(token, now))?.user ?? null;
}

export async function listTokensOf(userId: string, now = new Date()): Promise<ApiToken[]> {
  return (await listApiTokens(userId, now)).map(toApiToken);
}

export async function revokeToken(userId: string, tokenId: string): Promise<void> {
  if (!(await deleteApiToken(userId, tokenId))) throw new NotFoundError('That token does not exist or was already revoked.');
}

/** Ends every API token of the user (a new password: they were opened under the old one), inside the caller's transaction. */
export async function endApiTokensOf(userId: string, trx?: Db): Promise<void> {
  await deleteApiTokensOf(userId, trx);
}
