/**
 * `npm run dev`: PostgreSQL, migrations and demo data as `npm start` does, then the API server in
 * watch mode on PORT (3000) and the Vite dev server with hot reload, proxying /api to it.
 */
import { spawn } from 'node:child_process';
import path from 'node:path';
import { ROOT, startEmbeddedPostgres, stopEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

const embedded = !usesExternalDatabase();
if (embedded) process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres(['pacewright']), 'pacewright');

const { db } = await import('../lib/db.ts');
const { loadDemoDataOnFirstRun } = await import('./lib/demo-data.ts');
await db.migrate.latest();
await loadDemoDataOnFirstRun(db);
await db.destroy();

const children = [
  spawn(process.execPath, ['--watch', '--import', 'tsx', 'server/index.ts'], { cwd: ROOT, stdio: 'inherit', env: process.env }),
  spawn(process.execPath, [path.join(ROOT, 'node_modules/vite/bin/vite.js'), '--host', process.env.HOST ?? '127.0.0.1'], {
    cwd: ROOT,
    stdio: 'inherit',
    env: process.env,
  }),
];

let stopping = false;
function stop() {
  if (stopping) return;
  stopping = true;
  for (const child of children) child.kill('SIGTERM');
  if (embedded) stopEmbeddedPostgres();
  process.exit(0);
}
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const child of children) child.on('exit', stop);
