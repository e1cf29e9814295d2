// ESLint flat config (kept under .ci/ because the project's top level is fixed; `npm run lint` points here).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import importX from 'eslint-plugin-import-x';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const featuresOf = (side) =>
  readdirSync(path.join(root, side, 'features'), { withFileTypes: true })
    .filter((entry) => entry.isDirectory())
    .map((entry) => entry.name);

/**
 * Feature boundaries (server/features/README.md): a feature is imported by another feature, and by
 * db/, only through its public face, its `index.ts` (and `worker.ts`, what the compute threads load);
 * everything else in its folder (repositories, routes, helpers) is private. The composition roots
 * (server/app.ts, server/index.ts, server/cli, client/app) wire features together and may reach in.
 */
const featureZones = (side, importers) =>
  featuresOf(side).map((feature) => ({
    target: [
      ...featuresOf(side)
        // jobs/ starts every feature's background work (server/features/jobs): a composition root too.
        .filter((other) => other !== feature && other !== 'jobs')
        .map((other) => `./${side}/features/${other}`),
      ...importers,
    ],
    from: `./${side}/features/${feature}`,
    except: ['./index.ts', './worker.ts'],
    message: `Import the ${side} feature "${feature}" only through its public face, ${side}/features/${feature}/index.ts.`,
  }));

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'test-results/**', '.data/**', 'fixtures/generated/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    plugins: { 'import-x': importX },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' },
      ],
      '@typescript-eslint/consistent-type-imports': 'error',
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            // shared/ is pure: it never reaches into the client, the server, the database or Node.
            { target: './shared', from: './client' },
            { target: './shared', from: './server' },
            { target: './shared', from: './db' },
            { target: './client', from: './server' },
            { target: './client', from: './db' },
            { target: './server', from: './client' },
            // The layers below the features never reach up into one.
            { target: './server/lib', from: './server/features' },
            { target: './client/lib', from: './client/features' },
            { target: './client/components', from: './client/features' },
            // history/ imports runs/ (a bulk import imports runs); runs/ never imports history/ back.
            {
              target: './server/features/runs',
              from: './server/features/history',
              message:
                'runs/ never imports history/: history imports runs, and a cycle makes both one feature (hand the step in from jobs/).',
            },
            ...featureZones('server', ['./db']),
            ...featureZones('client', []),
          ],
        },
      ],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['node:*', 'knex', 'react', 'react-dom', 'express', 'pg'],
              message: 'shared/ is pure: no I/O, no framework.',
            },
          ],
        },
      ],
    },
  },
  {
    // Knex lives in repositories (and server/lib/db.ts, db/): a service says what it needs in the
    // words of its feature and a repository says how it is stored. Services may open a transaction
    // (`inTransaction`) and hand it to repositories; type imports (rows, `Db`) are fine anywhere.
    files: ['server/**/*.ts'],
    ignores: ['server/**/*.repository.ts', 'server/lib/db.ts', 'server/lib/read-replica.ts', 'server/cli/**'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          paths: [
            { name: 'knex', allowTypeImports: true, message: 'Knex is used only in repositories, server/lib/db.ts and db/.' },
          ],
          patterns: [
            {
              regex: '(^|/)lib/db(\\.ts)?$',
              importNames: ['db'],
              message: 'Queries live in a repository: call one, or open a transaction with inTransaction from server/lib/db.ts.',
            },
          ],
        },
      ],
      'no-restricted-syntax': [
        'error',
        {
          selector: "CallExpression[callee.type='Identifier'][callee.name=/^(db|trx|knex)$/]",
          message: 'Queries live in a repository: pass the transaction to a repository function instead.',
        },
        // The import rules above see only static imports: `const { db } = await import('./lib/db.ts')`
        // and `(await import('./lib/db.ts')).db` would slip past them.
        {
          selector:
            "VariableDeclarator[init.argument.type='ImportExpression'][init.argument.source.value=/(^|\\/)lib\\/db(\\.ts)?$/] > ObjectPattern > Property[key.name='db']",
          message: 'Queries live in a repository: call one, or open a transaction with inTransaction from server/lib/db.ts.',
        },
        {
          selector:
            "MemberExpression[property.name='db'][object.argument.type='ImportExpression'][object.argument.source.value=/(^|\\/)lib\\/db(\\.ts)?$/]",
          message: 'Queries live in a repository: call one, or open a transaction with inTransaction from server/lib/db.ts.',
        },
        {
          selector: "ImportExpression[source.value='knex']",
          message: 'Knex is used only in repositories, server/lib/db.ts and db/.',
        },
      ],
    },
  },
  {
    // A feature's face names each thing it makes public: no `export *`, so a new helper never leaks.
    files: ['server/features/*/index.ts', 'server/features/*/worker.ts', 'client/features/*/index.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        { selector: 'ExportAllDeclaration', message: 'Name what the feature makes public: export { … } from, never export *.' },
        {
          selector: 'ExportNamedDeclaration[source.value=/\\.repository(\\.ts)?$/]',
          message: 'A repository is private to its feature: the face exports service functions, never a repository.',
        },
      ],
    },
  },
  {
    // `.only` would silently narrow CI to one test; `.skip`/`.todo` would let a test stop counting.
    // Component tests are .tsx; `it.only.each`, `it.concurrent.only` and `describe.skipIf(…)` are caught too.
    files: ['tests/**/*.ts', 'tests/**/*.tsx'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector:
            'MemberExpression[object.name=/^(describe|suite|it|test|bench)$/][property.name=/^(only|skip|skipIf|runIf|todo)$/]',
          message: 'Focused or skipped tests never reach main: every test runs in CI.',
        },
        {
          selector:
            'MemberExpression[object.object.name=/^(describe|suite|it|test|bench)$/][property.name=/^(only|skip|skipIf|runIf|todo)$/]',
          message: 'Focused or skipped tests never reach main: every test runs in CI.',
        },
      ],
    },
  },
  { files: ['client/**/*.tsx', 'client/**/*.ts'], ...reactHooks.configs.flat['recommended-latest'] },
);
