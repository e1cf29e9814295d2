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

// Issue 15: the coach writes each runner's plan; the record of changes; copy a week safely; the
// session library applied to several runners; undo; day marks. Authorization rows: coach of another
// squad, a runner removed from the squad, a plain runner, an admin.

type App = ReturnType<typeof createApp>;
type Auth = Record<string, string>;

function freshApp(): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-prescribe-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

async function person(app: App, role: 'runner' | 'coach' | 'admin', name: string) {
  const { user, password } = await createUser({ role, name });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { id: user.id, auth: { Authorization: `Bearer ${token}` } as Auth };
}

/** A coach "Dana Coach" with a squad of three runners, and a runner of another coach's squad. */
async function squadWorld(app: App) {
  const coach = await person(app, 'coach', 'Dana Coach');
  const otherCoach = await person(app, 'coach', 'Other Coach');
  const admin = await person(app, 'admin', 'Admin Person');
  const runners = [
    await person(app, 'runner', 'Ivy Runner'),
    await person(app, 'runner', 'Tom Runner'),
    await person(app, 'runner', 'Mae Runner'),
  ];
  const stranger = await person(app, 'runner', 'Far Runner');
  const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Harbor Line' })).body.squad.id as string;
  const otherSquad = (await request(app).post('/api/squads').set(otherCoach.auth).send({ name: 'Ridge' })).body.squad
    .id as string;
  await db('squad_members').insert(runners.map((r) => ({ squad_id: squad, runner_id: r.id })));
  await db('squad_members').insert({ squad_id: otherSquad, runner_id: stranger.id });
  return { coach, otherCoach, admin, runners, stranger, squad, ivy: runners[0]! };
}

const planCount = async () => Number((await db('session_plans').count({ n: '*' }).first())!.n);
const FUEL_PLAN = { body_mass_kg: 62, easy_pace_s_per_km: 330, intakes: [] };

