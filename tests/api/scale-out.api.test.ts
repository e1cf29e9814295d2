import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { bearerFor, startAppProcess, type AppProcess } from '../support/server-process.ts';
import { waitUntil } from '../support/poll.ts';
import { createUser } from '../support/factories.ts';
import { buildZip } from '../support/zip-builder.ts';

/**
 * Roles scaled apart (issue 19): two web processes with the jobs off (ROLE=web) and two workers
 * (`npm run worker`) on one database and one DATA_DIR, as a deployment runs them. A 200-file archive
 * sent to one web process is imported by the workers exactly once, its progress read through the
 * other web process, and no web process works on it.
 */

const FILES = 200;
const JWT_SECRET = 'scale-out-test-secret-0123456789abcdef';
const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-scale-out-'));
const processes: AppProcess[] = [];
let webs: AppProcess[] = [];
let workers: AppProcess[] = [];

beforeAll(async () => {
  const env = { JWT_SECRET, DATA_DIR: dataDir, BCRYPT_COST: '4' };
  // One at a time: four cold starts at once only compete for the same two cores.
  for (const role of ['web', 'web', 'worker', 'worker'] as const) processes.push(await startAppProcess(role, env));
  webs = processes.filter((p) => p.role === 'web');
  workers = processes.filter((p) => p.role === 'worker');
}, 600_000);

afterAll(async () => {
  await Promise.all(processes.map((p) => p.stop()));
  rmSync(dataDir, { recursive: true, force: true });
}, 120_000);

const BASE_T = Date.UTC(2025, 0, 6, 6, 0);

/** A small generated run (8 minutes at 3.3 m/s, a point every 5 s), one day and one minute after the previous. */
function gpxFile(index: number): { name: string; data: Buffer } {
  const start_t = BASE_T + index * 86_400_000 + index * 60_000;
  const run = generateLakeRun({ start_t, phases: [{ kind: 'run', duration_s: 480, speed_mps: 3.3 }], sample_s: 5 });
  return {
    name: `season/run-${String(index).padStart(3, '0')}.gpx`,
    data: Buffer.from(writeGpx(`Shore loop ${index}`, [run.points])),
  };
}

interface Progress {
  status: string;
  total: number;
  done: number;
  imported: number;
  duplicates: number;
  rejected: unknown[];
}

const pidOf = (label: string | null) => Number(label?.split(':').pop());

describe('two web processes and two workers on one database', () => {
  it('import a 200-file archive exactly once, in the workers only', async () => {
    const { user, password } = await createUser();
    const [uploadWeb, readWeb] = webs as [AppProcess, AppProcess];
    const authorization = await bearerFor(uploadWeb.url, user.email, password);

    const zip = buildZip(Array.from({ length: FILES }, (_, i) => gpxFile(i)));
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(zip)]), 'season.zip');
    const sent = await fetch(`${uploadWeb.url}/api/imports`, {
      method: 'POST',
      headers: { Authorization: authorization },
      body: form,
    });
    expect(sent.status).toBe(202);
    const importId = ((await sent.json()) as { import: { id: string } }).import.id;

    // Progress through the other web process: no process keeps an import to itself.
    const readProgress = async () => {
      const res = await fetch(`${readWeb.url}/api/imports/${importId}`, { headers: { Authorization: authorization } });
      expect(res.status).toBe(200);
      return (await res.json()) as Progress;
    };
    const progress = await waitUntil(
      async () => {
        const p = await readProgress();
        return p.status === 'done' || p.status === 'failed' ? p : undefined;
      },
      'the import to finish',
      300_000,
    );
    expect(progress).toMatchObject({ status: 'done', total: FILES, done: FILES, imported: FILES, duplicates: 0, rejected: [] });

    // Exactly once: 200 runs, 200 stored files, each file's row naming one run, no run twice.
    const runs = await db('runs').where({ user_id: user.id }).select('id', 'started_at');
    expect(runs).toHaveLength(FILES);
    expect(new Set(runs.map((r) => new Date(r.started_at as Date).getTime())).size).toBe(FILES);
    expect(Number((await db('source_files').where({ user_id: user.id }).count({ n: '*' }).first())!.n)).toBe(FILES);
    const files = await db('import_files').where({ import_id: importId }).select('status', 'result', 'claimed_by');
    expect(files).toHaveLength(FILES);
    expect(files.every((f) => f.status === 'imported')).toBe(true);
    const runIds = files.flatMap((f) => (f.result as { runIds: string[] }).runIds);
    expect(runIds).toHaveLength(FILES);
    expect(new Set(runIds)).toEqual(new Set(runs.map((r) => r.id as string)));

    // Only workers claimed files, and both took part; the web processes said so at start and ran no job.
    const claimedBy = new Set(files.map((f) => pidOf(f.claimed_by as string | null)));
    expect([...claimedBy].sort()).toEqual(workers.map((w) => w.pid).sort());
    for (const web of webs) {
      expect(claimedBy.has(web.pid)).toBe(false);
      expect(web.logs.some((l) => l.msg === 'background jobs are off in this process (ROLE=web)')).toBe(true);
      // The orphan sweep runs at a job runner's start: a web process never logs one.
      expect(web.logs.some((l) => l.msg === 'orphan sweep finished')).toBe(false);
    }
    for (const worker of workers)
      await waitUntil(() => worker.logs.some((l) => l.msg === 'orphan sweep finished'), `worker ${worker.pid}'s orphan sweep`);
    console.log(
      `scale-out: ${FILES} files, claims per worker ${workers.map((w) => files.filter((f) => pidOf(f.claimed_by) === w.pid).length).join(' + ')}`,
    );
  }, 600_000);
});
