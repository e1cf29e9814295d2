import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

type App = ReturnType<typeof createApp>;

function freshApp(): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

async function person(app: App, role: 'runner' | 'coach' | 'admin' = 'runner') {
  const { user, password } = await createUser({ role });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, auth: { Authorization: `Bearer ${token}` } };
}

async function squadOf(coachId: string, runnerId: string) {
  const [squad] = await db('squads').insert({ coach_id: coachId, name: 'Test squad' }).returning('id');
  await db('squad_members').insert({ squad_id: squad!.id, runner_id: runnerId });
}

const planCount = async () => Number((await db('session_plans').count({ n: '*' }).first())!.n);

describe('POST /api/plans/parse', () => {
  it.each([
    ['2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down', 3, 14],
    ['10 mi easy, 8 mi @ 7:05/mi, 2 mi @ 6:55/mi, 1 mi cool-down', 4, 4],
    ['45 min easy', 1, 1],
  ])('parses "%s"', async (text, items, expanded) => {
    const app = freshApp();
    const { auth } = await person(app);
    const res = await request(app).post('/api/plans/parse').set(auth).send({ text });
    expect(res.status).toBe(200);
    expect(res.body.parts).toHaveLength(items);
    expect(res.body.expanded).toHaveLength(expanded);
    expect(res.body.text).toBe(text);
  });

  it('points at the mistake: 400 with details {position, expected}', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const res = await request(app).post('/api/plans/parse').set(auth).send({ text: '8 mi @ 7:65/mi' });
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/\S/);
    expect(res.body.details).toEqual({ position: expect.any(Number), expected: expect.any(String) });
    expect(res.body.details.position).toBeGreaterThanOrEqual(7);
  });
});

