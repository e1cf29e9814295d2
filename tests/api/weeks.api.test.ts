import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, onTestFinished, vi } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import type { MailCatcher } from '../../server/features/mail/mail-catcher.ts';
import type { Mailer } from '../../server/lib/mailer.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { UnreadAnswerSchema } from '../../shared/notes/schemas.ts';
import { RunnerWeekSchema, WeekDayRunSchema } from '../../shared/weeks/week-answer.ts';
import { DigestReceiptSchema, SquadOverviewRowSchema, SquadOverviewSchema } from '../../shared/weeks/squad-overview.ts';
import { z } from 'zod';
import { startTestMail } from '../support/mail.ts';
import { testConfig } from '../support/test-app.ts';

let catcher: MailCatcher;
let mailer: Mailer;
beforeAll(async () => ({ catcher, mailer } = await startTestMail()));
afterAll(async () => catcher.close());

type App = ReturnType<typeof createApp>;
function freshApp(): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-weeks-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer });
}

async function person(app: App, role: 'runner' | 'coach', name: string) {
  const { user, password } = await createUser({ role, name });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { user, auth: { Authorization: `Bearer ${token}` } };
}

/** An easy run of `km` kilometres at 3 m/s on a date (06:00 UTC; test runners live in UTC). */
function easyRun(date: string, km: number): Buffer {
  const phases: Phase[] = [{ kind: 'run', duration_s: (km * 1000) / 3, speed_mps: 3 }];
  const run = generateLakeRun({ start_t: Date.parse(`${date}T06:00:00Z`), phases, seed: km, sample_s: 5 });
  return Buffer.from(writeGpx(`Easy ${date}`, [run.points]));
}

async function upload(app: App, auth: Record<string, string>, date: string, km: number) {
  const res = await request(app).post('/api/runs').set(auth).attach('files', easyRun(date, km), `${date}.gpx`);
  expect(res.status).toBe(201);
}

