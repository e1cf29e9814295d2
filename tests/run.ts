/**
 * `npm test [unit|api|e2e …]`: static checks, then unit tests, API tests against a fresh PostgreSQL
 * database, and browser tests in Debian's Chromium against the built app. Prints one closing line
 * `N passed, N failed` for CI. Each run makes its own databases and drops them afterwards.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import knexFactory from 'knex';
import { buildClientIfStale } from '../server/cli/lib/client-build.ts';
import {
  ROOT,
  startEmbeddedPostgres,
  stopEmbeddedPostgres,
  usesExternalDatabase,
  withDatabase,
} from '../server/cli/lib/postgres.ts';

const LAYERS = ['unit', 'api', 'e2e'] as const;
type Layer = (typeof LAYERS)[number];
/** The Vitest projects (vite.config.ts) each layer runs: component tests run with the unit tests. */
const PROJECTS: Record<Layer, string[]> = { unit: ['unit', 'client'], api: ['api'], e2e: ['e2e'] };
const requested = process.argv.slice(2).filter((a): a is Layer => (LAYERS as readonly string[]).includes(a));
// Anything else narrows the files, e.g. `npm run test:e2e -- plan-check`.
const fileFilters = process.argv.slice(2).filter((a) => !(LAYERS as readonly string[]).includes(a));
const layers: Layer[] = requested.length ? requested : [...LAYERS];
const runStaticChecks = requested.length === 0 && process.env.SKIP_STATIC_CHECKS !== '1';
const bin = (name: string) => path.join(ROOT, 'node_modules/.bin', name);

function step(title: string, command: string, args: string[]): boolean {
  console.log(`\n▶ ${title}`);
  return spawnSync(command, args, { cwd: ROOT, stdio: 'inherit' }).status === 0;
}

let failedChecks = 0;
if (runStaticChecks) {
  if (!step('Type check (tsc --noEmit)', bin('tsc'), ['--noEmit'])) failedChecks++;
  if (!step('Lint (eslint)', bin('eslint'), ['--config', '.ci/eslint.config.js', '.'])) failedChecks++;
  if (!step('Format check (prettier)', bin('prettier'), ['--check', '.', '--log-level', 'warn'])) failedChecks++;
}

const needsDb = layers.some((l) => l !== 'unit');
const embedded = !usesExternalDatabase();
const pgWasRunning = embedded && spawnSync('bash', [path.join(ROOT, 'db/pg.sh'), 'status']).status === 0;
const serverUrl = needsDb ? (embedded ? startEmbeddedPostgres([]) : withDatabase(process.env.DATABASE_URL!, 'postgres')) : '';
const runId = `${Date.now().toString(36)}_${process.pid}`;
const admin = needsDb ? knexFactory({ client: 'pg', connection: withDatabase(serverUrl, 'postgres') }) : null;
const databases: string[] = [];

async function freshDatabase(layer: Layer): Promise<string> {
  const name = `pacewright_test_${layer}_${runId}`;
  await admin!.raw('create database ??', [name]);
  databases.push(name);
  const url = withDatabase(serverUrl, name);
  const knex = knexFactory((await import('../db/knexfile.ts')).knexConfig(url));
  try {
    await knex.migrate.latest();
  } finally {
    await knex.destroy();
  }
  if (layer === 'e2e') {
    // Seeding imports generated runs through the app's own import code, which binds to DATABASE_URL: run it as the CLI does.
    const seeded = spawnSync(process.execPath, ['--import', 'tsx', 'server/cli/db.ts', 'seed'], {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, DATABASE_URL: url, DATA_DIR: dataDir },
    });
    if (seeded.status !== 0) throw new Error('loading the demo data into the e2e database failed');
  }
  return url;
}