describe('POST /api/plans and friends', () => {
  it('a runner writes, lists, moves, rewrites and deletes their plan', async () => {
    const app = freshApp();
    const { auth, user } = await person(app);
    const created = await request(app)
      .post('/api/plans')
      .set(auth)
      .send({ date: '2026-10-03', title: 'Long run', text: '10 mi easy, 8 mi @ 7:05/mi' });
    expect(created.status).toBe(201);
    const plan = created.body.plan;
    expect(plan).toMatchObject({ date: '2026-10-03', title: 'Long run', runner_id: user.id, text: '10 mi easy, 8 mi @ 7:05/mi' });
    // 7:05/mi stored per km: 425 s / 1.609344 = 264.08 s/km (api-contract.md: paces in seconds per km).
    expect(plan.parts[1].target.fast_s_per_km).toBeCloseTo(264.08, 2);

    const list = await request(app).get('/api/plans?from=2026-10-01&to=2026-10-07').set(auth);
    expect(list.body.plans.map((p: { id: string }) => p.id)).toEqual([plan.id]);
    expect((await request(app).get('/api/plans?from=2026-10-04').set(auth)).body.plans).toEqual([]);

    const moved = await request(app).patch(`/api/plans/${plan.id}`).set(auth).send({ date: '2026-10-04', text: '45 min easy' });
    expect(moved.body.plan).toMatchObject({ date: '2026-10-04', text: '45 min easy', title: 'Long run' });
    expect((await request(app).get(`/api/plans/${plan.id}`).set(auth)).body.plan.date).toBe('2026-10-04');
    expect((await request(app).delete(`/api/plans/${plan.id}`).set(auth)).status).toBe(204);
    expect(await planCount()).toBe(0);
  });

  it('parts can be sent instead of text, and come back as canonical text', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const parts = (await request(app).post('/api/plans/parse').set(auth).send({ text: '3 x 1 km @ 3:50/km w/ 2 min jog' })).body
      .parts;
    const res = await request(app).post('/api/plans').set(auth).send({ date: '2026-10-05', parts });
    expect(res.status).toBe(201);
    expect(res.body.plan.text).toBe('3 x 1 km @ 3:50/km w/ 2 min jog');
  });

  it('a coach writes plans for a squad runner; not for a runner outside their squads; an admin reads but does not write', async () => {
    const app = freshApp();
    const runner = await person(app);
    const coach = await person(app, 'coach');
    const otherCoach = await person(app, 'coach');
    const admin = await person(app, 'admin');
    await squadOf(coach.user.id, runner.user.id);
    const body = { date: '2026-10-06', text: '6 x 800 m @ 2:55-3:00 w/ 400 m jog', runner_id: runner.user.id };
    const byCoach = await request(app).post('/api/plans').set(coach.auth).send(body);
    expect(byCoach.status).toBe(201);
    expect(byCoach.body.plan.author_id).toBe(coach.user.id);
    expect((await request(app).post('/api/plans').set(otherCoach.auth).send(body)).status).toBe(404);
    expect((await request(app).post('/api/plans').set(admin.auth).send(body)).status).toBe(403);
    expect((await request(app).get(`/api/plans/${byCoach.body.plan.id}`).set(admin.auth)).status).toBe(200);
    expect((await request(app).get(`/api/plans/${byCoach.body.plan.id}`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).get(`/api/plans?runner_id=${runner.user.id}`).set(runner.auth)).body.plans).toHaveLength(1);
    expect(await planCount()).toBe(1);
  });

  it('copies a week onto another, weekday for weekday', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    await request(app).post('/api/plans').set(auth).send({ date: '2026-09-28', text: '5 mi easy' });
    await request(app).post('/api/plans').set(auth).send({ date: '2026-10-03', text: '18 mi easy' });
    await request(app).post('/api/plans').set(auth).send({ date: '2026-10-05', text: '3 mi easy' }); // next week: not copied
    const res = await request(app)
      .post('/api/plans/copy-week')
      .set(auth)
      .send({ from_start: '2026-09-28', to_start: '2026-10-12' });
    expect(res.status).toBe(201);
    expect(res.body.plans.map((p: { date: string; text: string }) => [p.date, p.text])).toEqual([
      ['2026-10-12', '5 mi easy'],
      ['2026-10-17', '18 mi easy'],
    ]);
  });

  it.each([
    [{ date: '2026-10-03', text: '8 mi @ 0:00/mi' }, 'a pace of 0:00'],
    [{ date: '2026-10-03', text: `99 x (${Array(99).fill('400 m').join(', ')})` }, '99 repeats of 99 parts'],
    [{ date: '10000-01-01', text: '5 mi easy' }, 'a plan in year 10000'],
    [{ date: '2026-10-03', text: '5 mi easy', parts: [] }, 'both text and parts'],
    [{ date: '2026-10-03' }, 'no session'],
  ] as Array<[Record<string, unknown>, string]>)('refuses %j (%s) with 400 and stores nothing', async (body) => {
    const app = freshApp();
    const { auth } = await person(app);
    const res = await request(app).post('/api/plans').set(auth).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/\S/);
    expect(await planCount()).toBe(0);
  });

  it("another user's plan id answers 404 to read, change and delete, and nothing changes", async () => {
    const app = freshApp();
    const owner = await person(app);
    const other = await person(app);
    const plan = (await request(app).post('/api/plans').set(owner.auth).send({ date: '2026-10-03', text: '5 mi easy' })).body
      .plan;
    expect((await request(app).get(`/api/plans/${plan.id}`).set(other.auth)).status).toBe(404);
    expect((await request(app).patch(`/api/plans/${plan.id}`).set(other.auth).send({ text: '1 mi easy' })).status).toBe(404);
    expect((await request(app).delete(`/api/plans/${plan.id}`).set(other.auth)).status).toBe(404);
    expect((await request(app).get(`/api/plans/${plan.id}`).set(owner.auth)).body.plan.text).toBe('5 mi easy');
  });
});

