import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { DEFAULT_COMPUTE_NICE, defaultComputeThreads } from '../../config.ts';
import { AppError } from '../../lib/errors.ts';
import type { PlanCheckComputeInput, PlanCheckComputeOutput } from '../plans/worker.ts';
import type { ImportComputeInput, ImportComputeOutput } from '../runs/worker.ts';
import type { ComputeJob, ComputeTask, ComputeThreadSettings } from './compute-worker.ts';

/**
 * The worker-thread pool that does the CPU-heavy work (parsing and analysing uploaded tracks,
 * plan checks), so one account's files never freeze the event loop every request shares. Limits
 * and why: server/features/runs/README.md.
 */
export interface ComputeLimits {
  /** Worker threads (COMPUTE_THREADS); the event loop keeps a core of its own when there are two or more. */
  threads: number;
  /**
   * How many Linux nice values each thread runs below the event loop (COMPUTE_NICE, 0–19; 0 = as urgent): imports
   * and plan checks are background work, so when the cores are short the event loop answering reads runs first.
   * A niced thread with no competition still runs at full speed. Measured: tests/bench/README.md, session 10.
   */
  nice: number;
  /**
   * Longest a job may run in its thread before the thread is stopped: its own run time, counted from
   * the moment it is handed to a thread. Time spent waiting for a thread or for its user's turn never
   * counts, so a long file is never refused only because other files were queued ahead of it.
   */
  jobTimeoutMs: number;
  /** Jobs of one user in the pool at once; the rest of theirs wait their turn, so nobody fills the pool alone. */
  jobsAtOncePerUser: number;
  /**
   * Jobs of one user waiting for their turn (besides their `jobsAtOncePerUser` in the pool) before the next
   * is turned away at once with a 429 and Retry-After (ComputeAccountBusyError): without it one account's
   * pile of jobs had no bound at all. Others' jobs never wait behind it: each user has at most
   * `jobsAtOncePerUser` jobs in the shared queue, so a stranger's job still gets a place.
   */
  waitingPerUser: number;
  /**
   * Jobs waiting for a free thread, across users, before new ones are turned away at once with a 503
   * and Retry-After (ComputeBusyError): the bound on waiting, now that waiting no longer eats a job's time.
   */
  maxQueue: number;
  /** Heap of one worker, MB: a job that needs more ends its worker instead of the process. */
  workerHeapMb: number;
  /**
   * Read an upload's first file while it arrives (`tryRunArrivingJob`; READ_WHILE_ARRIVING=0 turns it off):
   * such a job waits in its thread for the bytes, so it only ever takes a thread that is free, at most
   * max(1, threads − 1) of them at once, and gives it back as soon as another job waits for one.
   */
  readWhileArriving: boolean;
  /** Such a job gives its thread back when no byte came for this long, or it has waited this long in all (ms). */
  arrivalStallMs: number;
  arrivalWaitMs: number;
}

export const DEFAULT_COMPUTE_LIMITS: ComputeLimits = {
  threads: defaultComputeThreads(),
  nice: DEFAULT_COMPUTE_NICE,
  jobTimeoutMs: 60_000,
  jobsAtOncePerUser: 2,
  // A runner's own reads at once stay well under it: 2 uploads, 2 bulk-import files, a history page's 4 plan checks.
  waitingPerUser: 8,
  maxQueue: 64,
  workerHeapMb: 1024,
  readWhileArriving: process.env.READ_WHILE_ARRIVING !== '0',
  arrivalStallMs: 2_000,
  arrivalWaitMs: 10_000,
};

/**
 * Seconds a client is asked to wait (Retry-After) when the queue is full. Most queued jobs are ordinary
 * files or plan checks of a fraction of a second each, so a full queue of 64 drains in well under this.
 */
export const COMPUTE_BUSY_RETRY_AFTER_SECONDS = 30;

/** The pool cannot take more work now (its queue is full); the client should retry shortly. */
export class ComputeBusyError extends AppError {
  constructor() {
    super(
      503,
      'busy',
      'Pacewright is reading a lot of files for other runners just now, so this one was not read or stored. Please send it again in half a minute.',
    );
    this.retryAfterSeconds = COMPUTE_BUSY_RETRY_AFTER_SECONDS;
  }
}

/**
 * Seconds a runner is asked to wait (Retry-After) when their own jobs fill their place in the pool: their
 * 8 waiting jobs are ordinary files or plan checks of a fraction of a second each, 2 at a time.
 */
export const COMPUTE_ACCOUNT_BUSY_RETRY_AFTER_SECONDS = 30;

