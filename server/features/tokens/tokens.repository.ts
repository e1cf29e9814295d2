import { db, type ApiTokenRow, type Db } from '../../lib/db.ts';
import type { ApiToken } from '../../../shared/auth/schemas.ts';

export function toApiToken(row: ApiTokenRow): ApiToken {
  return {
    id: row.id,
    name: row.name,
    created_at: row.created_at.toISOString(),
    expires_at: row.expires_at.toISOString(),
    last_used_at: row.last_used_at?.toISOString() ?? null,
  };
}

export async function insertApiToken(
  token: { userId: string; name: string; tokenHash: string; expiresAt: Date },
  trx: Db = db,
): Promise<ApiTokenRow> {
  const [row] = await trx('api_tokens')
    .insert({ user_id: token.userId, name: token.name, token_hash: token.tokenHash, expires_at: token.expiresAt })
    .returning('*');
  return row as ApiTokenRow;
}

/** The live (unexpired) token with this hash; marks it used. */
export async function touchLiveApiToken(tokenHash: string, now: Date, trx: Db = db): Promise<ApiTokenRow | undefined> {
  const [row] = await trx('api_tokens')
    .where({ token_hash: tokenHash })
    .andWhere('expires_at', '>', now)
    .update({ last_used_at: now })
    .returning('*');
  return row as ApiTokenRow | undefined;
}

export async function listApiTokens(userId: string, now: Date, trx: Db = db): Promise<ApiTokenRow[]> {
  return trx('api_tokens').where({ user_id: userId }).andWhere('expires_at', '>', now).orderBy('created_at', 'desc');
}

export async function deleteApiToken(userId: string, id: string, trx: Db = db): Promise<boolean> {
  const count = await trx('api_tokens').where({ user_id: userId, id }).delete();
  return count > 0;
}
