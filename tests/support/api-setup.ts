import { afterAll, beforeAll, beforeEach } from 'vitest';
import { runComputeJob, stopComputePool, warmComputePool } from '../../server/features/compute/compute-pool.ts';
import { db } from '../../server/lib/db.ts';

// The compute pool's first thread loads its code (a few seconds on a busy machine) before any test
// runs, as a server does at start, so no test's own time limit pays for it.
beforeAll(async () => {
  warmComputePool();
  await runComputeJob('warm-up', { kind: 'spin', ms: 0 });
}, 60_000);

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
  await stopComputePool();
  await db.destroy();
});
