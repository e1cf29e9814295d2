import { Piscina } from 'piscina';
import { defaultComputeThreads } from '../../config.ts';
import { AppError } from '../../lib/errors.ts';
import type { PlanCheckComputeInput, PlanCheckComputeOutput } from '../plans/worker.ts';
import type { ImportComputeInput, ImportComputeOutput } from '../runs/worker.ts';
import type { ComputeTask } from './compute-worker.ts';

/**
 * The worker-thread pool that does the CPU-heavy work (parsing and analysing uploaded tracks,
 * plan checks), so one account's files never freeze the event loop every request shares. Limits
 * and why: server/features/runs/README.md.
 */
export interface ComputeLimits {
  /** Worker threads (COMPUTE_THREADS); the event loop keeps a core of its own when there are two or more. */
  threads: number;
  /** Longest a job may take, queue wait included, before its worker is stopped. */
  jobTimeoutMs: number;
  /** Jobs of one user in the pool at once; the rest of theirs wait their turn, so nobody fills the pool alone. */
  jobsAtOncePerUser: number;
  /** Jobs waiting for a thread, across users, before new ones are turned away with a 503. */
  maxQueue: number;
  /** Heap of one worker, MB: a job that needs more ends its worker instead of the process. */
  workerHeapMb: number;
}

export const DEFAULT_COMPUTE_LIMITS: ComputeLimits = {
  threads: defaultComputeThreads(),
  jobTimeoutMs: 60_000,
  jobsAtOncePerUser: 2,
  maxQueue: 64,
  workerHeapMb: 1024,
};

/** The pool cannot take more work now (its queue is full); the client should retry shortly. */
export class ComputeBusyError extends AppError {
  constructor() {
    super(503, 'busy', 'Pacewright is busy reading other files just now. Please try again in a minute.');
  }
}

/** A job ran past its time limit and its worker was stopped. */
export class ComputeTimeoutError extends Error {
  constructor(readonly limitMs: number) {
    super(`a compute job ran longer than ${limitMs} ms`);
  }
}

/** A job's worker died (ran out of its heap, say). */
export class ComputeCrashError extends Error {}

const WORKER_FILE = new URL('./compute-worker.ts', import.meta.url).href;

let limits: ComputeLimits = DEFAULT_COMPUTE_LIMITS;
let pool: Piscina<ComputeTask, unknown> | null = null;
const running = new Map<string, number>();
const waiting = new Map<string, Array<() => void>>();

/** Changes the limits (server start, tests); a pool already running is replaced on its next job. */
export function configureComputePool(next: Partial<ComputeLimits>): void {
  limits = { ...limits, ...next };
  const old = pool;
  pool = null;
  void old?.destroy();
}

export function computeLimits(): ComputeLimits {
  return limits;
}

function thePool(): Piscina<ComputeTask, unknown> {
  pool ??= new Piscina<ComputeTask, unknown>({
    filename: WORKER_FILE,
    // Workers load TypeScript the way the server does (node --import tsx), whoever started this process.
    execArgv: ['--import', 'tsx'],
    minThreads: 1,
    maxThreads: limits.threads,
    idleTimeout: 60_000,
    maxQueue: limits.maxQueue,
    resourceLimits: { maxOldGenerationSizeMb: limits.workerHeapMb },
  });
  return pool;
}

/** Starts the pool's first thread now, so the first upload does not wait for it (app start). */
export function warmComputePool(): void {
  thePool();
}

/** Waits until `userId` has fewer than `jobsAtOncePerUser` jobs in the pool, then counts this one. */
async function takeTurn(userId: string): Promise<void> {
  if ((running.get(userId) ?? 0) >= limits.jobsAtOncePerUser) {
    await new Promise<void>((resolve) => {
      const queue = waiting.get(userId) ?? [];
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

function isQueueFull(err: unknown): boolean {
  return err instanceof Error && /queue is at limit/i.test(err.message);
}

/** Runs one job for `userId` in the pool, within its time limit; the caller's event loop stays free. */
export async function runComputeJob<T>(userId: string, task: ComputeTask): Promise<T> {
  await takeTurn(userId);
  const timeoutMs = limits.jobTimeoutMs;
  const signal = AbortSignal.timeout(timeoutMs);
  try {
    return (await thePool().run(task, { signal })) as T;
  } catch (err) {
    if (signal.aborted) throw new ComputeTimeoutError(timeoutMs);
    if (isQueueFull(err)) throw new ComputeBusyError();
    if (
      err instanceof Error &&
      /ERR_WORKER_OUT_OF_MEMORY|worker.*(exit|terminat)/i.test(`${(err as { code?: string }).code} ${err.message}`)
    ) {
      throw new ComputeCrashError(err.message, { cause: err });
    }
    throw err;
  } finally {
    endTurn(userId);
  }
}

export function computeImportJob(userId: string, input: ImportComputeInput): Promise<ImportComputeOutput> {
  return runComputeJob<ImportComputeOutput>(userId, { kind: 'import-file', input });
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
