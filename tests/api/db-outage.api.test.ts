/**
 * PostgreSQL stopped and started again under the running server (issue 8): /api/health says down
 * then up, requests in between get a 503 in words, the server process never restarts, nothing is lost.
 *
 * It needs a database it may stop, so it runs its own throwaway cluster through db/pg.sh (own folder,
 * own port) and the real server (`server/index.ts`, import worker and all) as a child process bound
 * to it. The shared test database of the other API tests is never touched.
 */
import bcrypt from 'bcryptjs';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import knexFactory from 'knex';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, onTestFailed } from 'vitest';
import { knexConfig } from '../../db/knexfile.ts';
import { freePort, ownCluster } from '../support/own-cluster.ts';
import { pollUntil } from '../support/poll.ts';
import { buildZip } from '../support/zip-builder.ts';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const DATABASE = 'pacewright_outage';
const FIXTURES = path.join(ROOT, 'fixtures/gps-samples');
const gpsFile = (name: string) => readFileSync(path.join(FIXTURES, name));

interface ServerProcess {
  child: ChildProcess;
  url: string;
  /** Everything the server printed so far (pino JSON lines, and anything a crash would print). */
  output(): string;
  /** The `msg` of every JSON log line. */
  logMessages(): string[];
}

/** The real server, started the way `npm run dev` starts it, logging at info so the test can read what happened. */
async function startServerProcess(databaseUrl: string, dataDir: string): Promise<ServerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      HOST: '127.0.0.1',
      PORT: '0',
      DATA_DIR: dataDir,
      STORAGE: 'fs',
      JWT_SECRET: 'outage-test-secret-0123456789-0123456789',
      BCRYPT_COST: '10',
      LOG_LEVEL: 'info',
      SMTP_URL: '',
      MAIL_CATCHER_PORT: '0',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const url = await new Promise<string>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`the server did not start within 60 s:\n${output}`)), 60_000);
    child.stdout!.on('data', () => {
      const listening = /listening on (http:\/\/127\.0\.0\.1:\d+)/.exec(output);
      if (listening) {
        clearTimeout(timer);
        resolve(listening[1]!);
      }
    });
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      reject(new Error(`the server ended (${code ?? signal}) before it listened:\n${output}`));
    });
  });
  return {
    child,
    url,
    output: () => output,
    logMessages: () =>
      output
        .split('\n')
        .filter((line) => line.startsWith('{'))
        .map((line) => String((JSON.parse(line) as { msg?: unknown }).msg)),
  };
}

const isRunning = (child: ChildProcess) => child.exitCode === null && child.signalCode === null;

/** What a runner or a script must get while the database is away: 503, Retry-After, a sentence, no internals. */
function expectDatabaseUnavailable(res: request.Response) {
  expect(res.status).toBe(503);
  expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
  expect(res.body).toEqual({
    error: expect.stringMatching(/^Pacewright cannot reach its database just now\./),
    code: 'database-unavailable',
  });
  expect(res.text).not.toMatch(/ECONNREFUSED|127\.0\.0\.1|\bat .+\.(ts|js):\d+|terminating connection/);
}

