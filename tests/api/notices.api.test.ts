import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { startImportWorker, stopImportWorker } from '../../server/features/history/import-queue.ts';
import type { MailCatcher } from '../../server/features/mail/mail-catcher.ts';
import { sendDueNotices } from '../../server/features/notices/notices.service.ts';
import { signUnsubscribeToken } from '../../server/features/notices/unsubscribe-token.ts';
import { db } from '../../server/lib/db.ts';
import type { Mailer } from '../../server/lib/mailer.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { NOTE_BATCH_SECONDS, UPLOAD_QUIET_SECONDS } from '../../shared/notices/batching.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { startTestMail } from '../support/mail.ts';
import { testConfig } from '../support/test-app.ts';
import { buildZip } from '../support/zip-builder.ts';

// Every e-mail here travels the real path: nodemailer → SMTP → the mail catcher → dev_outbox.
let catcher: MailCatcher;
let mailer: Mailer;
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-notices-'));
const config = testConfig({ publicUrl: 'http://pacewright.test', dataDir });
const store = createFsStore(dataDir);
let app: ReturnType<typeof createApp>;

beforeAll(async () => {
  ({ catcher, mailer } = await startTestMail());
  app = createApp({ config, store, mailer });
});
afterAll(async () => catcher.close());

interface CaughtMail {
  to: string;
  subject: string;
  text: string;
  headers: Record<string, string>;
}
const outbox = async () => (await request(app).get('/api/dev/outbox')).body.messages as CaughtMail[];
const mailTo = async (email: string) => (await outbox()).filter((m) => m.to === email);
/** Drives the batch sweep directly at a moment `seconds` from now, as the server's timer would. */
const sweepIn = (seconds: number) => sendDueNotices({ mailer, config }, new Date(Date.now() + seconds * 1000));

/** Each test imports generated runs; on a loaded machine that alone can pass the default 5 s. */
const IMPORTS_TAKE_TIME = { timeout: 30_000 };

const BASE_T = Date.UTC(2026, 10, 2, 6, 30);
/** A small generated run (distinct bytes per index), `index` days after BASE_T. */
function gpxFile(index: number): { name: string; data: Buffer } {
  const run = generateLakeRun({
    start_t: BASE_T + index * 86_400_000,
    phases: [{ kind: 'run', duration_s: 600, speed_mps: 3.2 }],
    sample_s: 5,
  });
  return { name: `run-${index}.gpx`, data: Buffer.from(writeGpx(`Lake loop ${index}`, [run.points])) };
}

/** A coach (reading miles) with a squad holding one runner, both signed in by bearer token. */
async function squadOfOne() {
  const coach = await createUser({ role: 'coach', name: 'Coach Dana', email: `coach-${Math.random()}@example.test` });
  await db('users').where({ id: coach.user.id }).update({ unit: 'mi' });
  const runner = await createUser({ name: 'Rhea Runner', email: `runner-${Math.random()}@example.test` });
  const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Harbor Line Runners' }).returning('id');
  await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });
  const token = async (u: typeof coach) =>
    (await request(app).post('/api/auth/token').send({ email: u.user.email, password: u.password })).body.token as string;
  return {
    coach: { ...coach, auth: { Authorization: `Bearer ${await token(coach)}` } },
    runner: { ...runner, auth: { Authorization: `Bearer ${await token(runner)}` } },
    squadId: squad!.id as string,
  };
}

async function upload(auth: Record<string, string>, files: Array<{ name: string; data: Buffer }>) {
  const req = request(app).post('/api/runs').set(auth);
  for (const f of files) req.attach('files', f.data, f.name);
  const res = await req;
  expect(res.status).toBe(201);
  return res.body.imported as Array<{ id: string }>;
}

