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

type App = ReturnType<typeof createApp>;
type Auth = Record<string, string>;

function freshApp(): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

async function person(app: App, role: 'runner' | 'coach' | 'admin' = 'runner') {
  const { user, password } = await createUser({ role });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, auth: { Authorization: `Bearer ${token}` } as Auth };
}

async function squadOf(coachId: string, runnerId: string) {
  const [squad] = await db('squads').insert({ coach_id: coachId, name: 'Test squad' }).returning('id');
  await db('squad_members').insert({ squad_id: squad!.id, runner_id: runnerId });
}

const count = async (table: 'fuel_items' | 'fuel_plans' | 'fuel_taken' | 'run_checkins') =>
  Number((await db(table).count({ n: '*' }).first())!.n);

const GEL = {
  name: 'energy gel, 25 g carbohydrate',
  serving: '1 gel',
  carbohydrate_g: 25,
  sodium_mg: 50,
  caffeine_mg: 0,
  fluid_ml: 0,
};
const MIX = { name: 'drink mix, 150 ml', serving: '150 ml', carbohydrate_g: 9, sodium_mg: 70, caffeine_mg: 0, fluid_ml: 150 };
/** 8:00 per mile in seconds per km. */
const EIGHT_PER_MILE = 480 / 1.609344;

async function addItem(app: App, auth: Auth, item: object = GEL): Promise<string> {
  const res = await request(app).post('/api/fuel-items').set(auth).send(item);
  expect(res.status).toBe(201);
  return res.body.item.id as string;
}

async function addPlan(app: App, auth: Auth, text: string, date = '2026-10-03', runnerId?: string): Promise<string> {
  const res = await request(app)
    .post('/api/plans')
    .set(auth)
    .send({ date, text, ...(runnerId ? { runner_id: runnerId } : {}) });
  expect(res.status).toBe(201);
  return res.body.plan.id as string;
}

describe('fuel items', () => {
  it('adds, lists, changes and deletes items; another user’s item id is 404', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const gel = await addItem(app, auth);
    await addItem(app, auth, MIX);
    const list = await request(app).get('/api/fuel-items').set(auth);
    expect(list.status).toBe(200);
    expect(list.body.items.map((i: { name: string }) => i.name)).toEqual([MIX.name, GEL.name].sort());

    const changed = await request(app).patch(`/api/fuel-items/${gel}`).set(auth).send({ caffeine_mg: 40 });
    expect(changed.status).toBe(200);
    expect(changed.body.item).toMatchObject({ ...GEL, caffeine_mg: 40, id: gel });

    const other = await person(app);
    expect((await request(app).patch(`/api/fuel-items/${gel}`).set(other.auth).send({ caffeine_mg: 0 })).status).toBe(404);
    expect((await request(app).delete(`/api/fuel-items/${gel}`).set(other.auth)).status).toBe(404);
    expect((await request(app).get('/api/fuel-items').set(other.auth)).body.items).toEqual([]);

    expect((await request(app).delete(`/api/fuel-items/${gel}`).set(auth)).status).toBe(204);
    expect((await request(app).delete(`/api/fuel-items/${gel}`).set(auth)).status).toBe(404);
    expect(await count('fuel_items')).toBe(1);
  });

  it.each([
    [{ ...GEL, carbohydrate_g: -5 }, 'carbohydrate_g'],
    [{ ...GEL, caffeine_mg: 401 }, 'caffeine_mg'],
    [{ ...GEL, name: '' }, 'name'],
  ])('refuses %j with 400 on %s and stores nothing', async (body, field) => {
    const app = freshApp();
    const { auth } = await person(app);
    const res = await request(app).post('/api/fuel-items').set(auth).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(await count('fuel_items')).toBe(0);
  });

  it('refuses a negative change and keeps the item as it was', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const gel = await addItem(app, auth);
    expect((await request(app).patch(`/api/fuel-items/${gel}`).set(auth).send({ sodium_mg: -1 })).status).toBe(400);
    expect((await db('fuel_items').where({ id: gel }).first())!.sodium_mg).toBe(50);
  });
});

