import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

// Plan-check results are stored per run and reused while their inputs stay the same (DEVELOPERS.md,
// "Decision records"). Each test reads a verdict, changes one input, and reads it again.

type App = ReturnType<typeof createApp>;
type Auth = Record<string, string>;

const RUN_DATE = '2026-11-24'; // a Tuesday; the week starts on Monday 23 November

function freshApp(): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-check-results-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

async function runnerWithRun(app: App) {
  const { user, password } = await createUser({ role: 'runner', name: 'Wren Walker' });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  const auth = { Authorization: `Bearer ${token}` };
  // 5 km steady at 3 m/s: about 5:33 per km (333 s/km).
  const { points } = generateLakeRun({
    start_t: Date.parse(`${RUN_DATE}T06:00:00Z`),
    phases: [{ kind: 'run', duration_s: 5000 / 3, speed_mps: 3 }],
    seed: 5,
    sample_s: 5,
  });
  const upload = await request(app)
    .post('/api/runs')
    .set(auth)
    .attach('files', Buffer.from(writeGpx('Steady 5 km', [points])), 'steady.gpx');
  expect(upload.status).toBe(201);
  return { runnerId: user.id, auth, runId: upload.body.imported[0].id as string };
}

async function addPlan(app: App, auth: Auth, date: string, text: string): Promise<string> {
  const res = await request(app).post('/api/plans').set(auth).send({ date, text });
  expect(res.status).toBe(201);
  return res.body.plan.id as string;
}

/** The run's session verdict as the week review and the run's own plan check both give it (they must agree). */
async function verdict(app: App, auth: Auth, runnerId: string, runId: string): Promise<string> {
  const week = await request(app).get(`/api/runners/${runnerId}/week?start=${RUN_DATE}`).set(auth);
  expect(week.status).toBe(200);
  const run = week.body.days[1].runs.find((r: { id: string }) => r.id === runId);
  const check = await request(app).get(`/api/runs/${runId}/plan-check`).set(auth);
  expect(check.status).toBe(200);
  expect(run.session_verdict).toBe(check.body.session_verdict);
  return check.body.session_verdict as string;
}

const storedRow = (runId: string) => db('plan_check_results').where({ run_id: runId }).first();

