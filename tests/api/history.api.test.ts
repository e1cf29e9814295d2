import { existsSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import yauzl from 'yauzl';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { startImportWorker, stopImportWorker } from '../../server/features/history/import-queue.ts';
import { IMPORT_QUEUE } from '../../server/features/history/imports.repository.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { pollUntil } from '../support/poll.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';
import { buildZip, type RawZipEntry } from '../support/zip-builder.ts';
import type { ImportProgress } from '../../shared/history/schemas.ts';

// One data folder, app and worker alike: the worker reads the archives the app stored.
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-history-'));
const config = testConfig({ dataDir });
const store = createFsStore(dataDir);
const app = createApp({ config, store, mailer: recordingMailer });
const workerOptions = { dataDir, maxEntryBytes: config.uploadMaxFileBytes, pollingIntervalSeconds: 0.5 };

beforeAll(async () => {
  await startImportWorker(store, workerOptions);
});

afterAll(async () => {
  await stopImportWorker();
});

const BASE_T = Date.UTC(2024, 2, 4, 6, 30);

/** A small generated run: `minutes` at 3.2 m/s sampled every 5 s, starting `index` days (and minutes) after BASE_T. */
function gpxFile(index: number, minutes = 10): { name: string; data: Buffer } {
  const start_t = BASE_T + index * 86_400_000 + index * 60_000;
  const run = generateLakeRun({ start_t, phases: [{ kind: 'run', duration_s: minutes * 60, speed_mps: 3.2 }], sample_s: 5 });
  const name = `run-${String(index).padStart(3, '0')}.gpx`;
  return { name, data: Buffer.from(writeGpx(`Lake loop ${index}`, [run.points])) };
}

const HISTORY_ZIP = buildZip(
  Array.from({ length: 200 }, (_, i) => gpxFile(i)).map((f) => ({ name: `history/${f.name}`, data: f.data })),
);

async function signedIn() {
  const { user, password } = await createUser();
  const res = await request(app).post('/api/auth/token').send({ email: user.email, password });
  return { user, password, auth: { Authorization: `Bearer ${res.body.token as string}` } };
}

function uploadZip(auth: Record<string, string>, zip: Buffer, name = 'history.zip') {
  return request(app).post('/api/imports').set(auth).attach('file', zip, name);
}

/** The import's answer, as the shared contract declares it (no copy of the type here). */
type Progress = ImportProgress;

async function progressOf(auth: Record<string, string>, id: string): Promise<Progress> {
  const res = await request(app).get(`/api/imports/${id}`).set(auth);
  expect(res.status).toBe(200);
  return res.body as Progress;
}

// Waits on the import's own progress; the bound only ends a hung import (200 files take 15–60 s on a busy machine).
function waitFor(auth: Record<string, string>, id: string, until: (p: Progress) => boolean, timeoutMs = 150_000) {
  return pollUntil(() => progressOf(auth, id), until, `import ${id}`, timeoutMs);
}

const finished = (p: Progress) => p.status === 'done' || p.status === 'failed';

async function count(table: string, where: Record<string, string> = {}) {
  const row = await db(table).where(where).count({ n: '*' }).first();
  return Number(row!.n);
}

function archivesWaiting(): string[] {
  const dir = path.join(dataDir, 'imports');
  return existsSync(dir) ? readdirSync(dir) : [];
}

function storedFilesOf(userId: string): string[] {
  const dir = path.join(dataDir, 'files', userId);
  return existsSync(dir) ? readdirSync(dir) : [];
}

function binary(res: request.Test) {
  return res.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });
}

async function unzip(zip: Buffer): Promise<Map<string, Buffer>> {
  const zipfile = await yauzl.fromBufferPromise(zip, { lazyEntries: true });
  const out = new Map<string, Buffer>();
  await new Promise<void>((resolve, reject) => {
    zipfile.on('entry', (entry: yauzl.Entry) => {
      zipfile.openReadStream(entry, (err, stream) => {
        if (err) return reject(err);
        const chunks: Buffer[] = [];
        stream.on('data', (c: Buffer) => chunks.push(c));
        stream.on('end', () => {
          out.set(entry.fileName, Buffer.concat(chunks));
          zipfile.readEntry();
        });
      });
    });
    zipfile.on('end', () => resolve());
    zipfile.on('error', reject);
    zipfile.readEntry();
  });
  return out;
}

