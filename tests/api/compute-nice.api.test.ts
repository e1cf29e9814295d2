/**
 * COMPUTE_NICE, against the real pool (piscina worker threads): each compute thread runs that many nice values
 * below the event loop, read back from Linux's own record of the thread (/proc/<pid>/task/<tid>/stat, field 19,
 * proc(5)); 0 leaves it at the event loop's. Relative to the event loop, so a server (or this test) started under
 * `nice` keeps the order. The event loop itself never moves.
 */
import { readFileSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config.ts';
import { configureComputePool, DEFAULT_COMPUTE_LIMITS, runComputeJob } from '../../server/features/compute/compute-pool.ts';

/** Field 19 (nice) of a thread's stat line: the fields after the parenthesised name start at field 3. */
function niceOfThread(tid: number): number {
  const stat = readFileSync(`/proc/${process.pid}/task/${tid}/stat`, 'utf8');
  return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[19 - 3]);
}

const eventLoopNice = niceOfThread(process.pid);

/** The Linux task id of the thread that runs the next job (the pool's threads report their own). */
function computeThreadId(): Promise<number> {
  return runComputeJob<number>('nice-test', { kind: 'thread-id' });
}

afterAll(() => configureComputePool(DEFAULT_COMPUTE_LIMITS));

describe('compute threads run below the event loop (COMPUTE_NICE)', () => {
  it('with COMPUTE_NICE=7 every compute thread runs 7 nice values below the event loop, which stays as it was', async () => {
    configureComputePool({ threads: 2, nice: 7 });
    // Two jobs at once take both threads: each reports its own id.
    const tids = await Promise.all([
      runComputeJob<number>('nice-a', { kind: 'thread-id' }),
      runComputeJob<number>('nice-b', { kind: 'thread-id' }),
    ]);
    expect(tids.every((tid) => Number.isInteger(tid) && tid !== process.pid)).toBe(true);
    for (const tid of new Set(tids)) expect(niceOfThread(tid)).toBe(Math.min(19, eventLoopNice + 7));
    expect(niceOfThread(process.pid)).toBe(eventLoopNice);
  }, 60_000);

  it("with COMPUTE_NICE=0 a new pool's thread runs at the event loop's nice (a niced thread is never reused)", async () => {
    configureComputePool({ threads: 1, nice: 7 });
    const niced = await computeThreadId();
    expect(niceOfThread(niced)).toBe(Math.min(19, eventLoopNice + 7));
    configureComputePool({ threads: 1, nice: 0 });
    const plain = await computeThreadId();
    expect(plain).not.toBe(niced);
    expect(niceOfThread(plain)).toBe(eventLoopNice);
  }, 60_000);

  it('the server starts its pool with the default of config, and the default threads run below the event loop', async () => {
    expect(loadConfig({}).computeNice).toBe(DEFAULT_COMPUTE_LIMITS.nice);
    expect(DEFAULT_COMPUTE_LIMITS.nice).toBeGreaterThan(0);
    configureComputePool(DEFAULT_COMPUTE_LIMITS);
    expect(niceOfThread(await computeThreadId())).toBe(Math.min(19, eventLoopNice + DEFAULT_COMPUTE_LIMITS.nice));
  }, 60_000);
});