describe('GET /api/runs/:id/plan-check', () => {
  // A generated workout on 3 Oct 2026 (UTC: the test runner's time zone): 2 km warm-up,
  // 6 × 800 m at 2:57.5 (the middle of 2:55–3:00) with 400 m jogs, 2 km cool-down.
  function workoutGpx(repSpeeds: number[]): Buffer {
    const stretches: Array<[number, number]> = [[2000, 3.0]];
    for (const speed of repSpeeds) stretches.push([800, speed], [400, 2.2]);
    stretches.push([2000, 2.9]);
    const phases: Phase[] = stretches.map(([m, v]) => ({ kind: 'run', duration_s: m / v, speed_mps: v }));
    const run = generateLakeRun({ start_t: Date.UTC(2026, 9, 3, 7), phases, seed: 4, gps_sigma_m: 1 });
    return Buffer.from(writeGpx('Track session', [run.points]));
  }
  const REP = 800 / 177.5;

  async function upload(app: App, auth: Record<string, string>, file: Buffer) {
    return (await request(app).post('/api/runs').set(auth).attach('files', file, 'workout.gpx')).body.imported[0].id as string;
  }

  it('links the run to the same-day plan and gives a verdict per expanded part', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const plan = (
      await request(app)
        .post('/api/plans')
        .set(auth)
        .send({ date: '2026-10-03', text: '2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down' })
    ).body.plan;
    const runId = await upload(app, auth, workoutGpx([REP, REP, REP, 2.2, REP, 4.95]));
    const res = await request(app).get(`/api/runs/${runId}/plan-check`).set(auth);
    expect(res.status).toBe(200);
    expect(res.body.plan_id).toBe(plan.id);
    expect(res.body.session_verdict).toBe('partly');
    // 14 unrolled, less the recovery after rep 6 that the plan did not write (issue #14).
    expect(res.body.parts).toHaveLength(13);
    const reps = res.body.parts.filter((p: { kind: string }) => p.kind === 'rep');
    expect(reps.map((r: { verdict: string }) => r.verdict)).toEqual([
      'on pace',
      'on pace',
      'on pace',
      'missed',
      'on pace',
      'quick',
    ]);
    expect(reps[0].planned).toEqual({ distance_m: 800, pace_fast_s_per_km: 218.75, pace_slow_s_per_km: 225 });
    expect(reps[0].actual.pace_s_per_km).toBeCloseTo(221.9, -1);

    const csv = await request(app).get(`/api/runs/${runId}/plan-check.csv`).set(auth);
    expect(csv.text.split('\r\n')[0]).toMatch(/^part,kind,planned_distance_m/);
    expect(csv.text.trim().split('\r\n')).toHaveLength(14);
  }, 30_000);

  it('a run with no plan that day is unplanned; the runner can link it to a plan and unlink it', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const runId = await upload(app, auth, workoutGpx([REP, REP, REP, REP, REP, REP]));
    expect((await request(app).get(`/api/runs/${runId}/plan-check`).set(auth)).body).toMatchObject({
      plan_id: null,
      session_verdict: 'unplanned',
      parts: [],
    });
    const plan = (
      await request(app)
        .post('/api/plans')
        .set(auth)
        .send({ date: '2026-10-02', text: '2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down' })
    ).body.plan;
    expect((await request(app).put(`/api/runs/${runId}/plan`).set(auth).send({ plan_id: plan.id })).status).toBe(204);
    const linked = (await request(app).get(`/api/runs/${runId}/plan-check`).set(auth)).body;
    expect(linked).toMatchObject({ plan_id: plan.id, linked: 'chosen', session_verdict: 'as planned' });
    await request(app).put(`/api/runs/${runId}/plan`).set(auth).send({ plan_id: null });
    expect((await request(app).get(`/api/runs/${runId}/plan-check`).set(auth)).body.session_verdict).toBe('unplanned');

    const other = await person(app);
    const foreignPlan = (await request(app).post('/api/plans').set(other.auth).send({ date: '2026-10-03', text: '5 mi easy' }))
      .body.plan;
    expect((await request(app).put(`/api/runs/${runId}/plan`).set(auth).send({ plan_id: foreignPlan.id })).status).toBe(404);
    expect((await request(app).get(`/api/runs/${runId}/plan-check`).set(other.auth)).status).toBe(404);
  }, 30_000);

  it('the runner or their coach sets the pace tolerance; a wider tolerance turns a slightly quick rep on pace', async () => {
    const app = freshApp();
    const runner = await person(app);
    const coach = await person(app, 'coach');
    await squadOf(coach.user.id, runner.user.id);
    await request(app)
      .post('/api/plans')
      .set(runner.auth)
      .send({ date: '2026-10-03', text: '2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down' });
    // 800 m in 2:49 = 211.25 s/km: 3.4 % quicker than 218.75.
    const runId = await upload(app, runner.auth, workoutGpx([REP, 800 / 169, REP, REP, REP, REP]));
    const before = (await request(app).get(`/api/runs/${runId}/plan-check`).set(runner.auth)).body;
    expect(before.parts[3].verdict).toBe('quick');
    expect(
      (await request(app).put(`/api/runners/${runner.user.id}/pace-tolerance`).set(coach.auth).send({ pace_tolerance: 0.05 }))
        .status,
    ).toBe(200);
    const after = (await request(app).get(`/api/runs/${runId}/plan-check`).set(runner.auth)).body;
    expect(after.tolerance).toBe(0.05);
    expect(after.parts[3].verdict).toBe('on pace');
    expect(
      (await request(app).put(`/api/runners/${runner.user.id}/pace-tolerance`).set(runner.auth).send({ pace_tolerance: 0.5 }))
        .status,
    ).toBe(400);
  }, 30_000);
});
