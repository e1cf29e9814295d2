import type Stripe from 'stripe';
import type { AppConfig } from '../../config.ts';
import { logger } from '../../lib/logger.ts';
import type { Mailer } from '../../lib/mailer.ts';
import type { FileStore } from '../../lib/storage.ts';

/**
 * Every background job of Pacewright, started in one place so a process either runs all of them
 * (ROLE=all, the default, and `npm run worker`) or none (ROLE=web). Each keeps its state in
 * PostgreSQL and locks what it works on, so any number of processes may run them on one database
 * (README.md in this folder).
 */
export interface BackgroundJobs {
  /** The job names, for the start-up log line. */
  names: string[];
  stop(): Promise<void>;
}

export interface BackgroundJobDeps {
  config: AppConfig;
  store: FileStore;
  mailer: Mailer;
  /** The payment service; null when payments are not set up (the nightly reconcile is then off). */
  payments: Stripe | null;
}

export async function startBackgroundJobs({ config, store, mailer, payments }: BackgroundJobDeps): Promise<BackgroundJobs> {
  const stops: Array<{ name: string; stop(): Promise<void> }> = [];
  // Bulk imports: a pg-boss queue in the app's database (server/features/history).
  const { startImportWorker, stopImportWorker } = await import('../history/import-queue.ts');
  await startImportWorker(store, {
    dataDir: config.dataDir,
    maxEntryBytes: config.uploadMaxFileBytes,
    databaseUrl: config.databaseUrl,
    storageQuotaBytes: config.storageQuotaBytes,
    lease: config.importLease,
  });
  stops.push({ name: 'bulk imports', stop: stopImportWorker });
  // Batched notice e-mails (uploads, notes, alerts), every few seconds.
  const { startNoticeSweeper } = await import('../notices/notice-sweeper.ts');
  stops.push({ name: 'notice e-mails', ...startNoticeSweeper({ mailer, config }) });
  // A runner hears of a coach's changes once per editing burst (server/features/plans/README.md).
  const { startPlanNoticeSweeper } = await import('../plans/plan-notices.ts');
  stops.push({ name: 'plan-change e-mails', ...startPlanNoticeSweeper(mailer, config) });
  // Files left by a crash (an original stored just before the process died, an old archive): now and hourly.
  // runs/ sweeps originals and uploads; history/'s archive step is handed in, so neither imports the other.
  const { startOrphanSweeper } = await import('../runs/orphan-sweeper.ts');
  const { sweepLeftoverArchives } = await import('../history/index.ts');
  const { dataDir, orphanGraceSeconds: graceSeconds } = config;
  stops.push({
    name: 'orphan file sweep',
    ...startOrphanSweeper({
      store,
      dataDir,
      graceSeconds,
      sweepArchives: (now) => sweepLeftoverArchives(dataDir, now, graceSeconds),
    }),
  });
  // The weekly digests on DIGEST_SCHEDULE (off: the schedule is removed); `npm run digest` sends them by hand.
  const { startDigestJob } = await import('../weeks/digest-job.ts');
  stops.push({
    name: config.digestSchedule ? `weekly digests (${config.digestSchedule})` : 'weekly digests (off)',
    ...(await startDigestJob(mailer, config)),
  });
  // The nightly comparison with the payment service (server/features/fees/README.md).
  if (payments) {
    const { startReconcileJob } = await import('../fees/reconcile-job.ts');
    stops.push({ name: 'fee reconcile', ...(await startReconcileJob(payments, config.databaseUrl)) });
  }
  return {
    names: stops.map((s) => s.name),
    async stop() {
      // Last started, first stopped; one that fails to stop never keeps the others running.
      for (const job of stops.reverse()) {
        await job.stop().catch((err: unknown) => logger.error({ err, job: job.name }, 'a background job did not stop cleanly'));
      }
    },
  };
}
