import PgBoss from 'pg-boss';
import { setTimeout as sleep } from 'node:timers/promises';
import { databaseUrlFromEnv } from '../../config.ts';
import { isDatabaseUnavailable } from '../../lib/database-errors.ts';
import { isDatabaseUp } from '../../lib/db.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import { IMPORT_QUEUE, listUnfinishedImportIds } from './imports.repository.ts';
import { ImportHoldings, processImport, sweepImportLeases, type ImportWorkDeps } from './imports.service.ts';

/**
 * The background side of bulk imports: a pg-boss queue in the app's own PostgreSQL (schema
 * `pgboss`), one job per import. Jobs only say "work on import X"; what is done lives in our
 * tables, so any number of jobs for one import are safe and a restart simply queues the unfinished.
 */
const QUEUE = IMPORT_QUEUE;
/** Imports worked on at the same time by one process. */
const IMPORTS_AT_ONCE = 2;
/** Files of one import imported at the same time (parsing is CPU-bound; two overlap the database writes). */
const FILES_AT_ONCE = 2;
/**
 * Leases on import work (README.md in this folder): a worker beats the heartbeat of what it holds
 * every `leaseSeconds / 6`; every `leaseSeconds / 4` each job-running process sweeps: a file not
 * beaten for `leaseSeconds` is given back and its import queued again, and a file claimed
 * `maxAttempts` times is given up with a sentence. Defaults: IMPORT_LEASE_SECONDS, IMPORT_MAX_ATTEMPTS.
 */
export interface ImportLease {
  leaseSeconds: number;
  maxAttempts: number;
}
export const DEFAULT_IMPORT_LEASE: ImportLease = { leaseSeconds: 60, maxAttempts: 3 };
/** How often a worker whose import lost the database looks whether it is back. */
const DATABASE_RECHECK_MS = 2_000;

interface ImportJob {
  importId: string;
}

/** The queue as the workers see it: supervised (expired jobs retried, old ones archived). */
let boss: Promise<PgBoss> | null = null;
/** Only for sending, in a process that runs no jobs (ROLE=web): no supervision, no schedules. */
let sender: Promise<PgBoss> | null = null;
let workerIds: string[] = [];
let stopping = false;
let heartbeat: NodeJS.Timeout | undefined;
let leaseSweep: NodeJS.Timeout | undefined;

function openBoss(databaseUrl: string, works: boolean): Promise<PgBoss> {
  return (async () => {
    const instance = new PgBoss({
      connectionString: databaseUrl,
      max: works ? 4 : 2,
      application_name: works ? 'pacewright-imports' : 'pacewright-imports-sender',
      supervise: works,
      schedule: works,
    });
    instance.on('error', (err) => logger.error({ err }, 'the import queue reported an error'));
    await instance.start();
    // A job that runs longer than expireIn is retried elsewhere; claims in import_files keep that harmless.
    await instance.createQueue(QUEUE, { name: QUEUE, retryLimit: 3, retryDelay: 30, expireInSeconds: 4 * 3600 });
    return instance;
  })();
}

function startBoss(databaseUrl: string): Promise<PgBoss> {
  boss ??= openBoss(databaseUrl, true).catch((err: unknown) => {
    boss = null;
    throw err;
  });
  return boss;
}

function startSender(databaseUrl: string): Promise<PgBoss> {
  sender ??= openBoss(databaseUrl, false).catch((err: unknown) => {
    sender = null;
    throw err;
  });
  return sender;
}

/** Files per queued job of one import, and the most jobs one import gets (common practice: a few, not one per file). */
const FILES_PER_JOB = 50;
const MOST_JOBS_PER_IMPORT = 4;

/**
 * How many jobs an import of `openFiles` files is queued as: one per FILES_PER_JOB files, up to
 * MOST_JOBS_PER_IMPORT, so a large archive is shared by every worker free for it (each job claims
 * files one by one in import_files, so the jobs of one import never import a file twice).
 */
export function jobsForImport(openFiles: number): number {
  return Math.min(MOST_JOBS_PER_IMPORT, Math.max(1, Math.ceil(openFiles / FILES_PER_JOB)));
}

/**
 * Queues an import for the workers (of this or any other process using the same database). A process
 * that works on imports itself sends through its own queue and wakes its idle workers at once.
 */
export async function enqueueImport(importId: string, databaseUrl = databaseUrlFromEnv(), openFiles = 1): Promise<void> {
  const instance = await (boss ?? startSender(databaseUrl));
  for (let i = 0; i < jobsForImport(openFiles); i++) await instance.send(QUEUE, { importId } satisfies ImportJob);
  for (const id of workerIds) instance.notifyWorker(id);
}

