import { existsSync, readFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { createFsStore, type FileStore } from '../../server/lib/storage.ts';
import { SPLITS_CSV_COLUMNS } from '../../shared/runs/splits-csv.ts';
import { createUser } from '../support/factories.ts';
import { createApp } from '../../server/app.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

type App = ReturnType<typeof createApp>;

const SAMPLES = path.resolve('fixtures/gps-samples');
const sample = (name: string) => readFileSync(path.join(SAMPLES, name));

function appWithStore(store?: FileStore, overrides = {}) {
  const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-data-'));
  const config = testConfig({ dataDir, ...overrides });
  return { app: createApp({ config, store: store ?? createFsStore(dataDir), mailer: recordingMailer }), dataDir };
}

async function tokenFor(app: App, email: string, password: string) {
  const res = await request(app).post('/api/auth/token').send({ email, password });
  return { Authorization: `Bearer ${res.body.token as string}` };
}

async function runnerWithToken(app: App) {
  const { user, password } = await createUser();
  return { user, auth: await tokenFor(app, user.email, password) };
}

async function counts() {
  const [runs, files, splits] = await Promise.all(
    ['runs', 'source_files', 'run_splits'].map((t) => db(t).count({ n: '*' }).first()),
  );
  return { runs: Number(runs!.n), files: Number(files!.n), splits: Number(splits!.n) };
}

describe('POST /api/runs', () => {
  it('imports a TCX watch file: 201, device distance, splits in both units, laps, the original kept byte for byte', async () => {
    const { app, dataDir } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const res = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', sample('watch-run-3-laps.tcx'), 'watch-run-3-laps.tcx');
    expect(res.status).toBe(201);
    expect(res.body.duplicates).toEqual([]);
    expect(res.body.rejected).toEqual([]);
    expect(res.body.imported).toHaveLength(1);
    const id = res.body.imported[0].id as string;

    const run = await request(app).get(`/api/runs/${id}`).set(auth);
    expect(run.status).toBe(200);
    // REFERENCE.tsv (gps-samples): last TCX DistanceMeters 4686.3 m, elapsed 1992 s, 3 device laps.
    expect(run.body.summary.distance_source).toBe('device');
    expect(run.body.summary.distance_m).toBeCloseTo(4686.3, 0);
    // REFERENCE.tsv spans 1992 s to the last trackpoint, but that point (22:03:05) carries only a time and
    // heart rate — no position, no distance — so the run ends at the previous point: 1991 s.
    expect(run.body.summary.elapsed_s).toBe(1991);
    expect(run.body.laps).toHaveLength(3);
    // 4686.3 m = 2 full miles + a partial; 4 full km + a partial.
    expect(run.body.splits.mi).toHaveLength(3);
    expect(run.body.splits.km).toHaveLength(5);
    expect(run.body.splits.mi[0].distance_m).toBeCloseTo(1609.344, 6);
    const miTotal = (run.body.splits.mi as Array<{ elapsed_s: number }>).reduce((a, s) => a + s.elapsed_s, 0);
    expect(miTotal).toBeCloseTo(run.body.summary.elapsed_s, 0);

    const original = await request(app)
      .get(`/api/runs/${id}/original`)
      .set(auth)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(Buffer.compare(original.body as Buffer, sample('watch-run-3-laps.tcx'))).toBe(0);
    expect(existsSync(path.join(dataDir, 'files'))).toBe(true);
  });

  it('the same file again is a duplicate of the existing run (422), not a second run', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const first = await request(app).post('/api/runs').set(auth).attach('files', sample('run-hr-4s.gpx'), 'run-hr-4s.gpx');
    const again = await request(app).post('/api/runs').set(auth).attach('files', sample('run-hr-4s.gpx'), 'renamed.gpx');
    expect(again.status).toBe(422);
    expect(again.body.duplicates).toEqual([
      { file: 'renamed.gpx', runId: first.body.imported[0].id, reason: 'same file', activity: null },
    ]);
    expect((await counts()).runs).toBe(1);
  });

  it('a mixed upload imports the good file and rejects the rest with sentences, storing nothing for them', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const res = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', gzipSync(sample('run-hr-4s.gpx')), 'evening.gpx.gz')
      .attach('files', sample('route-only.gpx'), 'route-only.gpx')
      .attach('files', Buffer.from('<!doctype html><html><body>Hello</body></html>'), 'page.gpx')
      .attach('files', Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46]), 'photo.gpx')
      .attach('files', sample('lake-gpx10-no-times.gpx'), 'lake-gpx10-no-times.gpx');
    expect(res.status).toBe(201);
    expect(res.body.imported.map((r: { file: string }) => r.file)).toEqual(['evening.gpx.gz']);
    const rejected = res.body.rejected as Array<{ file: string; error: string }>;
    expect(rejected.map((r) => r.file)).toEqual(['route-only.gpx', 'page.gpx', 'photo.gpx', 'lake-gpx10-no-times.gpx']);
    for (const r of rejected) expect(r.error).toMatch(/^[A-Z].*\.$/);
    expect(rejected[3]!.error).toMatch(/timestamps/i);
    expect(await counts()).toMatchObject({ runs: 1, files: 1 });
  });

  it('when every file is refused, responds 422', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const res = await request(app).post('/api/runs').set(auth).attach('files', sample('empty-track.gpx'), 'empty-track.gpx');
    expect(res.status).toBe(422);
    expect(res.body.imported).toEqual([]);
    expect(res.body.rejected[0].error).toMatch(/\.$/);
  });

  it('a file over the size limit gets 413 with JSON and nothing is stored', async () => {
    const { app } = appWithStore(undefined, { uploadMaxFileBytes: 100_000 });
    const { auth } = await runnerWithToken(app);
    const res = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', sample('watch-run-3-laps.tcx'), 'watch-run-3-laps.tcx');
    expect(res.status).toBe(413);
    expect(res.body.error).toMatch(/at most/);
    expect((await counts()).runs).toBe(0);
  });

  it('when storing the original fails, the file is refused and no half run remains', async () => {
    const failing: FileStore = {
      put: () => Promise.reject(new Error('disk full')),
      get: () => Promise.reject(new Error('missing')),
      delete: () => Promise.resolve(),
      list: async function* () {},
    };
    const { app } = appWithStore(failing);
    const { auth } = await runnerWithToken(app);
    const res = await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', sample('watch-run-3-laps.tcx'), 'watch-run-3-laps.tcx');
    expect(res.status).toBe(422);
    expect(res.body.rejected[0].error).toMatch(/Nothing was stored/);
    expect(await counts()).toEqual({ runs: 0, files: 0, splits: 0 });
  });

  it('with no files responds 400; signed out responds 401', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    expect((await request(app).post('/api/runs').set(auth).field('note', 'x')).status).toBe(400);
    expect((await request(app).post('/api/runs').attach('files', sample('run-hr-4s.gpx'), 'run-hr-4s.gpx')).status).toBe(401);
  });
});