describe('upload notices: one e-mail per upload batch', IMPORTS_TAKE_TIME, () => {
  it('10 files in one request → one notice to the coach, listing the 10 runs in miles, sent once the batch is quiet', async () => {
    const { coach, runner } = await squadOfOne();
    await upload(
      runner.auth,
      Array.from({ length: 10 }, (_, i) => gpxFile(i)),
    );
    expect(await sweepIn(UPLOAD_QUIET_SECONDS - 5)).toMatchObject({ sent: 0 });
    expect(await mailTo(coach.user.email)).toEqual([]);

    expect(await sweepIn(UPLOAD_QUIET_SECONDS + 1)).toMatchObject({ sent: 1 });
    const mails = await mailTo(coach.user.email);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toBe('Rhea Runner uploaded 10 runs');
    expect(mails[0]!.text.match(/Lake loop \d/g)).toHaveLength(10);
    // 600 s at 3.2 m/s ≈ 1920 m ≈ 1.19 mi in the coach's unit (1 mi = 1609.344 m, the international mile).
    expect(mails[0]!.text).toMatch(/· 1\.\d\d mi/);
    expect(mails[0]!.text).not.toMatch(/ km\b/);
    // Nothing is left to send.
    expect(await sweepIn(3600)).toMatchObject({ sent: 0 });
  });

  it('10 requests of one file within a minute → one notice listing all 10', async () => {
    const { coach, runner } = await squadOfOne();
    for (let i = 0; i < 10; i++) await upload(runner.auth, [gpxFile(20 + i)]);
    expect(await sweepIn(UPLOAD_QUIET_SECONDS + 1)).toMatchObject({ sent: 1 });
    const mails = await mailTo(coach.user.email);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toBe('Rhea Runner uploaded 10 runs');
    expect(mails[0]!.text.match(/Lake loop \d+/g)).toHaveLength(10);
  });

  it('an archive imported in the background → one notice for the whole archive', async () => {
    const { coach, runner } = await squadOfOne();
    await startImportWorker(store, { dataDir, maxEntryBytes: config.uploadMaxFileBytes, pollingIntervalSeconds: 0.5 });
    try {
      const zip = buildZip([0, 1, 2].map((i) => gpxFile(40 + i)));
      const started = await request(app).post('/api/imports').set(runner.auth).attach('file', zip, 'history.zip');
      expect(started.status).toBe(202);
      // Wait on the import's own state, not a fixed time.
      await expect
        .poll(async () => (await request(app).get(`/api/imports/${started.body.import.id}`).set(runner.auth)).body.status, {
          timeout: 30_000,
        })
        .toBe('done');
    } finally {
      await stopImportWorker();
    }
    await sweepIn(UPLOAD_QUIET_SECONDS + 1);
    const mails = await mailTo(coach.user.email);
    expect(mails.map((m) => m.subject)).toEqual(['Rhea Runner uploaded 3 runs']);
  }, 60_000);

  it('a coach who switched upload notices off gets none; a runner outside any squad notifies nobody', async () => {
    const { coach, runner } = await squadOfOne();
    const off = await request(app).patch('/api/me/notices').set(coach.auth).send({ import: false });
    expect(off.status).toBe(200);
    expect(off.body.switches).toMatchObject({ import: false, note: true });
    await upload(runner.auth, [gpxFile(60)]);
    const loner = await createUser();
    const lonerToken = (await request(app).post('/api/auth/token').send({ email: loner.user.email, password: loner.password }))
      .body.token as string;
    await upload({ Authorization: `Bearer ${lonerToken}` }, [gpxFile(61)]);
    expect(await sweepIn(UPLOAD_QUIET_SECONDS + 1)).toMatchObject({ sent: 0, dropped: 1 });
    expect(await outbox()).toEqual([]);
  });
});