// Each test imports several generated runs; on a loaded machine that takes longer than the default 5 s.
describe('GET /api/runners/:id/week', { timeout: 30_000 }, () => {
  it('sets plans and runs side by side with totals, the long run, missed sessions and a volume-jump flag', async () => {
    // "Missed" means planned before today: fix today at Tue 1 Dec 2026, after the week, whatever the real date.
    vi.useFakeTimers({ toFake: ['Date'], now: new Date('2026-12-01T12:00:00Z'), shouldAdvanceTime: true });
    onTestFinished(() => void vi.useRealTimers());
    const app = freshApp();
    const runner = await person(app, 'runner', 'Wren Walker');
    // Previous week (Mon 16 Nov 2026): 10 km. This week (Mon 23 Nov): 5 + 7 = 12 km, up 20 %.
    await upload(app, runner.auth, '2026-11-17', 10);
    await upload(app, runner.auth, '2026-11-24', 5);
    await upload(app, runner.auth, '2026-11-28', 7);
    await request(app).post('/api/plans').set(runner.auth).send({ date: '2026-11-24', text: '5 km easy' });
    await request(app).post('/api/plans').set(runner.auth).send({ date: '2026-11-26', text: '6 km easy' }); // not run: missed
    await request(app).post('/api/plans').set(runner.auth).send({ date: '2026-11-28', text: '7 km easy' });

    const res = await request(app).get(`/api/runners/${runner.user.id}/week?start=2026-11-25`).set(runner.auth);
    expect(res.status).toBe(200);
    const week = res.body;
    expect(week).toMatchObject({ runner_id: runner.user.id, start: '2026-11-23' }); // any date → its Monday
    expect(week.days.map((d: { date: string }) => d.date)).toEqual([
      '2026-11-23',
      '2026-11-24',
      '2026-11-25',
      '2026-11-26',
      '2026-11-27',
      '2026-11-28',
      '2026-11-29',
    ]);
    expect(week.days[1].runs).toHaveLength(1);
    expect(week.days[1].runs[0].session_verdict).toBe('as planned');
    expect(week.totals.planned_distance_m).toBe(18000);
    expect(week.totals.run_distance_m / 1000).toBeCloseTo(12, 0);
    expect(week.totals.sessions).toMatchObject({ as_planned: 2, missed: 1 });
    expect(week.long_run.distance_m / 1000).toBeCloseTo(7, 0);
    expect(week.flags.map((f: { code: string }) => f.code)).toContain('volume-jump');
    const jump = week.flags.find((f: { code: string }) => f.code === 'volume-jump');
    expect(jump.message).toMatch(/coach/i);
    expect(week.trend).toHaveLength(12);
    expect(week.trend.at(-1).run_distance_m / 1000).toBeCloseTo(12, 0);

    const csv = await request(app).get(`/api/runners/${runner.user.id}/week.csv?start=2026-11-23`).set(runner.auth);
    expect(csv.text.split('\r\n')[0]).toBe(
      'date,entry,title,planned_distance_m,planned_duration_s,run_distance_m,moving_s,verdict,trimp',
    );
    expect(csv.text.trim().split('\r\n')).toHaveLength(1 + 3 + 2);
  });

  it('notes on a week are seen by both sides; the coach marks the week reviewed', async () => {
    const app = freshApp();
    const runner = await person(app, 'runner', 'Wren Walker');
    const coach = await person(app, 'coach', 'Cass Coach');
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'S' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });
    await request(app)
      .post(`/api/runners/${runner.user.id}/weeks/2026-11-23/notes`)
      .set(coach.auth)
      .send({ text: 'Nice and steady.' });
    await request(app)
      .post(`/api/runners/${runner.user.id}/weeks/2026-11-23/notes`)
      .set(runner.auth)
      .send({ text: 'Legs felt fresh.' });
    expect(
      (await request(app).put(`/api/runners/${runner.user.id}/weeks/2026-11-23/review`).set(coach.auth).send({ reviewed: true }))
        .status,
    ).toBe(204);
    const seenByRunner = (await request(app).get(`/api/runners/${runner.user.id}/week?start=2026-11-23`).set(runner.auth)).body;
    expect(seenByRunner.notes.map((n: { author: { name: string }; text: string }) => `${n.author.name}: ${n.text}`)).toEqual([
      'Cass Coach: Nice and steady.',
      'Wren Walker: Legs felt fresh.',
    ]);
    expect(seenByRunner.reviewed_by.map((r: { coach_name: string }) => r.coach_name)).toEqual(['Cass Coach']);
  });

  it('the coach sees what the runner took and how the run went', async () => {
    const app = freshApp();
    const runner = await person(app, 'runner', 'Wren Walker');
    const coach = await person(app, 'coach', 'Cass Coach');
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'S' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });
    await upload(app, runner.auth, '2026-11-24', 6);
    const runId = (await db('runs').first('id'))!.id as string;
    const taken = await request(app)
      .put(`/api/runs/${runId}/fuel-taken`)
      .set(runner.auth)
      .send({ entries: [{ kind: 'water', fluid_ml: 300, time_s: 1200 }], stomach: 4, energy: 3, notes: 'Fine.' });
    expect(taken.status).toBe(200);
    const checkin = await request(app)
      .put(`/api/runs/${runId}/checkin`)
      .set(runner.auth)
      .send({ sleep_hours: 7.5, soreness: 2, cold_water: { water_temp_c: 12, minutes: 10 } });
    expect(checkin.status).toBe(200);
    const week = (await request(app).get(`/api/runners/${runner.user.id}/week?start=2026-11-23`).set(coach.auth)).body;
    const run = week.days[1].runs[0];
    expect(run.fuel_taken).toEqual({
      entries: 1,
      carbohydrate_g: 0,
      fluid_ml: 300,
      sodium_mg: 0,
      caffeine_mg: 0,
      planned: null,
      stomach: 4,
      energy: 3,
      notes: 'Fine.',
    });
    expect(run.checkin).toMatchObject({ sleep_hours: 7.5, soreness: 2, cold_water_temp_c: 12, cold_water_minutes: 10 });
    // The answer is exactly the shared schema: no field is sent that the client type does not know.
    expect(RunnerWeekSchema.safeParse(week).success).toBe(true);
    expect(Object.keys(run).sort()).toEqual(Object.keys(WeekDayRunSchema.shape).sort());
    expect(Object.keys(week).sort()).toEqual(Object.keys(RunnerWeekSchema.shape).sort());
  });

  it('notes carry an unread marker for the other side until opened; the count follows', async () => {
    const app = freshApp();
    const runner = await person(app, 'runner', 'Wren Walker');
    const coach = await person(app, 'coach', 'Cass Coach');
    const stranger = await person(app, 'runner', 'Sol Stranger');
    // The runner's profile zone, which the screens read notes on (client/README.md, "Whose clock").
    await db('users').where({ id: runner.user.id }).update({ time_zone: 'America/Chicago' });
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'S' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });
    await upload(app, runner.auth, '2026-11-24', 6);
    const runId = (await db('runs').first('id'))!.id as string;
    const note = await request(app)
      .post(`/api/runs/${runId}/notes`)
      .set(runner.auth)
      .send({ text: 'Calf tight late on.', concern: 'pain' });
    expect(note.status).toBe(201);
    expect(note.body.note).toMatchObject({ concern: 'pain', unread: false });
    const coachConcern = await request(app)
      .post(`/api/runs/${runId}/notes`)
      .set(coach.auth)
      .send({ text: 'x', concern: 'illness' });
    expect(coachConcern.status).toBe(400);

    const unread = (await request(app).get('/api/me/unread').set(coach.auth)).body;
    expect(unread).toMatchObject({
      count: 1,
      items: [{ kind: 'run-note', id: note.body.note.id, run_id: runId, runner_time_zone: 'America/Chicago' }],
    });
    expect(UnreadAnswerSchema.strict().safeParse(unread).success).toBe(true);
    const runPage = (await request(app).get(`/api/runs/${runId}`).set(coach.auth)).body;
    expect(runPage.owner_time_zone).toBe('America/Chicago');
    expect((await request(app).get('/api/me/unread').set(runner.auth)).body.count).toBe(0);
    const week = (await request(app).get(`/api/runners/${runner.user.id}/week?start=2026-11-23`).set(coach.auth)).body;
    expect(week.time_zone).toBe('America/Chicago');
    expect(week.unread_notes).toBe(1);
    expect(week.days[1].unread_notes).toBe(1);
    expect(week.days[1].runs[0].notes[0]).toMatchObject({ text: 'Calf tight late on.', concern: 'pain', unread: true });

    // Someone who cannot read the note: a clear 404 and nothing changes.
    const foreign = await request(app).post(`/api/notes/${note.body.note.id}/read`).set(stranger.auth);
    expect(foreign.status).toBe(404);
    expect(foreign.body.error).toMatch(/no note with this id/);
    expect(await db('note_reads').count({ n: '*' }).first()).toMatchObject({ n: '0' });

    expect((await request(app).post(`/api/notes/${note.body.note.id}/read`).set(coach.auth)).status).toBe(204);
    expect((await request(app).get('/api/me/unread').set(coach.auth)).body).toEqual({ count: 0, items: [] });
    const notes = (await request(app).get(`/api/runs/${runId}/notes`).set(coach.auth)).body.notes;
    expect(notes[0].unread).toBe(false);
  });
});

