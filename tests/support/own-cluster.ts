/**
 * A PostgreSQL cluster of a test's own (to stop it, or to copy it into a streaming replica) through
 * db/pg.sh: its own folder under /var/tmp and its own port. The shared test database is never touched.
 */
import { execFileSync } from 'node:child_process';
import { randomInt, randomUUID } from 'node:crypto';
import { createServer } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

/**
 * A free port outside Linux's ephemeral range (32768–60999), so no outgoing connection takes it while a
 * cluster is stopped and it can start again on the same port.
 */
export async function freePort(): Promise<number> {
  for (let attempt = 0; attempt < 20; attempt++) {
    const port = randomInt(20_000, 30_000);
    const free = await new Promise<boolean>((resolve) => {
      const probe = createServer();
      probe.once('error', () => resolve(false));
      probe.listen(port, '127.0.0.1', () => probe.close(() => resolve(true)));
    });
    if (free) return port;
  }
  throw new Error('no free port between 20000 and 30000 for the test cluster');
}

/**
 * The cluster holding `database` on `port`, and its replica mode: a streaming replica made with pg_basebackup on
 * `replicaPort` (db/pg.sh's default, `port` + 10, when the test needs none: `destroy` is safe without a replica).
 */
export function ownCluster(database: string, port: number, replicaPort = port + 10) {
  const env = {
    ...process.env,
    PGBASE: `/var/tmp/pg-test-${randomUUID().slice(0, 8)}`,
    PGPORT: String(port),
    REPLICA_PORT: String(replicaPort),
  };
  const pgSh = (...args: string[]) => {
    try {
      execFileSync('bash', [path.join(ROOT, 'db/pg.sh'), ...args], { env, stdio: 'pipe', timeout: 90_000 });
    } catch (err) {
      const stderr = (err as { stderr?: Buffer }).stderr?.toString() ?? '';
      throw new Error(`db/pg.sh ${args.join(' ')} failed (this test needs PostgreSQL's programs installed):\n${stderr}`, {
        cause: err,
      });
    }
  };
  return {
    /** PGBASE and PGPORT for a child process that runs db/pg.sh on this same cluster (e.g. `npm start`). */
    env: { PGBASE: env.PGBASE, PGPORT: env.PGPORT },
    url: `postgres://postgres@127.0.0.1:${port}/${database}`,
    replicaUrl: `postgres://postgres@127.0.0.1:${replicaPort}/${database}`,
    start: () => pgSh('start', database),
    /** Whether the primary runs (`db/pg.sh status` exits 0 when running, 3 when stopped). */
    isRunning: () => {
      try {
        execFileSync('bash', [path.join(ROOT, 'db/pg.sh'), 'status'], { env, stdio: 'pipe', timeout: 30_000 });
        return true;
      } catch {
        return false;
      }
    },
    /** `pg_ctl stop -m fast` on the primary: open sessions are cut with "terminating connection due to administrator command". */
    stop: () => pgSh('stop'),
    startReplica: () => pgSh('replica', 'start'),
    /** `pg_ctl stop -m fast`: open sessions are cut with "terminating connection due to administrator command". */
    stopReplica: () => pgSh('replica', 'stop'),
    destroy: () => {
      try {
        pgSh('replica', 'destroy');
      } finally {
        pgSh('destroy');
      }
    },
  };
}
