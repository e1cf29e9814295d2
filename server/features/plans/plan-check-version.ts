import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';

/**
 * The code that turns a run's series and its plan's resolved parts into a result: the plan check and the
 * one module it imports at run time. A module it starts importing at run time belongs here too
 * (tests/unit/server/plans/plan-check-version.test.ts checks that).
 */
export const PLAN_CHECK_SOURCES = ['shared/plans/plan-check.ts', 'shared/plans/closing-recovery.ts'] as const;

function hashSources(root: URL): string | null {
  try {
    const hash = createHash('sha256');
    for (const file of PLAN_CHECK_SOURCES) hash.update(readFileSync(new URL(file, root)));
    return hash.digest('hex').slice(0, 16);
  } catch {
    return null;
  }
}

/**
 * Names the plan-check code a stored result came from: a hash of its source, read once at start-up.
 * Any edit there makes every stored result stale, so each is recomputed on its next read — there is
 * no version number to remember to bump. Null when the source cannot be read (a bundled build): then
 * results are computed on every read and never stored.
 */
export const PLAN_CHECK_CODE_VERSION: string | null = hashSources(new URL('../../../', import.meta.url));
