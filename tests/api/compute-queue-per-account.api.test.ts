/**
 * The compute pool's bound per account, against the real pool (piscina worker threads): one account's pile of
 * jobs waiting for its turn is bounded (`waitingPerUser`), its next job is refused at once with 429, a sentence
 * and Retry-After, and another account's job still gets a place and completes. (Issue 13/19 follow-up: before,
 * one account's waiting jobs had no number at all.)
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import {
  COMPUTE_ACCOUNT_BUSY_RETRY_AFTER_SECONDS,
  ComputeAccountBusyError,
  computeJobsWaiting,
  computeJobsWaitingForTurn,
  configureComputePool,
  DEFAULT_COMPUTE_LIMITS,
  runComputeJob,
} from '../../server/features/compute/compute-pool.ts';
import { db } from '../../server/lib/db.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { waitUntil } from '../support/poll.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';
import { buildWorld, freshApp, person, type App, type World } from '../support/test-world.ts';

const { jobsAtOncePerUser, waitingPerUser } = DEFAULT_COMPUTE_LIMITS;

/**
 * One thread, busy with someone else's job until `releaseThread`, so every job sent meanwhile has to wait
 * however slow this shared machine is (a fixed-length job ended before a slow upload arrived).
 */
async function oneBusyThread(): Promise<{ blocker: Promise<unknown> }> {
  configureComputePool({ threads: 1, jobTimeoutMs: 120_000 });
  await runComputeJob('warm-up', { kind: 'spin', ms: 0 });
  const blocker = runComputeJob('someone-else', { kind: 'spin', ms: 120_000 });
  blocker.catch(() => undefined);
  // Wrapped: an async function returning the promise itself would wait for it.
  return { blocker };
}

/** Ends the blocking job: the pool is replaced (its thread stopped) and the waiting jobs run in a new one. */
async function releaseThread(blocker: Promise<unknown>): Promise<void> {
  configureComputePool({});
  await expect(blocker).rejects.toThrow();
}

/** Fills `userId`'s place in the pool: `jobsAtOncePerUser` jobs in it and `waitingPerUser` waiting for their turn. */
function fillAccount(userId: string): Array<Promise<unknown>> {
  const jobs = Array.from({ length: jobsAtOncePerUser + waitingPerUser }, () => runComputeJob(userId, { kind: 'spin', ms: 0 }));
  expect(computeJobsWaitingForTurn(userId)).toBe(waitingPerUser);
  return jobs;
}

afterEach(async () => {
  configureComputePool(DEFAULT_COMPUTE_LIMITS);
  await runComputeJob('warm-up', { kind: 'spin', ms: 0 });
}, 60_000);

describe('compute pool: one account cannot fill it alone', () => {
  it('the documented numbers: 8 waiting per account, well under the 64 waiting for a thread', () => {
    expect(waitingPerUser).toBe(8);
    expect(DEFAULT_COMPUTE_LIMITS.maxQueue).toBe(64);
  });

  it("an account's job past its bound is refused at once; another account's job is accepted and completes", async () => {
    const { blocker } = await oneBusyThread();
    const accountA = fillAccount('runner-a');
    const t0 = performance.now();
    const refused = runComputeJob('runner-a', { kind: 'spin', ms: 0 });
    await expect(refused).rejects.toBeInstanceOf(ComputeAccountBusyError);
    await expect(refused).rejects.toMatchObject({ status: 429, retryAfterSeconds: COMPUTE_ACCOUNT_BUSY_RETRY_AFTER_SECONDS });
    // Refused without waiting for the running job.
    expect(performance.now() - t0).toBeLessThan(1_000);
    // The refused job took no place: A still has exactly its bound waiting.
    expect(computeJobsWaitingForTurn('runner-a')).toBe(waitingPerUser);

    const accountB = runComputeJob('runner-b', { kind: 'spin', ms: 0 });
    // B's job has its place in the shared queue, behind A's two in the pool (its waiting ones never take one).
    await waitUntil(() => computeJobsWaiting() === jobsAtOncePerUser + 1, "B's job queued for the thread");
    await releaseThread(blocker);
    await expect(accountB).resolves.toEqual(expect.any(Number));
    await expect(Promise.all(accountA)).resolves.toHaveLength(jobsAtOncePerUser + waitingPerUser);
    expect(computeJobsWaitingForTurn('runner-a')).toBe(0);
    // Once A's jobs are done, A is accepted again.
    await expect(runComputeJob('runner-a', { kind: 'spin', ms: 0 })).resolves.toEqual(expect.any(Number));
  }, 60_000);

  it("POST /api/runs over the account's bound: 429, a sentence, Retry-After, nothing stored; another runner's upload is stored", async () => {
    const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-compute-account-'));
    const app = createApp({ config: testConfig({ dataDir }), store: createFsStore(dataDir), mailer: recordingMailer });
    const busyRunner = await person(app, 'runner', 'Bulk Runner');
    const otherRunner = await person(app, 'runner', 'Single Runner');
    const file = readFileSync('fixtures/gps-samples/run-hr-4s.gpx');
    const { blocker } = await oneBusyThread();
    const busyRunnersJobs = fillAccount(busyRunner.id);

    const refused = await request(app).post('/api/runs').set(busyRunner.auth).attach('files', file, 'run.gpx');
    expect(refused.status).toBe(429);
    expect(refused.body.code).toBe('busy-with-your-files');
    expect(refused.body.error).toBe(
      'Pacewright is still working through 8 earlier files or checks of yours, so this one was not done and nothing was stored. Please send it again in half a minute.',
    );
    expect(refused.headers['retry-after']).toBe(String(COMPUTE_ACCOUNT_BUSY_RETRY_AFTER_SECONDS));
    const kept = await db('source_files').where({ user_id: busyRunner.id }).select('id');
    expect(kept).toHaveLength(0);

    // Still waiting behind the blocked thread and A's jobs, not refused: it gets its place in the queue.
    const accepting = request(app)
      .post('/api/runs')
      .set(otherRunner.auth)
      .attach('files', file, 'run.gpx')
      .then((r) => r);
    await waitUntil(() => computeJobsWaiting() === jobsAtOncePerUser + 1, "the other runner's file queued");
    await releaseThread(blocker);
    const accepted = await accepting;
    expect(accepted.status).toBe(201);
    expect(accepted.body.imported).toHaveLength(1);
    await expect(Promise.all(busyRunnersJobs)).resolves.toHaveLength(jobsAtOncePerUser + waitingPerUser);
  }, 60_000);
});