describe('POST /api/imports', () => {
  it('imports a zip of 200 generated files completely, and the same zip again gives 200 duplicates', async () => {
    const { user, auth } = await signedIn();
    const res = await uploadZip(auth, HISTORY_ZIP);
    expect(res.status).toBe(202);
    const id = res.body.import.id as string;

    const progress = await waitFor(auth, id, finished);
    expect(progress).toMatchObject({ status: 'done', total: 200, done: 200, imported: 200, duplicates: 0, rejected: [] });
    expect(await count('runs', { user_id: user.id })).toBe(200);
    expect(storedFilesOf(user.id)).toHaveLength(200);
    expect(archivesWaiting()).toEqual([]);

    const again = await uploadZip(auth, HISTORY_ZIP, 'history-again.zip');
    expect(again.status).toBe(202);
    const second = await waitFor(auth, again.body.import.id as string, finished);
    expect(second).toMatchObject({ status: 'done', total: 200, done: 200, imported: 0, duplicates: 200, rejected: [] });
    expect(await count('runs', { user_id: user.id })).toBe(200);
  }, 330_000);

  it('when the worker is stopped mid-import and started again, it resumes and ends with exactly 200 runs', async () => {
    const { user, auth } = await signedIn();
    const res = await uploadZip(auth, HISTORY_ZIP);
    const id = res.body.import.id as string;
    await waitFor(auth, id, (p) => p.done >= 20);

    await stopImportWorker();
    const paused = await progressOf(auth, id);
    expect(paused.status).toBe('running');
    expect(paused.done).toBeLessThan(200);
    expect(await count('runs', { user_id: user.id })).toBe(paused.imported);
    // Nothing can move the import any more: no file of it is in a worker's hand and no queue job for it is active
    // (the stop waited for both), so the progress read again is the one read at the stop.
    expect(await count('import_files', { import_id: id, status: 'working' })).toBe(0);
    const activeJobs = await db('pgboss.job').where({ name: IMPORT_QUEUE, state: 'active' }).count({ n: '*' }).first();
    expect(Number(activeJobs!.n)).toBe(0);
    expect((await progressOf(auth, id)).done).toBe(paused.done);

    await startImportWorker(store, workerOptions);
    const progress = await waitFor(auth, id, finished);
    expect(progress).toMatchObject({ status: 'done', total: 200, done: 200, imported: 200, duplicates: 0 });
    expect(await count('runs', { user_id: user.id })).toBe(200);
    expect(await count('source_files', { user_id: user.id })).toBe(200);
    expect(await count('import_files', { import_id: id, status: 'imported' })).toBe(200);
  }, 330_000);

  it('GET /api/imports/:id of another user answers 404', async () => {
    const owner = await signedIn();
    const other = await signedIn();
    const res = await uploadZip(owner.auth, buildZip([gpxFile(1)]));
    const id = res.body.import.id as string;
    expect((await request(app).get(`/api/imports/${id}`).set(other.auth)).status).toBe(404);
    await waitFor(owner.auth, id, finished);
  });

  const GOOD = gpxFile(7);
  const refusals: Array<[string, () => Buffer, string, RegExp]> = [
    ['not a zip', () => GOOD.data, 'not-a-zip', /not a zip archive/],
    [
      'more than 5 000 entries',
      () => buildZip(Array.from({ length: 5001 }, (_, i) => ({ name: `n${i}.gpx`, data: Buffer.from('x'), store: true }))),
      'too-many-entries',
      /5001 entries; at most 5000/,
    ],
    [
      'a zip bomb by ratio',
      () => buildZip([GOOD, { name: 'bomb.gpx', data: Buffer.alloc(20 * 1024 * 1024, 0x20) }]),
      'zip-bomb',
      /"bomb\.gpx" is compressed more than 200 : 1/,
    ],
    ['an encrypted entry', () => buildZip([{ ...GOOD, encrypted: true }]), 'encrypted-archive', /protected by a password/],
    [
      'only a JPEG inside',
      () => buildZip([{ name: 'photo.jpg', data: Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46]) }]),
      'no-gps-files',
      /holds no GPS files/,
    ],
  ];

  it.each(refusals)(
    'when the archive is %s, responds 422 with its reason and keeps nothing',
    async (_label, zip, code, message) => {
      const { auth } = await signedIn();
      const res = await uploadZip(auth, zip());
      expect(res.status).toBe(422);
      expect(res.body.code).toBe(code);
      expect(res.body.error).toMatch(message);
      expect(res.body.error).toMatch(/^[A-Z"].*\.$/);
      expect(await count('imports')).toBe(0);
      expect(await count('import_files')).toBe(0);
      expect(await count('runs')).toBe(0);
      expect(await count('source_files')).toBe(0);
      expect(archivesWaiting()).toEqual([]);
    },
  );

  it('skips hostile entries (nested zip, ../ path, backslash, JPEG, a zip named .gpx, control characters in names) with their reasons and imports the rest', async () => {
    const { user, auth } = await signedIn();
    const inner = buildZip([gpxFile(2)]);
    const entries: RawZipEntry[] = [
      GOOD,
      { name: 'folder/', data: Buffer.alloc(0), store: true },
      { name: 'inner.zip', data: inner },
      { name: 'inner.gpx.gz.tar', data: inner },
      { name: '../evil.gpx', data: gpxFile(3).data },
      { name: '/etc/evil.gpx', data: gpxFile(4).data },
      { name: 'folder\\evil.gpx', data: gpxFile(5).data },
      { name: 'photo.jpg', data: Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 16]) },
      { name: 'sneaky.gpx', data: inner },
      { name: 'bell\u0007.gpx', data: gpxFile(6).data },
      { name: 'escape\u001b[31m.gpx', data: gpxFile(7).data },
    ];
    const res = await uploadZip(auth, buildZip(entries));
    expect(res.status).toBe(202);
    const progress = await waitFor(auth, res.body.import.id as string, finished);
    expect(progress).toMatchObject({ status: 'done', total: 10, done: 10, imported: 1, duplicates: 0 });
    const reasons = Object.fromEntries(progress.rejected.map((r) => [r.file, r.error]));
    expect(Object.keys(reasons).sort()).toEqual(
      [
        '../evil.gpx',
        '/etc/evil.gpx',
        'folder\\evil.gpx',
        'inner.gpx.gz.tar',
        'inner.zip',
        'photo.jpg',
        'sneaky.gpx',
        'bell?.gpx',
        'escape?[31m.gpx',
      ].sort(),
    );
    expect(reasons['inner.zip']).toMatch(/archive inside the archive/);
    expect(reasons['inner.gpx.gz.tar']).toMatch(/archive inside the archive/);
    expect(reasons['../evil.gpx']).toMatch(/climbs out of the archive/);
    expect(reasons['/etc/evil.gpx']).toMatch(/absolute path/);
    expect(reasons['folder\\evil.gpx']).toMatch(/backslash/);
    expect(reasons['photo.jpg']).toMatch(/not a GPS file/);
    expect(reasons['sneaky.gpx']).toMatch(/zip archive/);
    // Control characters in entry names (issue 13): skipped with a sentence, shown with "?" in their place.
    expect(reasons['bell?.gpx']).toMatch(/invisible control character/);
    expect(reasons['escape?[31m.gpx']).toMatch(/invisible control character/);
    expect(await count('runs', { user_id: user.id })).toBe(1);
    expect(await count('source_files', { user_id: user.id })).toBe(1);
    expect(storedFilesOf(user.id)).toHaveLength(1);
    expect(archivesWaiting()).toEqual([]);
  });

  it('without a signed-in user, responds 401 and writes nothing to disk', async () => {
    const res = await request(app).post('/api/imports').attach('file', HISTORY_ZIP, 'history.zip');
    expect(res.status).toBe(401);
    expect(archivesWaiting()).toEqual([]);
  });
});

