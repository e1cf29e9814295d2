import { ESLint } from 'eslint';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import viteConfig from '../../../vite.config.ts';

// `.only` fails CI twice over (issue 18): ESLint refuses it (and `.skip`, `.todo`, `skipIf`, `runIf`) in every test
// file, and Vitest runs with `allowOnly: false`. Snippets are linted as if they were test files at real paths.

const ROOT = path.resolve(import.meta.dirname, '../../..');
let eslint: ESLint;

beforeAll(() => {
  eslint = new ESLint({ cwd: ROOT, overrideConfigFile: path.join(ROOT, '.ci/eslint.config.js') });
});

async function rulesFiredFor(file: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(ROOT, file) });
  return result!.messages.map((m) => `${m.ruleId ?? 'parse'}: ${m.message}`);
}

const header = "import { describe, expect, it, test } from 'vitest';\n";

describe('focused and skipped tests', { timeout: 60_000 }, () => {
  it.each([
    ['tests/api/probe.api.test.ts', "it.only('a', () => expect(1).toBe(1));"],
    ['tests/unit/probe.test.ts', "describe.skip('a', () => {});"],
    ['tests/unit/probe.test.ts', "it.todo('a');"],
    ['tests/unit/probe.test.ts', "test.skipIf(true)('a', () => expect(1).toBe(1));"],
    ['tests/e2e/probe.test.ts', "describe.runIf(false)('a', () => {});"],
    ['tests/unit/probe.test.ts', "it.only.each([1])('a %s', (n) => expect(n).toBe(1));"],
    ['tests/unit/probe.test.ts', "it.concurrent.only('a', () => expect(1).toBe(1));"],
    ['tests/client/components/probe.test.tsx', "it.only('a', () => expect(<p />).toBeTruthy());"],
  ])('%s: `%s` is refused', async (file, code) => {
    // Only this rule: the snippets leave imports unused on purpose.
    const fired = (await rulesFiredFor(file, header + code + '\n')).filter((m) => m.startsWith('no-restricted-syntax'));
    expect(fired).toEqual(['no-restricted-syntax: Focused or skipped tests never reach main: every test runs in CI.']);
  });

  it('ordinary tests, tables and polls pass', async () => {
    const code = `${header}describe('a', () => {
  it('b', () => expect(1).toBe(1));
  it.each([1, 2])('c %s', (n) => expect(n).toBeGreaterThan(0));
  test('d', async () => expect.poll(() => 1).toBe(1));
});
`;
    expect(await rulesFiredFor('tests/unit/probe.test.ts', code)).toEqual([]);
  });

  it('Vitest itself refuses `.only` in every project (allowOnly: false)', () => {
    expect(viteConfig.test?.allowOnly).toBe(false);
    const projects = (viteConfig.test?.projects ?? []) as Array<{ extends?: boolean; test?: { allowOnly?: boolean } }>;
    expect(projects.length).toBeGreaterThanOrEqual(4);
    // Each project extends the root config and none turns it back on.
    for (const project of projects) {
      expect(project.extends).toBe(true);
      expect(project.test?.allowOnly).toBeUndefined();
    }
  });
});