/** This user already has `waitingPerUser` jobs waiting for their turn; they should send this one again shortly. */
export class ComputeAccountBusyError extends AppError {
  constructor(waitingJobs: number) {
    super(
      429,
      'busy-with-your-files',
      `Pacewright is still working through ${waitingJobs} earlier files or checks of yours, so this one was not done and nothing was stored. Please send it again in half a minute.`,
    );
    this.retryAfterSeconds = COMPUTE_ACCOUNT_BUSY_RETRY_AFTER_SECONDS;
  }
}

/** A job ran past its time limit (its own run time) and its worker was stopped. */
export class ComputeTimeoutError extends Error {
  constructor(readonly limitMs: number) {
    super(`a compute job ran longer than ${limitMs} ms`);
  }
}

/** A job's worker died (ran out of its heap, say). */
export class ComputeCrashError extends Error {}

const WORKER_FILE = new URL('./compute-worker.ts', import.meta.url).href;

let limits: ComputeLimits = DEFAULT_COMPUTE_LIMITS;
let pool: Piscina<ComputeJob, unknown> | null = null;
const running = new Map<string, number>();
const waiting = new Map<string, Array<() => void>>();
/** Jobs handed to a thread now (never more than `threads`), and those waiting for one, first come first served. */
let jobsInThreads = 0;
const threadQueue: Array<() => void> = [];
/** Jobs reading a file while it arrives, each with the way to ask it to give its thread back. */
const arrivingJobs = new Set<() => void>();

/** Changes the limits (server start, tests); a pool already running is replaced on its next job. */
export function configureComputePool(next: Partial<ComputeLimits>): void {
  limits = { ...limits, ...next };
  const old = pool;
  pool = null;
  void old?.destroy();
  handOutThreads();
}

/** Jobs waiting for a thread now (tests and the README's figures). */
export function computeJobsWaiting(): number {
  return threadQueue.length;
}

/** Jobs of `userId` waiting for their turn now (tests). */
export function computeJobsWaitingForTurn(userId: string): number {
  return waiting.get(userId)?.length ?? 0;
}

export function computeLimits(): ComputeLimits {
  return limits;
}

function thePool(): Piscina<ComputeJob, unknown> {
  pool ??= new Piscina<ComputeJob, unknown>({
    filename: WORKER_FILE,
    // Workers load TypeScript the way the server does (node --import tsx), whoever started this process.
    execArgv: ['--import', 'tsx'],
    minThreads: 1,
    maxThreads: limits.threads,
    idleTimeout: 60_000,
    // No queue of piscina's own: runComputeJob hands it at most `threads` jobs (takeThread).
    resourceLimits: { maxOldGenerationSizeMb: limits.workerHeapMb },
    // Each thread lowers its own priority when it starts (a nice value is per thread on Linux).
    workerData: { nice: limits.nice } satisfies ComputeThreadSettings,
  });
  return pool;
}

/** Jobs reading a file while it arrives now (tests). */
export function arrivingJobsNow(): number {
  return arrivingJobs.size;
}

/** Starts the pool's first thread now, so the first upload does not wait for it (app start). */
export function warmComputePool(): void {
  thePool();
}

/**
 * Waits until `userId` has fewer than `jobsAtOncePerUser` jobs in the pool, then counts this one; refuses at
 * once (ComputeAccountBusyError) when `waitingPerUser` of theirs wait already.
 */
async function takeTurn(userId: string): Promise<void> {
  if ((running.get(userId) ?? 0) >= limits.jobsAtOncePerUser) {
    const queue = waiting.get(userId) ?? [];
    if (queue.length >= limits.waitingPerUser) throw new ComputeAccountBusyError(queue.length);
    await new Promise<void>((resolve) => {
      queue.push(resolve);
      waiting.set(userId, queue);
    });
  }
  running.set(userId, (running.get(userId) ?? 0) + 1);
}

function endTurn(userId: string): void {
  const left = (running.get(userId) ?? 1) - 1;
  if (left > 0) running.set(userId, left);
  else running.delete(userId);
  const queue = waiting.get(userId);
  const next = queue?.shift();
  if (queue && queue.length === 0) waiting.delete(userId);
  next?.();
}

/** Starts waiting jobs while threads are free (a job ended, or the thread count grew). */
function handOutThreads(): void {
  while (jobsInThreads < limits.threads && threadQueue.length > 0) {
    jobsInThreads++;
    threadQueue.shift()!();
  }
}

/**
 * Waits for a free thread and counts the job in it. The pool is only ever given as many jobs as it
 * has threads, so a job's clock starts when it is handed over; a full queue refuses at once.
 */
