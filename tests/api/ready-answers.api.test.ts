/**
 * Ready answers (issue 19, server/features/week-cache/README.md "Ready answers"): a runner's own runs list and
 * run page are serialized once and kept while their input counter is unchanged. A change made behind the
 * counter's back (straight in the database) proves an answer was kept; each change through the app must show
 * in the next answer, for the runner signed in by token and by cookie; a coach's reads are built each time.
 * The week review is kept per reader (runner or coach) and must change with each input of its answer in turn.
 */
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import type { RunnerWeek } from '../../shared/weeks/week-answer.ts';
import { createUser } from '../support/factories.ts';
import { freshApp, person } from '../support/test-world.ts';

function easyRun(date: string, km: number): Buffer {
  const run = generateLakeRun({
    start_t: Date.parse(`${date}T06:00:00Z`),
    phases: [{ kind: 'run', duration_s: (km * 1000) / 3, speed_mps: 3 }],
    seed: km,
    sample_s: 5,
  });
  return Buffer.from(writeGpx(`Easy ${date}`, [run.points]));
}

describe('ready answers of the runs list and the run page', { timeout: 60_000 }, () => {
  it('keeps a runner’s own answers until one of their inputs changes through the app', async () => {
    const app = freshApp('ready-answers');
    const { user, password } = await createUser({ role: 'runner', name: 'Rhea Ready' });
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    const runner = { id: user.id, auth: { Authorization: `Bearer ${token}` } };
    const browser = request.agent(app);
    expect((await browser.post('/api/auth/login').send({ email: user.email, password })).status).toBe(200);
    const coach = await person(app, 'coach', 'Coach Ready');
    const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Ready squad' })).body.squad.id as string;
    await db('squad_members').insert({ squad_id: squad, runner_id: runner.id });

    const upload = async (date: string, km: number) => {
      const res = await request(app).post('/api/runs').set(runner.auth).attach('files', easyRun(date, km), `${date}.gpx`);
      expect(res.status).toBe(201);
      return res.body.imported[0].id as string;
    };
    const first = await upload('2026-11-30', 6);
    await upload('2026-12-01', 7);

    const list = async (as: 'token' | 'cookie' | 'coach' = 'token') => {
      const res =
        as === 'cookie'
          ? await browser.get('/api/runs?sort=date&order=asc')
          : as === 'coach'
            ? await request(app).get(`/api/runs?sort=date&order=asc&runner_id=${runner.id}`).set(coach.auth)
            : await request(app).get('/api/runs?sort=date&order=asc').set(runner.auth);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^application\/json/);
      return res.body as { total: number; runs: Array<{ id: string; name: string; kind: string }> };
    };
    const page = async (id: string, as: 'token' | 'cookie' | 'coach' = 'token') => {
      const res =
        as === 'cookie'
          ? await browser.get(`/api/runs/${id}`)
          : await request(app)
              .get(`/api/runs/${id}`)
              .set(as === 'coach' ? coach.auth : runner.auth);
      return { status: res.status, body: res.body as { name: string; kind: string } };
    };

    // Built once, then kept: a name changed in the database alone does not show to the runner…
    expect((await list()).runs[0]!.name).toBe('Easy 2026-11-30');
    expect((await list('cookie')).runs[0]!.name).toBe('Easy 2026-11-30');
    expect((await page(first)).body.name).toBe('Easy 2026-11-30');
    expect((await page(first, 'cookie')).body.name).toBe('Easy 2026-11-30');
    await db('runs').where({ id: first }).update({ name: 'Changed behind the counter' });
    expect((await list()).runs[0]!.name).toBe('Easy 2026-11-30');
    expect((await list('cookie')).runs[0]!.name).toBe('Easy 2026-11-30');
    expect((await page(first)).body.name).toBe('Easy 2026-11-30');
    expect((await page(first, 'cookie')).body.name).toBe('Easy 2026-11-30');
    // …while the coach's reads (checked and built each time) see the database as it is.
    expect((await list('coach')).runs[0]!.name).toBe('Changed behind the counter');
    expect((await page(first, 'coach')).body.name).toBe('Changed behind the counter');

    // Each change through the app shows in the very next answer, by token and by cookie.
    const changes: Array<[string, () => Promise<unknown>, () => Promise<void>]> = [
      [
        'a rename',
        () => request(app).patch(`/api/runs/${first}`).set(runner.auth).send({ name: 'Monday loop' }).expect(200),
        async () => {
          for (const as of ['token', 'cookie'] as const) {
            expect((await list(as)).runs[0]!.name, as).toBe('Monday loop');
            expect((await page(first, as)).body.name, as).toBe('Monday loop');
          }
        },
      ],
      [
        'a kind changed',
        () => request(app).patch(`/api/runs/${first}`).set(runner.auth).send({ kind: 'hike' }).expect(200),
        async () => {
          for (const as of ['token', 'cookie'] as const) {
            expect((await list(as)).runs[0]!.kind, as).toBe('hike');
            expect((await page(first, as)).body.kind, as).toBe('hike');
          }
        },
      ],
      [
        'an upload',
        () => upload('2026-12-02', 8),
        async () => {
          expect((await list()).total).toBe(3);
          expect((await list('cookie')).total).toBe(3);
        },
      ],
      [
        'a run deleted',
        () => request(app).delete(`/api/runs/${first}`).set(runner.auth).expect(204),
        async () => {
          for (const as of ['token', 'cookie'] as const) {
            expect((await list(as)).total, as).toBe(2);
            expect((await page(first, as)).status, as).toBe(404);
          }
        },
      ],
    ];
    for (const [what, change, check] of changes) {
      // Both answers are kept before the change (read twice: the second is the kept one).
      for (let k = 0; k < 2; k++) {
        await list();
        await list('cookie');
        await page(first);
        await page(first, 'cookie');
      }
      await change();
      await check().catch((err: unknown) => {
        throw new Error(`after ${what}: ${(err as Error).message}`);
      });
    }

    // Another runner's writes leave this runner's kept answers alone (their own counter did not move).
    await db('runs').where({ user_id: runner.id }).update({ name: 'Changed behind the counter again' });
    const other = await person(app, 'runner', 'Other Ready');
    await request(app).post('/api/runs').set(other.auth).attach('files', easyRun('2026-12-03', 5), 'other.gpx').expect(201);
    expect((await list()).runs.map((r) => r.name)).not.toContain('Changed behind the counter again');
  });
});

