/**
 * The CPU time of `npm run bench`'s six imports in two or more checkouts, side by side
 * (`node --import tsx tests/bench/cpu-bench.ts [--rounds N] <checkout> [<checkout> …]`).
 *
 * `npm run bench` reports wall time, and on a shared 2-core machine wall time is mostly waiting for
 * a core. This writes the bench's six files once (1 h, 3 h and 30 h at 1 s, GPX and TCX: the same
 * bytes, from bench-files.ts), so every checkout reads the same bytes, then runs
 * import-cpu.ts on each file: the checkouts take turns, each in a fresh process warmed up on the
 * file's start, and `process.cpuUsage()` gives the import's CPU time. It needs only
 * `parseTrackFile` and `analyseTrack` of a checkout, so older commits can be measured too.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { RUNS, writeDocument } from './bench-files.ts';

const args = process.argv.slice(2);
const rounds = args[0] === '--rounds' ? args.splice(0, 2)[1]! : '3';
if (args.length === 0) throw new Error('usage: cpu-bench.ts [--rounds N] <checkout> [<checkout> …]');
const importCpu = path.join(path.dirname(fileURLToPath(import.meta.url)), 'import-cpu.ts');
const dir = mkdtempSync(path.join(tmpdir(), 'pacewright-cpu-bench-'));
try {
  for (const run of RUNS) {
    for (const format of ['gpx', 'tcx'] as const) {
      const file = path.join(dir, `${run.label}.${format}`);
      writeFileSync(file, writeDocument(format, run.hours, run.speed));
      console.log(`\n## ${run.label} ${format.toUpperCase()}`);
      const measured = spawnSync(process.execPath, ['--import', 'tsx', importCpu, '--rounds', rounds, file, ...args], {
        stdio: 'inherit',
      });
      if (measured.status !== 0) throw new Error(`import-cpu.ts failed on ${file}`);
    }
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
