import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { ROOT } from './postgres.ts';

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(full) : statSync(full).mtimeMs);
  }
  return newest;
}

/** Builds the client with Vite when dist/client is missing or older than client/ or shared/. */
export function buildClientIfStale(): void {
  const index = path.join(ROOT, 'dist/client/index.html');
  const sources = Math.max(newestMtime(path.join(ROOT, 'client')), newestMtime(path.join(ROOT, 'shared')));
  if (existsSync(index) && statSync(index).mtimeMs >= sources) return;
  console.log('Building the client…');
  execFileSync(process.execPath, [path.join(ROOT, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], {
    cwd: ROOT,
    stdio: 'inherit',
  });
}
