import type { Knex } from 'knex';
import { migrationSource } from './migrations/index.ts';

/** Knex settings for a PostgreSQL URL. Migrations come from a static source so they run under tsx, Vitest and a bundle alike. */
export function knexConfig(databaseUrl: string): Knex.Config {
  return {
    client: 'pg',
    // A connection attempt to a PostgreSQL that does not answer gives up after 5 s (pg waits forever by default).
    connection: { connectionString: databaseUrl, connectionTimeoutMillis: 5_000 },
    pool: { min: 0, max: 10 },
    // Waiting for a free pooled connection: long enough for a burst of requests, short of Knex's 60 s default,
    // so requests fail with a 503 within seconds while the database is away.
    acquireConnectionTimeout: 10_000,
    migrations: { migrationSource, tableName: 'knex_migrations' },
  };
}