describe('note notices: at most one e-mail per person per 15 minutes', IMPORTS_TAKE_TIME, () => {
  it('5 notes within 15 minutes → one e-mail listing the 5; the other side hears nothing of its own notes', async () => {
    const { coach, runner } = await squadOfOne();
    const [run] = await upload(runner.auth, [gpxFile(70)]);
    for (let i = 1; i <= 3; i++) {
      const res = await request(app)
        .post(`/api/runs/${run!.id}/notes`)
        .set(runner.auth)
        .send({ text: `Run note number ${i}` });
      expect(res.status).toBe(201);
    }
    for (let i = 4; i <= 5; i++) {
      const res = await request(app)
        .post(`/api/runners/${runner.user.id}/weeks/2026-11-02/notes`)
        .set(runner.auth)
        .send({ text: `Week note number ${i}` });
      expect(res.status).toBe(201);
    }
    await sweepIn(NOTE_BATCH_SECONDS - 30);
    expect((await mailTo(coach.user.email)).filter((m) => /note/.test(m.subject))).toEqual([]);

    await sweepIn(NOTE_BATCH_SECONDS + 1);
    const notes = (await mailTo(coach.user.email)).filter((m) => /note/.test(m.subject));
    expect(notes).toHaveLength(1);
    expect(notes[0]!.subject).toBe('5 new notes from Rhea Runner');
    for (let i = 1; i <= 5; i++) expect(notes[0]!.text).toContain(`note number ${i}`);
    expect(notes[0]!.text).toContain('Rhea Runner on Rhea Runner’s run “Lake loop 70”');
    expect(await mailTo(runner.user.email)).toEqual([]);
  });

  it('a coach’s reply reaches the runner; a note already opened in the app is not e-mailed', async () => {
    const { coach, runner } = await squadOfOne();
    const [run] = await upload(runner.auth, [gpxFile(80)]);
    const seen = await request(app).post(`/api/runs/${run!.id}/notes`).set(coach.auth).send({ text: 'Opened before the e-mail' });
    await request(app).post(`/api/runs/${run!.id}/notes`).set(coach.auth).send({ text: 'Easy tomorrow, please.' });
    expect((await request(app).post(`/api/notes/${seen.body.note.id}/read`).set(runner.auth)).status).toBe(204);
    await sweepIn(NOTE_BATCH_SECONDS + 1);
    const mails = await mailTo(runner.user.email);
    expect(mails.map((m) => m.subject)).toEqual(['A new note from Coach Dana']);
    expect(mails[0]!.text).toContain('Coach Dana on your run “Lake loop 80”');
    expect(mails[0]!.text).toContain('Easy tomorrow, please.');
    expect(mails[0]!.text).not.toContain('Opened before the e-mail');
  });
});

describe('pain and soreness alerts: at once, worded with care', IMPORTS_TAKE_TIME, () => {
  it('a check-in with soreness 4 e-mails the coach at once (no sweep), once; defers to a physician or physiotherapist', async () => {
    const { coach, runner } = await squadOfOne();
    const [run] = await upload(runner.auth, [gpxFile(90)]);
    expect((await request(app).put(`/api/runs/${run!.id}/checkin`).set(runner.auth).send({ soreness: 3 })).status).toBe(200);
    expect(await mailTo(coach.user.email)).toEqual([]);

    expect((await request(app).put(`/api/runs/${run!.id}/checkin`).set(runner.auth).send({ soreness: 4 })).status).toBe(200);
    const [alert] = await mailTo(coach.user.email);
    expect(alert!.subject).toBe('Rhea Runner reported soreness 4 of 5');
    expect(alert!.text).toContain('not an assessment');
    expect(alert!.text).toMatch(/physician or physiotherapist/);
    expect(alert!.text).not.toMatch(/injur|strain|fracture|tendin/i);
    expect(alert!.headers['list-unsubscribe']).toMatch(/^<http:\/\/pacewright\.test\/api\/notices\/unsubscribe\/uns_/);

    // Editing the same check-in (still high) does not alert again.
    await request(app).put(`/api/runs/${run!.id}/checkin`).set(runner.auth).send({ soreness: 5 });
    expect(await mailTo(coach.user.email)).toHaveLength(1);
  });

  it('a note the runner flags as about illness alerts at once and is not listed again in the notes e-mail', async () => {
    const { coach, runner } = await squadOfOne();
    const [run] = await upload(runner.auth, [gpxFile(95)]);
    await request(app)
      .post(`/api/runs/${run!.id}/notes`)
      .set(runner.auth)
      .send({ text: 'Felt feverish after.', concern: 'illness' });
    await request(app).post(`/api/runs/${run!.id}/notes`).set(runner.auth).send({ text: 'Shoes felt fine.' });
    const alerts = await mailTo(coach.user.email);
    expect(alerts.map((m) => m.subject)).toEqual(['Rhea Runner wrote a note about illness']);
    expect(alerts[0]!.text).toContain('a physician is the one to say');

    await sweepIn(NOTE_BATCH_SECONDS + 1);
    const notes = (await mailTo(coach.user.email)).filter((m) => m.subject.startsWith('A new note'));
    expect(notes).toHaveLength(1);
    expect(notes[0]!.text).toContain('Shoes felt fine.');
    expect(notes[0]!.text).not.toContain('feverish');
  });
});