describe('GET /api/me/export', () => {
  it('holds every original, runs.csv, per-unit splits matching each run’s splits CSV, plans, notes and profile; re-importing the originals gives the same splits', async () => {
    const { user, auth } = await signedIn();
    const uploads = [gpxFile(11, 40), gpxFile(12, 30), gpxFile(13, 25)];
    let upload = request(app).post('/api/runs').set(auth);
    for (const f of uploads) upload = upload.attach('files', f.data, f.name);
    expect((await upload).status).toBe(201);
    const runs = await db('runs').where({ user_id: user.id }).orderBy('started_at');
    await db('session_plans').insert({
      runner_id: user.id,
      author_id: user.id,
      date: '2024-03-20',
      title: 'Tempo',
      notes: '',
      items: '[]',
    });
    await db('run_notes').insert({ run_id: runs[0]!.id, author_id: user.id, text: 'Windy on the far shore.' });

    const res = await binary(request(app).get('/api/me/export').set(auth));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    const files = await unzip(res.body as Buffer);
    const names = [...files.keys()];
    for (const name of [
      'runs.csv',
      'splits-mi.csv',
      'splits-km.csv',
      'plans.json',
      'notes.json',
      'profile.json',
      'goal-race.json',
      'race-results.json',
    ]) {
      expect(names).toContain(name);
    }
    const originals = names.filter((n) => n.startsWith('originals/'));
    expect(originals).toHaveLength(3);
    for (const f of uploads) {
      expect(originals.some((n) => n.endsWith(f.name) && files.get(n)!.equals(f.data))).toBe(true);
    }
    const runsCsv = files.get('runs.csv')!.toString('utf8').trimEnd().split('\r\n');
    expect(runsCsv[0]).toMatch(/^run_id,name,local_date,local_time,time_zone,distance_m,elapsed_s,moving_s,/);
    expect(runsCsv.slice(1).map((l) => l.split(',')[0])).toEqual(runs.map((r) => r.id));
    expect(JSON.parse(files.get('plans.json')!.toString())).toHaveLength(1);
    expect(JSON.parse(files.get('notes.json')!.toString()).run_notes[0].text).toBe('Windy on the far shore.');
    expect(JSON.parse(files.get('profile.json')!.toString())).toMatchObject({ id: user.id, email: user.email });
    expect(files.get('profile.json')!.toString()).not.toMatch(/password/);

    const exportedSplits = async (unit: 'mi' | 'km', runId: string) =>
      files
        .get(`splits-${unit}.csv`)!
        .toString('utf8')
        .split('\r\n')
        .filter((l) => l.startsWith(`${runId},`))
        .map((l) => l.slice(runId.length + 1));
    const apiSplits = async (a: Record<string, string>, runId: string, unit: 'mi' | 'km') =>
      (await request(app).get(`/api/runs/${runId}/splits.csv?unit=${unit}`).set(a)).text.trimEnd().split('\r\n');
    for (const unit of ['mi', 'km'] as const) {
      const header = files.get(`splits-${unit}.csv`)!.toString('utf8').split('\r\n')[0]!;
      for (const run of runs) {
        const fromApi = await apiSplits(auth, run.id, unit);
        expect(header).toBe(`run_id,${fromApi[0]}`);
        expect(await exportedSplits(unit, run.id)).toEqual(fromApi.slice(1));
        expect(fromApi.length).toBeGreaterThan(2);
      }
    }

    // Round trip: the exported originals, zipped again, into a fresh account.
    const fresh = await signedIn();
    const again = await uploadZip(fresh.auth, buildZip(originals.map((n) => ({ name: n, data: files.get(n)! }))));
    expect(again.status).toBe(202);
    expect(await waitFor(fresh.auth, again.body.import.id as string, finished)).toMatchObject({ imported: 3 });
    const freshRuns = await db('runs').where({ user_id: fresh.user.id }).orderBy('started_at');
    expect(freshRuns).toHaveLength(3);
    for (let i = 0; i < 3; i++) {
      for (const unit of ['mi', 'km'] as const) {
        expect(await apiSplits(fresh.auth, freshRuns[i]!.id, unit)).toEqual(await apiSplits(auth, runs[i]!.id, unit));
      }
    }
  }, 30_000);
});