describe('A coach writes a squad runner’s plan', () => {
  it('shows who wrote it and who changed it, and records every change by either side', async () => {
    const app = freshApp();
    const { coach, ivy } = await squadWorld(app);
    const created = await request(app)
      .post('/api/plans')
      .set(coach.auth)
      .send({ runner_id: ivy.id, date: '2026-12-12', title: 'Long run', text: '10 mi easy' });
    expect(created.status).toBe(201);
    expect(created.body.plan).toMatchObject({ author_id: coach.id, author_name: 'Dana Coach', updated_by_name: 'Dana Coach' });
    const id = created.body.plan.id as string;

    const edited = await request(app).patch(`/api/plans/${id}`).set(ivy.auth).send({ text: '11 mi easy' });
    expect(edited.status).toBe(200);
    expect(edited.body.plan).toMatchObject({ author_name: 'Dana Coach', updated_by_name: 'Ivy Runner' });
    const moved = await request(app).patch(`/api/plans/${id}`).set(coach.auth).send({ date: '2026-12-13' });
    expect(moved.body.plan.date).toBe('2026-12-13');

    const changes = await request(app).get(`/api/plans/${id}/changes`).set(ivy.auth);
    expect(changes.status).toBe(200);
    expect(
      changes.body.changes.map((c: { kind: string; actor_name: string; summary: string }) => [c.kind, c.actor_name, c.summary]),
    ).toEqual([
      ['moved', 'Dana Coach', 'Moved from Sat 12 Dec to Sun 13 Dec.'],
      ['changed', 'Ivy Runner', 'Changed session "10 mi easy" → "11 mi easy".'],
      ['added', 'Dana Coach', 'Added for Sat 12 Dec: 10 mi easy.'],
    ]);
  });

  it('moving a session keeps its fuel plan and the run linked to it', async () => {
    const app = freshApp();
    const { coach, ivy } = await squadWorld(app);
    const plan = (
      await request(app).post('/api/plans').set(coach.auth).send({ runner_id: ivy.id, date: '2026-11-24', text: '5 km easy' })
    ).body.plan.id as string;
    expect((await request(app).put(`/api/plans/${plan}/fuel-plan`).set(coach.auth).send(FUEL_PLAN)).status).toBe(200);
    const { points } = generateLakeRun({
      start_t: Date.parse('2026-11-24T06:00:00Z'),
      phases: [{ kind: 'run', duration_s: 1200, speed_mps: 3 }],
      seed: 3,
      sample_s: 5,
    });
    const upload = await request(app)
      .post('/api/runs')
      .set(ivy.auth)
      .attach('files', Buffer.from(writeGpx('Easy', [points])), 'easy.gpx');
    const runId = upload.body.imported[0].id as string;
    expect((await request(app).put(`/api/runs/${runId}/plan`).set(ivy.auth).send({ plan_id: plan })).status).toBe(204);

    expect((await request(app).patch(`/api/plans/${plan}`).set(coach.auth).send({ date: '2026-11-26' })).status).toBe(200);

    const fuel = await request(app).get(`/api/plans/${plan}/fuel-plan`).set(ivy.auth);
    expect(fuel.body.fuel_plan).not.toBeNull();
    expect((await request(app).get(`/api/runs/${runId}/plan-check`).set(ivy.auth)).body.plan_id).toBe(plan);
  });

  it('loses access the moment the runner leaves the squad: 404 to write, read and assign, nothing changed', async () => {
    const app = freshApp();
    const { coach, ivy, squad } = await squadWorld(app);
    const plan = (
      await request(app).post('/api/plans').set(coach.auth).send({ runner_id: ivy.id, date: '2026-12-12', text: '5 mi easy' })
    ).body.plan.id as string;
    expect((await request(app).delete(`/api/squads/${squad}/members/${ivy.id}`).set(coach.auth)).status).toBe(204);

    expect((await request(app).patch(`/api/plans/${plan}`).set(coach.auth).send({ date: '2026-12-13' })).status).toBe(404);
    expect((await request(app).delete(`/api/plans/${plan}`).set(coach.auth)).status).toBe(404);
    expect((await request(app).get(`/api/plans?runner_id=${ivy.id}`).set(coach.auth)).status).toBe(404);
    expect((await request(app).get(`/api/runners/${ivy.id}`).set(coach.auth)).status).toBe(404);
    const assign = await request(app)
      .post('/api/plans/assign')
      .set(coach.auth)
      .send({ runner_ids: [ivy.id], date: '2026-12-14', text: '5 mi easy' });
    expect(assign.status).toBe(404);
    expect(
      (await request(app).put('/api/days/2026-12-14').set(coach.auth).send({ kind: 'rest', runner_id: ivy.id })).status,
    ).toBe(404);
    const stored = await db('session_plans').where({ runner_id: ivy.id });
    expect(stored.map((p) => p.date)).toEqual(['2026-12-12']);
  });
});

describe('GET /api/runners/:id', () => {
  it('names the runner and their tolerance for the runner and their coach; others get 404, an admin reads', async () => {
    const app = freshApp();
    const { coach, otherCoach, admin, ivy, stranger } = await squadWorld(app);
    expect(
      (await request(app).put(`/api/runners/${ivy.id}/pace-tolerance`).set(coach.auth).send({ pace_tolerance: 0.03 })).status,
    ).toBe(200);
    const res = await request(app).get(`/api/runners/${ivy.id}`).set(coach.auth);
    expect(res.status).toBe(200);
    expect(res.body.runner).toMatchObject({ id: ivy.id, name: 'Ivy Runner', pace_tolerance: 0.03 });
    expect((await request(app).get(`/api/runners/${ivy.id}`).set(ivy.auth)).status).toBe(200);
    expect((await request(app).get(`/api/runners/${ivy.id}`).set(admin.auth)).status).toBe(200);
    expect((await request(app).get(`/api/runners/${ivy.id}`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).get(`/api/runners/${ivy.id}`).set(stranger.auth)).status).toBe(404);
  });
});