describe('PostgreSQL stopped and restarted under the running server', () => {
  let cluster: ReturnType<typeof ownCluster>;
  let dataDir: string;
  let server: ServerProcess | undefined;
  const runner = { email: 'outage.runner@pacewright.test', password: 'steady-lake-loops', name: 'Outage Runner' };
  let auth: Record<string, string>;

  beforeAll(async () => {
    cluster = ownCluster(DATABASE, await freePort());
    dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-outage-'));
    cluster.start();
    const knex = knexFactory(knexConfig(cluster.url));
    try {
      await knex.migrate.latest();
    } finally {
      await knex.destroy();
    }
    // The runner is put in directly: signing up goes through an e-mailed link (issue 13 #7).
    const seed = knexFactory(knexConfig(cluster.url));
    try {
      await seed('users').insert({
        email: runner.email,
        name: runner.name,
        role: 'runner',
        password_hash: await bcrypt.hash(runner.password, 4),
      });
    } finally {
      await seed.destroy();
    }
    server = await startServerProcess(cluster.url, dataDir);
    const token = await request(server.url).post('/api/auth/token').send({ email: runner.email, password: runner.password });
    expect(token.status).toBe(200);
    auth = { Authorization: `Bearer ${token.body.token as string}` };
  }, 120_000);

  afterAll(async () => {
    if (server && isRunning(server.child)) {
      const ended = new Promise((resolve) => server!.child.once('exit', resolve));
      server.child.kill('SIGKILL');
      await ended;
    }
    try {
      cluster?.destroy();
    } finally {
      if (dataDir) rmSync(dataDir, { recursive: true, force: true });
    }
  }, 30_000);

  it('answers 503 while it is down, carries on once it is back, without a restart and with nothing lost', async () => {
    const { url, child } = server!;
    const pid = child.pid;
    onTestFailed(() => console.error(`The server's last output:\n${server!.output().slice(-6_000)}`));

    const before = await request(url).post('/api/runs').set(auth).attach('files', gpsFile('run-hr-4s.gpx'), 'before.gpx');
    expect(before.status).toBe(201);
    const runBefore = before.body.imported[0].id as string;

    const QUEUE_ERROR = 'the import queue reported an error';
    const queueErrorsBefore = server!.logMessages().filter((m) => m === QUEUE_ERROR).length;
    cluster.stop();

    const health = async () => {
      const res = await request(url).get('/api/health');
      return { status: res.status, body: res.body as unknown };
    };
    const down = await pollUntil(health, (res) => res.status === 503, 'health says down');
    expect(down.body).toEqual({ ok: false, db: 'down' });

    expectDatabaseUnavailable(await request(url).get('/api/runs').set(auth));
    expectDatabaseUnavailable(await request(url).get(`/api/runs/${runBefore}`).set(auth));
    expectDatabaseUnavailable(
      await request(url).post('/api/runs').set(auth).attach('files', gpsFile('watch-run-3-laps.tcx'), 'during.tcx'),
    );
    expectDatabaseUnavailable(await request(url).post('/api/plans').set(auth).send({ date: '2026-06-01', text: '10 mi easy' }));
    // Signing in must not say "wrong password" just because the user table cannot be read.
    expectDatabaseUnavailable(
      await request(url).post('/api/auth/login').send({ email: runner.email, password: runner.password }),
    );
    expect((await request(url).get('/api/health')).status).toBe(503);

    // The import worker (pg-boss) polls every 2 s: wait until it has met the missing database too and said so.
    await pollUntil(
      async () => server!.logMessages().filter((m) => m === QUEUE_ERROR).length,
      (errors) => errors > queueErrorsBefore,
      'the import worker meets the missing database',
    );
    expect(isRunning(child)).toBe(true);

    cluster.start();

    const up = await pollUntil(health, (res) => res.status === 200, 'health says up');
    expect(up.body).toEqual({ ok: true, db: 'up' });
    expect(child.pid).toBe(pid);
    expect(isRunning(child)).toBe(true);

    const listed = await request(url).get('/api/runs').set(auth);
    expect(listed.status).toBe(200);
    expect(listed.body.runs.map((r: { id: string }) => r.id)).toEqual([runBefore]);

    const after = await request(url).post('/api/runs').set(auth).attach('files', gpsFile('watch-run-3-laps.tcx'), 'after.tcx');
    expect(after.status).toBe(201);

    // The background import worker (pg-boss) reconnects by itself and takes new work.
    const zip = buildZip([{ name: 'history/lake.gpx', data: gpsFile('run-excerpt-3-segments.gpx') }]);
    const queued = await request(url).post('/api/imports').set(auth).attach('file', zip, 'history.zip');
    expect(queued.status).toBe(202);
    const importPath = `/api/imports/${queued.body.import.id as string}`;
    const progress = await pollUntil(
      async () => (await request(url).get(importPath).set(auth)).body as { status: string },
      (body) => body.status === 'done' || body.status === 'failed',
      'the bulk import after the outage finishes',
    );
    expect(progress).toMatchObject({ status: 'done', total: 1, imported: 1, rejected: [] });

    const all = await request(url).get('/api/runs').set(auth);
    expect(all.body.total).toBe(3);
    expect(all.body.runs.map((r: { id: string }) => r.id)).toContain(runBefore);

    // Every database error was recognised as such: logged as a warning, never as an unexplained 500.
    const messages = server!.logMessages();
    expect(messages).toContain('the database cannot be reached');
    expect(messages).not.toContain('unhandled error');
    expect(isRunning(child)).toBe(true);
  }, 60_000);

  it('still shuts down cleanly afterwards', async () => {
    const { child } = server!;
    const exit = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
    child.kill('SIGTERM');
    expect(await exit).toBe(0);
  }, 30_000);
});
