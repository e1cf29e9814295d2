import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const PG_SH = path.join(ROOT, 'db/pg.sh');

/** True when the developer pointed us at their own PostgreSQL. */
export function usesExternalDatabase(): boolean {
  return Boolean(process.env.DATABASE_URL);
}

/**
 * Makes sure the embedded PostgreSQL runs on 127.0.0.1 (installing the Debian package as root when missing)
 * and that the named databases exist. Returns the server URL without a database name.
 */
export function startEmbeddedPostgres(databases: string[]): string {
  try {
    execFileSync('bash', [PG_SH, 'start', ...databases], { stdio: ['ignore', 'inherit', 'inherit'] });
  } catch {
    console.error(
      '\nPostgreSQL could not be started. On Debian/Ubuntu install it with `sudo apt-get install postgresql`' +
        ' (or run `npm start` as root to let it install), or set DATABASE_URL to an existing server.',
    );
    process.exit(1);
  }
  return `postgres://postgres@127.0.0.1:${process.env.PGPORT ?? 54329}`;
}

export function stopEmbeddedPostgres(): void {
  execFileSync('bash', [PG_SH, 'stop'], { stdio: ['ignore', 'inherit', 'inherit'] });
}

/** Replaces the database name in a PostgreSQL URL. */
export function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}