export interface ImportWorkerOptions {
  dataDir: string;
  /** Largest single file taken from an archive, bytes (the single-upload limit). */
  maxEntryBytes: number;
  databaseUrl?: string;
  /** How often an idle worker looks for jobs; pg-boss allows 0.5 s at least. */
  pollingIntervalSeconds?: number;
  /** Original files a user may keep, bytes; no limit when absent. */
  storageQuotaBytes?: number;
  /** Lease length and attempts (IMPORT_LEASE_SECONDS, IMPORT_MAX_ATTEMPTS); DEFAULT_IMPORT_LEASE when absent. */
  lease?: ImportLease;
}

/** Runs `task` every `ms`, never two at once; errors are logged (the database may be away) and the next round tries again. */
function every(ms: number, what: string, task: () => Promise<unknown>): NodeJS.Timeout {
  let running = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    task()
      .catch((err: unknown) => logger.warn({ err }, `${what} failed; it runs again shortly`))
      .finally(() => (running = false));
  }, ms);
  timer.unref();
  return timer;
}

/**
 * Starts this process's import workers and queues every import left unfinished by a stop or crash.
 * Call once (server start; API tests start and stop it explicitly).
 */
export async function startImportWorker(store: FileStore, options: ImportWorkerOptions): Promise<void> {
  stopping = false;
  const lease = options.lease ?? DEFAULT_IMPORT_LEASE;
  const instance = await startBoss(options.databaseUrl ?? databaseUrlFromEnv());
  const holdings = new ImportHoldings();
  const deps: ImportWorkDeps = {
    store,
    dataDir: options.dataDir,
    maxEntryBytes: options.maxEntryBytes,
    filesAtOnce: FILES_AT_ONCE,
    holdings,
    shouldStop: () => stopping,
    storageQuotaBytes: options.storageQuotaBytes,
  };
  for (let i = 0; i < IMPORTS_AT_ONCE; i++) {
    workerIds.push(
      await instance.work<ImportJob>(
        QUEUE,
        { batchSize: 1, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 2 },
        async ([job]) => {
          if (job) await importOrResumeLater(instance, job.data.importId, deps, lease);
        },
      ),
    );
  }
  for (const importId of await listUnfinishedImportIds()) await instance.send(QUEUE, { importId } satisfies ImportJob);
  const sweep = async () => {
    const swept = await sweepImportLeases({
      ...lease,
      dataDir: options.dataDir,
      enqueue: async (importId) => {
        await instance.send(QUEUE, { importId } satisfies ImportJob);
        for (const id of workerIds) instance.notifyWorker(id);
      },
    });
    if (swept.requeued.length > 0 || swept.givenUp.length > 0) {
      logger.warn(swept, 'import lease sweep: work of a stopped worker was queued again');
    }
  };
  heartbeat = every((lease.leaseSeconds * 1000) / 6, 'the import heartbeat', () => holdings.beat());
  leaseSweep = every((lease.leaseSeconds * 1000) / 4, 'the import lease sweep', sweep);
}

/**
 * Works on an import; if the database goes away meanwhile, waits until it is back and queues the
 * import again for when the claims on its files in flight have run out. Failing the job instead
 * would not help: pg-boss cannot record a failure without the database either, and the job would
 * then sit as active for hours.
 */
async function importOrResumeLater(instance: PgBoss, importId: string, deps: ImportWorkDeps, lease: ImportLease): Promise<void> {
  try {
    await processImport(importId, deps);
  } catch (err) {
    if (!isDatabaseUnavailable(err)) throw err;
    logger.warn({ err, importId }, 'the database went away during an import; it resumes once the database is back');
    while (!stopping && !(await isDatabaseUp())) await sleep(DATABASE_RECHECK_MS);
    // When stopping, the next start's sweep queues the import again.
    if (!stopping) await instance.send(QUEUE, { importId } satisfies ImportJob, { startAfter: lease.leaseSeconds + 5 });
  }
}

/** Stops the workers: files in hand are finished, no new one is started; the rest waits for the next start. */
export async function stopImportWorker(): Promise<void> {
  stopping = true;
  clearInterval(leaseSweep);
  const current = boss;
  boss = null;
  workerIds = [];
  // The files in hand keep their heartbeat until they are finished.
  if (current) await (await current).stop({ graceful: true, wait: true, timeout: 60_000 });
  clearInterval(heartbeat);
  await stopImportSender();
}

/** Closes the send-only queue of a process that runs no jobs (its shutdown). */
export async function stopImportSender(): Promise<void> {
  const current = sender;
  sender = null;
  if (current) await (await current).stop({ graceful: true, wait: true, timeout: 10_000 });
}
