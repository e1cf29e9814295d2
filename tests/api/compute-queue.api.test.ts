/**
 * The compute pool's two limits, against the real pool (piscina worker threads): a job's time limit
 * counts only its own run time, never its wait for a thread, and the wait is bounded by a number of
 * queued jobs instead: a full queue answers 503 with a sentence and Retry-After, and nothing of the
 * refused upload is kept. (Session 6 found a 100-mile upload refused with 422 on a busy host only
 * because other files were queued ahead of it.)
 */
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import {
  COMPUTE_BUSY_RETRY_AFTER_SECONDS,
  ComputeBusyError,
  ComputeTimeoutError,
  computeJobsWaiting,
  configureComputePool,
  DEFAULT_COMPUTE_LIMITS,
  runComputeJob,
} from '../../server/features/compute/compute-pool.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { waitUntil } from '../support/poll.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';
import { person } from '../support/test-world.ts';

/** One thread, started before the clock matters (a new pool loads its code first, seconds on a busy machine). */
async function oneThread(limits: { jobTimeoutMs: number; maxQueue: number }): Promise<void> {
  configureComputePool({ threads: 1, ...limits });
  await runComputeJob('warm-up', { kind: 'spin', ms: 0 });
}

afterEach(async () => {
  configureComputePool(DEFAULT_COMPUTE_LIMITS);
  await runComputeJob('warm-up', { kind: 'spin', ms: 0 });
}, 60_000);

describe('compute pool: a job is timed by its own run, the queue by its length', () => {
  it('six 0.6 s jobs queued on one thread all finish under a 3 s limit though the last waits longer than that', async () => {
    await oneThread({ jobTimeoutMs: 3_000, maxQueue: 64 });
    const t0 = performance.now();
    // Six users, so no job waits for its user's turn: they wait only for the one thread.
    const outcomes = await Promise.allSettled(
      Array.from({ length: 6 }, (_, k) => runComputeJob(`runner-${k}`, { kind: 'spin', ms: 600 })),
    );
    const wall = performance.now() - t0;
    expect(outcomes.map((o) => o.status)).toEqual(Array(6).fill('fulfilled'));
    // One thread runs them one after another: the sixth was handed over after 3 s of others' work (≥ 5 × 0.6 s),
    // which the old limit (queue wait included) counted against it and refused.
    expect(wall).toBeGreaterThanOrEqual(3_600);
  }, 60_000);

  it('a job running past its limit is still stopped, and the job queued behind it then runs', async () => {
    await oneThread({ jobTimeoutMs: 1_000, maxQueue: 64 });
    const long = runComputeJob('runner-a', { kind: 'spin', ms: 20_000 });
    const next = runComputeJob('runner-b', { kind: 'spin', ms: 0 });
    await expect(long).rejects.toBeInstanceOf(ComputeTimeoutError);
    await expect(next).resolves.toEqual(expect.any(Number));
  }, 60_000);

  it('a full queue refuses the next job at once with ComputeBusyError; the queued ones still run', async () => {
    await oneThread({ jobTimeoutMs: 30_000, maxQueue: 2 });
    const running = runComputeJob('runner-a', { kind: 'spin', ms: 1_500 });
    const queued = [runComputeJob('runner-b', { kind: 'spin', ms: 0 }), runComputeJob('runner-c', { kind: 'spin', ms: 0 })];
    await waitUntil(() => computeJobsWaiting() === 2, 'two jobs waiting');
    const t0 = performance.now();
    await expect(runComputeJob('runner-d', { kind: 'spin', ms: 0 })).rejects.toBeInstanceOf(ComputeBusyError);
    // Refused without waiting for the running job (1.5 s).
    expect(performance.now() - t0).toBeLessThan(1_000);
    await expect(Promise.all([running, ...queued])).resolves.toHaveLength(3);
    expect(computeJobsWaiting()).toBe(0);
  }, 60_000);

  it('POST /api/runs while the queue is full: 503, a sentence, Retry-After, nothing stored; accepted once it drains', async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-compute-queue-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const runner = await person(app, 'runner', 'Queue Runner');
    const file = readFileSync('fixtures/gps-samples/run-hr-4s.gpx');
    await oneThread({ jobTimeoutMs: 30_000, maxQueue: 1 });
    const running = runComputeJob('someone-else', { kind: 'spin', ms: 3_000 });
    const queued = runComputeJob('another-runner', { kind: 'spin', ms: 0 });
    await waitUntil(() => computeJobsWaiting() === 1, 'one job waiting');

    const refused = await request(app).post('/api/runs').set(runner.auth).attach('files', file, 'run.gpx');
    expect(refused.status).toBe(503);
    expect(refused.body.code).toBe('busy');
    expect(refused.body.error).toMatch(/^Pacewright is reading a lot of files for other runners just now.*half a minute\.$/);
    expect(refused.headers['retry-after']).toBe(String(COMPUTE_BUSY_RETRY_AFTER_SECONDS));
    const runs = await db('runs').where({ user_id: runner.id }).select('id');
    const files = await db('source_files').where({ user_id: runner.id }).select('id');
    expect([runs.length, files.length]).toEqual([0, 0]);
    // The upload's temporary file is removed once the answer has gone.
    await waitUntil(() => readdirSync(path.join(dataDir, 'uploads')).length === 0, 'the temporary upload removed');

    await Promise.all([running, queued]);
    const accepted = await request(app).post('/api/runs').set(runner.auth).attach('files', file, 'run.gpx');
    expect(accepted.status).toBe(201);
    expect(accepted.body.imported).toHaveLength(1);
  }, 60_000);
});
