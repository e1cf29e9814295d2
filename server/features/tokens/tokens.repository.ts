import { db, preparedStatement, type ApiTokenRow, type Db, type UserRow } from '../../lib/db.ts';
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

/** Every bearer request sends it, named (prepared): planning it cost more than running it. */
const apiTokenCaller = preparedStatement<UserRow & { token_id: string; token_last_used_at: Date | null; inputs_counter: string }>(
  'authenticate-api-token',
  `select users.*, api_tokens.id as token_id, api_tokens.last_used_at as token_last_used_at,
          coalesce(week_input_counters.counter, 0)::text as inputs_counter
   from api_tokens join users on users.id = api_tokens.user_id
   left join week_input_counters on week_input_counters.runner_id = users.id
   where api_tokens.token_hash = ? and api_tokens.expires_at > ?
   limit 1`,
);

/**
 * The user behind the live (unexpired) token with this hash, when the token was last marked used, and the
 * user's input counter (`week_input_counters`, 0 before their first counted write): the one query every
 * bearer request makes, so ready answers (server/features/week-cache) need no query of their own to check it.
 */
export async function findLiveApiTokenUser(
  tokenHash: string,
  now: Date,
  trx: Db = db,
): Promise<{ user: UserRow; tokenId: string; lastUsedAt: Date | null; inputsCounter: string } | undefined> {
  const [row] = await apiTokenCaller([tokenHash, now], trx);
  if (!row) return undefined;
  const { token_id: tokenId, token_last_used_at: lastUsedAt, inputs_counter: inputsCounter, ...user } = row;
  return { user, tokenId, lastUsedAt, inputsCounter };
}

/** Marks the token used at `now`, unless that was already recorded after `since`. */
export async function markApiTokenUsed(id: string, now: Date, since: Date, trx: Db = db): Promise<void> {
  await trx('api_tokens')
    .where({ id })
    .andWhere((q) => q.whereNull('last_used_at').orWhere('last_used_at', '<', since))
    .update({ last_used_at: now });
}

export async function listApiTokens(userId: string, now: Date, trx: Db = db): Promise<ApiTokenRow[]> {
  return trx('api_tokens').where({ user_id: userId }).andWhere('expires_at', '>', now).orderBy('created_at', 'desc');
}

export async function deleteApiToken(userId: string, id: string, trx: Db = db): Promise<boolean> {
  const count = await trx('api_tokens').where({ user_id: userId, id }).delete();
  return count > 0;
}

/** Locks the owner's user row, so two requests at once cannot both take an account's last token place. */
export async function lockTokenOwner(userId: string, trx: Db): Promise<void> {
  await trx('users').where({ id: userId }).forUpdate().first('id');
}

export async function countLiveApiTokens(userId: string, now: Date, trx: Db = db): Promise<number> {
  const [{ live }] = (await trx('api_tokens')
    .where({ user_id: userId })
    .andWhere('expires_at', '>', now)
    .count({ live: '*' })) as [{ live: string | number }];
  return Number(live);
}

export async function deleteApiTokensOf(userId: string, trx: Db = db): Promise<number> {
  return trx('api_tokens').where({ user_id: userId }).delete();
}
