import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { afterAnswerSettled } from '../../server/lib/after-answer.ts';
import { db } from '../../server/lib/db.ts';
import { CSRF_HEADER, MAX_API_TOKENS_PER_USER, SESSION_COOKIE } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { recordedMail, signedInAgent, testApp, type BrowserAgent } from '../support/test-app.ts';

/**
 * Issue 13 #3, #6, #10, #12 and issue 17's sign-in limit. Each test measures the status the old code
 * got wrong: a captured session cookie kept answering 200 after sign-out and reset, an older reset
 * link kept working, DELETE /api/me took 100 wrong passwords without a 429, good sign-ins used up
 * the address's limit, and a bearer token could mint more tokens without end.
 */

/** The raw session cookie a browser holds, as an attacker who copied it would replay it. */
async function capturedCookie(browser: BrowserAgent): Promise<string> {
  const res = await browser.agent.get('/api/auth/me');
  expect(res.status).toBe(200);
  const jar = (browser.agent as unknown as { jar: { getCookie(name: string, access: object): { value: string } | undefined } })
    .jar;
  const cookie = jar.getCookie(SESSION_COOKIE, { domain: '127.0.0.1', path: '/', secure: false, script: false });
  expect(cookie?.value).toBeTruthy();
  return `${SESSION_COOKIE}=${cookie!.value}`;
}

const replay = (app: ReturnType<typeof testApp>, cookie: string) => request(app).get('/api/auth/me').set('Cookie', cookie);

const resetTokensMailedTo = (to: string) =>
  recordedMail.filter((m) => m.to === to).map((m) => /\/reset-password\/(rst_[A-Za-z0-9_-]{43})/.exec(m.text)![1]!);

