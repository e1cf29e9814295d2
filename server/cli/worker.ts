/**
 * `npm run worker`: the background jobs (bulk imports, notice and plan-change e-mails, weekly digests, the orphan file
 * sweep, the nightly fee reconcile) and no HTTP. Run any number beside web processes started with
 * ROLE=web, all on one DATABASE_URL (README "Scaling out"). Without DATABASE_URL it uses the embedded
 * PostgreSQL, as `npm start` does. Ctrl-C (or SIGTERM) finishes the files in hand and stops.
 */
import { startEmbeddedPostgres, usesExternalDatabase, withDatabase } from './lib/postgres.ts';

if (!usesExternalDatabase()) process.env.DATABASE_URL = withDatabase(startEmbeddedPostgres(['pacewright']), 'pacewright');

const { ConfigError } = await import('../config.ts');
const { db } = await import('../lib/db.ts');
const { logger } = await import('../lib/logger.ts');
const { startWorker } = await import('../index.ts');

// The schema a worker's jobs expect; knex's migration lock makes concurrent starts safe.
await db.migrate.latest();

let running: Awaited<ReturnType<typeof startWorker>>;
try {
  running = await startWorker();
} catch (err) {
  if (err instanceof ConfigError) {
    console.error(`Pacewright worker cannot start: ${err.message}`);
    process.exit(1);
  }
  throw err;
}
logger.info({ jobs: running.jobs }, 'Pacewright worker is running (no HTTP)');

let stopping = false;
async function stop() {
  if (stopping) return;
  stopping = true;
  await running.close();
  process.exit(0);
}
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