describe('a runner leaving a squad', IMPORTS_TAKE_TIME, () => {
  it('tells the coach at once; a coach removing a runner is not told about their own action', async () => {
    const { coach, runner, squadId } = await squadOfOne();
    const left = await request(app).delete(`/api/squads/${squadId}/members/${runner.user.id}`).set(runner.auth);
    expect(left.status).toBe(204);
    const mails = await mailTo(coach.user.email);
    expect(mails.map((m) => m.subject)).toEqual(['Rhea Runner left Harbor Line Runners']);
    expect(mails[0]!.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');

    const other = await createUser({ name: 'Otto Other' });
    await db('squad_members').insert({ squad_id: squadId, runner_id: other.user.id });
    expect((await request(app).delete(`/api/squads/${squadId}/members/${other.user.id}`).set(coach.auth)).status).toBe(204);
    expect(await mailTo(coach.user.email)).toHaveLength(1);
  });
});

describe('POST /api/notices/unsubscribe/:token (RFC 8058 one-click)', IMPORTS_TAKE_TIME, () => {
  /** The real message's List-Unsubscribe address, as a mail program reads it. */
  async function leaveNoticeLink() {
    const squad = await squadOfOne();
    await request(app).delete(`/api/squads/${squad.squadId}/members/${squad.runner.user.id}`).set(squad.runner.auth);
    const [mail] = await mailTo(squad.coach.user.email);
    const header = mail!.headers['list-unsubscribe']!;
    const url = new URL(/^<(.+)>$/.exec(header)![1]!);
    return { ...squad, path: url.pathname, header };
  }
  const switchesOf = async (id: string) =>
    db('users')
      .where({ id })
      .first(
        'notify_on_import',
        'notify_on_note',
        'notify_on_pain_alert',
        'notify_on_squad_leave',
        'notify_on_digest',
        'notify_on_plan_change',
      );

  it('the List-Unsubscribe-Post request, without sign-in, turns off exactly that kind', async () => {
    const { coach, path: unsubscribePath } = await leaveNoticeLink();
    expect(unsubscribePath).toMatch(/^\/api\/notices\/unsubscribe\/uns_[A-Za-z0-9_-]+$/);
    const before = await request(app).get(unsubscribePath);
    expect(before.body).toEqual({ kind: 'squad_leave', label: 'A runner leaves one of my squads', on: true });

    // What a mail program sends: form-encoded List-Unsubscribe=One-Click, no cookies, no credentials.
    const res = await request(app).post(unsubscribePath).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ kind: 'squad_leave', label: 'A runner leaves one of my squads', on: false });
    expect(await switchesOf(coach.user.id)).toEqual({
      notify_on_import: true,
      notify_on_note: true,
      notify_on_pain_alert: true,
      notify_on_squad_leave: false,
      notify_on_digest: true,
      notify_on_plan_change: true,
    });
    // A second POST (mail programs may retry) changes nothing and says it is off.
    const again = await request(app).post(unsubscribePath).type('form').send('List-Unsubscribe=One-Click');
    expect(again.status).toBe(200);
    expect(again.body.on).toBe(false);
  });

  it('multipart/form-data (also allowed by RFC 8058) works too; a POST without the one-click pair changes nothing', async () => {
    const { coach, path: unsubscribePath } = await leaveNoticeLink();
    const empty = await request(app).post(unsubscribePath).type('form').send('');
    expect(empty.status).toBe(400);
    expect(empty.body.error).toBe('Send List-Unsubscribe=One-Click to turn this notice off.');
    expect((await switchesOf(coach.user.id))!.notify_on_squad_leave).toBe(true);
    const res = await request(app).post(unsubscribePath).field('List-Unsubscribe', 'One-Click');
    expect(res.status).toBe(200);
    expect((await switchesOf(coach.user.id))!.notify_on_squad_leave).toBe(false);
  });

  it('a forged link, a link replayed after the switch was turned back on, and a deleted account: a clear answer and no change', async () => {
    const { coach, path: unsubscribePath } = await leaveNoticeLink();
    const token = unsubscribePath.split('/').pop()!;
    // Forged: the kind changed in the payload, or signed with another secret.
    const forgedKind = signUnsubscribeToken('another-secret-that-is-long-enough-0123456789', {
      userId: coach.user.id,
      kind: 'import',
      issuedAt: new Date(),
    });
    for (const bad of [`${token.slice(0, -2)}AA`, forgedKind, 'uns_short']) {
      const res = await request(app).post(`/api/notices/unsubscribe/${bad}`).type('form').send('List-Unsubscribe=One-Click');
      expect(res.status).toBe(400);
      expect(res.body.code).toBe('unsubscribe-link-invalid');
    }
    expect(await switchesOf(coach.user.id)).toMatchObject({ notify_on_squad_leave: true, notify_on_import: true });

    // Off by the link, then back on in the profile: the old link no longer switches it off.
    expect((await request(app).post(unsubscribePath).type('form').send('List-Unsubscribe=One-Click')).status).toBe(200);
    const on = await request(app).patch('/api/me/notices').set(coach.auth).send({ squad_leave: true });
    expect(on.body.switches.squad_leave).toBe(true);
    const replay = await request(app).post(unsubscribePath).type('form').send('List-Unsubscribe=One-Click');
    expect(replay.status).toBe(409);
    expect(replay.body.error).toMatch(/back on after this e-mail was sent/);
    expect((await switchesOf(coach.user.id))!.notify_on_squad_leave).toBe(true);
    // The page's read of the same link says so before any click, with the POST's status and sentence.
    const read = await request(app).get(unsubscribePath);
    expect(read.status).toBe(409);
    expect(read.body).toMatchObject({ code: 'unsubscribe-link-outdated', error: replay.body.error });
    expect((await switchesOf(coach.user.id))!.notify_on_squad_leave).toBe(true);

    await db('users').where({ id: coach.user.id }).delete();
    const gone = await request(app).post(unsubscribePath).type('form').send('List-Unsubscribe=One-Click');
    expect(gone.status).toBe(410);
    expect(gone.body.error).toMatch(/deleted/);
    const readGone = await request(app).get(unsubscribePath);
    expect(readGone.status).toBe(410);
    expect(readGone.body).toMatchObject({ code: 'unsubscribe-account-gone', error: gone.body.error });
  });

  it('with every notice switched off, a password reset the user asks for still arrives', async () => {
    const { coach } = await squadOfOne();
    const off = await request(app)
      .patch('/api/me/notices')
      .set(coach.auth)
      .send({ import: false, note: false, pain_alert: false, squad_leave: false, digest: false, plan_change: false });
    expect(Object.values(off.body.switches)).toEqual([false, false, false, false, false, false]);
    expect((await request(app).post('/api/auth/password-reset').send({ email: coach.user.email })).status).toBe(202);
    await expect.poll(async () => (await mailTo(coach.user.email)).length).toBe(1);
    expect((await mailTo(coach.user.email))[0]!.headers['list-unsubscribe']).toBeUndefined();
  });
});