describe('the ready answer of the week review', { timeout: 60_000 }, () => {
  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-12-03T12:00:00Z'), shouldAdvanceTime: true });
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  it('is kept per reader and changes with every input: the runner’s counter, read markers, unit, date, zone and access', async () => {
    const WEEK = '2026-11-30'; // Monday; "today" is Thursday 3 Dec 2026
    const app = freshApp('ready-week');
    const runner = await person(app, 'runner', 'Wren Ready');
    const coach = await person(app, 'coach', 'Coach Weekly');
    const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Weekly squad' })).body.squad.id as string;
    await db('squad_members').insert({ squad_id: squad, runner_id: runner.id });
    const uploaded = await request(app).post('/api/runs').set(runner.auth).attach('files', easyRun(WEEK, 6), `${WEEK}.gpx`);
    expect(uploaded.status).toBe(201);
    const run = uploaded.body.imported[0].id as string;
    // A long run planned for Tuesday and not run: its flag names the distance in the reader's unit.
    await request(app).post('/api/plans').set(runner.auth).send({ date: '2026-12-01', text: '20 km easy' }).expect(201);

    const weekOf = async (who: { auth: Record<string, string> }, start = WEEK) => {
      const res = await request(app).get(`/api/runners/${runner.id}/week?start=${start}`).set(who.auth);
      return { status: res.status, body: res.body as RunnerWeek };
    };
    const counter = async () =>
      (await db('week_input_counters').where({ runner_id: runner.id }).first<{ counter: string } | undefined>())?.counter ?? '0';
    const runName = (week: RunnerWeek) => week.days[0]!.runs[0]!.name;

    // Built once per reader, then kept: a name changed in the database alone shows to neither.
    for (const who of [runner, coach]) {
      expect(runName((await weekOf(who)).body)).toBe(`Easy ${WEEK}`);
    }
    await db('runs').where({ id: run }).update({ name: 'Changed behind the counter' });
    for (const who of [runner, coach]) {
      expect(runName((await weekOf(who)).body)).toBe(`Easy ${WEEK}`);
    }

    // The runner's counter: a rename through the app shows to both readers.
    await request(app).patch(`/api/runs/${run}`).set(runner.auth).send({ name: 'Monday loop' }).expect(200);
    for (const who of [runner, coach]) expect(runName((await weekOf(who)).body)).toBe('Monday loop');

    // Read markers, the reader's own: the coach's note is unread for the runner, never for its author…
    const note = (await request(app).post(`/api/runs/${run}/notes`).set(coach.auth).send({ text: 'Smooth.' }).expect(201)).body
      .note.id as string;
    expect((await weekOf(runner)).body.unread_notes).toBe(1);
    expect((await weekOf(runner)).body.days[0]!.runs[0]!.notes[0]!.unread).toBe(true);
    expect((await weekOf(coach)).body.unread_notes).toBe(0);
    // …and opening it changes no counter, yet the runner's next answer shows it read.
    const before = await counter();
    await request(app).post(`/api/notes/${note}/read`).set(runner.auth).expect(204);
    expect(await counter()).toBe(before);
    const read = (await weekOf(runner)).body;
    expect(read.unread_notes).toBe(0);
    expect(read.days[0]!.runs[0]!.notes[0]!.unread).toBe(false);
    // Served kept: the token query and one for the access check, counter and read markers; nothing of the week.
    const sql: string[] = [];
    const listen = (q: { sql: string }) => sql.push(q.sql);
    db.on('query', listen);
    try {
      expect((await weekOf(runner)).body).toEqual(read);
    } finally {
      db.off('query', listen);
    }
    expect(sql).toHaveLength(2);
    expect(sql[1]).toMatch(/note_reads/);

    // The reader's unit, from their own row (changed in the database alone: no counter moves).
    const flag = (week: RunnerWeek) => week.flags.map((f) => f.message).join(' ');
    expect(flag((await weekOf(coach)).body)).toMatch(/20(\.0)? km/);
    await db('users').where({ id: coach.id }).update({ unit: 'mi' });
    expect(await counter()).toBe(before);
    expect(flag((await weekOf(coach)).body)).toMatch(/12\.4 mi/);
    expect(flag((await weekOf(runner)).body)).toMatch(/20(\.0)? km/);

    // The runner's local date: their zone changed in the database alone moves "today"…
    expect((await weekOf(coach)).body.today).toBe('2026-12-03');
    await db('users').where({ id: runner.id }).update({ time_zone: 'Pacific/Kiritimati' }); // UTC+14: already Friday
    expect((await weekOf(coach)).body.today).toBe('2026-12-04');
    // …and so does the clock: the next week without any write.
    vi.setSystemTime(new Date('2026-12-07T12:00:00Z'));
    expect((await weekOf(coach)).body.today).toBe('2026-12-08');
    expect((await weekOf(coach)).body.start).toBe(WEEK);
    expect((await weekOf(coach, '2026-12-08')).body.start).toBe('2026-12-07');

    // Access is checked on every request: a coach no longer coaching the runner gets nothing kept.
    await db('squad_members').where({ squad_id: squad, runner_id: runner.id }).delete();
    expect((await weekOf(coach)).status).toBe(404);
    const stranger = await person(app, 'coach', 'Coach Stranger');
    expect((await weekOf(stranger)).status).toBe(404);
    expect((await weekOf(runner)).status).toBe(200);
  });
});
