import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { GOAL_RACE_IN_THE_PAST, RACE_RESULT_IN_THE_FUTURE } from '../../shared/goals/tense.ts';
import { localDateTime } from '../../shared/runs/local-time.ts';
import { createUser } from '../support/factories.ts';
import { testApp } from '../support/test-app.ts';

async function bearerFor(app: ReturnType<typeof testApp>, role: 'runner' | 'coach' = 'runner') {
  const { user, password } = await createUser({ role });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, auth: { Authorization: `Bearer ${token}` } };
}

const GOAL = { name: 'Lakeside Marathon', date: '2027-04-18', distance_m: 42195, goal_time_s: 3 * 3600 + 5 * 60 };

describe('PUT /api/me/goal-race', () => {
  it('sets, replaces, reads and clears the goal race', async () => {
    const app = testApp();
    const { auth } = await bearerFor(app);
    expect((await request(app).get('/api/me/goal-race').set(auth)).body).toEqual({ goal_race: null });
    const set = await request(app).put('/api/me/goal-race').set(auth).send(GOAL);
    expect(set.status).toBe(200);
    expect(set.body.goal_race).toMatchObject(GOAL);
    await request(app)
      .put('/api/me/goal-race')
      .set(auth)
      .send({ ...GOAL, goal_time_s: 3 * 3600 });
    expect((await request(app).get('/api/me/goal-race').set(auth)).body.goal_race.goal_time_s).toBe(10800);
    expect(await db('goal_races').count({ n: '*' }).first()).toEqual({ n: '1' });
    expect((await request(app).delete('/api/me/goal-race').set(auth)).status).toBe(204);
    expect((await request(app).delete('/api/me/goal-race').set(auth)).status).toBe(404);
  });

  it.each([
    [{ ...GOAL, date: '10000-01-01' }, 'date'],
    [{ ...GOAL, date: '2027-02-30' }, 'date'],
    [{ ...GOAL, distance_m: 0 }, 'distance_m'],
    [{ ...GOAL, goal_time_s: 600 }, 'goal_time_s'], // a marathon in 10 minutes
    [{ ...GOAL, name: '' }, 'name'],
  ])('refuses %j (400 on %s) and changes nothing', async (body, field) => {
    const app = testApp();
    const { auth } = await bearerFor(app);
    const res = await request(app).put('/api/me/goal-race').set(auth).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(await db('goal_races').count({ n: '*' }).first()).toEqual({ n: '0' });
  });
});

describe('race results', () => {
  it('adds, lists newest first and deletes; another runner cannot read or delete them', async () => {
    const app = testApp();
    const { auth, user } = await bearerFor(app);
    await request(app).post('/api/me/race-results').set(auth).send({ date: '2026-05-01', distance_m: 10000, time_s: 2400 });
    const added = await request(app)
      .post('/api/me/race-results')
      .set(auth)
      .send({ name: 'Harbor 5K', date: '2026-09-12', distance_m: 5000, time_s: 1170 });
    expect(added.status).toBe(201);
    const list = await request(app).get('/api/me/race-results').set(auth);
    expect(list.body.results.map((r: { date: string }) => r.date)).toEqual(['2026-09-12', '2026-05-01']);

    const other = await bearerFor(app);
    expect((await request(app).get(`/api/me/race-results?runner_id=${user.id}`).set(other.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/me/race-results/${added.body.result.id}`).set(other.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/me/race-results/${added.body.result.id}`).set(auth)).status).toBe(204);
    expect(await db('race_results').count({ n: '*' }).first()).toEqual({ n: '1' });
  });
});

describe('dates in the right tense (issue 17)', () => {
  // Today is read in the runner's profile time zone. Pacific/Kiritimati is UTC+14 all year (IANA tzdata),
  // so its date is ahead of UTC's for ten hours of every day and never behind it.
  const ZONE = 'Pacific/Kiritimati';
  const dayOf = (offsetDays: number) => localDateTime(Date.now() + offsetDays * 86_400_000, ZONE).date;

  it('refuses a goal race already past in the runner’s time zone, in words, and takes today', async () => {
    const app = testApp();
    const { auth, user } = await bearerFor(app);
    await db('users').where({ id: user.id }).update({ time_zone: ZONE });
    for (const date of ['2020-06-14', dayOf(-1)]) {
      const res = await request(app)
        .put('/api/me/goal-race')
        .set(auth)
        .send({ ...GOAL, date });
      expect([date, res.status]).toEqual([date, 400]);
      expect(res.body.details).toEqual([{ field: 'date', message: GOAL_RACE_IN_THE_PAST }]);
    }
    expect(await db('goal_races').count({ n: '*' }).first()).toEqual({ n: '0' });
    const today = await request(app)
      .put('/api/me/goal-race')
      .set(auth)
      .send({ ...GOAL, date: dayOf(0) });
    expect(today.status).toBe(200);
  });

  it('refuses a race result still to come in the runner’s time zone, in words, and takes today', async () => {
    const app = testApp();
    const { auth, user } = await bearerFor(app);
    await db('users').where({ id: user.id }).update({ time_zone: ZONE });
    for (const date of ['2030-06-14', dayOf(1)]) {
      const res = await request(app).post('/api/me/race-results').set(auth).send({ date, distance_m: 10000, time_s: 2400 });
      expect([date, res.status]).toEqual([date, 400]);
      expect(res.body.details).toEqual([{ field: 'date', message: RACE_RESULT_IN_THE_FUTURE }]);
    }
    expect(await db('race_results').count({ n: '*' }).first()).toEqual({ n: '0' });
    const today = await request(app)
      .post('/api/me/race-results')
      .set(auth)
      .send({ date: dayOf(0), distance_m: 10000, time_s: 2400 });
    expect(today.status).toBe(201);
  });
});
