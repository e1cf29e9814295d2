import pg from 'pg';

/**
 * A compute worker's own connection to PostgreSQL (one, opened on first use, closed when idle), for
 * reading large values such as stored tracks: receiving and decoding megabytes of bytea is CPU
 * work that belongs off the event loop as much as the computation that follows.
 */
let pool: pg.Pool | null = null;
let poolUrl: string | null = null;

export function workerDatabase(databaseUrl: string): pg.Pool {
  if (!pool || poolUrl !== databaseUrl) {
    void pool?.end().catch(() => undefined);
    pool = new pg.Pool({
      connectionString: databaseUrl,
      max: 1,
      connectionTimeoutMillis: 5_000,
      idleTimeoutMillis: 10_000,
      allowExitOnIdle: true,
    });
    // A connection dropped while idle (PostgreSQL restarting) is simply opened again on next use.
    pool.on('error', () => undefined);
    poolUrl = databaseUrl;
  }
  return pool;
}