describe('ending sessions (issue 13 #3)', () => {
  it('a cookie captured before sign-out gets 401 session-ended afterwards; the other session of the same user stays', async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const phone = await signedInAgent(app, user.email, password);
    const laptop = await signedInAgent(app, user.email, password);
    const stolen = await capturedCookie(phone);
    expect((await replay(app, stolen)).status).toBe(200);

    expect((await phone.agent.post('/api/auth/logout').set(CSRF_HEADER, phone.csrf)).status).toBe(204);
    const after = await replay(app, stolen);
    expect(after.status).toBe(401);
    expect(after.body.code).toBe('session-ended');
    expect((await laptop.agent.get('/api/auth/me')).status).toBe(200);
    expect(await db('sessions').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({ n: '1' });
  });

  it('a cookie captured before a password reset gets 401; so does every session, and every older reset link is dead (#10)', async () => {
    const { user, password } = await createUser({ email: 'reset-me@example.test' });
    const app = testApp({ publicUrl: 'http://pacewright.test' });
    const browser = await signedInAgent(app, user.email, password);
    const stolen = await capturedCookie(browser);

    recordedMail.length = 0;
    expect((await request(app).post('/api/auth/password-reset').send({ email: user.email })).status).toBe(202);
    expect((await request(app).post('/api/auth/password-reset').send({ email: user.email })).status).toBe(202);
    await afterAnswerSettled();
    expect(resetTokensMailedTo(user.email)).toHaveLength(2);
    const [older, newer] = resetTokensMailedTo(user.email) as [string, string];

    expect(
      (await request(app).post(`/api/auth/password-reset/${newer}`).send({ password: 'chosen after the reset' })).status,
    ).toBe(204);
    expect((await replay(app, stolen)).status).toBe(401);
    expect((await browser.agent.get('/api/auth/me')).status).toBe(401);

    const late = await request(app).post(`/api/auth/password-reset/${older}`).send({ password: 'an attacker would pick' });
    expect(late.status).toBe(410);
    expect(
      (await request(app).post('/api/auth/login').send({ email: user.email, password: 'chosen after the reset' })).status,
    ).toBe(200);
  });

  it('"sign out everywhere" ends every session of the user (401 for each captured cookie), not other users', async () => {
    const { user, password } = await createUser();
    const other = await createUser();
    const app = testApp();
    const phone = await signedInAgent(app, user.email, password);
    const laptop = await signedInAgent(app, user.email, password);
    const neighbour = await signedInAgent(app, other.user.email, other.password);
    const stolen = await capturedCookie(laptop);

    const res = await phone.agent.post('/api/auth/sign-out-everywhere').set(CSRF_HEADER, phone.csrf);
    expect(res.status).toBe(204);
    expect((await replay(app, stolen)).status).toBe(401);
    expect((await phone.agent.get('/api/auth/me')).status).toBe(401);
    expect((await laptop.agent.get('/api/auth/me')).status).toBe(401);
    expect((await neighbour.agent.get('/api/auth/me')).status).toBe(200);
  });

  it('a password change ends every other session and every API token; the session that changed it stays signed in', async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const here = await signedInAgent(app, user.email, password);
    const elsewhere = await signedInAgent(app, user.email, password);
    const stolen = await capturedCookie(elsewhere);
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;

    const wrong = await here.agent
      .post('/api/me/password')
      .set(CSRF_HEADER, here.csrf)
      .send({ current_password: 'not my password at all', new_password: 'a fresh long secret' });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error).toMatch(/not your current password/);

    const changed = await here.agent
      .post('/api/me/password')
      .set(CSRF_HEADER, here.csrf)
      .send({ current_password: password, new_password: 'a fresh long secret' });
    expect(changed.status).toBe(204);
    expect((await here.agent.get('/api/auth/me')).status).toBe(200);
    expect((await replay(app, stolen)).status).toBe(401);
    expect((await request(app).get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(401);
    expect((await request(app).post('/api/auth/login').send({ email: user.email, password })).status).toBe(401);
    expect((await request(app).post('/api/auth/login').send({ email: user.email, password: 'a fresh long secret' })).status).toBe(
      200,
    );
  });

  it('a password change with a bearer token is refused 403 (it needs the website session)', async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const res = await request(app)
      .post('/api/me/password')
      .set('Authorization', `Bearer ${token}`)
      .send({ current_password: password, new_password: 'a fresh long secret' });
    expect(res.status).toBe(403);
    expect(res.body.code).toBe('cookie-session-required');
  });

  it(`keeps at most 50 live sessions per account: the 51st sign-in ends the oldest`, async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const first = await signedInAgent(app, user.email, password);
    const stolen = await capturedCookie(first);
    for (let i = 0; i < 50; i++) await request(app).post('/api/auth/login').send({ email: user.email, password });
    expect(await db('sessions').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({ n: '50' });
    expect((await replay(app, stolen)).status).toBe(401);
  });
});

