/**
 * Read replicas for real (issue 19): a primary of the test's own and a streaming replica made from it with
 * pg_basebackup (db/pg.sh replica start), the real server bound to both (DATABASE_REPLICA_URL).
 *
 * - Reads through the app are served by the replica: with replay paused on the replica, a change made
 *   directly on the primary is not in the answer (so the replica, not the primary, answered).
 * - Read-your-writes: right after a write through the app, the writer's reads show it (from the primary)
 *   while the replica has not replayed it; someone who did not write still reads the replica.
 * - Past the lag bound every read goes to the primary; once replay resumes the replica serves again.
 * - The replica stopped: every request still succeeds.
 *
 * Waits are on events (the replica's replay state, the app's answers), never fixed sleeps.
 */
import bcrypt from 'bcryptjs';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import knexFactory, { type Knex } from 'knex';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { knexConfig } from '../../db/knexfile.ts';
import { READ_SOURCE_HEADER } from '../../server/lib/read-replica.ts';
import { freePort, ownCluster } from '../support/own-cluster.ts';
import { pollUntil } from '../support/poll.ts';
import { startServerProcess, type ServerProcess } from '../support/server-process.ts';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DATABASE = 'pacewright_replica';
/** The lag bound the server runs with here: long enough for a few requests on a busy machine, short enough to wait out. */
const MAX_LAG_MS = 6_000;
const source = (res: request.Response) => res.headers[READ_SOURCE_HEADER.toLowerCase()] as string | undefined;

