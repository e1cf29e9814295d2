/**
 * Assembled weeks are cached per runner and invalidated exactly (issue 19, server/features/week-cache/README.md).
 * A stored week is marked (its runner's name replaced in the stored body): an answer carrying the mark was
 * served from the cache, one without it was built again. Each input of a week is changed in turn through the
 * app, and the next week review (the runner's) and squad overview (the coach's) must be built again and show it.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { forgetKeptWeeks } from '../../server/features/week-cache/index.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import type { RunnerWeek } from '../../shared/weeks/week-answer.ts';
import type { SquadOverviewRow } from '../../shared/weeks/squad-overview.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';
import { freshApp, person } from '../support/test-world.ts';

const MARK = 'Served from the cache';
const WEEK = '2026-11-30'; // Monday; "today" is fixed at Thursday 3 Dec 2026

function easyRun(date: string, km: number): Buffer {
  const run = generateLakeRun({
    start_t: Date.parse(`${date}T06:00:00Z`),
    phases: [{ kind: 'run', duration_s: (km * 1000) / 3, speed_mps: 3 }],
    seed: km,
    sample_s: 5,
  });
  return Buffer.from(writeGpx(`Easy ${date}`, [run.points]));
}

describe('assembled weeks in the cache', { timeout: 60_000 }, () => {
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-12-03T12:00:00Z'), shouldAdvanceTime: true });
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('serves an unchanged week from the cache and builds it again after each of its inputs changes', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-week-cache-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const person = async (role: 'runner' | 'coach', name: string) => {
      const { user, password } = await createUser({ role, name });
      const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
      return { user, auth: { Authorization: `Bearer ${token}` } };
    };
    const runner = await person('runner', 'Tess Cached');
    const coach = await person('coach', 'Coach Cached');
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Cache squad' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });

    const uploadRun = async (date: string, km: number) => {
      const res = await request(app).post('/api/runs').set(runner.auth).attach('files', easyRun(date, km), `${date}.gpx`);
      expect(res.status).toBe(201);
      return res.body.imported[0].id as string;
    };
    const firstRun = await uploadRun('2026-11-30', 6);
    const plan = await request(app).post('/api/plans').set(runner.auth).send({ date: '2026-12-01', text: '5 km easy' });
    expect(plan.status).toBe(201);

    const review = async (): Promise<RunnerWeek> => {
      const res = await request(app).get(`/api/runners/${runner.user.id}/week?start=${WEEK}`).set(runner.auth);
      expect(res.status).toBe(200);
      return res.body;
    };
    const overviewRow = async (): Promise<SquadOverviewRow> => {
      const res = await request(app).get(`/api/squads/${squad!.id}/overview?week=${WEEK}`).set(coach.auth);
      expect(res.status).toBe(200);
      expect(res.body.rows).toHaveLength(1);
      return res.body.rows[0];
    };
    /** Marks every stored week of the runner; returns how many there were. */
    const mark = async () =>
      db('assembled_weeks')
        .where({ runner_id: runner.user.id })
        .update({ body: db.raw("jsonb_set(body, '{runner,name}', ?::jsonb)", [JSON.stringify(MARK)]) });
    const expectFromCache = async () => {
      expect((await review()).runner.name).toBe(MARK);
      expect((await overviewRow()).runner.name).toBe(MARK);
    };
    const expectBuiltAgain = async (what: string) => {
      const week = await review();
      expect(week.runner.name, `week review after ${what}`).toBe('Tess Cached');
      const row = await overviewRow();
      expect(row.runner.name, `squad overview after ${what}`).toBe('Tess Cached');
      return { week, row };
    };

    // Built once (and stored: the review and the overview, each for its reader), then served from the cache.
    await expectBuiltAgain('the first read');
    expect(await mark()).toBe(2);
    // This process keeps the weeks it built in memory too: the mark in the database does not show…
    expect((await review()).runner.name).toBe('Tess Cached');
    expect((await overviewRow()).runner.name).toBe('Tess Cached');
    // …until they are forgotten; then the next answers come from the stored weeks (and are kept again).
    forgetKeptWeeks();
    await expectFromCache();
    await expectFromCache();

    const changes: Array<[string, () => Promise<unknown>, ((built: { week: RunnerWeek; row: SquadOverviewRow }) => void)?]> = [
      ['an upload', () => uploadRun('2026-12-02', 8), ({ row }) => expect(row.run_distance_m).toBeGreaterThan(13_900)],
      [
        'a run renamed',
        () => request(app).patch(`/api/runs/${firstRun}`).set(runner.auth).send({ name: 'Monday loop' }).expect(200),
        ({ week }) => expect(week.days[0]!.runs[0]!.name).toBe('Monday loop'),
      ],
      [
        'a plan added',
        () => request(app).post('/api/plans').set(runner.auth).send({ date: '2026-12-04', text: '10 km easy' }).expect(201),
        ({ row }) => expect(row.sessions_planned).toBe(2),
      ],
      [
        'a run linked to no plan',
        () => request(app).put(`/api/runs/${firstRun}/plan`).set(runner.auth).send({ plan_id: null }).expect(204),
      ],
      [
        'a run note',
        () => request(app).post(`/api/runs/${firstRun}/notes`).set(coach.auth).send({ text: 'Nice and steady.' }).expect(201),
        ({ week }) => expect(week.days[0]!.runs[0]!.notes.map((n) => n.text)).toEqual(['Nice and steady.']),
      ],
      [
        'a week note',
        () =>
          request(app)
            .post(`/api/runners/${runner.user.id}/weeks/${WEEK}/notes`)
            .set(coach.auth)
            .send({ text: 'Good week.' })
            .expect(201),
        ({ week }) => expect(week.notes.map((n) => n.text)).toEqual(['Good week.']),
      ],
      [
        'a check-in',
        () =>
          request(app).put(`/api/runs/${firstRun}/checkin`).set(runner.auth).send({ soreness: 4, notes: 'calves' }).expect(200),
        ({ row }) => expect(row.high_soreness).toBe(1),
      ],
      [
        'fuel taken',
        () =>
          request(app)
            .put(`/api/runs/${firstRun}/fuel-taken`)
            .set(runner.auth)
            .send({ entries: [{ kind: 'water', fluid_ml: 300, time_s: null }] })
            .expect(200),
        ({ week }) => expect(week.days[0]!.runs[0]!.fuel_taken?.fluid_ml).toBe(300),
      ],
      [
        'the pace tolerance',
        () =>
          request(app)
            .put(`/api/runners/${runner.user.id}/pace-tolerance`)
            .set(coach.auth)
            .send({ pace_tolerance: 0.03 })
            .expect(200),
      ],
      [
        'the goal race',
        () =>
          request(app)
            .put('/api/me/goal-race')
            .set(runner.auth)
            .send({ name: 'Spring marathon', date: '2027-04-18', distance_m: 42_195, goal_time_s: 3 * 3600 + 1800 })
            .expect(200),
      ],
      [
        'a race result',
        () =>
          request(app)
            .post('/api/me/race-results')
            .set(runner.auth)
            .send({ date: '2026-10-01', distance_m: 10_000, time_s: 2700 })
            .expect(201),
      ],
      [
        'the profile time zone',
        () => request(app).patch('/api/me').set(runner.auth).send({ time_zone: 'Pacific/Auckland' }).expect(200),
        ({ week }) => expect(week.today).toBe('2026-12-04'),
      ],
      [
        'the coach marking the week reviewed',
        () =>
          request(app)
            .put(`/api/runners/${runner.user.id}/weeks/${WEEK}/review`)
            .set(coach.auth)
            .send({ reviewed: true })
            .expect(204),
        ({ row }) => expect(row.reviewed).toBe(true),
      ],
      [
        'a day marked',
        () =>
          request(app).put('/api/days/2026-12-03').set(coach.auth).send({ kind: 'rest', runner_id: runner.user.id }).expect(200),
      ],
      [
        'a plan deleted',
        () =>
          request(app)
            .delete(`/api/plans/${(plan.body.plan as { id: string }).id}`)
            .set(runner.auth)
            .expect(204),
        ({ row }) => expect(row.sessions_planned).toBe(1),
      ],
      [
        'a run deleted',
        () => request(app).delete(`/api/runs/${firstRun}`).set(runner.auth).expect(204),
        ({ week }) => expect(week.days[0]!.runs).toEqual([]),
      ],
      // Not writes of the app: a stored week from another version of the code, or built on another local date.
      [
        'a code version change',
        // The weeks kept in memory were built by this process's own code on today's date: forgotten with the change.
        () =>
          db('assembled_weeks').where({ runner_id: runner.user.id }).update({ code_version: 'older code' }).then(forgetKeptWeeks),
      ],
      [
        'a new day',
        () => db('assembled_weeks').where({ runner_id: runner.user.id }).update({ today: '2026-12-02' }).then(forgetKeptWeeks),
      ],
    ];
    for (const [what, change, check] of changes) {
      expect(await mark(), `weeks stored before ${what}`).toBe(2);
      // Read from the stored weeks and kept in memory, marked: a change must end both.
      forgetKeptWeeks();
      await expectFromCache();
      await change();
      const built = await expectBuiltAgain(what);
      check?.(built);
    }
    // And once built again, served from the cache until the next change.
    await mark();
    forgetKeptWeeks();
    await expectFromCache();
  });

  it('an overview reads the counters and stored weeks in one query and builds only the weeks it lacks', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-week-cache-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const { user: coachUser, password } = await createUser({ role: 'coach', name: 'Coach Many' });
    const coachAuth = {
      Authorization: `Bearer ${(await request(app).post('/api/auth/token').send({ email: coachUser.email, password })).body.token as string}`,
    };
    const runners = await Promise.all([1, 2, 3, 4].map((n) => createUser({ role: 'runner', name: `Runner ${n}` })));
    const [squad] = await db('squads').insert({ coach_id: coachUser.id, name: 'Many' }).returning('id');
    await db('squad_members').insert(runners.map((r) => ({ squad_id: squad!.id, runner_id: r.user.id })));
    const sql: string[] = [];
    const listen = (q: { sql: string }) => sql.push(q.sql);
    const overview = async () => {
      sql.length = 0;
      db.on('query', listen);
      try {
        const res = await request(app).get(`/api/squads/${squad!.id}/overview?week=${WEEK}`).set(coachAuth);
        expect(res.status).toBe(200);
        return res.body;
      } finally {
        db.off('query', listen);
      }
    };
    // The token query reads the caller's own counter too (ready answers, week-cache README): not the overview's reads.
    const counted = (pattern: RegExp) => sql.filter((s) => pattern.test(s) && !/api_tokens/.test(s)).length;
    await overview();
    expect(await db('assembled_weeks').count({ n: '*' }).first()).toEqual({ n: '4' });
    // All four stored (and kept by this process): one query for the runners and their counters, none of the
    // week's own tables read, no stored week read again.
    await overview();
    expect(counted(/week_input_counters/)).toBe(1);
    expect(counted(/assembled_weeks/)).toBe(0);
    expect(counted(/from "runs"|from runs/)).toBe(0);
    expect(counted(/session_plans/)).toBe(0);
    // One runner's plan changes: only that week is built again (the plans read once, for that runner).
    await db.transaction(async (trx) => {
      await trx('session_plans').insert({
        runner_id: runners[2]!.user.id,
        author_id: runners[2]!.user.id,
        date: '2026-12-01',
        title: 'Easy',
        notes: '',
        items: JSON.stringify([]),
      });
      await trx.raw(
        'insert into week_input_counters (runner_id, counter) values (?, 1) on conflict (runner_id) do update set counter = week_input_counters.counter + 1',
        [runners[2]!.user.id],
      );
    });
    const body = await overview();
    // The runners with their counters, then the one changed runner's counter and stored week (it has none).
    expect(counted(/week_input_counters/)).toBe(2);
    expect(sql.find((s) => /assembled_weeks/.test(s) && !/insert/.test(s))).toMatch(/unnest/);
    expect(counted(/session_plans/)).toBeGreaterThan(0);
    const planQuery = sql.find((s) => /from "session_plans"/.test(s) && /"session_plans"\."runner_id" in \(\$\d+\)/.test(s));
    expect(planQuery, 'plans read for the one lacking runner only').toBeDefined();
    expect(body.rows.find((r: { runner: { id: string } }) => r.runner.id === runners[2]!.user.id).sessions_planned).toBe(1);
  });

  it('deleting an account removes the runner’s stored weeks, and the coach’s overview no longer shows them', async () => {
    const app = freshApp('week-cache-delete');
    const { user: leaver, password } = await createUser({ role: 'runner', name: 'Leaving Runner' });
    const leaverAuth = {
      Authorization: `Bearer ${(await request(app).post('/api/auth/token').send({ email: leaver.email, password })).body.token as string}`,
    };
    const stayer = await person(app, 'runner', 'Staying Runner');
    const coach = await person(app, 'coach', 'Coach Keeps');
    const [squad] = await db('squads').insert({ coach_id: coach.id, name: 'Deletion squad' }).returning('id');
    await db('squad_members').insert([
      { squad_id: squad!.id, runner_id: leaver.id },
      { squad_id: squad!.id, runner_id: stayer.id },
    ]);
    const upload = await request(app).post('/api/runs').set(leaverAuth).attach('files', easyRun('2026-12-01', 5), 'leaver.gpx');
    expect(upload.status).toBe(201);
    const overview = async () => {
      const res = await request(app).get(`/api/squads/${squad!.id}/overview?week=${WEEK}`).set(coach.auth);
      expect(res.status).toBe(200);
      return (res.body.rows as SquadOverviewRow[]).map((r) => r.runner.name).sort();
    };
    const storedOf = async (runnerId: string) =>
      Number((await db('assembled_weeks').where({ runner_id: runnerId }).count({ n: '*' }).first())!.n);

    expect(await overview()).toEqual(['Leaving Runner', 'Staying Runner']);
    expect((await request(app).get(`/api/runners/${leaver.id}/week?start=${WEEK}`).set(leaverAuth)).status).toBe(200);
    expect(await storedOf(leaver.id)).toBe(2); // the coach's overview row and the runner's own review
    expect(await storedOf(stayer.id)).toBe(1);

    const res = await request(app).delete('/api/me').set(leaverAuth).send({ password });
    expect(res.status).toBe(204);

    expect(await storedOf(leaver.id)).toBe(0);
    expect(await db('week_input_counters').where({ runner_id: leaver.id }).first()).toBeUndefined();
    const naming = await db('assembled_weeks').whereRaw('strpos(body::text, ?) > 0', [leaver.id]).count({ n: '*' }).first();
    expect(Number(naming!.n), 'no stored week names the deleted runner').toBe(0);
    expect(await overview()).toEqual(['Staying Runner']);
    expect(await storedOf(stayer.id)).toBe(1);
  });

  it('deleting a coach’s account removes the stored weeks that carry their words', async () => {
    const app = freshApp('week-cache-delete-coach');
    const runner = await person(app, 'runner', 'Runner Stays');
    const { user: coachUser, password } = await createUser({ role: 'coach', name: 'Coach Leaves' });
    const coachAuth = {
      Authorization: `Bearer ${(await request(app).post('/api/auth/token').send({ email: coachUser.email, password })).body.token as string}`,
    };
    const [squad] = await db('squads').insert({ coach_id: coachUser.id, name: 'Leaving squad' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.id });
    const note = await request(app)
      .post(`/api/runners/${runner.id}/weeks/${WEEK}/notes`)
      .set(coachAuth)
      .send({ text: 'Keep it easy this week.' });
    expect(note.status).toBe(201);
    const review = async () => {
      const res = await request(app).get(`/api/runners/${runner.id}/week?start=${WEEK}`).set(runner.auth);
      expect(res.status).toBe(200);
      return res.body as RunnerWeek;
    };
    expect((await review()).notes.map((n) => n.text)).toEqual(['Keep it easy this week.']);
    expect(Number((await db('assembled_weeks').where({ runner_id: runner.id }).count({ n: '*' }).first())!.n)).toBe(1);

    expect((await request(app).delete('/api/me').set(coachAuth).send({ password })).status).toBe(204);

    expect(Number((await db('assembled_weeks').where({ runner_id: runner.id }).count({ n: '*' }).first())!.n)).toBe(0);
    expect((await review()).notes).toEqual([]);
  });
});
