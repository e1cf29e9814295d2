import { db } from '../../server/lib/db.ts';

/**
 * One hash per table of its whole content, to show that a refused request changed nothing.
 * `api_tokens` is left out: every request with a bearer token stamps its `last_used_at`.
 */
export async function databaseFingerprint(): Promise<Record<string, string>> {
  const { rows } = await db.raw<{ rows: Array<{ tablename: string }> }>(
    "select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_migrations%' and tablename <> 'api_tokens' order by tablename",
  );
  const fingerprint: Record<string, string> = {};
  for (const { tablename } of rows) {
    const { rows: hashed } = await db.raw<{ rows: Array<{ hash: string | null }> }>(
      "select md5(coalesce(string_agg(t::text, chr(10) order by t::text), '')) as hash from ?? t",
      [tablename],
    );
    fingerprint[tablename] = hashed[0]!.hash ?? '';
  }
  return fingerprint;
}