describe('a streaming read replica serves the read-only pages', () => {
  let cluster: ReturnType<typeof ownCluster>;
  let dataDir: string;
  let server: ServerProcess | undefined;
  let primary: Knex;
  let replica: Knex;
  const people = {
    ada: { email: 'replica.ada@pacewright.test', name: 'Replica Ada', role: 'runner' },
    ben: { email: 'replica.ben@pacewright.test', name: 'Replica Ben', role: 'runner' },
    cora: { email: 'replica.cora@pacewright.test', name: 'Replica Cora', role: 'coach' },
  } as const;
  const password = 'quiet-river-strides';
  const ids: Record<keyof typeof people, string> = { ada: '', ben: '', cora: '' };
  const auth: Record<keyof typeof people, Record<string, string>> = { ada: {}, ben: {}, cora: {} };
  let squadId: string;
  let runId: string;
  let uploadedName: string;

  const get = (who: keyof typeof people, url: string) => request(server!.url).get(url).set(auth[who]);

  beforeAll(async () => {
    const port = await freePort();
    let replicaPort = await freePort();
    while (replicaPort === port) replicaPort = await freePort();
    cluster = ownCluster(DATABASE, port, replicaPort);
    dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-replica-'));
    cluster.start();
    primary = knexFactory(knexConfig(cluster.url));
    await primary.migrate.latest();
    // People are put in directly: signing up goes through an e-mailed link (issue 13 #7).
    const hash = await bcrypt.hash(password, 4);
    for (const key of Object.keys(people) as Array<keyof typeof people>) {
      const [row] = await primary('users')
        .insert({ ...people[key], password_hash: hash })
        .returning('id');
      ids[key] = row!.id;
    }
    const [squad] = await primary('squads').insert({ coach_id: ids.cora, name: 'Replica squad' }).returning('id');
    squadId = squad!.id;
    await primary('squad_members').insert([
      { squad_id: squadId, runner_id: ids.ada },
      { squad_id: squadId, runner_id: ids.ben },
    ]);
    // The replica is copied after the schema and people exist; everything later reaches it by streaming.
    cluster.startReplica();
    replica = knexFactory({ ...knexConfig(cluster.replicaUrl), pool: { min: 0, max: 1 } });
    server = await startServerProcess({
      DATABASE_URL: cluster.url,
      DATABASE_REPLICA_URL: cluster.replicaUrl,
      DATABASE_REPLICA_MAX_LAG_MS: String(MAX_LAG_MS),
      DATA_DIR: dataDir,
    });
    for (const key of Object.keys(people) as Array<keyof typeof people>) {
      const token = await request(server.url).post('/api/auth/token').send({ email: people[key].email, password });
      expect(token.status).toBe(200);
      auth[key] = { Authorization: `Bearer ${token.body.token as string}` };
    }
  }, 120_000);

  afterAll(async () => {
    await server?.stop();
    await primary?.destroy();
    await replica?.destroy();
    try {
      cluster?.destroy();
    } finally {
      if (dataDir) rmSync(dataDir, { recursive: true, force: true });
    }
  }, 60_000);

  it('serves reads from the replica, which holds what was written through the app', async () => {
    const upload = await request(server!.url)
      .post('/api/runs')
      .set(auth.ada)
      .attach('files', readFileSync(path.join(ROOT, 'fixtures/gps-samples/handheld-1s-partial-hr.gpx')), 'handheld.gpx');
    expect(upload.status).toBe(201);
    runId = upload.body.imported[0].id as string;
    // Right after the upload the uploader's list has the run, wherever it was read.
    const list = await get('ada', '/api/runs');
    expect(list.status).toBe(200);
    expect(list.body.runs.map((r: { id: string }) => r.id)).toEqual([runId]);

    // Once the replica has replayed the upload, Ada's run page comes from the replica.
    const page = await pollUntil(
      () => get('ada', `/api/runs/${runId}`),
      (res) => res.status === 200 && source(res) === 'replica',
      'the run page served by the replica',
    );
    uploadedName = page.body.name as string;
    expect(page.body.id).toBe(runId);

    // Replay paused, then a change made directly on the primary: an answer without it came from the replica.
    await replica.raw('select pg_wal_replay_pause()');
    await pollUntil(
      async () =>
        (await replica.raw<{ rows: Array<{ state: string }> }>('select pg_get_wal_replay_pause_state() as state')).rows[0]!.state,
      (state) => state === 'paused',
      'replay paused on the replica',
    );
    await primary('runs').where({ id: runId }).update({ name: 'Changed on the primary only' });
    const fromReplica = await get('ada', `/api/runs/${runId}`);
    expect(fromReplica.status).toBe(200);
    expect(source(fromReplica)).toBe('replica');
    expect(fromReplica.body.name).toBe(uploadedName);
    const listFromReplica = await get('ada', '/api/runs');
    expect(source(listFromReplica)).toBe('replica');
    expect(listFromReplica.body.runs[0].name).toBe(uploadedName);
    // The coach's pages too: the week review and the squad overview.
    const week = await get('cora', `/api/runners/${ids.ada}/week`);
    expect(week.status).toBe(200);
    expect(source(week)).toBe('replica');
    const overview = await get('cora', `/api/squads/${squadId}/overview`);
    expect(overview.status).toBe(200);
    expect(source(overview)).toBe('replica');
    expect(overview.body.rows.map((r: { runner: { name: string } }) => r.runner.name).sort()).toEqual([
      'Replica Ada',
      'Replica Ben',
    ]);

    // Read-your-writes (replay still paused): Ada renames her run through the app and reads it back at once.
    const renamed = await request(server!.url)
      .patch(`/api/runs/${runId}`)
      .set(auth.ada)
      .send({ name: 'Renamed through the app' });
    expect(renamed.status).toBe(200);
    const ownRead = await get('ada', `/api/runs/${runId}`);
    expect(ownRead.status).toBe(200);
    expect(ownRead.body.name).toBe('Renamed through the app');
    expect(source(ownRead)).toBe('primary');
    const ownList = await get('ada', '/api/runs');
    expect(ownList.body.runs[0].name).toBe('Renamed through the app');
    expect(source(ownList)).toBe('primary');
    // Ben wrote nothing: his reads still come from the replica.
    const benList = await get('ben', '/api/runs');
    expect(benList.status).toBe(200);
    expect(source(benList)).toBe('replica');
  }, 60_000);

  it('sends every read to the primary while the replica lags past the bound, and back once it catches up', async () => {
    // Replay is still paused: the lag grows until it passes the bound.
    const lagging = await pollUntil(
      () => get('ben', '/api/runs'),
      (res) => source(res) === 'primary',
      'reads moved to the primary',
      MAX_LAG_MS + 20_000,
    );
    expect(lagging.status).toBe(200);
    const adaPage = await get('ada', `/api/runs/${runId}`);
    expect(source(adaPage)).toBe('primary');
    expect(adaPage.body.name).toBe('Renamed through the app');

    await replica.raw('select pg_wal_replay_resume()');
    // Caught up: Ada's own write is replayed, so her reads come from the replica again, and show her change.
    const caughtUp = await pollUntil(
      () => get('ada', `/api/runs/${runId}`),
      (res) => source(res) === 'replica',
      'Ada read from the replica again',
    );
    expect(caughtUp.body.name).toBe('Renamed through the app');
  }, 60_000);

  it('answers every request once the replica is stopped', async () => {
    cluster.stopReplica();
    const reads = () => [
      get('ada', '/api/runs'),
      get('ada', `/api/runs/${runId}`),
      get('cora', `/api/runners/${ids.ada}/week`),
      get('cora', `/api/squads/${squadId}/overview`),
      get('ben', '/api/runs'),
    ];
    const statuses: number[] = [];
    // Some rounds at once right after the stop (pooled connections cut, new ones refused), then until all read the primary.
    for (let round = 0; round < 3; round++) {
      const answers = await Promise.all(reads());
      statuses.push(...answers.map((res) => res.status));
    }
    const settled = await pollUntil(
      () => Promise.all(reads()),
      (answers) => answers.every((res) => res.status === 200 && source(res) === 'primary'),
      'every read served by the primary',
    );
    statuses.push(...settled.map((res) => res.status));
    expect(statuses.every((s) => s === 200)).toBe(true);
    expect(statuses.length).toBeGreaterThanOrEqual(20);
    // Writes and the writer's reads carry on too.
    const renamed = await request(server!.url)
      .patch(`/api/runs/${runId}`)
      .set(auth.ada)
      .send({ name: 'Renamed without a replica' });
    expect(renamed.status).toBe(200);
    const page = await get('ada', `/api/runs/${runId}`);
    expect(page.status).toBe(200);
    expect(page.body.name).toBe('Renamed without a replica');
    expect(server!.child.exitCode).toBeNull();
  }, 60_000);
});