describe('PUT /api/plans/:id/fuel-plan', () => {
  async function longRunPlan(app: App, auth: Auth) {
    const planId = await addPlan(app, auth, '18 mi easy');
    const gel = await addItem(app, auth);
    const mix = await addItem(app, auth, MIX);
    const body = {
      body_mass_kg: 70,
      easy_pace_s_per_km: EIGHT_PER_MILE,
      start_clock: '07:00',
      intakes: [
        { item_id: gel, when: { type: 'every_distance', every: 5, unit: 'mi' } },
        { item_id: mix, when: { type: 'every_time', every_s: 900 } },
      ],
    };
    return { planId, gel, mix, body };
  }

  it('18 mi easy at 8:00/mi: gels at miles 5, 10, 15 at 0:40, 1:20, 2:00; drinks every 15 min; hourly totals vs targets', async () => {
    const app = freshApp();
    const { auth, user } = await person(app);
    const { planId, gel, body } = await longRunPlan(app, auth);
    expect((await request(app).get(`/api/plans/${planId}/fuel-plan`).set(auth)).body).toEqual({ fuel_plan: null });

    const res = await request(app).put(`/api/plans/${planId}/fuel-plan`).set(auth).send(body);
    expect(res.status).toBe(200);
    const plan = res.body.fuel_plan;
    expect(plan).toMatchObject({ plan_id: planId, runner_id: user.id, goal_race: false, body_mass_kg: 70, start_clock: '07:00' });
    expect(plan.expected_duration_s).toBeCloseTo(8640, 6);
    const gels = plan.schedule.intakes.filter((i: { item_id: string }) => i.item_id === gel);
    expect(gels.map((g: { distance_mi: number }) => g.distance_mi)).toEqual([5, 10, 15]);
    expect(gels.map((g: { clock: string }) => g.clock)).toEqual(['0:40:00', '1:20:00', '2:00:00']);
    expect(gels.map((g: { time_of_day: string }) => g.time_of_day)).toEqual(['07:40', '08:20', '09:00']);
    expect(plan.schedule.intakes).toHaveLength(12);
    expect(
      plan.schedule.hours.map(
        (h: { hour: number; carbohydrate_g: number; fluid_ml: number; status: { carbohydrate: string } }) => [
          h.hour,
          h.carbohydrate_g,
          h.fluid_ml,
          h.status.carbohydrate,
        ],
      ),
    ).toEqual([
      [1, 52, 450, 'within'],
      [2, 61, 600, 'over'],
      [3, 43, 300, 'over'],
    ]);
    // 2:24 falls in the 30–60 g/h band of the joint position; every target names its source.
    expect(plan.targets.carbohydrate).toMatchObject({ low: 30, high: 60, unit: 'g/h', evidence: 'from memory' });
    expect(plan.targets.fluid).toMatchObject({ low: 400, high: 800, unit: 'ml/h' });
    expect(plan.targets.fluid.source).toContain('Sawka et al. 2007');
    expect(plan.targets.sodium.source).toContain('DGE');
    expect(plan.cautions.map((c: { topic: string }) => c.topic)).toEqual(['fluid', 'sodium', 'carbohydrate']);
    expect(plan.cautions[2].last_word).toMatch(/physician, a registered dietitian or a qualified coach/);
    expect(plan.meals.carbohydrate_loading.grams_per_day).toEqual({ low_g: 700, high_g: 840 });
    expect(plan.source_changed).toBe(false);

    const again = await request(app).get(`/api/plans/${planId}/fuel-plan`).set(auth);
    expect(again.body.fuel_plan.schedule).toEqual(plan.schedule);
    expect(await count('fuel_plans')).toBe(1);

    // Saving again replaces it; own targets replace the proposal and say so.
    const own = await request(app)
      .put(`/api/plans/${planId}/fuel-plan`)
      .set(auth)
      .send({ ...body, targets: { carbohydrate: { low: 50, high: 70 } } });
    expect(own.body.fuel_plan.targets.carbohydrate).toMatchObject({ low: 50, high: 70, evidence: 'set' });
    expect(own.body.fuel_plan.proposed_targets.carbohydrate).toMatchObject({ low: 30, high: 60 });
    expect(own.body.fuel_plan.schedule.hours[1].status.carbohydrate).toBe('within');
    expect(await count('fuel_plans')).toBe(1);

    // Rewriting the session plan marks the fuel plan out of date.
    await request(app).patch(`/api/plans/${planId}`).set(auth).send({ text: '20 mi easy' });
    expect((await request(app).get(`/api/plans/${planId}/fuel-plan`).set(auth)).body.fuel_plan.source_changed).toBe(true);
    expect((await request(app).delete(`/api/plans/${planId}/fuel-plan`).set(auth)).status).toBe(204);
    expect(await count('fuel_plans')).toBe(0);
  });

  it.each([
    [
      'without an easy pace for an effort-only part',
      (b: Record<string, unknown>) => ({ ...b, easy_pace_s_per_km: undefined }),
      400,
      'easy_pace_s_per_km',
    ],
    ['with a body mass of 0 kg', (b: Record<string, unknown>) => ({ ...b, body_mass_kg: 0 }), 400, 'body_mass_kg'],
    [
      'with 500 gels at once',
      (b: Record<string, unknown>) => ({ ...b, intakes: [{ ...(b.intakes as object[])[0], servings: 500 }] }),
      400,
      'intakes.0.servings',
    ],
    [
      'with a brand-new unknown item id',
      (b: Record<string, unknown>) => ({
        ...b,
        intakes: [{ item_id: '7a4a1f5e-2f0b-4e4c-8d7e-3c1f9b0a6d21', when: { type: 'at_times', at_s: [600] } }],
      }),
      400,
      'intakes.0.item_id',
    ],
  ])('refuses a fuel plan %s and stores nothing', async (_what, change, status, field) => {
    const app = freshApp();
    const { auth } = await person(app);
    const { planId, body } = await longRunPlan(app, auth);
    const res = await request(app).put(`/api/plans/${planId}/fuel-plan`).set(auth).send(change(body));
    expect(res.status).toBe(status);
    expect(res.body.error).toMatch(/\S/);
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(await count('fuel_plans')).toBe(0);
  });

  it('refuses another runner’s item and another runner’s session plan', async () => {
    const app = freshApp();
    const { auth } = await person(app);
    const { planId, body } = await longRunPlan(app, auth);
    const other = await person(app);
    const otherGel = await addItem(app, other.auth);
    const withOthersItem = { ...body, intakes: [{ item_id: otherGel, when: { type: 'at_times', at_s: [600] } }] };
    expect((await request(app).put(`/api/plans/${planId}/fuel-plan`).set(auth).send(withOthersItem)).status).toBe(400);
    expect(
      (
        await request(app)
          .put(`/api/plans/${planId}/fuel-plan`)
          .set(other.auth)
          .send({ ...body, intakes: [] })
      ).status,
    ).toBe(404);
    expect((await request(app).get(`/api/plans/${planId}/fuel-plan`).set(other.auth)).status).toBe(404);
    expect(await count('fuel_plans')).toBe(0);
  });

  it('a coach writes and reads a squad runner’s fuel plan; a coach of another squad gets 404; an admin reads but does not write', async () => {
    const app = freshApp();
    const runner = await person(app);
    const coach = await person(app, 'coach');
    const otherCoach = await person(app, 'coach');
    const admin = await person(app, 'admin');
    await squadOf(coach.user.id, runner.user.id);
    const gel = await addItem(app, runner.auth);
    const planId = await addPlan(app, coach.auth, '10 mi @ 7:30/mi', '2026-10-04', runner.user.id);
    const body = { body_mass_kg: 62, intakes: [{ item_id: gel, when: { type: 'every_time', every_s: 1800 } }] };

    const put = await request(app).put(`/api/plans/${planId}/fuel-plan`).set(coach.auth).send(body);
    expect(put.status).toBe(200);
    expect(put.body.fuel_plan.author_id).toBe(coach.user.id);
    expect(put.body.fuel_plan.expected_duration_s).toBeCloseTo(4500, 6);
    expect(put.body.fuel_plan.schedule.intakes.map((i: { clock: string }) => i.clock)).toEqual(['0:30:00', '1:00:00']);
    expect((await request(app).get(`/api/fuel-items?runner_id=${runner.user.id}`).set(coach.auth)).body.items).toHaveLength(1);

    expect((await request(app).get(`/api/plans/${planId}/fuel-plan`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).put(`/api/plans/${planId}/fuel-plan`).set(otherCoach.auth).send(body)).status).toBe(404);
    expect((await request(app).get(`/api/fuel-items?runner_id=${runner.user.id}`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).get(`/api/plans/${planId}/fuel-plan`).set(admin.auth)).status).toBe(200);
    expect((await request(app).put(`/api/plans/${planId}/fuel-plan`).set(admin.auth).send(body)).status).toBe(403);
  });
});

