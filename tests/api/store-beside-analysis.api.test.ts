import { readFileSync } from 'node:fs';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { decodeColumns } from '../../server/features/runs/track-blob.ts';
import { db } from '../../server/lib/db.ts';
import { freshApp, person } from '../support/test-world.ts';

// Issue 19, session 10 (server/features/runs/README.md, "The store beside the analysis"): a new file of one run
// hands its track over as soon as its series is built; the transaction locks, checks for the same file and the
// same run, inserts the source file and the track row while the rest of the run is analysed, then the run's own
// rows go in and it commits. STORE_BESIDE_ANALYSIS=0 stores after the analysis, as before: both must store the
// very same run, and a file refused after its track came ahead must leave nothing.

const sample = (name: string) => readFileSync(path.join('fixtures/gps-samples', name));

/** The tables an insert of each statement Knex sends from now until `stop()` goes to, in order. */
function watchInserts() {
  const tables: string[] = [];
  const listener = (query: { sql: string }) => {
    const table = /^insert into "([a-z_]+)"/.exec(query.sql)?.[1];
    if (table) tables.push(table);
  };
  db.on('query', listener);
  return { tables, stop: () => db.off('query', listener) };
}

let stopWatching: (() => void) | undefined;
afterEach(() => {
  stopWatching?.();
  delete process.env.STORE_BESIDE_ANALYSIS;
});

async function storedRows(userId: string) {
  const count = async (table: string, column = 'user_id') =>
    Number(
      (
        await db(table)
          .where({ [column]: userId })
          .count({ n: '*' })
      )[0]!.n,
    );
  const runIds = (await db('runs').where({ user_id: userId }).select('id')).map((r) => r.id as string);
  const tracks = runIds.length ? Number((await db('run_tracks').whereIn('run_id', runIds).count({ n: '*' }))[0]!.n) : 0;
  return { source_files: await count('source_files'), runs: await count('runs'), run_tracks: tracks };
}

/** A run as the API answers it and its stored track, without what differs between two owners (ids, names of keys). */
async function storedRun(app: ReturnType<typeof freshApp>, auth: Record<string, string>, runId: string) {
  const detail = (await request(app).get(`/api/runs/${runId}`).set(auth)).body;
  const { id: _id, owner_id: _owner, ...rest } = detail;
  const row = await db('run_tracks').where({ run_id: runId }).first();
  const columns = decodeColumns(row!.columns, row!.point_count, row!.data, row!.data_layout);
  const bytes = Object.fromEntries(Object.entries(columns).map(([name, c]) => [name, Buffer.from(c.buffer).toString('base64')]));
  return { detail: { ...rest, summary: { ...rest.summary, id: undefined } }, layout: row!.data_layout, bytes };
}

describe('the store beside the analysis (issue 19, session 10)', () => {
  for (const name of ['handheld-1s-partial-hr.gpx', 'watch-run-15-laps.tcx']) {
    it(`${name}: the track row goes in before the run's row, and the run stored is the one stored after the analysis`, async () => {
      const app = freshApp('beside');
      const beside = await person(app, 'runner', 'Beside Runner');
      const after = await person(app, 'runner', 'After Runner');

      const watch = watchInserts();
      stopWatching = watch.stop;
      const one = await request(app).post('/api/runs').set(beside.auth).attach('files', sample(name), name);
      watch.stop();
      expect(one.status).toBe(201);
      // The track came ahead: it is stored while the run's own rows wait for the analysis (checked at commit).
      expect(watch.tables.filter((t) => ['source_files', 'run_tracks', 'runs'].includes(t))).toEqual([
        'source_files',
        'run_tracks',
        'runs',
      ]);

      process.env.STORE_BESIDE_ANALYSIS = '0';
      const watchAfter = watchInserts();
      stopWatching = watchAfter.stop;
      const two = await request(app).post('/api/runs').set(after.auth).attach('files', sample(name), name);
      watchAfter.stop();
      expect(two.status).toBe(201);
      expect(watchAfter.tables.filter((t) => ['source_files', 'run_tracks', 'runs'].includes(t))).toEqual([
        'source_files',
        'runs',
        'run_tracks',
      ]);

      const a = await storedRun(app, beside.auth, one.body.imported[0].id as string);
      const b = await storedRun(app, after.auth, two.body.imported[0].id as string);
      expect(a.layout).toBe('xor-planes');
      expect(a).toEqual(b);
      expect(await storedRows(beside.id)).toEqual({ source_files: 1, runs: 1, run_tracks: 1 });
    });
  }

  it('a file the analysis refuses after its track came ahead is refused in its words; nothing of it is stored', async () => {
    const app = freshApp('beside-refused');
    const runner = await person(app, 'runner', 'Refused Runner');
    const res = await request(app)
      .post('/api/runs')
      .set(runner.auth)
      .attach('files', sample('odd-backwards-time.tcx'), 'odd.tcx');
    expect(res.status).toBe(422);
    expect(res.body.rejected[0].error).toMatch(/^Times in this file go backwards: .* Nothing was imported/);
    expect(await storedRows(runner.id)).toEqual({ source_files: 0, runs: 0, run_tracks: 0 });
  });

  it('a track row whose run never comes is refused at commit, and nothing of that transaction stays', async () => {
    const runId = randomUUID();
    const before = Number((await db('run_tracks').count({ n: '*' }))[0]!.n);
    await expect(
      db.transaction(async (trx) => {
        await trx('run_tracks').insert({ run_id: runId, point_count: 0, columns: [], data: Buffer.alloc(0) });
        // Accepted for now: the reference to runs is checked at COMMIT (DEFERRABLE INITIALLY DEFERRED).
        expect(await trx('run_tracks').where({ run_id: runId }).first()).toBeDefined();
      }),
    ).rejects.toThrow(/run_tracks_run_id_foreign/);
    expect(await db('run_tracks').where({ run_id: runId }).first()).toBeUndefined();
    expect(Number((await db('run_tracks').count({ n: '*' }))[0]!.n)).toBe(before);
  });
});