async function takeThread(): Promise<void> {
  if (jobsInThreads < limits.threads && threadQueue.length === 0) {
    jobsInThreads++;
    return;
  }
  if (threadQueue.length >= limits.maxQueue) throw new ComputeBusyError();
  // A job waiting for bytes gives its thread back to this one (its file is then read after it has arrived).
  for (const askToYield of arrivingJobs) askToYield();
  await new Promise<void>((resolve) => threadQueue.push(resolve));
}

function leaveThread(): void {
  jobsInThreads--;
  handOutThreads();
}

/**
 * Runs one job for `userId` in the pool, within its time limit (its own run time, not its wait);
 * the caller's event loop stays free. Throws ComputeAccountBusyError when too many of this user's jobs wait
 * already, ComputeBusyError when too many jobs of all users wait for a thread.
 */
export async function runComputeJob<T>(userId: string, task: ComputeTask): Promise<T> {
  await takeTurn(userId);
  try {
    await takeThread();
  } catch (err) {
    endTurn(userId);
    throw err;
  }
  return runInThread<T>(userId, task);
}

/** Most jobs reading a file while it arrives at once: one thread fewer than the pool has, at least one. */
export function arrivingJobsAtOnce(): number {
  return limits.readWhileArriving ? Math.max(1, limits.threads - 1) : 0;
}

/**
 * Starts a job that reads a file while it arrives, only if it can start now: this user's turn and a thread
 * are free, nobody waits for a thread, and fewer than `arrivingJobsAtOnce()` such jobs run; else null (the
 * file is read after it has arrived, as before). While it runs, a job that has to wait for a thread calls
 * `askToYield`: the arriving job then stops waiting for bytes and gives its thread back.
 */
export function tryRunArrivingJob<T>(userId: string, task: ComputeTask, askToYield: () => void): Promise<T> | null {
  if (arrivingJobs.size >= arrivingJobsAtOnce()) return null;
  if ((running.get(userId) ?? 0) >= limits.jobsAtOncePerUser) return null;
  if (jobsInThreads >= limits.threads || threadQueue.length > 0) return null;
  running.set(userId, (running.get(userId) ?? 0) + 1);
  jobsInThreads++;
  arrivingJobs.add(askToYield);
  return runInThread<T>(userId, task).finally(() => arrivingJobs.delete(askToYield));
}

/** Runs a job that holds its user's turn and a thread, within its time limit; gives both back when it ends. */
async function runInThread<T>(userId: string, task: ComputeTask): Promise<T> {
  const timeoutMs = limits.jobTimeoutMs;
  const stop = new AbortController();
  // The clock starts when the thread starts the job (it says so on `started`), so neither the wait for a
  // thread nor a new thread loading its code (seconds on a busy machine) counts against the job.
  const { port1: startedHere, port2: started } = new MessageChannel();
  let timer: NodeJS.Timeout | undefined;
  startedHere.once('message', () => {
    timer = setTimeout(() => stop.abort(), timeoutMs);
  });
  try {
    // An import's port for its track sent ahead of the answer (runs/import-compute.ts) moves to the thread too.
    const handOver = task.kind === 'import-file' ? task.input.handOver : undefined;
    const transferList = handOver ? [started, handOver] : [started];
    return (await thePool().run({ task, started }, { signal: stop.signal, transferList })) as T;
  } catch (err) {
    if (stop.signal.aborted) throw new ComputeTimeoutError(timeoutMs);
    if (
      err instanceof Error &&
      /ERR_WORKER_OUT_OF_MEMORY|worker.*(exit|terminat)/i.test(`${(err as { code?: string }).code} ${err.message}`)
    ) {
      throw new ComputeCrashError(err.message, { cause: err });
    }
    throw err;
  } finally {
    clearTimeout(timer);
    startedHere.close();
    leaveThread();
    endTurn(userId);
  }
}

export function computeImportJob(userId: string, input: ImportComputeInput): Promise<ImportComputeOutput> {
  return runComputeJob<ImportComputeOutput>(userId, { kind: 'import-file', input });
}

/** `tryRunArrivingJob` of an import: null when it cannot start now. */
export function computeArrivingImportJob(
  userId: string,
  input: ImportComputeInput,
  askToYield: () => void,
): Promise<ImportComputeOutput> | null {
  return tryRunArrivingJob<ImportComputeOutput>(userId, { kind: 'import-file', input }, askToYield);
}

export function computePlanCheckJob(userId: string, input: PlanCheckComputeInput): Promise<PlanCheckComputeOutput> {
  return runComputeJob<PlanCheckComputeOutput>(userId, { kind: 'plan-check', input });
}

/** Ends the worker threads (server close). */
export async function stopComputePool(): Promise<void> {
  const old = pool;
  pool = null;
  await old?.destroy();
}