describe('PUT /api/me/goal-race/fuel-plan', () => {
  it('times the plan by the goal time: a 3:30:00 marathon at 60–90 g/h', async () => {
    const app = freshApp();
    const { auth, user } = await person(app);
    const gel = await addItem(app, auth);
    const body = { body_mass_kg: 70, intakes: [{ item_id: gel, when: { type: 'every_distance', every: 5, unit: 'km' } }] };
    const none = await request(app).put('/api/me/goal-race/fuel-plan').set(auth).send(body);
    expect(none.status).toBe(422);
    expect(none.body.error).toMatch(/goal race/);

    await request(app)
      .put('/api/me/goal-race')
      .set(auth)
      .send({ name: 'Lakeside Marathon', date: '2027-04-18', distance_m: 42195, goal_time_s: 3.5 * 3600 });
    expect((await request(app).get('/api/me/goal-race/fuel-plan').set(auth)).body).toEqual({ fuel_plan: null });
    const res = await request(app).put('/api/me/goal-race/fuel-plan').set(auth).send(body);
    expect(res.status).toBe(200);
    const plan = res.body.fuel_plan;
    expect(plan).toMatchObject({ goal_race: true, plan_id: null, runner_id: user.id, expected_duration_s: 12600 });
    expect(plan.expected_distance_m).toBe(42195);
    expect(plan.schedule.intakes.map((i: { distance_km: number }) => i.distance_km)).toEqual([5, 10, 15, 20, 25, 30, 35, 40]);
    // 5 km at 3:30:00 marathon pace (298.614 s/km) is 0:24:53.
    expect(plan.schedule.intakes[0].clock).toBe('0:24:53');
    expect(plan.targets.carbohydrate).toMatchObject({ low: 60, high: 90 });
    expect(plan.schedule.target_totals.carbohydrate).toEqual({ low: 210, high: 315 });
    expect(plan.schedule.target_totals.fluid.low).toBeCloseTo(1400, 6);
    expect(plan.schedule.totals.carbohydrate_g).toBe(200);
    expect((await request(app).get('/api/me/goal-race/fuel-plan').set(auth)).body.fuel_plan.id).toBe(plan.id);

    // Clearing the goal race removes its fuel plan.
    await request(app).delete('/api/me/goal-race').set(auth);
    expect(await count('fuel_plans')).toBe(0);
  });

  it('a coach of the runner reads and writes it with runner_id; a coach of another squad gets 404', async () => {
    const app = freshApp();
    const runner = await person(app);
    const coach = await person(app, 'coach');
    const otherCoach = await person(app, 'coach');
    await squadOf(coach.user.id, runner.user.id);
    await request(app)
      .put('/api/me/goal-race')
      .set(runner.auth)
      .send({ name: 'Harbor Half', date: '2027-03-07', distance_m: 21097.5, goal_time_s: 5400 });
    const body = { body_mass_kg: 58, intakes: [] };
    expect(
      (await request(app).put(`/api/me/goal-race/fuel-plan?runner_id=${runner.user.id}`).set(coach.auth).send(body)).status,
    ).toBe(200);
    expect(
      (await request(app).get(`/api/me/goal-race/fuel-plan?runner_id=${runner.user.id}`).set(coach.auth)).body.fuel_plan
        .goal_race,
    ).toBe(true);
    expect((await request(app).get(`/api/me/goal-race/fuel-plan?runner_id=${runner.user.id}`).set(otherCoach.auth)).status).toBe(
      404,
    );
    expect(
      (await request(app).put(`/api/me/goal-race/fuel-plan?runner_id=${runner.user.id}`).set(otherCoach.auth).send(body)).status,
    ).toBe(404);
  });
});

