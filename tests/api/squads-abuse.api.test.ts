import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { INVITATIONS_PER_ADDRESS_PER_DAY, INVITATIONS_PER_COACH_PER_DAY } from '../../server/features/squads/squads.service.ts';
import { db } from '../../server/lib/db.ts';
import { createUser } from '../support/factories.ts';
import { recordedMail, testApp } from '../support/test-app.ts';

/**
 * Issue 13 #5 and #11. The old code let a new coach name a squad "Account locked - verify at
 * http://… now" and send 60 invitations in 7 s, to the same address again and again, and let an
 * account with another e-mail address accept an invitation.
 */

type App = ReturnType<typeof testApp>;

async function person(app: App, role: 'runner' | 'coach', overrides: { email?: string; name?: string } = {}) {
  const { user, password } = await createUser({ role, ...overrides });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, auth: { Authorization: `Bearer ${token}` } };
}

async function squadOf(app: App, coach: { auth: Record<string, string> }, name = 'Harbor Line Runners'): Promise<string> {
  const res = await request(app).post('/api/squads').set(coach.auth).send({ name });
  expect(res.status).toBe(201);
  return res.body.squad.id as string;
}

const invite = (app: App, coach: { auth: Record<string, string> }, squad: string, email: string) =>
  request(app).post(`/api/squads/${squad}/invitations`).set(coach.auth).send({ email });

describe('squad names (issue 13 #5)', () => {
  it.each([
    'Account locked - verify at http://evil.example now',
    'Join us at www.example.org',
    'harbor-line.run',
    'mail help@example.org',
  ])('refuses "%s" with a sentence (400) and makes no squad', async (name) => {
    const app = testApp();
    const coach = await person(app, 'coach');
    const res = await request(app).post('/api/squads').set(coach.auth).send({ name });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([{ field: 'name', message: expect.stringMatching(/cannot hold a web or e-mail address/) }]);
    expect(await db('squads').count({ n: '*' }).first()).toEqual({ n: '0' });
  });

  it('a coach whose display name is a link cannot send invitations (400), so the name never reaches an inbox', async () => {
    const app = testApp();
    const coach = await person(app, 'coach', { name: 'Verify at evil.example' });
    const squad = await squadOf(app, coach);
    recordedMail.length = 0;
    const res = await invite(app, coach, squad, 'someone@example.test');
    expect(res.status).toBe(400);
    expect(res.body.code).toBe('link-in-coach-name');
    expect(recordedMail).toEqual([]);
  });
});

describe('invitation limits (issue 13 #5)', () => {
  it(`a coach sends at most ${INVITATIONS_PER_COACH_PER_DAY} invitations a day: the next is 429 with a sentence and sends nothing`, async () => {
    const app = testApp();
    const coach = await person(app, 'coach');
    const squad = await squadOf(app, coach);
    for (let i = 0; i < INVITATIONS_PER_COACH_PER_DAY; i++)
      expect((await invite(app, coach, squad, `runner-${i}@example.test`)).status).toBe(201);
    recordedMail.length = 0;
    const over = await invite(app, coach, squad, 'one-more@example.test');
    expect(over.status).toBe(429);
    expect(over.body.error).toMatch(/send the rest tomorrow/);
    expect(recordedMail).toEqual([]);
    // A day later the coach may invite again.
    await db('invitations').update({ created_at: new Date(Date.now() - 86_400_000 - 1000) });
    expect((await invite(app, coach, squad, 'one-more@example.test')).status).toBe(201);
  });

  it(`one address receives at most ${INVITATIONS_PER_ADDRESS_PER_DAY} invitations a day, from any coach: the next is 429`, async () => {
    const app = testApp();
    const first = await person(app, 'coach');
    const second = await person(app, 'coach');
    const squadA = await squadOf(app, first);
    const squadB = await squadOf(app, second, 'Ridge Road');
    const statuses = [];
    for (let i = 0; i < INVITATIONS_PER_ADDRESS_PER_DAY; i++)
      statuses.push((await invite(app, first, squadA, 'Target@example.test')).status);
    const fromOther = await invite(app, second, squadB, 'target@example.test');
    statuses.push(fromOther.status);
    expect(statuses).toEqual([...Array<number>(INVITATIONS_PER_ADDRESS_PER_DAY).fill(201), 429]);
    expect(fromOther.body.error).toMatch(/wait a day/);
    expect(recordedMail.filter((m) => m.to === 'target@example.test')).toHaveLength(INVITATIONS_PER_ADDRESS_PER_DAY);
  });
});

describe('invitation binding (issue 13 #11)', () => {
  it('an account with another e-mail address gets 403 with a sentence naming both; the invited address joins', async () => {
    const app = testApp();
    const coach = await person(app, 'coach');
    const squad = await squadOf(app, coach);
    recordedMail.length = 0;
    expect((await invite(app, coach, squad, 'invited@example.test')).status).toBe(201);
    const token = /\/invite\/(inv_[A-Za-z0-9_-]{43})/.exec(recordedMail.at(-1)!.text)![1]!;

    const other = await person(app, 'runner', { email: 'someone-else@example.test' });
    const refused = await request(app).post(`/api/invitations/${token}/accept`).set(other.auth);
    expect(refused.status).toBe(403);
    expect(refused.body.code).toBe('invitation-other-address');
    expect(refused.body.error).toBe(
      'This invitation was sent to invited@example.test, and you are signed in as someone-else@example.test. Sign in with the invited address, or ask your coach to invite someone-else@example.test instead.',
    );
    expect(await db('squad_members').where({ squad_id: squad }).count({ n: '*' }).first()).toEqual({ n: '0' });

    const invited = await person(app, 'runner', { email: 'Invited@example.test' });
    expect((await request(app).post(`/api/invitations/${token}/accept`).set(invited.auth)).status).toBe(200);
  });
});
