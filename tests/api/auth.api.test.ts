import jwt from 'jsonwebtoken';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config.ts';
import { db } from '../../server/lib/db.ts';
import { CSRF_HEADER, SESSION_COOKIE, SIGN_UP_SENT_MESSAGE } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { afterAnswerSettled } from '../../server/lib/after-answer.ts';
import { signUpThroughMail, signUpTokenMailedTo } from '../support/sign-up.ts';
import { browserAgent, recordedMail, signedInAgent, testApp, testConfig } from '../support/test-app.ts';

const sessionCookieOf = (res: request.Response) =>
  ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith(`${SESSION_COOKIE}=`));

describe('POST /api/auth/register', () => {
  it('when the input is valid, answers 201 with the user and confirmation "sent" but no cookie; the e-mailed link makes that very user, sets an httpOnly SameSite=Lax session cookie and stores a bcrypt hash', async () => {
    // The production default cost, not the cheap test cost.
    const app = testApp({ bcryptCost: loadConfig({}).bcryptCost });
    const { browser, asked, answer } = await signUpThroughMail(app, {
      email: 'New.Runner@Example.test',
      password: 'a long enough secret',
      name: 'New Runner',
      role: 'runner',
    });
    expect(asked.status).toBe(201);
    expect(asked.body).toEqual({
      user: {
        id: expect.stringMatching(/^[0-9a-f-]{36}$/),
        email: 'new.runner@example.test',
        name: 'New Runner',
        role: 'runner',
      },
      confirmation: 'sent',
      message: SIGN_UP_SENT_MESSAGE,
    });
    expect(sessionCookieOf(asked)).toBeUndefined();
    expect(answer.status).toBe(201);
    // The id answered at sign-up is the account's id.
    expect(answer.body.user).toEqual({ ...asked.body.user });
    expect(answer.body.next).toBeNull();
    const cookie = sessionCookieOf(answer)!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).toMatch(/Max-Age=\d+/);
    const row = await db('users').where({ email: 'new.runner@example.test' }).first();
    expect(row!.id).toBe(asked.body.user.id);
    // bcrypt hash with a cost factor of at least 10 (the minimum)
    expect(row!.password_hash).toMatch(/^\$2[aby]\$(1\d|[2-9]\d)\$/);
    const me = await browser.agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe('new.runner@example.test');
  });

  it('the sign-up answer itself makes no account and sets no cookie; the link works once', async () => {
    const app = testApp();
    const asked = await request(app)
      .post('/api/auth/register')
      .send({ email: 'once@example.test', password: 'a long enough secret', name: 'Once', role: 'coach', next: '/invite/x' });
    expect(asked.status).toBe(201);
    expect(sessionCookieOf(asked)).toBeUndefined();
    await afterAnswerSettled();
    expect(await db('users').where({ email: 'once@example.test' }).first()).toBeUndefined();
    expect(await db('pending_signups').where({ id: asked.body.user.id }).first()).toMatchObject({
      email: 'once@example.test',
      role: 'coach',
    });
    const token = signUpTokenMailedTo('once@example.test')!;
    const first = await request(app).post(`/api/auth/register/${token}`);
    expect(first.status).toBe(201);
    expect(first.body.user).toEqual(asked.body.user);
    expect(first.body.next).toBe('/invite/x');
    const again = await request(app).post(`/api/auth/register/${token}`);
    expect(again.status).toBe(410);
    expect(again.body.error).toMatch(/already been used/);
    const forged = await request(app).post(`/api/auth/register/sgn_${'A'.repeat(43)}`);
    expect(forged.status).toBe(400);
  });

  it('through an invitation to the invited address, signs up at once: 201, confirmation "not-needed", the session cookie (api-contract.md); to another address, the e-mailed-link way', async () => {
    const app = testApp();
    const { user: coach, password: coachPassword } = await createUser({ role: 'coach', name: 'Squad Coach' });
    const asCoach = await signedInAgent(app, coach.email, coachPassword);
    const squad = await asCoach.agent.post('/api/squads').set(CSRF_HEADER, asCoach.csrf).send({ name: 'Morning Group' });
    expect(squad.status).toBe(201);
    recordedMail.length = 0;
    const invited = await asCoach.agent
      .post(`/api/squads/${squad.body.squad.id}/invitations`)
      .set(CSRF_HEADER, asCoach.csrf)
      .send({ email: 'invited@example.test' });
    expect(invited.status).toBe(201);
    const invitation = recordedMail.at(-1)!.text.match(/(inv_[A-Za-z0-9_-]{43})/)![1]!;
    const input = { password: 'a long enough secret', name: 'Invited Runner', role: 'runner', invitation };

    const elsewhere = await request(app)
      .post('/api/auth/register')
      .send({ ...input, email: 'someone-else@example.test' });
    expect(elsewhere.status).toBe(201);
    expect(elsewhere.body.confirmation).toBe('sent');
    expect(sessionCookieOf(elsewhere)).toBeUndefined();

    const { agent, csrf } = await browserAgent(app);
    const direct = await agent
      .post('/api/auth/register')
      .set(CSRF_HEADER, csrf)
      .send({ ...input, email: 'Invited@example.test' });
    expect(direct.status).toBe(201);
    expect(direct.body).toEqual({
      user: { id: expect.any(String), email: 'invited@example.test', name: 'Invited Runner', role: 'runner' },
      confirmation: 'not-needed',
    });
    expect(sessionCookieOf(direct)).toBeDefined();
    expect((await agent.get('/api/auth/me')).body.user.id).toBe(direct.body.user.id);
    await afterAnswerSettled();
    expect(await db('users').whereIn('email', ['invited@example.test', 'someone-else@example.test']).pluck('email')).toEqual([
      'invited@example.test',
    ]);
  });

  it('refuses a next page on another site (400), so the link can never send anyone away', async () => {
    for (const next of ['//evil.example/x', 'https://evil.example', '/\\evil.example']) {
      const res = await request(testApp())
        .post('/api/auth/register')
        .send({ email: 'x@example.test', password: 'a long enough secret', name: 'X', role: 'runner', next });
      expect(res.status).toBe(400);
      expect(res.body.details).toEqual([expect.objectContaining({ field: 'next' })]);
    }
  });

  it('when the role is admin or unknown, responds 400 with a field error', async () => {
    for (const role of ['admin', 'superuser', 42]) {
      const res = await request(testApp())
        .post('/api/auth/register')
        .send({ email: 'x@example.test', password: 'a long enough secret', name: 'X', role });
      expect(res.status).toBe(400);
      expect(res.body.details).toEqual([expect.objectContaining({ field: 'role' })]);
    }
    expect(await db('users').count({ n: '*' }).first()).toEqual({ n: '0' });
  });

  it('when fields are missing or wrong, responds 400 naming each field', async () => {
    const res = await request(testApp()).post('/api/auth/register').send({ email: 'not-an-email', password: 'short' });
    expect(res.status).toBe(400);
    const fields = (res.body.details as Array<{ field: string }>).map((d) => d.field).sort();
    expect(fields).toEqual(['email', 'name', 'password', 'role']);
    expect(res.body.error).toBe('Some fields need attention.');
  });
});

