/**
 * `npm start`: PostgreSQL on loopback, migrations, demo data on first run, the client build, the server.
 * Ctrl-C stops the server and the embedded PostgreSQL cleanly.
 */
import { buildClientIfStale } from './lib/client-build.ts';
import { startEmbeddedPostgres, stopEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

const embedded = !usesExternalDatabase();
if (embedded) process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres(['pacewright']), 'pacewright');

const { loadConfig, ConfigError } = await import('../config.ts');
let config: ReturnType<typeof loadConfig>;
try {
  config = loadConfig();
} catch (err) {
  if (err instanceof ConfigError) {
    console.error(`Pacewright cannot start: ${err.message}`);
    if (embedded) stopEmbeddedPostgres();
    process.exit(1);
  }
  throw err;
}

const { db } = await import('../lib/db.ts');
const { loadDemoDataOnFirstRun } = await import('./lib/demo-data.ts');
const { DEMO_PEOPLE } = await import('../../db/seeds/01_demo_people.ts');

const [, applied] = (await db.migrate.latest()) as [number, string[]];
if (applied.length) console.log(`Applied ${applied.length} migration(s).`);
if (process.env.NODE_ENV !== 'production' && (await loadDemoDataOnFirstRun(db))) {
  console.log('Loaded the demo data (Harbor Line Runners).');
}

buildClientIfStale();

const { startServer } = await import('../index.ts');
const { portInUseMessage } = await import('./lib/port-in-use.ts');
let running: Awaited<ReturnType<typeof startServer>>;
try {
  running = await startServer();
} catch (err) {
  // A failed start never leaves the embedded PostgreSQL running behind it (issue 17).
  if (embedded) stopEmbeddedPostgres();
  const busy = portInUseMessage(err, config);
  if (!busy) throw err;
  console.error(`Pacewright cannot start: ${busy}`);
  process.exit(1);
}

console.log(`\nPacewright is running at ${running.url}\n`);
if (process.env.NODE_ENV !== 'production') {
  console.log('Demo sign-ins (invented people; change them before any real use):');
  for (const p of DEMO_PEOPLE) console.log(`  ${p.role.padEnd(7)} ${p.email.padEnd(26)} ${p.password}`);
  console.log(`\nAPI reference: ${running.url}/api/docs`);
}
console.log('Press Ctrl-C to stop.\n');

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  console.log('\nStopping…');
  await running.close();
  if (embedded) stopEmbeddedPostgres();
  process.exit(0);
}
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