describe('PATCH /api/me/notices', IMPORTS_TAKE_TIME, () => {
  it('refuses an unknown kind or a non-boolean with a sentence and changes nothing', async () => {
    const { coach } = await squadOfOne();
    const unknown = await request(app).patch('/api/me/notices').set(coach.auth).send({ likes: false });
    expect(unknown.status).toBe(400);
    const wrong = await request(app).patch('/api/me/notices').set(coach.auth).send({ note: 'no' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error).toBe('Choose on (true) or off (false).');
    expect((await request(app).get('/api/me/notices').set(coach.auth)).body.switches.note).toBe(true);
  });
});

describe('the weekly digest', IMPORTS_TAKE_TIME, () => {
  it('carries the one-click unsubscribe headers for the digest kind', async () => {
    const { coach, squadId } = await squadOfOne();
    const sent = await request(app).post(`/api/squads/${squadId}/digest`).set(coach.auth).send({});
    expect(sent.status).toBe(200);
    const [digest] = await mailTo(coach.user.email);
    expect(digest!.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
    const unsubscribePath = new URL(/^<(.+)>$/.exec(digest!.headers['list-unsubscribe']!)![1]!).pathname;
    expect((await request(app).get(unsubscribePath)).body).toMatchObject({ kind: 'digest', on: true });
  });
});
