import { createHash, randomBytes } from 'node:crypto';
import type { AppConfig } from '../../config.ts';
import { NotFoundError } from '../../lib/errors.ts';
import type { UserRow } from '../../lib/db.ts';
import {
  deleteApiToken,
  findLiveApiTokenUser,
  insertApiToken,
  listApiTokens,
  markApiTokenUsed,
  toApiToken,
} from './tokens.repository.ts';
import type { ApiToken } from '../../../shared/auth/schemas.ts';

const TOKEN_PREFIX = 'pw_';

export function hashApiToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

/** Issues a new bearer token. The plain token is returned once and only its hash is stored. */
export async function issueApiToken(
  userId: string,
  name: string,
  config: AppConfig,
  now = new Date(),
): Promise<{ token: string; expires_at: string; id: string; name: string }> {
  const token = TOKEN_PREFIX + randomBytes(32).toString('base64url');
  const expiresAt = new Date(now.getTime() + config.apiTokenDays * 24 * 3600 * 1000);
  const row = await insertApiToken({ userId, name, tokenHash: hashApiToken(token), expiresAt });
  return { token, expires_at: row.expires_at.toISOString(), id: row.id, name: row.name };
}

/**
 * How often a token's `last_used_at` is written: at its first use, then at most once a minute. A script
 * sending many requests at once would otherwise queue every one of them on the same row's lock.
 */
const LAST_USED_RESOLUTION_MS = 60_000;

/** The user behind a bearer token, or null when it is unknown, revoked or expired. */
export async function resolveApiTokenUser(token: string, now = new Date()): Promise<UserRow | null> {
  if (!token.startsWith(TOKEN_PREFIX)) return null;
  const found = await findLiveApiTokenUser(hashApiToken(token), now);
  if (!found) return null;
  const since = new Date(now.getTime() - LAST_USED_RESOLUTION_MS);
  if (!found.lastUsedAt || found.lastUsedAt < since) await markApiTokenUsed(found.tokenId, now, since);
  return found.user;
}

export async function listTokensOf(userId: string, now = new Date()): Promise<ApiToken[]> {
  return (await listApiTokens(userId, now)).map(toApiToken);
}

export async function revokeToken(userId: string, tokenId: string): Promise<void> {
  if (!(await deleteApiToken(userId, tokenId))) throw new NotFoundError('That token does not exist or was already revoked.');
}
