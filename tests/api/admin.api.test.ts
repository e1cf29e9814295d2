import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { CSRF_HEADER } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { signedInAgent, testApp } from '../support/test-app.ts';

describe('admin routes and roles', () => {
  it.each([
    ['runner', 403],
    ['coach', 403],
    ['admin', 200],
  ] as const)('GET /api/admin/users as a %s responds %i', async (role, status) => {
    const { user, password } = await createUser({ role });
    const browser = await signedInAgent(testApp(), user.email, password);
    const res = await browser.agent.get('/api/admin/users');
    expect(res.status).toBe(status);
    if (status === 200) expect(res.body.users.map((u: { email: string }) => u.email)).toEqual([user.email]);
    else expect(res.body.code).toBe('forbidden');
  });

  it('GET /api/admin/users signed out responds 401', async () => {
    expect((await request(testApp()).get('/api/admin/users')).status).toBe(401);
  });

  it('an admin changes a runner to coach; the change applies to the next request', async () => {
    const admin = await createUser({ role: 'admin' });
    const runner = await createUser({ role: 'runner' });
    const app = testApp();
    const adminBrowser = await signedInAgent(app, admin.user.email, admin.password);
    const runnerBrowser = await signedInAgent(app, runner.user.email, runner.password);
    const res = await adminBrowser.agent
      .patch(`/api/admin/users/${runner.user.id}`)
      .set(CSRF_HEADER, adminBrowser.csrf)
      .send({ role: 'coach' });
    expect(res.status).toBe(200);
    expect(res.body.user.role).toBe('coach');
    expect((await runnerBrowser.agent.get('/api/auth/me')).body.user.role).toBe('coach');
  });

  it('an unknown role responds 400 and changes nothing', async () => {
    const admin = await createUser({ role: 'admin' });
    const runner = await createUser({ role: 'runner' });
    const browser = await signedInAgent(testApp(), admin.user.email, admin.password);
    const res = await browser.agent
      .patch(`/api/admin/users/${runner.user.id}`)
      .set(CSRF_HEADER, browser.csrf)
      .send({ role: 'owner' });
    expect(res.status).toBe(400);
    expect(res.body.details[0].field).toBe('role');
    expect((await db('users').where({ id: runner.user.id }).first())!.role).toBe('runner');
  });

  it('a runner cannot make themself admin (403, nothing changes)', async () => {
    const runner = await createUser({ role: 'runner' });
    const browser = await signedInAgent(testApp(), runner.user.email, runner.password);
    const res = await browser.agent
      .patch(`/api/admin/users/${runner.user.id}`)
      .set(CSRF_HEADER, browser.csrf)
      .send({ role: 'admin' });
    expect(res.status).toBe(403);
    const selfPromote = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ role: 'admin' });
    expect(selfPromote.status).toBe(400);
    expect((await db('users').where({ id: runner.user.id }).first())!.role).toBe('runner');
  });

  it('an unknown or malformed user id responds 404', async () => {
    const admin = await createUser({ role: 'admin' });
    const browser = await signedInAgent(testApp(), admin.user.email, admin.password);
    for (const id of ['00000000-0000-4000-8000-000000000000', 'not-an-id', "1' or '1'='1"]) {
      const res = await browser.agent
        .patch(`/api/admin/users/${encodeURIComponent(id)}`)
        .set(CSRF_HEADER, browser.csrf)
        .send({ role: 'coach' });
      expect(res.status).toBe(404);
    }
  });
});

describe('GET /api/me and PATCH /api/me', () => {
  it('saves every profile field and returns it', async () => {
    const { user, password } = await createUser();
    const browser = await signedInAgent(testApp(), user.email, password);
    const changes = {
      name: 'Renamed',
      unit: 'km',
      birth_year: 1990,
      resting_hr: 50,
      max_hr: 185,
      weight_kg: 61.5,
      time_zone: 'Europe/Berlin',
    };
    const res = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send(changes);
    expect(res.status).toBe(200);
    expect(res.body.profile).toMatchObject(changes);
    expect((await browser.agent.get('/api/me')).body.profile).toMatchObject(changes);
  });

  it('rejects an unknown time zone and a resting heart rate above the stored maximum, changing nothing', async () => {
    const { user, password } = await createUser();
    const browser = await signedInAgent(testApp(), user.email, password);
    await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ max_hr: 180 });
    const tz = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ time_zone: 'Mars/Olympus_Mons' });
    expect(tz.status).toBe(400);
    expect(tz.body.details[0].field).toBe('time_zone');
    const hr = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ resting_hr: 110, max_hr: 105 });
    expect(hr.status).toBe(400);
    const hrAgainstStored = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ max_hr: 100 });
    expect(hrAgainstStored.status).toBe(200);
    const resting = await browser.agent.patch('/api/me').set(CSRF_HEADER, browser.csrf).send({ resting_hr: 100 });
    expect(resting.status).toBe(400);
    expect(resting.body.error).toMatch(/below maximum/);
    const row = await db('users').where({ id: user.id }).first();
    expect(row).toMatchObject({ time_zone: 'UTC', resting_hr: null, max_hr: 100 });
  });
});