describe('GET /api/runs/:id/splits.csv', () => {
  it('has the contract columns in order, 3-decimal distances, 1-decimal seconds and m:ss pace', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const id = (
      await request(app).post('/api/runs').set(auth).attach('files', sample('watch-run-3-laps.tcx'), 'watch-run-3-laps.tcx')
    ).body.imported[0].id;
    for (const unit of ['mi', 'km'] as const) {
      const res = await request(app).get(`/api/runs/${id}/splits.csv?unit=${unit}`).set(auth);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      // The file name carries the run's local date and its name, slugged (issue 17).
      expect(res.headers['content-disposition']).toMatch(
        new RegExp(`filename="?\\d{4}-\\d{2}-\\d{2}-[a-z0-9-]+-splits-${unit}\\.csv"?$`),
      );
      const [header, ...rows] = res.text.trim().split(/\r\n/);
      expect(header!.split(',').slice(0, 10)).toEqual([...SPLITS_CSV_COLUMNS]);
      expect(rows).toHaveLength(unit === 'mi' ? 3 : 5);
      const first = rows[0]!.split(',');
      expect(first.slice(0, 3)).toEqual(['1', unit, '1.000']);
      expect(first[3]).toMatch(/^\d+\.\d$/);
      expect(first[4]).toMatch(/^\d+\.\d$/);
      expect(first[5]).toMatch(/^\d+:\d\d$/);
      expect(rows.at(-1)!.split(',')[2]).not.toBe('1.000');
    }
    expect((await request(app).get(`/api/runs/${id}/splits.csv?unit=yards`).set(auth)).status).toBe(400);
  });

  it('leaves heart-rate cells empty when the file has no heart rate', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const id = (
      await request(app)
        .post('/api/runs')
        .set(auth)
        .attach('files', sample('watch-run-no-elevation.gpx'), 'watch-run-no-elevation.gpx')
    ).body.imported[0].id;
    const rows = (await request(app).get(`/api/runs/${id}/splits.csv?unit=km`).set(auth)).text.trim().split(/\r\n/).slice(1);
    expect(rows.length).toBeGreaterThan(0);
    for (const row of rows) expect(row.split(',').slice(6, 8)).toEqual(['', '']);
  });
});