describe('fuel taken and check-in on a run', () => {
  /** A 6-mile run on 3 Oct 2026 at 3.35 m/s (about 8:00/mi), generated around the invented lake. */
  function sixMileGpx(): Buffer {
    const distance = 6 * 1609.344;
    const run = generateLakeRun({
      start_t: Date.UTC(2026, 9, 3, 7),
      phases: [{ kind: 'run', duration_s: distance / 3.35, speed_mps: 3.35 }],
      seed: 7,
      gps_sigma_m: 1,
    });
    return Buffer.from(writeGpx('Long run', [run.points]));
  }

  async function setUp() {
    const app = freshApp();
    const runner = await person(app);
    const coach = await person(app, 'coach');
    const otherCoach = await person(app, 'coach');
    await squadOf(coach.user.id, runner.user.id);
    const gel = await addItem(app, runner.auth);
    const planId = await addPlan(app, runner.auth, '6 mi easy');
    await request(app)
      .put(`/api/plans/${planId}/fuel-plan`)
      .set(runner.auth)
      .send({
        body_mass_kg: 70,
        easy_pace_s_per_km: EIGHT_PER_MILE,
        intakes: [{ item_id: gel, when: { type: 'every_distance', every: 2, unit: 'mi' } }],
      });
    const upload = await request(app).post('/api/runs').set(runner.auth).attach('files', sixMileGpx(), 'long-run.gpx');
    expect(upload.status).toBe(201);
    return { app, runner, coach, otherCoach, gel, runId: upload.body.imported[0].id as string };
  }

  it('records what was taken and shows planned vs taken per hour', async () => {
    const { app, runner, coach, otherCoach, gel, runId } = await setUp();
    const before = await request(app).get(`/api/runs/${runId}/fuel-taken`).set(runner.auth);
    expect(before.status).toBe(200);
    expect(before.body.fuel_taken).toBeNull();
    expect(before.body.planned_vs_taken.totals.planned.carbohydrate_g).toBe(50); // miles 2 and 4

    const res = await request(app)
      .put(`/api/runs/${runId}/fuel-taken`)
      .set(runner.auth)
      .send({
        entries: [
          { kind: 'item', item_id: gel, servings: 1, time_s: 960 },
          { kind: 'item', item_id: gel, servings: 0.5, time_s: 3700 },
          { kind: 'water', fluid_ml: 200, time_s: null },
        ],
        stomach: 4,
        energy: 3,
        notes: 'second gel was hard to get down',
      });
    expect(res.status).toBe(200);
    expect(res.body.fuel_taken).toMatchObject({ stomach: 4, energy: 3, notes: 'second gel was hard to get down' });
    expect(res.body.fuel_taken.entries[1]).toMatchObject({ name: GEL.name, servings: 0.5, carbohydrate_g: 12.5 });
    const hours = res.body.planned_vs_taken.hours.map(
      (h: { planned: { carbohydrate_g: number }; taken: { carbohydrate_g: number } }) => [
        h.planned.carbohydrate_g,
        h.taken.carbohydrate_g,
      ],
    );
    expect(hours).toEqual([
      [50, 25],
      [0, 12.5],
    ]);
    expect(res.body.planned_vs_taken.untimed.fluid_ml).toBe(200);
    expect(res.body.cautions.map((c: { topic: string }) => c.topic)).toEqual(['fluid', 'sodium']);

    // The item changing later does not rewrite what was taken.
    await request(app).patch(`/api/fuel-items/${gel}`).set(runner.auth).send({ carbohydrate_g: 30 });
    const read = await request(app).get(`/api/runs/${runId}/fuel-taken`).set(coach.auth);
    expect(read.status).toBe(200);
    expect(read.body.fuel_taken.entries[0].carbohydrate_g).toBe(25);
    expect((await request(app).get(`/api/runs/${runId}/fuel-taken`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).put(`/api/runs/${runId}/fuel-taken`).set(coach.auth).send({ entries: [] })).status).toBe(403);
    expect(await count('fuel_taken')).toBe(1);
  });

  it("ticks off planned bottle drinks: each carries its share of the bottle's mix in the hour it was drunk", async () => {
    const { app, runner, gel, runId } = await setUp();
    const plan = (await request(app).get(`/api/runs/${runId}/fuel-taken`).set(runner.auth)).body.planned_vs_taken;
    const planId = (await db('fuel_plans').where({ id: plan.fuel_plan_id }).first())!.plan_id as string;
    // Bottle A: 500 ml with two gels (50 g carbohydrate, 100 mg sodium); 250 ml at 0:30 and at 1:10.
    const saved = await request(app)
      .put(`/api/plans/${planId}/fuel-plan`)
      .set(runner.auth)
      .send({
        body_mass_kg: 70,
        easy_pace_s_per_km: EIGHT_PER_MILE,
        expected_duration_s: 5400,
        bottles: [{ id: 'A', volume_ml: 500, contents: [{ item_id: gel, servings: 2 }] }],
        intakes: [{ bottle: 'A', ml: 250, when: { type: 'at_times', at_s: [1800, 4200] } }],
      });
    expect(saved.status).toBe(200);

    const res = await request(app)
      .put(`/api/runs/${runId}/fuel-taken`)
      .set(runner.auth)
      .send({
        entries: [
          { kind: 'drink', bottle: 'A', fluid_ml: 250, time_s: 1800 },
          // Only half of the second drink went down.
          { kind: 'drink', bottle: 'A', fluid_ml: 125, time_s: 4300 },
        ],
      });
    expect(res.status).toBe(200);
    expect(res.body.fuel_taken.entries[1]).toMatchObject({
      kind: 'drink',
      bottle: 'A',
      name: 'bottle A',
      fluid_ml: 125,
      carbohydrate_g: 12.5,
      sodium_mg: 25,
    });
    const hours = res.body.planned_vs_taken.hours.map(
      (h: { planned: { carbohydrate_g: number; fluid_ml: number }; taken: { carbohydrate_g: number; fluid_ml: number } }) => [
        h.planned.fluid_ml,
        h.taken.fluid_ml,
        h.planned.carbohydrate_g,
        h.taken.carbohydrate_g,
      ],
    );
    expect(hours).toEqual([
      [250, 250, 25, 25],
      [250, 125, 25, 12.5],
    ]);
    // Fluid and sodium numbers keep their cautions.
    expect(res.body.cautions.map((c: { topic: string }) => c.topic)).toEqual(['fluid', 'sodium']);
  });

  it('refuses a drink from a bottle the fuel plan does not have, and stores nothing', async () => {
    const { app, runner, runId } = await setUp();
    const res = await request(app)
      .put(`/api/runs/${runId}/fuel-taken`)
      .set(runner.auth)
      .send({ entries: [{ kind: 'drink', bottle: 'A', fluid_ml: 200, time_s: 600 }] });
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([
      { field: 'entries.0.bottle', message: "There is no bottle with this name in the run's fuel plan." },
    ]);
    expect(await count('fuel_taken')).toBe(0);
  });

  it.each([
    [{ entries: [{ kind: 'drink', bottle: 'A', fluid_ml: 0 }] }, 'entries.0.fluid_ml'],
    [{ entries: [{ kind: 'item', item_id: '7a4a1f5e-2f0b-4e4c-8d7e-3c1f9b0a6d21', servings: 1 }] }, 'entries.0.item_id'],
    [{ entries: [{ kind: 'water', fluid_ml: -100 }] }, 'entries.0.fluid_ml'],
    [{ entries: [], stomach: 6 }, 'stomach'],
  ])('refuses fuel taken %j and stores nothing', async (body, field) => {
    const { app, runner, runId } = await setUp();
    const res = await request(app).put(`/api/runs/${runId}/fuel-taken`).set(runner.auth).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(await count('fuel_taken')).toBe(0);
  });

  it('records a check-in; cold-water immersion comes with its caution; coaches read it', async () => {
    const { app, runner, coach, otherCoach, runId } = await setUp();
    expect((await request(app).get(`/api/runs/${runId}/checkin`).set(runner.auth)).body).toEqual({ checkin: null, cautions: [] });
    const res = await request(app)
      .put(`/api/runs/${runId}/checkin`)
      .set(runner.auth)
      .send({
        sleep_hours: 7.5,
        soreness: 2,
        mood: 4,
        walking_minutes: 20,
        mobility_minutes: 10,
        cold_water: { water_temp_c: 8, minutes: 10 },
      });
    expect(res.status).toBe(200);
    expect(res.body.checkin).toMatchObject({ sleep_hours: 7.5, soreness: 2, mood: 4, walking_minutes: 20, mobility_minutes: 10 });
    expect(res.body.checkin.cold_water).toEqual({
      water_temp_c: 8,
      minutes: 10,
      notes: ['Colder than the 10–15 °C the pooled studies used.'],
    });
    expect(res.body.cautions).toHaveLength(1);
    expect(res.body.cautions[0]).toMatchObject({ topic: 'cold water' });
    expect(res.body.cautions[0].source).toContain('Machado et al. 2016');
    expect(res.body.cautions[0].last_word).toMatch(/physician/);

    const read = await request(app).get(`/api/runs/${runId}/checkin`).set(coach.auth);
    expect(read.status).toBe(200);
    expect(read.body.checkin.mood).toBe(4);
    expect((await request(app).get(`/api/runs/${runId}/checkin`).set(otherCoach.auth)).status).toBe(404);
    expect((await request(app).put(`/api/runs/${runId}/checkin`).set(coach.auth).send({ mood: 1 })).status).toBe(403);

    const plain = await request(app).put(`/api/runs/${runId}/checkin`).set(runner.auth).send({ mood: 5 });
    expect(plain.body.checkin.cold_water).toBeNull();
    expect(plain.body.cautions).toEqual([]);
  });

  it.each([
    [{ cold_water: { water_temp_c: 50, minutes: 10 } }, 'cold_water.water_temp_c'],
    [{ cold_water: { water_temp_c: 12, minutes: 90 } }, 'cold_water.minutes'],
    [{ soreness: 7 }, 'soreness'],
  ])('refuses a check-in %j and stores nothing', async (body, field) => {
    const { app, runner, runId } = await setUp();
    const res = await request(app).put(`/api/runs/${runId}/checkin`).set(runner.auth).send(body);
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { field: string }) => d.field)).toContain(field);
    expect(await count('run_checkins')).toBe(0);
  });
});