/** pg-boss rows (jobs and archived jobs) whose data names one of `importIds`. */
async function queueRowsNaming(importIds: string[]): Promise<number> {
  let n = 0;
  for (const table of ['pgboss.job', 'pgboss.archive']) {
    const { rows } = await db.raw<{ rows: Array<{ n: string }> }>(
      `select count(*) as n from ${table} where data->>'importId' = any(?::text[])`,
      [importIds],
    );
    n += Number(rows[0]!.n);
  }
  return n;
}

describe('DELETE /api/me', () => {
  /** Every uuid column of every table in the schema, with how many rows hold `id` there. */
  async function columnsHolding(id: string): Promise<string[]> {
    const { rows } = await db.raw<{ rows: Array<{ table_name: string; column_name: string }> }>(
      "select table_name, column_name from information_schema.columns where table_schema = 'public' and data_type = 'uuid'",
    );
    const holding: string[] = [];
    for (const { table_name, column_name } of rows) {
      const n = await db(table_name).where(column_name, id).count({ n: '*' }).first();
      if (Number(n!.n) > 0) holding.push(`${table_name}.${column_name}`);
    }
    return holding.sort();
  }

  async function runnerWithEverything() {
    const runner = await signedIn();
    const coach = await createUser({ role: 'coach' });
    const id = runner.user.id;
    const up = await uploadZip(runner.auth, buildZip([gpxFile(21), gpxFile(22)]));
    await waitFor(runner.auth, up.body.import.id as string, finished);
    const run = await db('runs').where({ user_id: id }).first();
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Harbor Line Runners' }).returning('*');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: id });
    await db('invitations').insert({
      squad_id: squad!.id,
      invited_by: coach.user.id,
      email: runner.user.email,
      token_hash: `hash-${id}`,
      expires_at: new Date(Date.now() + 86_400_000),
      accepted_at: new Date(),
      accepted_by: id,
    });
    await db('run_notes').insert([
      { run_id: run!.id, author_id: coach.user.id, text: 'Nice even splits.' },
      { run_id: run!.id, author_id: id, text: 'Felt easy.' },
    ]);
    await db('week_notes').insert({ runner_id: id, week_start: '2024-03-04', author_id: coach.user.id, text: 'Good week.' });
    await db('week_reviews').insert({ runner_id: id, week_start: '2024-03-04', coach_id: coach.user.id });
    const [plan] = await db('session_plans')
      .insert({ runner_id: id, author_id: coach.user.id, date: '2024-03-06', title: 'Intervals', notes: '', items: '[]' })
      .returning('*');
    await db('run_plan_links').insert({ run_id: run!.id, plan_id: plan!.id });
    await db('goal_races').insert({
      user_id: id,
      name: 'Lakeside Marathon',
      date: '2024-10-13',
      distance_m: 42195,
      goal_time_s: 12600,
    });
    await db('race_results').insert({ user_id: id, name: 'Spring 10K', date: '2024-04-01', distance_m: 10000, time_s: 2700 });
    await db('password_resets').insert({ user_id: id, token_hash: `reset-${id}`, expires_at: new Date(Date.now() + 3_600_000) });
    if (await db.schema.hasTable('fuel_items')) {
      await db('fuel_items').insert({
        user_id: id,
        name: 'Lemon gel',
        carbohydrate_g: 25,
        sodium_mg: 50,
        caffeine_mg: 0,
        fluid_ml: 0,
      });
    }
    await db('dev_outbox').insert({ to: runner.user.email, subject: 'Invitation', text: 'Join', html: '<p>Join</p>' });
    return { ...runner, coach, squadId: squad!.id as string };
  }

  it('removes every row that references the runner in every table and every stored file; the squad simply loses them', async () => {
    const { user, password, auth, coach, squadId } = await runnerWithEverything();
    const before = await columnsHolding(user.id);
    expect(before).toEqual(
      expect.arrayContaining([
        'api_tokens.user_id',
        'goal_races.user_id',
        'imports.user_id',
        'invitations.accepted_by',
        'password_resets.user_id',
        'race_results.user_id',
        'run_notes.author_id',
        'runs.user_id',
        'session_plans.runner_id',
        'source_files.user_id',
        'squad_members.runner_id',
        'users.id',
        'week_notes.runner_id',
        'week_reviews.runner_id',
      ]),
    );
    expect(storedFilesOf(user.id)).toHaveLength(2);
    const importIds = (await db('imports').where({ user_id: user.id }).select('id')).map((r) => r.id as string);
    expect(await queueRowsNaming(importIds)).toBeGreaterThan(0);

    const res = await request(app).delete('/api/me').set(auth).send({ password });
    expect(res.status).toBe(204);

    expect(await columnsHolding(user.id)).toEqual([]);
    expect(storedFilesOf(user.id)).toEqual([]);
    // Issue 13 #15: no empty DATA_DIR/files/<uid>/ folder, no pg-boss row naming the user's imports.
    expect(existsSync(path.join(dataDir, 'files', user.id))).toBe(false);
    expect(await queueRowsNaming(importIds)).toBe(0);
    expect(archivesWaiting()).toEqual([]);
    expect(await count('invitations', { email: user.email })).toBe(0);
    expect(await count('dev_outbox', { to: user.email })).toBe(0);
    expect(await count('runs')).toBe(0);
    // The coach and their squad stay; the squad no longer has this runner.
    expect(await count('squads', { id: squadId })).toBe(1);
    expect(await count('users', { id: coach.user.id })).toBe(1);
    expect((await request(app).get('/api/me').set(auth)).status).toBe(401);
  }, 30_000);

  it('when a coach deletes their account, their squads go; the runners keep all their own data', async () => {
    const { user: runner, coach, squadId } = await runnerWithEverything();
    const coachAuth = {
      Authorization: `Bearer ${(await request(app).post('/api/auth/token').send({ email: coach.user.email, password: coach.password })).body.token as string}`,
    };
    const runsBefore = await count('runs', { user_id: runner.id });

    const res = await request(app).delete('/api/me').set(coachAuth).send({ password: coach.password });
    expect(res.status).toBe(204);

    expect(await columnsHolding(coach.user.id)).toEqual([]);
    expect(await count('squads', { id: squadId })).toBe(0);
    expect(await count('squad_members', { runner_id: runner.id })).toBe(0);
    expect(await count('runs', { user_id: runner.id })).toBe(runsBefore);
    // The plan the coach wrote stays with the runner, without an author.
    expect(await db('session_plans').where({ runner_id: runner.id }).first()).toMatchObject({
      author_id: null,
      title: 'Intervals',
    });
    expect(storedFilesOf(runner.id)).toHaveLength(2);
  }, 30_000);

  it('with a wrong password, responds 401 and changes nothing', async () => {
    const { user, auth } = await signedIn();
    await request(app).post('/api/runs').set(auth).attach('files', gpxFile(30).data, 'run.gpx');
    const res = await request(app).delete('/api/me').set(auth).send({ password: 'not my password' });
    expect(res.status).toBe(401);
    expect(res.body.code).toBe('wrong-password');
    expect(res.body.error).toMatch(/^That password does not match your account/);
    expect(await count('users', { id: user.id })).toBe(1);
    expect(await count('runs', { user_id: user.id })).toBe(1);
    expect(storedFilesOf(user.id)).toHaveLength(1);
  });

  it('without a password, responds 400 with a field error', async () => {
    const { auth } = await signedIn();
    const res = await request(app).delete('/api/me').set(auth).send({});
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([{ field: 'password', message: 'Type your password to confirm.' }]);
  });
});
