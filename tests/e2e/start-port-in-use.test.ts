import { spawn } from 'node:child_process';
import { createServer, type Server } from 'node:net';
import path from 'node:path';
import knexFactory from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { migrationSource } from '../../db/migrations/index.ts';
import { freePort, ownCluster } from '../support/own-cluster.ts';

// Issue 17: `npm start` with the mail catcher's port taken says so in one sentence naming the variable,
// and stops the embedded PostgreSQL it started. The real start script (server/cli/start.ts, what `npm start`
// runs) on a cluster of the test's own; the client is already built for the browser tests, and one user in
// the database keeps the demo data from loading (it loads only into an empty database).

let cluster: ReturnType<typeof ownCluster>;
let blocker: Server;
let busyPort: number;

beforeAll(async () => {
  cluster = ownCluster('pacewright', await freePort());
  cluster.start();
  const knex = knexFactory({ client: 'pg', connection: cluster.url });
  try {
    await knex.migrate.latest({ migrationSource });
    await knex('users').insert({ email: 'someone@example.test', password_hash: 'x', name: 'Someone' });
  } finally {
    await knex.destroy();
  }
  busyPort = await freePort();
  blocker = createServer();
  await new Promise<void>((resolve, reject) => {
    blocker.once('error', reject);
    blocker.listen(busyPort, '127.0.0.1', resolve);
  });
}, 180_000);

afterAll(async () => {
  await new Promise((resolve) => blocker?.close(resolve));
  cluster?.destroy();
});

describe('npm start with the mail catcher port taken', () => {
  it('prints one sentence naming MAIL_CATCHER_PORT, exits 1 without a stack trace, and stops its PostgreSQL', async () => {
    expect(cluster.isRunning()).toBe(true);
    const { DATABASE_URL: _external, ...env } = process.env;
    const child = spawn(process.execPath, ['--import', 'tsx', path.resolve('server/cli/start.ts')], {
      env: { ...env, ...cluster.env, MAIL_CATCHER_PORT: String(busyPort), PORT: '0', HOST: '127.0.0.1', NODE_ENV: 'development' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderr = '';
    child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    child.stdout.resume();
    const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));

    expect(code).toBe(1);
    expect(stderr).toContain(
      `Pacewright cannot start: Port ${busyPort} is already in use: stop the program using it, or set MAIL_CATCHER_PORT to a free port`,
    );
    expect(stderr).not.toMatch(/EADDRINUSE|\n\s+at /);
    expect(cluster.isRunning()).toBe(false);
  }, 180_000);
});
