import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

// Issue 17: every environment variable the server, its commands and the database scripts read is in the
// README's table (MAIL_CATCHER_PORT was missing once). Reads are found in the source as `env.NAME`,
// `env['NAME']` or `process.env.NAME`, so a new variable without a row fails here.

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../..');
const README = readFileSync(path.join(ROOT, 'README.md'), 'utf8');
const SOURCE_FOLDERS = ['server', 'db'];
const READ = /\benv(?:\.([A-Z][A-Z0-9_]+)|\[['"]([A-Z][A-Z0-9_]+)['"]\])/g;

function sourcesUnder(dir: string): string[] {
  return readdirSync(path.join(ROOT, dir), { withFileTypes: true }).flatMap((entry) => {
    const rel = path.join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'node_modules' ? [] : sourcesUnder(rel);
    return /\.(ts|tsx)$/.test(entry.name) ? [rel] : [];
  });
}

function variablesRead(): Set<string> {
  const names = new Set<string>();
  for (const file of SOURCE_FOLDERS.flatMap(sourcesUnder)) {
    for (const match of readFileSync(path.join(ROOT, file), 'utf8').matchAll(READ)) names.add((match[1] ?? match[2])!);
  }
  return names;
}

/** The first cell of each row of the README's tables, e.g. `MAIL_CATCHER_PORT`. */
function documentedVariables(): Set<string> {
  const names = new Set<string>();
  for (const line of README.split('\n')) {
    const first = /^\|\s*`([A-Z][A-Z0-9_]+)`\s*\|/.exec(line);
    if (first) names.add(first[1]!);
  }
  return names;
}

describe('README: environment variables', () => {
  it('has a table row for every variable the code reads, MAIL_CATCHER_PORT included', () => {
    const read = variablesRead();
    // The scan must find the reads it is there for, or it proves nothing.
    for (const known of ['PORT', 'DATABASE_URL', 'MAIL_CATCHER_PORT', 'PGPORT', 'S3_BUCKET']) expect(read).toContain(known);
    const documented = documentedVariables();
    const missing = [...read].filter((name) => !documented.has(name)).sort();
    expect(missing, 'variables read in server/ or db/ without a row in README.md').toEqual([]);
  });
});