describe('stored plan-check results', () => {
  it('are stored on first read, reused while nothing changes, and read the same as a fresh check', async () => {
    const app = freshApp();
    const { runnerId, auth, runId } = await runnerWithRun(app);
    await addPlan(app, auth, RUN_DATE, '5 km @ 5:20-5:45/km');
    expect(await storedRow(runId)).toBeUndefined();

    const first = (await request(app).get(`/api/runs/${runId}/plan-check`).set(auth)).body;
    expect(first.session_verdict).toBe('as planned');
    const stored = await storedRow(runId);
    expect(stored).toMatchObject({ result: { session_verdict: 'as planned' } });

    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');
    const again = await storedRow(runId);
    expect(again!.inputs_key).toBe(stored!.inputs_key);
    expect(again!.computed_at.getTime()).toBe(stored!.computed_at.getTime()); // read, not computed again

    await db('plan_check_results').delete();
    expect((await request(app).get(`/api/runs/${runId}/plan-check`).set(auth)).body).toEqual(first);
  });

  it('a stored result whose inputs no longer match is never served: it is computed again and replaced', async () => {
    const app = freshApp();
    const { runnerId, auth, runId } = await runnerWithRun(app);
    await addPlan(app, auth, RUN_DATE, '5 km @ 5:20-5:45/km');
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');
    await db('plan_check_results')
      .where({ run_id: runId })
      .update({ inputs_key: 'inputs of long ago', result: { method: 'planned amounts', parts: [], session_verdict: 'missed' } });

    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');
    expect((await storedRow(runId))!.inputs_key).not.toBe('inputs of long ago');
  });

  it('follow an edited plan: new paces, then the plan moved to another day', async () => {
    const app = freshApp();
    const { runnerId, auth, runId } = await runnerWithRun(app);
    const planId = await addPlan(app, auth, RUN_DATE, '5 km @ 5:20-5:45/km');
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');

    expect((await request(app).patch(`/api/plans/${planId}`).set(auth).send({ text: '5 km @ 4:30/km' })).status).toBe(200);
    expect(await verdict(app, auth, runnerId, runId)).toBe('partly'); // run far slower than 4:30

    expect((await request(app).patch(`/api/plans/${planId}`).set(auth).send({ date: '2026-11-26' })).status).toBe(200);
    expect(await verdict(app, auth, runnerId, runId)).toBe('unplanned');
  });

  it("follow the runner's pace tolerance", async () => {
    const app = freshApp();
    const { runnerId, auth, runId } = await runnerWithRun(app);
    await addPlan(app, auth, RUN_DATE, '5 km @ 5:45/km'); // 345 s/km: the run is about 3.5 % quicker
    expect(await verdict(app, auth, runnerId, runId)).toBe('partly');

    const widen = await request(app).put(`/api/runners/${runnerId}/pace-tolerance`).set(auth).send({ pace_tolerance: 0.05 });
    expect(widen.status).toBe(200);
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');

    await request(app).put(`/api/runners/${runnerId}/pace-tolerance`).set(auth).send({ pace_tolerance: 0.02 });
    expect(await verdict(app, auth, runnerId, runId)).toBe('partly');
  });

  it('follow the goal race behind a race-named pace, and a new race result', async () => {
    const app = freshApp();
    const { runnerId, auth, runId } = await runnerWithRun(app);
    const planId = await addPlan(app, auth, RUN_DATE, '5 km @ goal');
    const goal = (goal_time_s: number) =>
      request(app)
        .put('/api/me/goal-race')
        .set(auth)
        .send({ name: 'Lake Tamsel 10K', date: '2027-03-14', distance_m: 10000, goal_time_s });

    expect((await goal(3333)).status).toBe(200); // 333 s/km: the run's own pace
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');
    expect((await goal(2700)).status).toBe(200); // 270 s/km
    expect(await verdict(app, auth, runnerId, runId)).toBe('partly');

    // `@ 5K` comes from the goal (carried over to 5 km, far quicker than the run) until a recent 5 km result says otherwise.
    expect((await request(app).patch(`/api/plans/${planId}`).set(auth).send({ text: '5 km @ 5K' })).status).toBe(200);
    expect(await verdict(app, auth, runnerId, runId)).toBe('partly');
    const result = await request(app)
      .post('/api/me/race-results')
      .set(auth)
      .send({ name: 'Lake Tamsel 5K', date: '2026-11-01', distance_m: 5000, time_s: 1666 });
    expect(result.status).toBe(201);
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');
  });

  it("follow the run's chosen plan: another plan, back to the same-day plan, then no plan", async () => {
    const app = freshApp();
    const { runnerId, auth, runId } = await runnerWithRun(app);
    await addPlan(app, auth, RUN_DATE, '5 km @ 5:20-5:45/km');
    const otherDay = await addPlan(app, auth, '2026-11-25', '5 km @ 4:30/km');
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');

    const link = (plan_id: string | null) => request(app).put(`/api/runs/${runId}/plan`).set(auth).send({ plan_id });
    expect((await link(otherDay)).status).toBe(204);
    expect(await verdict(app, auth, runnerId, runId)).toBe('partly');
    expect((await link('auto')).status).toBe(204);
    expect(await verdict(app, auth, runnerId, runId)).toBe('as planned');
    expect((await link(null)).status).toBe(204);
    expect(await verdict(app, auth, runnerId, runId)).toBe('unplanned');
  });

  it('go with their run', async () => {
    const app = freshApp();
    const { auth, runId } = await runnerWithRun(app);
    await addPlan(app, auth, RUN_DATE, '5 km @ 5:20-5:45/km');
    await request(app).get(`/api/runs/${runId}/plan-check`).set(auth);
    expect(await storedRow(runId)).toBeDefined();
    expect((await request(app).delete(`/api/runs/${runId}`).set(auth)).status).toBe(204);
    expect(await db('plan_check_results').count({ n: '*' }).first()).toEqual({ n: '0' });
  });
});
