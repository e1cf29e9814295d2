import { ESLint } from 'eslint';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';

// The feature boundaries of .ci/eslint.config.js (server/features/README.md), run through ESLint's
// own API on small snippets placed at real paths, so a config change that stops a rule firing fails here.

const ROOT = path.resolve(import.meta.dirname, '../../..');
let eslint: ESLint;

beforeAll(() => {
  eslint = new ESLint({ cwd: ROOT, overrideConfigFile: path.join(ROOT, '.ci/eslint.config.js') });
});

/** The rule ids ESLint reports for `code` as if it were the file at `file` (relative to the repository). */
async function rulesFiredFor(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(ROOT, file) });
  return result!.messages.map((m) => `${m.ruleId ?? 'parse'}: ${m.message}`);
}

describe('server feature boundaries', { timeout: 60_000 }, () => {
  it("refuses another feature's repository, and says which face to use", async () => {
    const fired = await rulesFiredFor(
      'server/features/weeks/boundary-probe.service.ts',
      "import { findRunById } from '../runs/runs.repository.ts';\nexport const probe = findRunById;\n",
    );
    expect(fired).toHaveLength(1);
    expect(fired[0]).toMatch(/^import-x\/no-restricted-paths: .*server\/features\/runs\/index\.ts/);
  });

  it("refuses another feature's service or helper file too, but takes its index.ts", async () => {
    expect(
      await rulesFiredFor(
        'server/features/fuel/boundary-probe.service.ts',
        "import { getReadableRun } from '../runs/runs.service.ts';\nexport const probe = getReadableRun;\n",
      ),
    ).toHaveLength(1);
    expect(
      await rulesFiredFor(
        'server/features/fuel/boundary-probe.service.ts',
        "import { getReadableRun } from '../runs/index.ts';\nexport const probe = getReadableRun;\n",
      ),
    ).toEqual([]);
  });

  it('refuses server internals in db/ seeds', async () => {
    const fired = await rulesFiredFor(
      'db/seeds/boundary-probe.ts',
      "import { importFiles } from '../../server/features/runs/runs.service.ts';\nexport const probe = importFiles;\n",
    );
    expect(fired).toEqual([expect.stringMatching(/^import-x\/no-restricted-paths: /)]);
  });

  it('refuses the Knex instance and Knex calls in a service, and allows them in a repository', async () => {
    const code =
      "import { db } from '../../lib/db.ts';\nexport const probe = (id: string) => db('runs').where({ id }).first();\n";
    const inService = await rulesFiredFor('server/features/runs/boundary-probe.service.ts', code);
    expect(inService).toEqual([
      expect.stringMatching(/^@typescript-eslint\/no-restricted-imports: /),
      expect.stringMatching(/^no-restricted-syntax: Queries live in a repository/),
    ]);
    expect(await rulesFiredFor('server/features/runs/boundary-probe.repository.ts', code)).toEqual([]);
    // Type imports (rows, the transaction type) and opening a transaction stay allowed in services.
    expect(
      await rulesFiredFor(
        'server/features/runs/boundary-probe.service.ts',
        "import type { Knex } from 'knex';\nimport { inTransaction, type RunRow } from '../../lib/db.ts';\nexport const probe = (work: (trx: Knex.Transaction) => Promise<RunRow>) => inTransaction(work);\n",
      ),
    ).toEqual([]);
  });

  it('sees the Knex instance taken through a dynamic import too, as server/index.ts once did', async () => {
    const destructured =
      "export async function probe() {\n  const { db } = await import('./lib/db.ts');\n  await db.destroy();\n}\n";
    expect(await rulesFiredFor('server/index.ts', destructured)).toEqual([
      expect.stringMatching(/^no-restricted-syntax: Queries live in a repository/),
    ]);
    const member = "export async function probe() {\n  await (await import('../../lib/db.ts')).db.destroy();\n}\n";
    expect(await rulesFiredFor('server/features/runs/boundary-probe.service.ts', member)).toEqual([
      expect.stringMatching(/^no-restricted-syntax: Queries live in a repository/),
    ]);
    const knex = "export async function probe() {\n  return (await import('knex')).default;\n}\n";
    expect(await rulesFiredFor('server/features/runs/boundary-probe.service.ts', knex)).toEqual([
      expect.stringMatching(/^no-restricted-syntax: Knex is used only in repositories/),
    ]);
    // What the composition root takes instead: closing the pool, no query builder.
    const closing =
      "export async function probe() {\n  const { closeDatabase } = await import('./lib/db.ts');\n  await closeDatabase();\n}\n";
    expect(await rulesFiredFor('server/index.ts', closing)).toEqual([]);
    // Scripts (server/cli) are composition roots that run queries themselves.
    expect(await rulesFiredFor('server/cli/boundary-probe.ts', destructured)).toEqual([]);
  });

  it('holds in the services that were once exempt: no file outside repositories, lib/db and cli may query', async () => {
    const code = "import { db } from '../../lib/db.ts';\nexport const probe = () => db('users').first();\n";
    // The nine files of the old KNEX_NOT_YET_MOVED list (issue 18), linted at their real paths.
    const onceExempt = [
      'server/features/auth/auth.service.ts',
      'server/features/auth/credential-limiter.ts',
      'server/features/auth/password-reset.service.ts',
      'server/features/auth/sign-up.service.ts',
      'server/features/fees/fees.service.ts',
      'server/features/notices/notices.service.ts',
      'server/features/plans/plan-notices.ts',
      'server/features/squads/squads.service.ts',
      'server/features/tokens/tokens.service.ts',
    ];
    for (const file of onceExempt) {
      expect(await rulesFiredFor(file, code), file).toEqual([
        expect.stringMatching(/^@typescript-eslint\/no-restricted-imports: /),
        expect.stringMatching(/^no-restricted-syntax: Queries live in a repository/),
      ]);
    }
  });

  it('a public face never re-exports a repository: it offers service functions', async () => {
    const fired = await rulesFiredFor(
      'server/features/goals/index.ts',
      "export { findGoalRace } from './goals.repository.ts';\n",
    );
    expect(fired).toEqual([expect.stringMatching(/^no-restricted-syntax: A repository is private to its feature/)]);
    expect(
      await rulesFiredFor('server/features/goals/index.ts', "export { findGoalRace } from './goal-reads.service.ts';\n"),
    ).toEqual([]);
  });

  it('runs/ never imports history/, even through its face (history imports runs)', async () => {
    const fired = await rulesFiredFor(
      'server/features/runs/boundary-probe.ts',
      "import { sweepLeftoverArchives } from '../history/index.ts';\nexport const probe = sweepLeftoverArchives;\n",
    );
    expect(fired).toEqual([expect.stringMatching(/^import-x\/no-restricted-paths: .*runs\/ never imports history\//)]);
  });

  it('a public face names what it exports: no export *', async () => {
    const fired = await rulesFiredFor('server/features/goals/index.ts', "export * from './goals.service.ts';\n");
    expect(fired).toEqual([expect.stringMatching(/^no-restricted-syntax: Name what the feature makes public/)]);
  });
});

describe('client feature boundaries', { timeout: 60_000 }, () => {
  it("refuses another client feature's component file, and takes its index.ts", async () => {
    expect(
      await rulesFiredFor(
        'client/features/squad/components/boundary-probe.tsx',
        "import { UnreadDot } from '../../notes/components/unread-dot.tsx';\nexport const probe = UnreadDot;\n",
      ),
    ).toEqual([expect.stringMatching(/^import-x\/no-restricted-paths: .*client\/features\/notes\/index\.ts/)]);
    expect(
      await rulesFiredFor(
        'client/features/squad/components/boundary-probe.tsx',
        "import { UnreadDot } from '../../notes/index.ts';\nexport const probe = UnreadDot;\n",
      ),
    ).toEqual([]);
  });
});
