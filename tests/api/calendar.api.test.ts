import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import ical from 'node-ical';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

// The calendar feed (issue 15), read by an independent iCalendar parser (node-ical), not by our writer.

type App = ReturnType<typeof createApp>;

function freshApp(): App {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-calendar-'));
  return createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
}

async function person(app: App, role: 'runner' | 'coach', name: string) {
  const { user, password } = await createUser({ role, name });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { id: user.id, auth: { Authorization: `Bearer ${token}` } };
}

/** The feed's path (the URL's path part) and its events, parsed by node-ical. */
async function readFeed(app: App, url: string) {
  const res = await request(app).get(new URL(url).pathname);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/^text\/calendar/);
  const parsed = ical.sync.parseICS(res.text);
  return Object.values(parsed).filter((c): c is ical.VEvent => c?.type === 'VEVENT');
}

const ymd = (d: Date) =>
  `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
// Days counted from one instant read once: a test that runs across midnight (UTC) still sends and expects the same
// dates, all well inside the feed's window (90 days back, 366 ahead).
const STARTED_AT = Date.now();
const inDays = (n: number) => new Date(STARTED_AT + n * 86_400_000).toISOString().slice(0, 10);

describe('POST /api/me/calendar and GET <feed url>', () => {
  it('one all-day event per session, with a UID that stays when the session is edited or moved, SEQUENCE bumped', async () => {
    const app = freshApp();
    const runner = await person(app, 'runner', 'Ivy Runner');
    const a = (
      await request(app)
        .post('/api/plans')
        .set(runner.auth)
        .send({ date: inDays(3), title: 'Tempo', text: '2 mi easy, 3 mi @ 6:50/mi' })
    ).body.plan.id as string;
    await request(app)
      .post('/api/plans')
      .set(runner.auth)
      .send({ date: inDays(5), text: '10 mi easy' });
    const created = await request(app).post('/api/me/calendar').set(runner.auth);
    expect(created.status).toBe(201);
    expect(created.body.url).toMatch(/\/api\/calendar\/cal_[A-Za-z0-9_-]{43}\.ics$/);

    const before = await readFeed(app, created.body.url);
    expect(before).toHaveLength(2);
    const tempo = before.find((e) => e.summary === 'Tempo')!;
    expect(tempo.uid).toBe(`${a}@pacewright.invalid`);
    expect(tempo.datetype).toBe('date');
    expect(ymd(tempo.start)).toBe(inDays(3));
    expect(String(tempo.description)).toContain('2 mi easy, 3 mi @ 6:50/mi');
    // node-ical gives URL as a value with parameters; its text is the link back to the session's week.
    expect(JSON.stringify(tempo.url)).toContain('/plan?week=');

    await request(app)
      .patch(`/api/plans/${a}`)
      .set(runner.auth)
      .send({ date: inDays(4), title: 'Tempo moved' });
    const after = await readFeed(app, created.body.url);
    expect(after).toHaveLength(2);
    const moved = after.find((e) => e.uid === tempo.uid)!;
    expect(moved.summary).toBe('Tempo moved');
    expect(ymd(moved.start)).toBe(inDays(4));
    expect(Number(moved.sequence)).toBe(Number(tempo.sequence ?? 0) + 1);
    expect(moved.lastmodified!.getTime()).toBeGreaterThanOrEqual(tempo.lastmodified!.getTime());
  });

  it('replacing the address stops the old one (404), turning it off stops the new one; made-up addresses 404', async () => {
    const app = freshApp();
    const runner = await person(app, 'runner', 'Ivy Runner');
    const status = async () => (await request(app).get('/api/me/calendar').set(runner.auth)).body as unknown;
    expect(await status()).toEqual({ on: false, since: null });
    const first = (await request(app).post('/api/me/calendar').set(runner.auth)).body.url as string;
    const second = (await request(app).post('/api/me/calendar').set(runner.auth)).body.url as string;
    expect((await request(app).get(new URL(first).pathname)).status).toBe(404);
    expect((await request(app).get(new URL(second).pathname)).status).toBe(200);
    // The status says on and since when, never the address (it is shown once, when made).
    const on = (await request(app).get('/api/me/calendar').set(runner.auth)).text;
    expect(JSON.parse(on)).toEqual({ on: true, since: expect.stringMatching(/^\d{4}-\d{2}-\d{2}T/) });
    expect(on).not.toContain('cal_');
    expect((await request(app).delete('/api/me/calendar').set(runner.auth)).status).toBe(204);
    expect(await status()).toEqual({ on: false, since: null });
    expect((await request(app).get(new URL(second).pathname)).status).toBe(404);
    expect((await request(app).get(`/api/calendar/cal_${'A'.repeat(43)}.ics`)).status).toBe(404);
    expect((await request(app).get('/api/calendar/not-a-token')).status).toBe(404);
    expect(Number((await db('calendar_feeds').count({ n: '*' }).first())!.n)).toBe(0);
  });

  it('a coach’s feed holds the squad’s sessions named by runner, and a runner who left drops out', async () => {
    const app = freshApp();
    const coach = await person(app, 'coach', 'Dana Coach');
    const runner = await person(app, 'runner', 'Ivy Runner');
    const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Harbor' })).body.squad.id as string;
    await db('squad_members').insert({ squad_id: squad, runner_id: runner.id });
    await request(app)
      .post('/api/plans')
      .set(coach.auth)
      .send({ runner_id: runner.id, date: inDays(2), title: 'Long run', text: '16 mi easy' });
    await request(app)
      .post('/api/plans')
      .set(coach.auth)
      .send({ date: inDays(2), title: 'Own jog', text: '4 mi easy' });
    const url = (await request(app).post('/api/me/calendar').set(coach.auth)).body.url as string;
    const events = await readFeed(app, url);
    expect(events.map((e) => String(e.summary)).sort()).toEqual(['Ivy Runner: Long run', 'Own jog']);
    await db('squad_members').where({ runner_id: runner.id }).delete();
    expect((await readFeed(app, url)).map((e) => String(e.summary))).toEqual(['Own jog']);
  });
});