describe('who may read a run', () => {
  it('owner and their coach read it; another runner, a coach of another squad and the signed-out do not (404/401)', async () => {
    const { app } = appWithStore();
    const owner = await runnerWithToken(app);
    const id = (await request(app).post('/api/runs').set(owner.auth).attach('files', sample('run-hr-4s.gpx'), 'run-hr-4s.gpx'))
      .body.imported[0].id;
    const coach = await createUser({ role: 'coach' });
    const otherCoach = await createUser({ role: 'coach' });
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Test squad' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: owner.user.id });
    const other = await runnerWithToken(app);
    const admin = await createUser({ role: 'admin' });

    const status = async (auth: Record<string, string> | null, url: string) =>
      (await (auth ? request(app).get(url).set(auth) : request(app).get(url))).status;
    for (const url of [`/api/runs/${id}`, `/api/runs/${id}/splits.csv`, `/api/runs/${id}/track`, `/api/runs/${id}/original`]) {
      expect(await status(owner.auth, url)).toBe(200);
      expect(await status(await tokenFor(app, coach.user.email, coach.password), url)).toBe(200);
      expect(await status(await tokenFor(app, admin.user.email, admin.password), url)).toBe(200);
      expect(await status(other.auth, url)).toBe(404);
      expect(await status(await tokenFor(app, otherCoach.user.email, otherCoach.password), url)).toBe(404);
      expect(await status(null, url)).toBe(401);
    }
    // A coach can read but not delete; another runner cannot delete either.
    expect(
      (
        await request(app)
          .delete(`/api/runs/${id}`)
          .set(await tokenFor(app, coach.user.email, coach.password))
      ).status,
    ).toBe(404);
    expect((await request(app).delete(`/api/runs/${id}`).set(other.auth)).status).toBe(404);
    expect((await counts()).runs).toBe(1);
  });
});

describe('listing, renaming and deleting runs', () => {
  it('lists newest first with paging and date filters, renames, and deletes the run with its original file', async () => {
    const { app, dataDir } = appWithStore();
    const { auth } = await runnerWithToken(app);
    await request(app)
      .post('/api/runs')
      .set(auth)
      .attach('files', sample('run-hr-4s.gpx'), 'run-hr-4s.gpx')
      .attach('files', sample('watch-run-3-laps.tcx'), 'watch-run-3-laps.tcx');
    const list = await request(app).get('/api/runs?per_page=1').set(auth);
    expect(list.status).toBe(200);
    expect(list.body.total).toBe(2);
    expect(list.body.runs).toHaveLength(1);
    // run-hr-4s.gpx was recorded 2012-10-24, watch-run-3-laps.tcx 2012-12-26 (REFERENCE.tsv): newest first.
    expect(list.body.runs[0].started_at.slice(0, 10)).toBe('2012-12-26');
    const filtered = await request(app).get('/api/runs?from=2012-10-01&to=2012-10-31').set(auth);
    expect(filtered.body.runs.map((r: { started_at: string }) => r.started_at.slice(0, 7))).toEqual(['2012-10']);
    expect((await request(app).get('/api/runs?from=yesterday').set(auth)).status).toBe(400);

    const id = list.body.runs[0].id as string;
    const renamed = await request(app).patch(`/api/runs/${id}`).set(auth).send({ name: 'Boxing Day tempo' });
    expect(renamed.body.run.name).toBe('Boxing Day tempo');

    const file = await db('source_files')
      .join('runs', 'runs.source_file_id', 'source_files.id')
      .where('runs.id', id)
      .first('storage_key');
    const stored = path.join(dataDir, 'files', file!.storage_key as string);
    expect(existsSync(stored)).toBe(true);
    expect((await request(app).delete(`/api/runs/${id}`).set(auth)).status).toBe(204);
    expect(existsSync(stored)).toBe(false);
    expect((await request(app).get(`/api/runs/${id}`).set(auth)).status).toBe(404);
    expect(await db('run_splits').where({ run_id: id }).first()).toBeUndefined();
  });
});

