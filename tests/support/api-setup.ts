import { afterAll, afterEach, beforeAll, beforeEach } from 'vitest';
import { stopPasswordPool } from '../../server/features/auth/password-pool.ts';
import { runComputeJob, stopComputePool, warmComputePool } from '../../server/features/compute/compute-pool.ts';
import { checkAnswersWith, type AnswerMismatch } from '../../server/lib/api-router.ts';
import { db } from '../../server/lib/db.ts';
import { answersChecked } from './answers-checked.ts';

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
  await stopPasswordPool();
  await db.destroy();
});

// Every 2xx answer of the API suite is checked against its route's declaration (server/lib/api-router.ts):
// a JSON body that does not parse with the answer schema, a file of an undeclared type or a body on a 204
// fails the test that caused it.
const mismatches: AnswerMismatch[] = [];
checkAnswersWith((mismatch) => {
  if (mismatch) mismatches.push(mismatch);
  else answersChecked.count++;
});

afterEach(() => {
  const found = mismatches.splice(0);
  if (found.length > 0)
    throw new Error(
      `Answers that do not match their declared schema:\n${found.map((m) => `${m.route}: ${m.problem}`).join('\n')}`,
    );
});