describe('POST /api/auth/login', () => {
  it('when the password is right, responds 200 with the user and a session cookie', async () => {
    const { user, password } = await createUser({ email: 'ok@example.test' });
    const res = await request(testApp()).post('/api/auth/login').send({ email: 'OK@example.test', password });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({ id: user.id, email: 'ok@example.test', name: user.name, role: 'runner' });
    expect(sessionCookieOf(res)).toBeDefined();
  });

  it('when the password is wrong or the e-mail unknown, responds 401 with the same message and no cookie', async () => {
    await createUser({ email: 'ok@example.test' });
    const app = testApp();
    const wrongPassword = await request(app)
      .post('/api/auth/login')
      .send({ email: 'ok@example.test', password: 'nope nope nope' });
    const unknownEmail = await request(app)
      .post('/api/auth/login')
      .send({ email: 'who@example.test', password: 'nope nope nope' });
    expect(wrongPassword.status).toBe(401);
    expect(unknownEmail.status).toBe(401);
    expect(wrongPassword.body.error).toBe(unknownEmail.body.error);
    expect(sessionCookieOf(wrongPassword)).toBeUndefined();
  });

  it('when too many attempts come from one address, responds 429 with a sentence', async () => {
    const app = testApp({ authRateLimit: { windowMs: 60_000, max: 3 } });
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await request(app).post('/api/auth/login').send({ email: 'a@example.test', password: 'whatever123' });
      statuses.push(res.status);
      if (res.status === 429) expect(res.body.error).toMatch(/Too many wrong passwords/);
    }
    expect(statuses).toEqual([401, 401, 401, 429, 429]);
  });
});

