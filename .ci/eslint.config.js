// ESLint flat config (kept under .ci/ because the project's top level is fixed; `npm run lint` points here).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import importX from 'eslint-plugin-import-x';

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
    // `.only` would silently narrow CI to one test; `.skip`/`.todo` would let a test stop counting.
    files: ['tests/**/*.ts'],
    rules: {
      'no-restricted-syntax': [
        'error',
        {
          selector:
            "CallExpression[callee.type='MemberExpression'][callee.object.name=/^(describe|it|test|bench)$/][callee.property.name=/^(only|skip|skipIf|runIf|todo)$/]",
          message: 'Focused or skipped tests never reach main: every test runs in CI.',
        },
      ],
    },
  },
  { files: ['client/**/*.tsx', 'client/**/*.ts'], ...reactHooks.configs.flat['recommended-latest'] },
);
