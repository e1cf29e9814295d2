import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { PLAN_CHECK_CODE_VERSION, PLAN_CHECK_SOURCES } from '../../../../server/features/plans/plan-check-version.ts';

const ROOT = path.resolve(import.meta.dirname, '../../../..');

describe('the plan-check code version', () => {
  it('is read from the source, so stored results are keyed by the code that made them', () => {
    expect(PLAN_CHECK_CODE_VERSION).toMatch(/^[0-9a-f]{16}$/);
  });

  it('covers every module the plan check runs: a module it imports at run time must be listed', () => {
    const listed = new Set<string>(PLAN_CHECK_SOURCES);
    for (const file of PLAN_CHECK_SOURCES) {
      const source = readFileSync(path.join(ROOT, file), 'utf8');
      // Type-only imports vanish at run time; any other import is code the results depend on.
      const runtimeImports = [...source.matchAll(/^import\s+(?!type\s)[^;]*?from\s+'(\.[^']+)'/gm)].map((m) =>
        path.posix.join(path.posix.dirname(file), m[1]!),
      );
      for (const imported of runtimeImports) expect(listed, `${file} imports ${imported}`).toContain(imported);
    }
  });
});