describe('session tokens', () => {
  it('when the session JWT is expired, responds 401 "session has ended" and clears the cookie', async () => {
    const { user } = await createUser();
    const config = testConfig();
    const expired = jwt.sign({ exp: Math.floor(Date.now() / 1000) - 60 }, config.jwtSecret, {
      subject: user.id,
      audience: 'pacewright-session',
    });
    const res = await request(testApp(config)).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${expired}`);
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('session-ended');
    expect(sessionCookieOf(res)).toMatch(/Expires=Thu, 01 Jan 1970/);
  });

  it('when the session JWT is signed with another secret, responds 401', async () => {
    const { user } = await createUser();
    const forged = jwt.sign({}, 'someone-elses-secret-0123456789abcdef', {
      subject: user.id,
      audience: 'pacewright-session',
      expiresIn: '1h',
    });
    const res = await request(testApp()).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${forged}`);
    expect(res.status).toBe(401);
  });

  it('when the token uses alg "none", responds 401', async () => {
    const { user } = await createUser();
    const unsigned = jwt.sign({ sub: user.id, aud: 'pacewright-session' }, '', { algorithm: 'none' });
    const res = await request(testApp()).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE}=${unsigned}`);
    expect(res.status).toBe(401);
  });

  it('after sign-out the session cookie is cleared', async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const browser = await signedInAgent(app, user.email, password);
    const out = await browser.agent.post('/api/auth/logout').set(CSRF_HEADER, browser.csrf);
    expect(out.status).toBe(204);
    expect((await browser.agent.get('/api/auth/me')).status).toBe(401);
  });
});

describe('CSRF (double-submit)', () => {
  it('when a cookie-authenticated write has no X-CSRF-Token, responds 403 and changes nothing', async () => {
    const { user, password } = await createUser({ name: 'Before' });
    const browser = await signedInAgent(testApp(), user.email, password);
    const res = await browser.agent.patch('/api/me').send({ name: 'After' });
    expect(res.status).toBe(403);
    expect(res.body.code).toBe('csrf-failed');
    const wrong = await browser.agent
      .patch('/api/me')
      .set(CSRF_HEADER, 'x' + browser.csrf.slice(1))
      .send({ name: 'After' });
    expect(wrong.status).toBe(403);
    expect((await db('users').where({ id: user.id }).first())!.name).toBe('Before');
    const right = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ name: 'After' });
    expect(right.status).toBe(200);
  });
});

describe('bearer tokens for scripts', () => {
  it('POST /api/auth/token gives a token that authenticates without cookie or CSRF; it is stored hashed and can be revoked', async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const issued = await request(app).post('/api/auth/token').send({ email: user.email, password });
    expect(issued.status).toBe(200);
    expect(issued.body).toEqual({
      token: expect.stringMatching(/^pw_/),
      expires_at: expect.any(String),
      id: expect.any(String),
      name: 'Script token',
    });
    expect(new Date(issued.body.expires_at).getTime()).toBeGreaterThan(Date.now());
    const stored = await db('api_tokens').where({ user_id: user.id }).first();
    expect(stored!.token_hash).not.toContain(issued.body.token);
    expect(stored!.token_hash).toMatch(/^[0-9a-f]{64}$/);

    const auth = { Authorization: `Bearer ${issued.body.token}` };
    const write = await request(app).patch('/api/me').set(auth).send({ unit: 'km' });
    expect(write.status).toBe(200);
    expect(write.body.profile.unit).toBe('km');

    const list = await request(app).get('/api/auth/tokens').set(auth);
    expect(list.body.tokens).toHaveLength(1);
    expect(list.body.tokens[0].last_used_at).not.toBeNull();
    expect(JSON.stringify(list.body)).not.toContain(issued.body.token);

    expect((await request(app).delete(`/api/auth/tokens/${issued.body.id}`).set(auth)).status).toBe(204);
    const after = await request(app).get('/api/auth/me').set(auth);
    expect(after.status).toBe(401);
    expect(after.body.code).toBe('invalid-token');
  });

  it('a token cannot be revoked by another user (404)', async () => {
    const a = await createUser();
    const b = await createUser();
    const app = testApp();
    const tokenA = (await request(app).post('/api/auth/token').send({ email: a.user.email, password: a.password })).body;
    const tokenB = (await request(app).post('/api/auth/token').send({ email: b.user.email, password: b.password })).body;
    const res = await request(app).delete(`/api/auth/tokens/${tokenA.id}`).set('Authorization', `Bearer ${tokenB.token}`);
    expect(res.status).toBe(404);
    expect(await db('api_tokens').where({ id: tokenA.id }).first()).toBeDefined();
  });

  it('an unknown or malformed bearer token gets 401', async () => {
    for (const header of ['Bearer pw_nonsense', 'Bearer', 'Basic abc']) {
      const res = await request(testApp()).get('/api/auth/me').set('Authorization', header);
      expect(res.status).toBe(401);
    }
  });
});