describe('squad overview and weekly digest', { timeout: 30_000 }, () => {
  it('one row per runner; the digest e-mail lists each runner under the heading that is true, in the coach’s miles', async () => {
    const app = freshApp();
    const coach = await person(app, 'coach', 'Cass Coach');
    await db('users').where({ id: coach.user.id }).update({ unit: 'mi' });
    const steady = await person(app, 'runner', 'Sage Steady');
    const jumper = await person(app, 'runner', 'Jun Jumper');
    const absent = await person(app, 'runner', 'Ada Absent');
    const unplanned = await person(app, 'runner', 'Nia Noplan');
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Lakeside Harriers' }).returning('id');
    await db('squad_members').insert(
      [steady, jumper, absent, unplanned].map((p) => ({ squad_id: squad!.id, runner_id: p.user.id })),
    );
    for (const date of ['2026-11-24', '2026-11-25']) {
      expect((await request(app).post('/api/plans').set(steady.auth).send({ date, text: '45 min easy' })).status).toBe(201);
    }
    await upload(app, steady.auth, '2026-11-17', 8);
    await upload(app, steady.auth, '2026-11-18', 8);
    await upload(app, steady.auth, '2026-11-24', 8);
    await upload(app, steady.auth, '2026-11-25', 8);
    await upload(app, jumper.auth, '2026-11-17', 5);
    await upload(app, jumper.auth, '2026-11-24', 9);
    await upload(app, unplanned.auth, '2026-11-24', 24.3);
    // A runner on another clock than the coach's: the row says which, so "last upload" counts the runner's days.
    await db('users').where({ id: jumper.user.id }).update({ time_zone: 'America/Chicago' });

    const overview = await request(app).get(`/api/squads/${squad!.id}/overview?week=2026-11-23`).set(coach.auth);
    expect(overview.status).toBe(200);
    // The answer is exactly its declared schema: no key missing, none the schema does not name.
    SquadOverviewSchema.extend({ rows: z.array(SquadOverviewRowSchema.strict()) })
      .strict()
      .parse(overview.body);
    expect(overview.body.rows.map((r: { runner: { name: string } }) => r.runner.name)).toEqual([
      'Ada Absent',
      'Jun Jumper',
      'Nia Noplan',
      'Sage Steady',
    ]);
    expect(overview.body.rows[1].volume_12_weeks).toHaveLength(12);
    expect(overview.body.rows[1].time_zone).toBe('America/Chicago');
    expect(overview.body.rows[0].time_zone).toBe('UTC'); // the profile's default zone (users migration)
    // Time-based plans keep their time: 2 × 45 min, not "0.0 planned".
    expect(overview.body.rows[3]).toMatchObject({ planned_distance_m: 0, planned_duration_s: 5400, sessions_due: 2 });

    const digest = await request(app).post(`/api/squads/${squad!.id}/digest`).set(coach.auth).send({ week: '2026-11-23' });
    expect(digest.status).toBe(200);
    DigestReceiptSchema.strict().parse(digest.body);
    const [mail] = (await request(app).get('/api/dev/outbox')).body.messages;
    expect(mail.to).toBe(coach.user.email);
    expect(mail.subject).toBe('Lakeside Harriers: week of 2026-11-23');
    const section = (heading: string) => mail.text.split(`${heading} (`)[1]!.split('\n\n')[0]!;
    // Miles from the overview's metres (1 mi = 1609.344 m, the international mile).
    const mi = (name: string) =>
      (overview.body.rows.find((r: { runner: { name: string } }) => r.runner.name === name).run_distance_m / 1609.344).toFixed(1);
    expect(section('On plan')).toContain(`Sage Steady: ${mi('Sage Steady')} mi (`);
    expect(section('On plan')).toMatch(/h moving\) of 1:30 h planned, \d of 2 sessions due so far as planned/);
    // About 9 km against about 5 km the week before; the flag names the runner for the coach.
    expect(section('To look at')).toContain(`Jun Jumper: ${mi('Jun Jumper')} mi run, nothing planned`);
    expect(section('To look at')).toContain(`Jun Jumper ran ${mi('Jun Jumper')} mi this week`);
    expect(section('To look at')).not.toMatch(/\bYou ran\b|Your coach/);
    expect(section('No run uploaded this week')).toMatch(/Ada Absent/);
    expect(section('Running without a plan this week')).toContain(`Nia Noplan: ${mi('Nia Noplan')} mi run, nothing planned`);
    expect(section('On plan')).not.toMatch(/Jun|Ada|Nia/);
    expect(mail.text).not.toMatch(/\d km\b/);
    expect(mail.html).toMatch(/<h2[^>]*>No run uploaded this week \(1\)<\/h2>/);
  });
});