type ListedRun = { id: string; started_at: string; distance_m: number; moving_s: number };

/** Stores runs straight in the table (the list reads only summary columns), all from one source file. */
async function storeRuns(
  userId: string,
  runs: Array<{ started_at: string; distance_m: number; moving_s: number }>,
  fileHash = 'f'.repeat(64),
) {
  const [file] = await db('source_files')
    .insert({
      user_id: userId,
      original_name: 'many.tcx',
      sha256: fileHash,
      size_bytes: '1',
      storage_key: 'k',
      format: 'tcx',
    })
    .returning('id');
  await db('runs').insert(
    runs.map((run, index) => ({
      user_id: userId,
      source_file_id: file!.id,
      activity_index: index,
      name: `Run ${index}`,
      started_at: new Date(run.started_at),
      ended_at: new Date(Date.parse(run.started_at) + run.moving_s * 1000),
      local_date: run.started_at.slice(0, 10),
      local_time: run.started_at.slice(11, 16),
      time_zone: 'UTC',
      time_zone_source: 'profile',
      distance_m: run.distance_m,
      distance_source: 'device',
      elapsed_s: run.moving_s,
      moving_s: run.moving_s,
      points: 2,
      segments: 1,
      details: {},
    })),
  );
}

/** The order the API promises, computed over every run at once: nulls (pace without distance) last, then id. */
function sortedInJs(runs: ListedRun[], sort: string, order: 'asc' | 'desc'): string[] {
  const valueOf = (run: ListedRun): number | null => {
    if (sort === 'date') return Date.parse(run.started_at);
    if (sort === 'distance') return run.distance_m;
    if (sort === 'duration') return run.moving_s;
    return run.distance_m > 0 && run.moving_s > 0 ? run.moving_s / run.distance_m : null;
  };
  const sign = order === 'asc' ? 1 : -1;
  return [...runs]
    .sort((a, b) => {
      const [va, vb] = [valueOf(a), valueOf(b)];
      if (va === null || vb === null) return va === vb ? sign * (a.id < b.id ? -1 : 1) : va === null ? 1 : -1;
      if (va !== vb) return sign * (va - vb);
      return sign * (a.id < b.id ? -1 : 1);
    })
    .map((run) => run.id);
}

