import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Knex } from 'knex';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { insertRunWhole, type RunChildren } from '../../server/features/runs/runs.repository.ts';
import { db, type RunRow } from '../../server/lib/db.ts';
import { MAX_BIND_PARAMETERS } from '../../server/lib/insert-by-columns.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import type { DeviceLap, TrackPoint } from '../../shared/tracks/types.ts';
import { writeTcx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

// Issue 13 #13: a track whose splits needed more than 65 535 bind parameters in one INSERT answered
// "please try again", which could never work. PostgreSQL's protocol counts a statement's parameters
// in an Int16 (documentation, "Message Formats", Bind), so 65 535 is the most one statement takes.
// The parts of a run are inserted with one array per column (server/lib/insert-by-columns.ts): splits,
// laps and fastest sections in one statement whose parameters are as many as their columns, whatever
// the number of rows (session 9: one round trip instead of one statement per 1 000 rows and table).

interface Statement {
  sql: string;
  parameters: number;
}

/** Every statement Knex sends from now until `stop()`, with its number of bind parameters. */
function watchStatements() {
  const seen: Statement[] = [];
  const listener = (query: { sql: string; bindings?: readonly unknown[] }) =>
    seen.push({ sql: query.sql, parameters: query.bindings?.length ?? 0 });
  db.on('query', listener);
  return { seen, stop: () => db.off('query', listener) };
}
let stopWatching: (() => void) | undefined;
afterEach(() => stopWatching?.());

const T0 = Date.parse('2026-11-01T06:00:00Z');

function splitRows(count: number): RunChildren['splits'] {
  return Array.from({ length: count }, (_, i) => ({
    unit: i % 2 ? 'mi' : 'km',
    split_index: Math.floor(i / 2) + 1,
    distance_m: 1000,
    start_at: new Date(T0 + i * 300_000),
    end_at: new Date(T0 + (i + 1) * 300_000),
    elapsed_s: 300,
    moving_s: 300,
    pace_s: 300,
    flat_pace_s: 300,
    avg_hr: 150,
    max_hr: 160,
    avg_cad: 170,
    elev_gain_m: 1,
    elev_loss_m: 1,
  })) as RunChildren['splits'];
}

async function runRow(): Promise<Omit<RunRow, 'id' | 'created_at'>> {
  const { user } = await createUser();
  const [source] = await db('source_files')
    .insert({
      user_id: user.id,
      original_name: 'long.tcx',
      sha256: 'a'.repeat(64),
      size_bytes: '1',
      storage_key: 'k',
      format: 'tcx',
    })
    .returning('*');
  return {
    user_id: user.id,
    source_file_id: source!.id,
    activity_index: 0,
    name: 'Very long run',
    sport: 'running',
    activity_kind: 'run',
    started_at: new Date(T0),
    ended_at: new Date(T0 + 3_600_000),
    local_date: '2026-11-01',
    local_time: '06:00',
    time_zone: 'UTC',
    time_zone_source: 'profile',
    distance_m: 10_000,
    distance_source: 'device',
    elapsed_s: 3600,
    moving_s: 3600,
    ascent_m: null,
    descent_m: null,
    avg_hr: null,
    max_hr: null,
    avg_cad: null,
    points: 0,
    segments: 1,
    details: {},
  };
}

describe('the parts of a very long run are inserted whole (issue 13 #13)', () => {
  it('the limit is real: PostgreSQL refuses one INSERT of 4 600 splits (69 000 parameters)', async () => {
    const run = await runRow();
    const [row] = await db('runs').insert(run).returning('*');
    const rows = splitRows(4_600).map((s) => ({ run_id: (row as RunRow).id, ...s }));
    expect(rows.length * Object.keys(rows[0]!).length).toBe(69_000);
    // The count wraps round the 16-bit field: 69 000 − 65 536 = 3 464.
    await expect(db('run_splits').insert(rows)).rejects.toThrow(/bind message has 3464 parameter formats/);
    expect(await db('run_splits').count({ n: '*' }).first()).toEqual({ n: '0' });
  });

  it('4 600 splits (69 000 values) are stored whole in one statement of 15 parameters, one per column', async () => {
    const run = await runRow();
    const watch = watchStatements();
    stopWatching = watch.stop;
    const stored = await db.transaction((trx: Knex.Transaction) =>
      insertRunWhole(
        run,
        { track: { columns: ['t'], point_count: 0, data: Buffer.alloc(0) }, splits: splitRows(4_600), laps: [], fastest: [] },
        trx,
      ),
    );
    watch.stop();
    const splitInserts = watch.seen.filter((s) => /insert into "run_splits"/.test(s.sql));
    expect(splitInserts.map((s) => s.parameters)).toEqual([15]);
    expect(Math.max(...watch.seen.map((s) => s.parameters))).toBeLessThanOrEqual(MAX_BIND_PARAMETERS);
    expect(await db('run_splits').where({ run_id: stored.id }).count({ n: '*' }).first()).toEqual({ n: '4600' });
    // Every value as it was sent: the last split's times and numbers read back equal.
    const last = await db('run_splits').where({ run_id: stored.id, unit: 'km', split_index: 2_300 }).first();
    expect(last).toMatchObject({
      start_at: new Date(T0 + 4_598 * 300_000),
      end_at: new Date(T0 + 4_599 * 300_000),
      pace_s: 300,
      avg_cad: 170,
    });
  });

  it('NaN, ±Infinity, null and the millisecond of a time read back as they were sent', async () => {
    const run = await runRow();
    const [split] = splitRows(1);
    const odd = {
      ...split!,
      start_at: new Date(T0 + 123),
      pace_s: Number.NaN,
      flat_pace_s: Number.POSITIVE_INFINITY,
      elev_loss_m: Number.NEGATIVE_INFINITY,
      avg_hr: null,
      distance_m: 1000.0000000000001,
    };
    const stored = await db.transaction((trx: Knex.Transaction) =>
      insertRunWhole(
        run,
        { track: { columns: ['t'], point_count: 0, data: Buffer.alloc(0) }, splits: [odd], laps: [], fastest: [] },
        trx,
      ),
    );
    const back = await db('run_splits').where({ run_id: stored.id }).first();
    expect(back?.pace_s).toBeNaN();
    expect(back).toMatchObject({
      start_at: new Date(T0 + 123),
      flat_pace_s: Number.POSITIVE_INFINITY,
      elev_loss_m: Number.NEGATIVE_INFINITY,
      avg_hr: null,
      distance_m: 1000.0000000000001,
    });
  });

  it('through the upload: a 200 000-point, 28-hour TCX with 10 000 device laps (70 000 values) imports, 201, every lap stored, in one statement', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-long-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const { user, password } = await createUser();
    const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
    // 200 000 points half a second apart, 2.4 m/s due north (about 6:57 per km, 240 km): a 24-hour
    // race's worth. A device lap every 20 points.
    const points: TrackPoint[] = Array.from({ length: 200_000 }, (_, i) => ({
      t: T0 + i * 500,
      lat: 46 + (i * 1.2) / 111_195,
      lon: -31,
    }));
    const laps: DeviceLap[] = Array.from({ length: 10_000 }, (_, k) => ({
      start_t: T0 + k * 10_000,
      total_time_s: 10,
      distance_m: 24,
      avg_hr: null,
      max_hr: null,
    }));
    const watch = watchStatements();
    stopWatching = watch.stop;
    const res = await request(app)
      .post('/api/runs')
      .set({ Authorization: `Bearer ${token}` })
      .attach('files', gzipSync(writeTcx(points, laps)), 'ultra-laps.tcx.gz');
    watch.stop();
    expect(res.status).toBe(201);
    const runId = res.body.imported[0].id as string;
    expect(await db('run_laps').where({ run_id: runId }).count({ n: '*' }).first()).toEqual({ n: '10000' });
    expect(Number((await db('run_splits').where({ run_id: runId, unit: 'km' }).count({ n: '*' }).first())!.n)).toBe(240);
    const lapInserts = watch.seen.filter((s) => /insert into "run_laps"/.test(s.sql));
    expect(lapInserts).toHaveLength(1);
    expect(Math.max(...watch.seen.map((s) => s.parameters))).toBeLessThanOrEqual(MAX_BIND_PARAMETERS);
  }, 120_000);
});