describe('POST /api/plans/copy-week', () => {
  it('refuses to copy onto a week with sessions without a mode (409 with details.existing), so a second press never doubles', async () => {
    const app = freshApp();
    const { coach, ivy } = await squadWorld(app);
    for (const [date, text] of [
      ['2026-12-01', '5 mi easy'],
      ['2026-12-05', '12 mi easy'],
    ]) {
      await request(app).post('/api/plans').set(coach.auth).send({ runner_id: ivy.id, date, text });
    }
    const body = { runner_id: ivy.id, from_start: '2026-11-30', to_start: '2026-12-07' };
    const first = await request(app).post('/api/plans/copy-week').set(coach.auth).send(body);
    expect(first.status).toBe(201);
    expect(first.body.plans.map((p: { date: string }) => p.date)).toEqual(['2026-12-08', '2026-12-12']);
    expect(first.body.plans[0].author_name).toBe('Dana Coach');
    const second = await request(app).post('/api/plans/copy-week').set(coach.auth).send(body);
    expect(second.status).toBe(409);
    expect(second.body.details).toEqual({ existing: 2 });
    expect(second.body.error).toMatch(/already has 2 sessions/);
    expect(await planCount()).toBe(4);
  });

  it('replaces (and undo puts the replaced sessions back with their ids and fuel plans) or adds beside', async () => {
    const app = freshApp();
    const { ivy } = await squadWorld(app);
    await request(app).post('/api/plans').set(ivy.auth).send({ date: '2026-12-01', text: '6 mi easy' });
    const old = (await request(app).post('/api/plans').set(ivy.auth).send({ date: '2026-12-09', text: '3 mi easy' })).body.plan
      .id;
    await request(app).put(`/api/plans/${old}/fuel-plan`).set(ivy.auth).send(FUEL_PLAN);
    const body = { from_start: '2026-11-30', to_start: '2026-12-07' };

    const replaced = await request(app)
      .post('/api/plans/copy-week')
      .set(ivy.auth)
      .send({ ...body, mode: 'replace' });
    expect(replaced.status).toBe(201);
    expect(replaced.body.replaced).toBe(1);
    const week = async () =>
      (await request(app).get('/api/plans?from=2026-12-07&to=2026-12-13').set(ivy.auth)).body.plans.map(
        (p: { text: string }) => p.text,
      );
    expect(await week()).toEqual(['6 mi easy']);

    expect((await request(app).delete(`/api/plans/batches/${replaced.body.batch_id}`).set(ivy.auth)).status).toBe(204);
    expect(await week()).toEqual(['3 mi easy']);
    expect((await request(app).get(`/api/plans/${old}/fuel-plan`).set(ivy.auth)).body.fuel_plan).not.toBeNull();
    expect((await request(app).delete(`/api/plans/batches/${replaced.body.batch_id}`).set(ivy.auth)).status).toBe(404);

    const added = await request(app)
      .post('/api/plans/copy-week')
      .set(ivy.auth)
      .send({ ...body, mode: 'add' });
    expect(added.status).toBe(201);
    expect((await week()).sort()).toEqual(['3 mi easy', '6 mi easy']);
  });

  it('answers 400 with a sentence when the source week is empty or the mode is unknown, and writes nothing', async () => {
    const app = freshApp();
    const { ivy } = await squadWorld(app);
    const empty = await request(app)
      .post('/api/plans/copy-week')
      .set(ivy.auth)
      .send({ from_start: '2026-11-30', to_start: '2026-12-07' });
    expect(empty.status).toBe(400);
    expect(empty.body.error).toBe('That week has no sessions to copy.');
    await request(app).post('/api/plans').set(ivy.auth).send({ date: '2026-12-01', text: '6 mi easy' });
    const bad = await request(app)
      .post('/api/plans/copy-week')
      .set(ivy.auth)
      .send({ from_start: '2026-11-30', to_start: '2026-12-07', mode: 'double' });
    expect(bad.status).toBe(400);
    expect(await planCount()).toBe(1);
  });
});

