import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

// DEVELOPERS.md stays a guide a newcomer can trust (issue 18): short, its folder map naming paths that exist, and
// every feature's decisions (a README.md beside the code) one link away.

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const GUIDE = readFileSync(path.join(ROOT, 'DEVELOPERS.md'), 'utf8');
const SKIPPED_FOLDERS = new Set(['node_modules', 'dist', 'test-results', '.git', '.data']);

function readmesUnder(dir: string): string[] {
  return readdirSync(path.join(ROOT, dir), { withFileTypes: true }).flatMap((entry) => {
    const rel = path.posix.join(dir, entry.name);
    if (entry.isDirectory()) return SKIPPED_FOLDERS.has(entry.name) ? [] : readmesUnder(rel);
    return entry.name === 'README.md' ? [rel] : [];
  });
}

/** The section of the guide under `## title`, up to the next `## `. */
function section(title: string): string {
  const start = GUIDE.indexOf(`## ${title}\n`);
  expect(start, `DEVELOPERS.md has a "## ${title}" section`).toBeGreaterThanOrEqual(0);
  const end = GUIDE.indexOf('\n## ', start + 1);
  return GUIDE.slice(start, end === -1 ? undefined : end);
}

describe('DEVELOPERS.md', () => {
  it('stays under 250 lines', () => {
    expect(GUIDE.split('\n').length).toBeLessThanOrEqual(250);
  });

  it('links only files that exist', () => {
    const links = [...GUIDE.matchAll(/\]\(([^)#\s]+)(?:#[^)]*)?\)/g)].map((m) => m[1]!).filter((l) => !/^[a-z]+:/.test(l));
    expect(links.length).toBeGreaterThan(10);
    for (const link of links) expect(existsSync(path.join(ROOT, link)), `${link} exists`).toBe(true);
  });

  it("links every README.md in the repository (each feature's decisions)", () => {
    const readmes = readmesUnder('.').filter((f) => f !== 'README.md');
    // The feature folders hold most of them: a walk that found none would prove nothing.
    expect(readmes.filter((f) => f.startsWith('server/features/')).length).toBeGreaterThan(5);
    for (const readme of readmes) expect(GUIDE, `DEVELOPERS.md links ${readme}`).toContain(`](${readme})`);
  });

  it('names in its folder map only paths that exist', () => {
    const map = section('Folders');
    const rows = map.split('\n- ').slice(1);
    expect(rows.map((r) => /^`([^`]+)`/.exec(r)?.[1])).toEqual([
      'client/',
      'server/',
      'shared/',
      'db/',
      'tests/',
      'fixtures/',
      '.ci/',
    ]);
    let checked = 0;
    for (const row of rows) {
      const folder = /^`([^`]+)`/.exec(row)![1]!;
      const tokens = [...row.matchAll(/`([^`]+)`/g)].map((m) => m[1]!);
      // File and folder names only: templates (`<feature>`), commands and symbols are not paths.
      for (const token of tokens.filter((t) => /^[\w.-]+(\/[\w.-]+)*\/?$/.test(t) && /[./]/.test(t))) {
        const candidates = [path.join(ROOT, folder, token), path.join(ROOT, token)];
        expect(
          candidates.some((c) => existsSync(c)),
          `${token} (under ${folder}) exists`,
        ).toBe(true);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(20);
    // Every top-level folder of the code has its row.
    for (const folder of ['client', 'server', 'shared', 'db', 'tests', 'fixtures'])
      expect(existsSync(path.join(ROOT, folder)), folder).toBe(true);
  });
});
