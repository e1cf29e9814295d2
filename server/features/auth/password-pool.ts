import { Piscina } from 'piscina';
import { AppError } from '../../lib/errors.ts';
import type { PasswordTask } from './password-worker.ts';

/**
 * A small worker-thread pool of its own for bcrypt (hash and compare), so no sign-in keeps the event
 * loop busy, sign-ins never wait behind track imports in the compute pool, and imports never wait
 * behind sign-ins. Limits and why: server/features/auth/README.md.
 */
export interface PasswordLimits {
  /** Worker threads (PASSWORD_THREADS, default 1): one cost-12 check is ~0.25 s of one core. */
  threads: number;
  /**
   * Checks and hashes waiting for a thread before new ones are refused at once with a 503 and
   * Retry-After (PasswordBusyError): at ~0.25 s each on one thread, 64 waiting drain in ~16 s.
   */
  maxQueue: number;
}

/** PASSWORD_THREADS when it is a whole number from 1, at most 8; else 1. */
export function defaultPasswordThreads(env: NodeJS.ProcessEnv = process.env): number {
  const configured = Number(env.PASSWORD_THREADS);
  if (Number.isInteger(configured) && configured >= 1) return Math.min(configured, 8);
  return 1;
}

export const DEFAULT_PASSWORD_LIMITS: PasswordLimits = { threads: defaultPasswordThreads(), maxQueue: 64 };

/** Seconds a client is asked to wait when the queue is full: a full queue drains in ~16 s on one thread. */
export const PASSWORD_BUSY_RETRY_AFTER_SECONDS = 20;

/** The password threads cannot take more work now; the client should try again shortly. */
export class PasswordBusyError extends AppError {
  constructor() {
    super(
      503,
      'busy',
      'Pacewright is checking a lot of passwords just now, so yours was not checked and nothing was changed. Please try again in 20 seconds.',
    );
    this.retryAfterSeconds = PASSWORD_BUSY_RETRY_AFTER_SECONDS;
  }
}

const WORKER_FILE = new URL('./password-worker.ts', import.meta.url).href;

let limits: PasswordLimits = DEFAULT_PASSWORD_LIMITS;
let pool: Piscina<PasswordTask, string | boolean> | null = null;

/** Changes the limits (server start, tests); a running pool is replaced on its next task. */
export function configurePasswordPool(next: Partial<PasswordLimits>): void {
  limits = { ...limits, ...next };
  const old = pool;
  pool = null;
  void old?.destroy();
}

export function passwordLimits(): PasswordLimits {
  return limits;
}

function thePool(): Piscina<PasswordTask, string | boolean> {
  pool ??= new Piscina<PasswordTask, string | boolean>({
    filename: WORKER_FILE,
    // Workers load TypeScript the way the server does (node --import tsx), whoever started this process.
    execArgv: ['--import', 'tsx'],
    minThreads: 1,
    maxThreads: limits.threads,
    idleTimeout: 60_000,
    // Bcrypt needs little memory; a small heap keeps each thread cheap.
    resourceLimits: { maxOldGenerationSizeMb: 64 },
  });
  return pool;
}

/** Starts the first password thread now, so the first sign-in does not wait for it (app start). */
export function warmPasswordPool(): void {
  thePool();
}

function runPasswordTask<T extends string | boolean>(task: PasswordTask): Promise<T> {
  const current = thePool();
  // Tasks in threads (at most `threads`) plus those queued: refuse at once past the queue's bound.
  if (current.queueSize >= limits.maxQueue) return Promise.reject(new PasswordBusyError());
  return current.run(task) as Promise<T>;
}

/** bcrypt.hash in a password thread. */
export function hashInThread(password: string, cost: number): Promise<string> {
  return runPasswordTask<string>({ kind: 'hash', password, cost });
}

/** bcrypt.compare in a password thread. */
export function compareInThread(password: string, hash: string): Promise<boolean> {
  return runPasswordTask<boolean>({ kind: 'compare', password, hash });
}

/** Ends the password threads (server close). */
export async function stopPasswordPool(): Promise<void> {
  const old = pool;
  pool = null;
  await old?.destroy();
}
