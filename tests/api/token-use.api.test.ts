import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { issueApiToken, resolveApiTokenUser } from '../../server/features/tokens/tokens.service.ts';
import { createUser } from '../support/factories.ts';
import { testConfig } from '../support/test-app.ts';

const lastUsed = async (id: string) => (await db('api_tokens').where({ id }).first())!.last_used_at as Date | null;

describe('a bearer token in use', () => {
  it('answers with its user row (and nothing of the token), noting the use at first and then at most once a minute', async () => {
    const { user } = await createUser();
    const t0 = new Date('2026-11-24T06:00:00Z');
    const issued = await issueApiToken(user.id, 'script', testConfig(), t0);
    expect(await lastUsed(issued.id)).toBeNull();

    const found = await resolveApiTokenUser(issued.token, t0);
    expect(found).toEqual(await db('users').where({ id: user.id }).first());
    expect((await lastUsed(issued.id))!.getTime()).toBe(t0.getTime());

    await resolveApiTokenUser(issued.token, new Date(t0.getTime() + 30_000));
    expect((await lastUsed(issued.id))!.getTime()).toBe(t0.getTime()); // within the minute: no write

    const later = new Date(t0.getTime() + 61_000);
    await resolveApiTokenUser(issued.token, later);
    expect((await lastUsed(issued.id))!.getTime()).toBe(later.getTime());
  });

  it('is refused once expired, revoked or mistyped', async () => {
    const { user } = await createUser();
    const t0 = new Date('2026-11-24T06:00:00Z');
    const issued = await issueApiToken(user.id, 'script', testConfig(), t0);
    expect(await resolveApiTokenUser(issued.token, new Date(issued.expires_at))).toBeNull();
    expect(await resolveApiTokenUser(`${issued.token}x`, t0)).toBeNull();
    expect(await resolveApiTokenUser('not-a-token', t0)).toBeNull();
    await db('api_tokens').where({ id: issued.id }).delete();
    expect(await resolveApiTokenUser(issued.token, t0)).toBeNull();
  });
});