const resultsDir = path.join(ROOT, 'test-results');
// Original files written during tests go to a throwaway folder, never the developer's .data/.
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-test-data-'));
mkdirSync(resultsDir, { recursive: true });
let passed = 0;
let failed = failedChecks;
// Skipped and todo tests are reported; CI runs every test, so any of them fails the run.
let pending = 0;
// CI shows only the tail of the log, so the last lines name every failed test.
const failedNames: string[] = [];

try {
  for (const layer of layers) {
    const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: 'test', DATA_DIR: dataDir };
    if (layer !== 'unit') env.DATABASE_URL = await freshDatabase(layer);
    if (layer === 'e2e') buildClientIfStale();
    // One report per run, so two runs at once on one machine never read each other's.
    const outputFile = path.join(resultsDir, `vitest-${layer}-${runId}.json`);
    rmSync(outputFile, { force: true });
    console.log(`\n▶ ${layer} tests`);
    const vitest = spawnSync(
      bin('vitest'),
      [
        'run',
        ...PROJECTS[layer].flatMap((p) => ['--project', p]),
        '--reporter=default',
        '--reporter=json',
        `--outputFile=${outputFile}`,
        ...fileFilters,
      ],
      {
        cwd: ROOT,
        stdio: 'inherit',
        env,
      },
    );
    if (!existsSync(outputFile)) {
      console.error(`The ${layer} tests did not report results.`);
      failed++;
      continue;
    }
    const report = JSON.parse(readFileSync(outputFile, 'utf8')) as {
      numPassedTests: number;
      numFailedTests: number;
      numPendingTests: number;
      numTodoTests: number;
      numTotalTests: number;
      success: boolean;
      testResults?: { name: string; status?: string; assertionResults?: { fullName: string; status: string }[] }[];
    };
    renameSync(outputFile, path.join(resultsDir, `vitest-${layer}.json`)); // the latest report keeps the usual name
    passed += report.numPassedTests;
    pending += report.numPendingTests + report.numTodoTests;
    // Tests that never finished (a worker that ran out of memory or crashed) count as failed too.
    const unfinished =
      report.numTotalTests - report.numPassedTests - report.numFailedTests - report.numPendingTests - report.numTodoTests;
    failed += report.numFailedTests + Math.max(0, unfinished);
    failedNames.push(...failedTestNames(layer, report.testResults ?? []));
    const reportedFailure = report.numFailedTests > 0 || unfinished > 0;
    // An unhandled error fails the run even when every test passed (vitest exits non-zero).
    if (report.numTotalTests === 0 || ((!report.success || vitest.status !== 0) && !reportedFailure)) failed++;
  }
} finally {
  if (admin) {
    for (const name of databases) await admin.raw('drop database if exists ?? with (force)', [name]);
    await admin.destroy();
  }
  if (embedded && needsDb && !pgWasRunning) stopEmbeddedPostgres();
  rmSync(dataDir, { recursive: true, force: true });
}

if (failedNames.length) console.log(`\nFailed:\n${failedNames.map((name) => `  × ${name}`).join('\n')}`);
if (failedChecks) console.log(`\n${failedChecks} static check(s) failed (counted as failures).`);
if (pending) console.log(`\n${pending} test(s) skipped or todo (counted as failures: every test runs in CI).`);
console.log(`\n${passed} passed, ${failed + pending} failed, ${pending} skipped`);
process.exit(failed + pending === 0 ? 0 : 1);

function failedTestNames(
  layer: string,
  files: { name: string; status?: string; assertionResults?: { fullName: string; status: string }[] }[],
): string[] {
  return files.flatMap((file) => {
    const where = `${layer} ${path.relative(ROOT, file.name)}`;
    const tests = (file.assertionResults ?? []).filter((test) => test.status === 'failed');
    // A file that failed outside any test (it did not load, or an error after its tests) is named alone.
    if (tests.length === 0) return file.status === 'failed' ? [`${where} (the file itself)`] : [];
    return tests.map((test) => `${where} › ${test.fullName}`);
  });
}