describe('the credential limiter (issue 13 #6, issue 17)', () => {
  const realLimits = { authRateLimit: { windowMs: 15 * 60_000, max: 20 }, credentialFailuresPerAccount: 20 };

  it('50 successful sign-ins from one address all pass; then 20 wrong passwords get 401 and the 21st gets 429', async () => {
    const { user, password } = await createUser();
    const app = testApp(realLimits);
    for (let i = 0; i < 50; i++) {
      const res = await request(app).post('/api/auth/login').send({ email: user.email, password });
      expect(res.status).toBe(200);
    }
    const statuses: number[] = [];
    for (let i = 0; i < 21; i++) {
      const res = await request(app)
        .post('/api/auth/login')
        .send({ email: `guess-${i}@example.test`, password: 'wrong wrong wrong' });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([...Array<number>(20).fill(401), 429]);
    // Limited means limited: even the right password waits now.
    const blocked = await request(app).post('/api/auth/login').send({ email: user.email, password });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toMatch(/Too many wrong passwords.*wait 15 minutes/);
  });

  it('DELETE /api/me: 20 wrong passwords get 401, the 21st 429, the account stays', async () => {
    const { user, password } = await createUser();
    const app = testApp(realLimits);
    const browser = await signedInAgent(app, user.email, password);
    const statuses: number[] = [];
    for (let i = 0; i < 21; i++) {
      const res = await browser.agent
        .delete('/api/me')
        .set(CSRF_HEADER, browser.csrf)
        .send({ password: `guess number ${i}` });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([...Array<number>(20).fill(401), 429]);
    expect(await db('users').where({ id: user.id }).first()).toBeDefined();
  });

  it('guesses sent all at once cannot slip past the limit: of 40 at once, at most 20 reach a password check', async () => {
    const { user, password } = await createUser();
    const app = testApp(realLimits);
    const browser = await signedInAgent(app, user.email, password);
    const answers = await Promise.all(
      Array.from({ length: 40 }, (_, i) =>
        browser.agent
          .delete('/api/me')
          .set(CSRF_HEADER, browser.csrf)
          .send({ password: `parallel guess ${i}` }),
      ),
    );
    const wrong = answers.filter((r) => r.status === 401).length;
    const limited = answers.filter((r) => r.status === 429).length;
    expect(wrong).toBeLessThanOrEqual(20);
    expect(wrong + limited).toBe(40);
  });

  it('per account: 20 wrong passwords from 20 addresses, then the 21st from a fresh address gets 429', async () => {
    const { user } = await createUser();
    const previous = process.env.TRUST_PROXY;
    process.env.TRUST_PROXY = 'loopback';
    try {
      const app = testApp(realLimits);
      const statuses: number[] = [];
      for (let i = 0; i < 21; i++) {
        const res = await request(app)
          .post('/api/auth/token')
          .set('X-Forwarded-For', `203.0.113.${i + 1}`)
          .send({ email: user.email, password: 'not the password' });
        statuses.push(res.status);
      }
      expect(statuses).toEqual([...Array<number>(20).fill(401), 429]);
    } finally {
      if (previous === undefined) delete process.env.TRUST_PROXY;
      else process.env.TRUST_PROXY = previous;
    }
  });

  it('a wrong current password on the password change counts too', async () => {
    const { user, password } = await createUser();
    const app = testApp({ ...realLimits, credentialFailuresPerAccount: 2 });
    const browser = await signedInAgent(app, user.email, password);
    const statuses: number[] = [];
    for (let i = 0; i < 3; i++) {
      const res = await browser.agent
        .post('/api/me/password')
        .set(CSRF_HEADER, browser.csrf)
        .send({ current_password: `guess ${i}`, new_password: 'a fresh long secret' });
      statuses.push(res.status);
    }
    expect(statuses).toEqual([401, 401, 429]);
  });
});

describe('API tokens (issue 13 #12)', () => {
  it('a bearer token cannot mint another token (403); the website session can', async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const minted = await request(app).post('/api/auth/tokens').set('Authorization', `Bearer ${token}`).send({ name: 'Copy' });
    expect(minted.status).toBe(403);
    expect(minted.body.code).toBe('cookie-session-required');
    expect(await db('api_tokens').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({ n: '1' });

    const browser = await signedInAgent(app, user.email, password);
    const named = await browser.agent.post('/api/auth/tokens').set(CSRF_HEADER, browser.csrf).send({ name: 'Nightly' });
    expect(named.status).toBe(201);
  });

  it(`an account holds at most ${MAX_API_TOKENS_PER_USER} live tokens: the next one gets 409 with a sentence`, async () => {
    const { user, password } = await createUser();
    const app = testApp();
    const browser = await signedInAgent(app, user.email, password);
    for (let i = 0; i < MAX_API_TOKENS_PER_USER; i++) {
      const res = await browser.agent
        .post('/api/auth/tokens')
        .set(CSRF_HEADER, browser.csrf)
        .send({ name: `Script ${i}` });
      expect(res.status).toBe(201);
    }
    const over = await browser.agent.post('/api/auth/tokens').set(CSRF_HEADER, browser.csrf).send({ name: 'One more' });
    expect(over.status).toBe(409);
    expect(over.body.error).toMatch(/Revoke one/);
    const byPassword = await request(app).post('/api/auth/token').send({ email: user.email, password });
    expect(byPassword.status).toBe(409);
    expect(await db('api_tokens').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({
      n: String(MAX_API_TOKENS_PER_USER),
    });
  });
});
