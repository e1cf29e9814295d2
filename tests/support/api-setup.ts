import { afterAll, beforeEach } from 'vitest';
import { db } from '../../server/lib/db.ts';

// Every API test starts from empty tables (migrations ran once in tests/run.ts).
beforeEach(async () => {
  const { rows } = await db.raw<{ rows: Array<{ tablename: string }> }>(
    "select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_migrations%'",
  );
  if (rows.length)
    await db.raw(
      `truncate ${rows.map(() => '??').join(', ')} restart identity cascade`,
      rows.map((r) => r.tablename),
    );
});

afterAll(async () => {
  await db.destroy();
});
