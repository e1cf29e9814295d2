import type { Knex } from 'knex';
import { migrationSource } from './migrations/index.ts';

/** Knex settings for a PostgreSQL URL. Migrations come from a static source so they run under tsx, Vitest and a bundle alike. */
export function knexConfig(databaseUrl: string): Knex.Config {
  return {
    client: 'pg',
    connection: databaseUrl,
    pool: { min: 0, max: 10 },
    migrations: { migrationSource, tableName: 'knex_migrations' },
  };
}