describe('GET /api/runs?sort=…&order=…', () => {
  it('orders every run (not one page) by each sort and order; pages neither repeat nor skip a run', async () => {
    const { app } = appWithStore();
    const { user, auth } = await runnerWithToken(app);
    // Ties on purpose (same start, same distance, same moving time, same pace) and two runs without distance.
    await storeRuns(user.id, [
      { started_at: '2026-03-01T07:00:00.000Z', distance_m: 10000, moving_s: 3000 },
      { started_at: '2026-03-01T07:00:00.000Z', distance_m: 5000, moving_s: 1500 },
      { started_at: '2026-03-02T18:30:00.000Z', distance_m: 5000, moving_s: 1400 },
      { started_at: '2026-02-27T06:15:00.000Z', distance_m: 21097.5, moving_s: 6300 },
      { started_at: '2026-03-05T12:00:00.000Z', distance_m: 0, moving_s: 1800 },
      { started_at: '2026-03-04T12:00:00.000Z', distance_m: 0, moving_s: 900 },
      { started_at: '2026-01-10T09:00:00.000Z', distance_m: 8000, moving_s: 3000 },
      { started_at: '2026-01-11T09:00:00.000Z', distance_m: 12000, moving_s: 3000 },
      { started_at: '2026-02-01T09:00:00.000Z', distance_m: 3000, moving_s: 1000 },
      { started_at: '2026-02-02T09:00:00.000Z', distance_m: 3000, moving_s: 1000 },
      { started_at: '2026-02-03T09:00:00.000Z', distance_m: 42195, moving_s: 12600 },
    ]);
    const all = await request(app).get('/api/runs?per_page=200').set(auth);
    expect(all.body.total).toBe(11);
    const everyRun = all.body.runs as ListedRun[];

    for (const sort of ['date', 'distance', 'duration', 'pace']) {
      for (const order of ['asc', 'desc'] as const) {
        const paged: string[] = [];
        for (let page = 1; page <= 3; page++) {
          const res = await request(app).get(`/api/runs?sort=${sort}&order=${order}&per_page=4&page=${page}`).set(auth);
          expect(res.status).toBe(200);
          expect(res.body).toMatchObject({ total: 11, page, per_page: 4 });
          paged.push(...(res.body.runs as ListedRun[]).map((run) => run.id));
        }
        expect({ sort, order, ids: paged }).toEqual({ sort, order, ids: sortedInJs(everyRun, sort, order) });
      }
    }
    // Without sort and order: newest first, as before.
    expect(everyRun.map((run) => run.id)).toEqual(sortedInJs(everyRun, 'date', 'desc'));
    // Runs without distance have no pace: last in both orders.
    const paceAsc = await request(app).get('/api/runs?sort=pace&order=asc').set(auth);
    const paceDesc = await request(app).get('/api/runs?sort=pace&order=desc').set(auth);
    expect(paceAsc.body.runs.slice(-2).map((run: ListedRun) => run.distance_m)).toEqual([0, 0]);
    expect(paceDesc.body.runs.slice(-2).map((run: ListedRun) => run.distance_m)).toEqual([0, 0]);
  });

  it('after=next_cursor walks every sort and order to the same runs as the pages, the last page has no cursor', async () => {
    const { app } = appWithStore();
    const { user, auth } = await runnerWithToken(app);
    await storeRuns(user.id, [
      { started_at: '2026-03-01T07:00:00.000Z', distance_m: 10000, moving_s: 3000 },
      { started_at: '2026-03-01T07:00:00.000Z', distance_m: 5000, moving_s: 1500 },
      { started_at: '2026-03-02T18:30:00.000Z', distance_m: 5000, moving_s: 1400 },
      { started_at: '2026-02-27T06:15:00.000Z', distance_m: 21097.5, moving_s: 6300 },
      { started_at: '2026-03-05T12:00:00.000Z', distance_m: 0, moving_s: 1800 },
      { started_at: '2026-03-04T12:00:00.000Z', distance_m: 0, moving_s: 900 },
      { started_at: '2026-01-10T09:00:00.000Z', distance_m: 8000, moving_s: 3000 },
      { started_at: '2026-01-11T09:00:00.000Z', distance_m: 12000, moving_s: 3000 },
      { started_at: '2026-02-01T09:00:00.000Z', distance_m: 3000, moving_s: 1000 },
      { started_at: '2026-02-02T09:00:00.000Z', distance_m: 3000, moving_s: 1000 },
      { started_at: '2026-02-03T09:00:00.000Z', distance_m: 42195, moving_s: 12600 },
    ]);
    // Microseconds a JavaScript date cannot hold: the cursor carries PostgreSQL's exact text of the key.
    await db('runs')
      .where({ user_id: user.id })
      .andWhere('started_at', new Date('2026-02-01T09:00:00.000Z'))
      .update({ started_at: db.raw("'2026-02-01T09:00:00.000731Z'::timestamptz") });
    const everyRun = (await request(app).get('/api/runs?per_page=200').set(auth)).body.runs as ListedRun[];
    for (const sort of ['date', 'distance', 'duration', 'pace']) {
      for (const order of ['asc', 'desc'] as const) {
        const walked: string[] = [];
        let after: string | null = null;
        let pages = 0;
        do {
          const cursor: string = after === null ? '' : `&after=${encodeURIComponent(after)}`;
          const res = await request(app).get(`/api/runs?sort=${sort}&order=${order}&per_page=4${cursor}`).set(auth);
          expect(res.status).toBe(200);
          expect(res.body.total).toBe(11);
          walked.push(...(res.body.runs as ListedRun[]).map((run) => run.id));
          // The deep page by cursor is the same as the page by offset.
          const byOffset = await request(app)
            .get(`/api/runs?sort=${sort}&order=${order}&per_page=4&page=${pages + 1}`)
            .set(auth);
          expect(res.body.runs).toEqual(byOffset.body.runs);
          after = res.body.next_cursor as string | null;
          pages++;
        } while (after !== null && pages < 10);
        expect({ sort, order, pages, ids: walked }).toEqual({ sort, order, pages: 3, ids: sortedInJs(everyRun, sort, order) });
      }
    }
    // A page that ends exactly at the last run says so: no cursor.
    const whole = await request(app).get('/api/runs?per_page=11').set(auth);
    expect(whole.body.next_cursor).toBeNull();
  });

  it('after=next_cursor stays in place when runs are added or deleted before it (an offset page shifts)', async () => {
    const { app } = appWithStore();
    const { user, auth } = await runnerWithToken(app);
    await storeRuns(
      user.id,
      Array.from({ length: 8 }, (_, i) => ({
        started_at: `2026-04-${String(10 + i)}T07:00:00.000Z`,
        distance_m: 5000,
        moving_s: 1500,
      })),
    );
    const first = await request(app).get('/api/runs?per_page=3').set(auth);
    const secondBefore = await request(app).get('/api/runs?per_page=3&page=2').set(auth);
    // Two newer runs arrive and the newest shown run is deleted while the runner reads page one.
    await storeRuns(
      user.id,
      [
        { started_at: '2026-04-20T07:00:00.000Z', distance_m: 6000, moving_s: 1800 },
        { started_at: '2026-04-21T07:00:00.000Z', distance_m: 6000, moving_s: 1800 },
      ],
      'e'.repeat(64),
    );
    expect(
      (
        await request(app)
          .delete(`/api/runs/${first.body.runs[0].id as string}`)
          .set(auth)
      ).status,
    ).toBe(204);
    const next = await request(app)
      .get(`/api/runs?per_page=3&after=${first.body.next_cursor as string}`)
      .set(auth);
    expect(next.status).toBe(200);
    expect(next.body.runs.map((r: ListedRun) => r.id)).toEqual(secondBefore.body.runs.map((r: ListedRun) => r.id));
    const secondAfter = await request(app).get('/api/runs?per_page=3&page=2').set(auth);
    expect(secondAfter.body.runs.map((r: ListedRun) => r.id)).not.toEqual(secondBefore.body.runs.map((r: ListedRun) => r.id));
  });

  it('answers 400 with a sentence for a damaged cursor, one from another order, or a cursor with a page number', async () => {
    const { app } = appWithStore();
    const { user, auth } = await runnerWithToken(app);
    await storeRuns(user.id, [
      { started_at: '2026-05-01T07:00:00.000Z', distance_m: 5000, moving_s: 1500 },
      { started_at: '2026-05-02T07:00:00.000Z', distance_m: 6000, moving_s: 1500 },
    ]);
    const cursor = (await request(app).get('/api/runs?per_page=1').set(auth)).body.next_cursor as string;
    expect(cursor).toMatch(/^[A-Za-z0-9_-]+$/);
    const forged = Buffer.from(JSON.stringify([1, 'date', 'desc', "2026-05-02'; drop table runs; --", user.id])).toString(
      'base64url',
    );
    const sqlKey = Buffer.from(JSON.stringify([1, 'distance', 'desc', '1 or 1=1', user.id])).toString('base64url');
    for (const bad of [
      'not-a-cursor',
      `${cursor}x`,
      cursor.slice(0, -4),
      forged,
      sqlKey,
      'A'.repeat(301),
      encodeURIComponent(Buffer.from('[1,"date"]').toString('base64')),
    ]) {
      const res = await request(app).get(`/api/runs?per_page=1&after=${bad}`).set(auth);
      expect({ bad, status: res.status }).toEqual({ bad, status: 400 });
      expect(res.body.error).toBe('This link to more runs no longer works. Start again from the first page of your runs.');
    }
    const otherOrder = await request(app).get(`/api/runs?per_page=1&sort=distance&after=${cursor}`).set(auth);
    expect(otherOrder.status).toBe(400);
    expect(otherOrder.body.error).toMatch(/no longer works/);
    const both = await request(app).get(`/api/runs?per_page=1&page=2&after=${cursor}`).set(auth);
    expect(both.status).toBe(400);
    expect(both.body.error).toBe('Ask for a page number or for the runs after a link, not both.');
    expect(await db('runs').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({ n: '2' });
  });

  it('answers 400 with a sentence for an unknown sort or order', async () => {
    const { app } = appWithStore();
    const { auth } = await runnerWithToken(app);
    const badSort = await request(app).get('/api/runs?sort=heart_rate').set(auth);
    expect(badSort.status).toBe(400);
    expect(badSort.body.error).toMatch(/date, distance, duration, pace/);
    const badOrder = await request(app).get('/api/runs?sort=pace&order=sideways').set(auth);
    expect(badOrder.status).toBe(400);
    expect(badOrder.body.error).toMatch(/asc or desc/);
  });

  it('documents sort and order in /api/openapi.json from the same schema', async () => {
    const { app } = appWithStore();
    const doc = await request(app).get('/api/openapi.json');
    const parameters = doc.body.paths['/api/runs'].get.parameters as Array<{ name: string; in: string; schema: unknown }>;
    expect(parameters.find((p) => p.name === 'sort')).toEqual({
      name: 'sort',
      in: 'query',
      required: false,
      schema: { default: 'date', type: 'string', enum: ['date', 'distance', 'duration', 'pace'] },
    });
    expect(parameters.find((p) => p.name === 'order')?.schema).toMatchObject({ default: 'desc', enum: ['asc', 'desc'] });
  });
});

describe('POST /api/runs/:id/notes and GET /api/runs/:id/notes', () => {
  it('the runner and their coach write and read notes on a run; another runner gets 404; an empty note gets 400', async () => {
    const { app } = appWithStore();
    const owner = await runnerWithToken(app);
    const id = (await request(app).post('/api/runs').set(owner.auth).attach('files', sample('run-hr-4s.gpx'), 'run-hr-4s.gpx'))
      .body.imported[0].id;
    const coach = await createUser({ role: 'coach', name: 'Coach Test' });
    const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Test squad' }).returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: owner.user.id });
    const coachAuth = await tokenFor(app, coach.user.email, coach.password);

    const mine = await request(app).post(`/api/runs/${id}/notes`).set(owner.auth).send({ text: 'Legs heavy after mile 2.' });
    expect(mine.status).toBe(201);
    expect(mine.body.note).toMatchObject({ run_id: id, text: 'Legs heavy after mile 2.', author: { id: owner.user.id } });
    const theirs = await request(app).post(`/api/runs/${id}/notes`).set(coachAuth).send({ text: 'Ease the next two days.' });
    expect(theirs.status).toBe(201);

    const list = await request(app).get(`/api/runs/${id}/notes`).set(owner.auth);
    expect(list.body.notes.map((n: { text: string; author: { name: string } }) => [n.author.name, n.text])).toEqual([
      [owner.user.name, 'Legs heavy after mile 2.'],
      ['Coach Test', 'Ease the next two days.'],
    ]);
    const other = await runnerWithToken(app);
    expect((await request(app).get(`/api/runs/${id}/notes`).set(other.auth)).status).toBe(404);
    expect((await request(app).post(`/api/runs/${id}/notes`).set(other.auth).send({ text: 'hi' })).status).toBe(404);
    expect((await request(app).post(`/api/runs/${id}/notes`).set(owner.auth).send({ text: '   ' })).status).toBe(400);
    expect(await db('run_notes').count({ n: '*' }).first()).toEqual({ n: '2' });
  });
});
