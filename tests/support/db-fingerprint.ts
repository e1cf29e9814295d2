import { db } from '../../server/lib/db.ts';

/**
 * One hash per table of its whole content, to show that a refused request changed nothing.
 * Left out: `api_tokens` (every request with a bearer token stamps its `last_used_at`), and the
 * shared limits' bookkeeping (`rate_limit_hits`, `upload_slots`), which counts requests, refused ones
 * too, and holds a slot only while an upload arrives.
 */
export async function databaseFingerprint(): Promise<Record<string, string>> {
  const { rows } = await db.raw<{ rows: Array<{ tablename: string }> }>(
    "select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_migrations%' and tablename not in ('api_tokens', 'rate_limit_hits', 'upload_slots') order by tablename",
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