/** buildWorld's runner, coached in a squad, with one run on the planned day (2026-11-24) and no stored plan check. */
async function coachedRunnerWithRun(app: App): Promise<World & { runId: string }> {
  const world = await buildWorld(app);
  const { points } = generateLakeRun({
    start_t: Date.parse('2026-11-24T07:00:00Z'),
    phases: [{ kind: 'run', duration_s: 45 * 60, speed_mps: 3 }],
    seed: 11,
    sample_s: 5,
  });
  const upload = await request(app)
    .post('/api/runs')
    .set(world.runner.auth)
    .attach('files', Buffer.from(writeGpx('Easy 45', [points])), 'easy.gpx');
  expect(upload.status).toBe(201);
  const runId = upload.body.imported[0].id as string;
  // The next read has to compute the check (a tolerance change, a new plan or new code make a stored one stale).
  await db('plan_check_results').where({ run_id: runId }).delete();
  return { ...world, runId };
}

describe("plan checks recomputed by a read are charged to the reader, not to the runner (session 9's note)", () => {
  it("a coach's reads take the coach's turn: with the runner's place full they wait and answer, and the runner's place is untouched", async () => {
    const app = freshApp('charge-reader');
    const { runner, coach, runId } = await coachedRunnerWithRun(app);
    const { blocker } = await oneBusyThread();
    const runnersJobs = fillAccount(runner.id);

    // Before: both reads were charged to the runner and refused at once with the runner's "files or checks of yours".
    const settled: string[] = [];
    const weekRead = request(app)
      .get(`/api/runners/${runner.id}/week?start=2026-11-24`)
      .set(coach.auth)
      .then((r) => (settled.push('week'), r));
    const checkRead = request(app)
      .get(`/api/runs/${runId}/plan-check`)
      .set(coach.auth)
      .then((r) => (settled.push('check'), r));
    // The coach's two checks hold the coach's 2 places and wait for the thread behind the runner's 2.
    await waitUntil(
      () => settled.length > 0 || computeJobsWaiting() === 2 * jobsAtOncePerUser,
      "the coach's plan checks queued for the thread",
    );
    expect(settled).toEqual([]);
    expect(computeJobsWaitingForTurn(runner.id)).toBe(waitingPerUser);
    expect(computeJobsWaitingForTurn(coach.id)).toBe(0);

    await releaseThread(blocker);
    const [week, check] = await Promise.all([weekRead, checkRead]);
    expect(week.status).toBe(200);
    expect(check.status).toBe(200);
    expect(check.body.session_verdict).not.toBe('unplanned');
    const weekRun = week.body.days
      .flatMap((d: { runs: Array<{ id: string }> }) => d.runs)
      .find((r: { id: string }) => r.id === runId);
    expect(weekRun.session_verdict).toBe(check.body.session_verdict);
    await expect(Promise.all(runnersJobs)).resolves.toHaveLength(jobsAtOncePerUser + waitingPerUser);
  }, 60_000);

  it("with the coach's place full, the coach's read is refused in the coach's words while the runner's own upload is stored", async () => {
    const app = freshApp('charge-reader-full');
    const { runner, coach, runId } = await coachedRunnerWithRun(app);
    const { blocker } = await oneBusyThread();
    const coachesJobs = fillAccount(coach.id);

    // Before: charged to the runner, whose place was free, so it was queued for the thread (and answered 200 later).
    let answered = false;
    const reading = request(app)
      .get(`/api/runs/${runId}/plan-check`)
      .set(coach.auth)
      .then((r) => ((answered = true), r));
    await waitUntil(() => answered || computeJobsWaiting() > jobsAtOncePerUser, "the coach's read answered or queued");
    expect(answered).toBe(true);
    const refused = await reading;
    expect(refused.status).toBe(429);
    expect(refused.body.code).toBe('busy-with-your-files');
    expect(refused.headers['retry-after']).toBe(String(COMPUTE_ACCOUNT_BUSY_RETRY_AFTER_SECONDS));
    expect(computeJobsWaitingForTurn(runner.id)).toBe(0);

    const uploading = request(app)
      .post('/api/runs')
      .set(runner.auth)
      .attach('files', readFileSync('fixtures/gps-samples/run-hr-4s.gpx'), 'run.gpx')
      .then((r) => r);
    await waitUntil(() => computeJobsWaiting() === jobsAtOncePerUser + 1, "the runner's file queued");
    await releaseThread(blocker);
    const uploaded = await uploading;
    expect(uploaded.status).toBe(201);
    await expect(Promise.all(coachesJobs)).resolves.toHaveLength(jobsAtOncePerUser + waitingPerUser);
    // Once the coach's own checks are done, the read is answered.
    const again = await request(app).get(`/api/runs/${runId}/plan-check`).set(coach.auth);
    expect(again.status).toBe(200);
  }, 60_000);
});