describe('The session library', () => {
  it('keeps a session with its parts and fuel plan, renames it, rewrites it and deletes it', async () => {
    const app = freshApp();
    const { coach, ivy, otherCoach } = await squadWorld(app);
    const plan = (
      await request(app)
        .post('/api/plans')
        .set(coach.auth)
        .send({ runner_id: ivy.id, date: '2026-12-12', text: '2 mi easy, 6 x 800 m @ 3:50-3:55/km w/ 400 m jog' })
    ).body.plan.id as string;
    expect((await request(app).put(`/api/plans/${plan}/fuel-plan`).set(coach.auth).send(FUEL_PLAN)).status).toBe(200);
    const saved = await request(app).post('/api/library').set(coach.auth).send({ name: 'Track 800s', plan_id: plan });
    expect(saved.status).toBe(201);
    expect(saved.body.session).toMatchObject({
      name: 'Track 800s',
      text: '2 mi easy, 6 x 800 m @ 3:50-3:55/km w/ 400 m jog',
      has_fuel_plan: true,
    });
    const id = saved.body.session.id as string;

    const renamed = await request(app)
      .patch(`/api/library/${id}`)
      .set(coach.auth)
      .send({ name: 'Track 6 × 800', text: '6 x 800 m @ 5K w/ 400 m jog' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.session).toMatchObject({ name: 'Track 6 × 800', text: '6 x 800 m @ 5K w/ 400 m jog' });
    expect((await request(app).get('/api/library').set(coach.auth)).body.sessions).toHaveLength(1);
    expect((await request(app).get('/api/library').set(otherCoach.auth)).body.sessions).toHaveLength(0);
    expect((await request(app).patch(`/api/library/${id}`).set(otherCoach.auth).send({ name: 'Mine' })).status).toBe(404);
    expect((await request(app).delete(`/api/library/${id}`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/library/${id}`).set(coach.auth)).status).toBe(204);
    expect((await request(app).get('/api/library').set(coach.auth)).body.sessions).toHaveLength(0);
  });

  it.each([
    [{ name: '', text: '5 mi easy' }, 'Name the session'],
    [{ name: '   ', text: '5 mi easy' }, 'Name the session'],
    [{ name: 'Easy' }, 'Write the session'],
    [{ name: 'Easy', text: '5 mi @ 0:00/mi' }, ''],
  ])('refuses %j with 400 and a sentence, storing nothing', async (body, sentence) => {
    const app = freshApp();
    const { coach } = await squadWorld(app);
    const res = await request(app).post('/api/library').set(coach.auth).send(body);
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).toContain(sentence);
    expect(Number((await db('library_sessions').count({ n: '*' }).first())!.n)).toBe(0);
  });

  it('a second session of the same name (any case) answers 409', async () => {
    const app = freshApp();
    const { coach } = await squadWorld(app);
    expect((await request(app).post('/api/library').set(coach.auth).send({ name: 'Hills', text: '8 x 1 min' })).status).toBe(201);
    const again = await request(app).post('/api/library').set(coach.auth).send({ name: 'HILLS', text: '10 x 1 min' });
    expect(again.status).toBe(409);
    expect(again.body.error).toBe('Your library already has a session with this name.');
  });
});

describe('POST /api/plans/assign', () => {
  it('applies a library session to three runners on one date: one plan each, with the fuel plan, race paces left to each runner', async () => {
    const app = freshApp();
    const { coach, runners } = await squadWorld(app);
    const lib = (
      await request(app)
        .post('/api/library')
        .set(coach.auth)
        .send({ name: 'Goal-pace long run', title: 'Long run', text: '10 mi easy, 8 mi @ goal' })
    ).body.session.id as string;
    const res = await request(app)
      .post('/api/plans/assign')
      .set(coach.auth)
      .send({ runner_ids: runners.map((r) => r.id), date: '2026-12-12', library_id: lib });
    expect(res.status).toBe(201);
    expect(res.body.plans).toHaveLength(3);
    expect(res.body.plans.map((p: { runner_id: string }) => p.runner_id).sort()).toEqual(runners.map((r) => r.id).sort());
    for (const p of res.body.plans) {
      expect(p).toMatchObject({ date: '2026-12-12', title: 'Long run', text: '10 mi easy, 8 mi @ goal', author_id: coach.id });
    }
    // Undo removes all three.
    expect((await request(app).delete(`/api/plans/batches/${res.body.batch_id}`).set(coach.auth)).status).toBe(204);
    expect(await planCount()).toBe(0);
  });

  it('copies the library session’s fuel plan onto each new session', async () => {
    const app = freshApp();
    const { coach, runners, ivy } = await squadWorld(app);
    const plan = (
      await request(app).post('/api/plans').set(coach.auth).send({ runner_id: ivy.id, date: '2026-12-05', text: '16 mi easy' })
    ).body.plan.id;
    await request(app).put(`/api/plans/${plan}/fuel-plan`).set(coach.auth).send(FUEL_PLAN);
    const lib = (await request(app).post('/api/library').set(coach.auth).send({ name: 'Long', plan_id: plan })).body.session.id;
    const res = await request(app)
      .post('/api/plans/assign')
      .set(coach.auth)
      .send({ runner_ids: [runners[1]!.id, runners[2]!.id], date: '2026-12-12', library_id: lib });
    expect(res.body.plans).toHaveLength(2);
    for (const p of res.body.plans) {
      const fuel = await request(app).get(`/api/plans/${p.id}/fuel-plan`).set(coach.auth);
      expect(fuel.body.fuel_plan.body_mass_kg).toBe(62);
    }
  });

  it('is all or nothing: one runner not in the coach’s squads → 404, nothing created', async () => {
    const app = freshApp();
    const { coach, runners, stranger } = await squadWorld(app);
    const res = await request(app)
      .post('/api/plans/assign')
      .set(coach.auth)
      .send({ runner_ids: [...runners.map((r) => r.id), stranger.id], date: '2026-12-12', text: '5 mi easy' });
    expect(res.status).toBe(404);
    expect(res.body.error).toBe('One of the chosen runners is not in your squads, so nothing was added.');
    expect(await planCount()).toBe(0);
  });

  it.each([
    ['no runners', () => [], 'Choose at least one runner.'],
    ['500 runners', () => Array.from({ length: 500 }, () => crypto.randomUUID()), 'Choose at most 100 runners at a time.'],
    ['a runner twice', (id: string) => [id, id], 'A runner is chosen twice.'],
  ])('refuses %s with 400 and a sentence', async (_label, ids, sentence) => {
    const app = freshApp();
    const { coach, ivy } = await squadWorld(app);
    const res = await request(app)
      .post('/api/plans/assign')
      .set(coach.auth)
      .send({ runner_ids: ids(ivy.id), date: '2026-12-12', text: '5 mi easy' });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).toContain(sentence);
    expect(await planCount()).toBe(0);
  });

  it('bad date, both text and library, another person’s library session: 400/400/404, nothing created', async () => {
    const app = freshApp();
    const { coach, otherCoach, ivy } = await squadWorld(app);
    const lib = (await request(app).post('/api/library').set(otherCoach.auth).send({ name: 'Theirs', text: '5 mi easy' })).body
      .session.id;
    const send = (body: object) =>
      request(app)
        .post('/api/plans/assign')
        .set(coach.auth)
        .send({ runner_ids: [ivy.id], ...body });
    expect((await send({ date: '2026-02-30', text: '5 mi easy' })).status).toBe(400);
    expect((await send({ date: '3026-01-01', text: '5 mi easy' })).status).toBe(400);
    expect((await send({ date: '2026-12-12', text: '5 mi easy', library_id: lib })).status).toBe(400);
    expect((await send({ date: '2026-12-12', library_id: lib })).status).toBe(404);
    expect(await planCount()).toBe(0);
  });

  it('authorization: a runner only for themselves, an admin 403, another coach 404', async () => {
    const app = freshApp();
    const { admin, otherCoach, ivy, runners } = await squadWorld(app);
    const body = (ids: string[]) => ({ runner_ids: ids, date: '2026-12-12', text: '5 mi easy' });
    expect(
      (
        await request(app)
          .post('/api/plans/assign')
          .set(ivy.auth)
          .send(body([ivy.id]))
      ).status,
    ).toBe(201);
    expect(
      (
        await request(app)
          .post('/api/plans/assign')
          .set(ivy.auth)
          .send(body([runners[1]!.id]))
      ).status,
    ).toBe(404);
    expect(
      (
        await request(app)
          .post('/api/plans/assign')
          .set(admin.auth)
          .send(body([ivy.id]))
      ).status,
    ).toBe(403);
    expect(
      (
        await request(app)
          .post('/api/plans/assign')
          .set(otherCoach.auth)
          .send(body([ivy.id]))
      ).status,
    ).toBe(404);
    expect(await planCount()).toBe(1);
  });
});

describe('DELETE /api/plans/batches/:id', () => {
  it('only the batch’s author can undo it; a made-up id is 404', async () => {
    const app = freshApp();
    const { coach, ivy } = await squadWorld(app);
    const res = await request(app)
      .post('/api/plans/assign')
      .set(coach.auth)
      .send({ runner_ids: [ivy.id], date: '2026-12-12', text: '5 mi easy' });
    expect((await request(app).delete(`/api/plans/batches/${res.body.batch_id}`).set(ivy.auth)).status).toBe(404);
    expect((await request(app).delete(`/api/plans/batches/${crypto.randomUUID()}`).set(coach.auth)).status).toBe(404);
    expect(await planCount()).toBe(1);
  });
});

describe('Day marks: PUT/DELETE /api/days/:date, GET /api/days', () => {
  it('the runner or their coach marks a day; the week answer lists it under the day', async () => {
    const app = freshApp();
    const { coach, ivy } = await squadWorld(app);
    const ill = await request(app)
      .put('/api/days/2026-12-08')
      .set(coach.auth)
      .send({ kind: 'ill', note: 'Head cold', runner_id: ivy.id });
    expect(ill.status).toBe(200);
    expect(ill.body.day_mark).toMatchObject({ date: '2026-12-08', kind: 'ill', minutes: null, note: 'Head cold' });
    const cross = await request(app)
      .put('/api/days/2026-12-09')
      .set(ivy.auth)
      .send({ kind: 'cross-training', minutes: 45, note: 'Bike' });
    expect(cross.status).toBe(200);
    const list = await request(app).get(`/api/days?from=2026-12-07&to=2026-12-13&runner_id=${ivy.id}`).set(coach.auth);
    expect(list.body.day_marks.map((m: { kind: string }) => m.kind)).toEqual(['ill', 'cross-training']);
    const week = await request(app).get(`/api/runners/${ivy.id}/week?start=2026-12-07`).set(coach.auth);
    expect(week.body.days[1].day_marks).toEqual([expect.objectContaining({ kind: 'ill' })]);
    expect(week.body.days[2].day_marks).toEqual([expect.objectContaining({ kind: 'cross-training', minutes: 45 })]);
    expect((await request(app).delete('/api/days/2026-12-08').set(ivy.auth)).status).toBe(204);
    expect((await request(app).delete('/api/days/2026-12-08').set(ivy.auth)).status).toBe(404);
  });

  it.each([
    ['2026-12-40', { kind: 'rest' }],
    ['2026-12-08', { kind: 'holiday' }],
    ['2026-12-08', { kind: 'cross-training' }],
    ['2026-12-08', { kind: 'rest', minutes: 30 }],
    ['2026-12-08', { kind: 'cross-training', minutes: 5000 }],
  ])('refuses %s %j with 400, storing nothing', async (date, body) => {
    const app = freshApp();
    const { ivy } = await squadWorld(app);
    const res = await request(app).put(`/api/days/${date}`).set(ivy.auth).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/\S/);
    expect(Number((await db('day_marks').count({ n: '*' }).first())!.n)).toBe(0);
  });

  it('another coach gets 404, an admin 403', async () => {
    const app = freshApp();
    const { otherCoach, admin, ivy } = await squadWorld(app);
    expect(
      (await request(app).put('/api/days/2026-12-08').set(otherCoach.auth).send({ kind: 'rest', runner_id: ivy.id })).status,
    ).toBe(404);
    expect(
      (await request(app).put('/api/days/2026-12-08').set(admin.auth).send({ kind: 'rest', runner_id: ivy.id })).status,
    ).toBe(403);
    expect(
      (await request(app).get(`/api/days?from=2026-12-07&to=2026-12-13&runner_id=${ivy.id}`).set(otherCoach.auth)).status,
    ).toBe(404);
  });
});
