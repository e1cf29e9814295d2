import type { Server } from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ConfigError, loadConfig, type AppConfig } from './config.ts';
import { logger } from './lib/logger.ts';
import { afterAnswerSettled } from './lib/after-answer.ts';

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export interface RunningServer {
  server: Server;
  config: AppConfig;
  url: string;
  /** Sends batched notices that are due (at `now`, default the clock); it also runs every few seconds. */
  sweepNotices(now?: Date): Promise<{ sent: number; dropped: number; failed: number }>;
  close(): Promise<void>;
}

let logsStrayRejections = false;

/**
 * A promise rejected with nobody waiting ends a Node process by default. Libraries leave some behind
 * while PostgreSQL is away (pg-boss records a job's outcome without awaiting it): log them and keep
 * serving, so a database restart never needs a web server restart.
 */
function logStrayRejections(): void {
  if (logsStrayRejections) return;
  logsStrayRejections = true;
  process.on('unhandledRejection', (reason) => logger.error({ err: reason }, 'a background task failed; the server carries on'));
}

/** Starts the web server (config from the environment). Only this module calls `listen`. */
export async function startServer(env: NodeJS.ProcessEnv = process.env): Promise<RunningServer> {
  const config = loadConfig(env);
  logStrayRejections();
  // Imported after the config check so a bad production config fails before any connection is made.
  const { createApp } = await import('./app.ts');
  const { db } = await import('./lib/db.ts');
  const { createStoreFromEnv } = await import('./lib/storage.ts');
  const store = await createStoreFromEnv(config.dataDir, env);
  // Development and tests: catch outgoing mail on loopback and show it at /api/dev/outbox.
  const { startMailCatcher } = await import('./features/mail/mail-catcher.ts');
  const catcher = !config.smtpUrl && config.env !== 'production' ? await startMailCatcher(config.mailCatcherPort) : null;
  const mailConfig = catcher ? { ...config, mailCatcherPort: catcher.port } : config;
  const { createSmtpMailer } = await import('./lib/mailer.ts');
  // Parsing, analysis and plan checks run in worker threads (server/features/runs/README.md).
  const { configureComputePool, stopComputePool } = await import('./features/compute/compute-pool.ts');
  configureComputePool({ threads: config.computeThreads });
  // Development and tests: the local fake of the payment service on loopback, unless PAYMENTS_URL names one.
  // Imported only here and only outside production, so a production server never loads it.
  const fake =
    !config.payments.url && config.env !== 'production'
      ? await (
          await import('./features/fees/payment-fake.ts')
        ).startPaymentFake({ port: config.payments.fakePort, webhookSecret: config.payments.webhookSecret })
      : null;
  if (fake) config.payments.url = fake.url;
  const { createPaymentsClient } = await import('./features/fees/payments-client.ts');
  const payments = createPaymentsClient(config);
  const mailer = createSmtpMailer(mailConfig);
  const app = createApp({
    config,
    store,
    mailer,
    payments,
    clientDir: path.join(ROOT, 'dist/client'),
  });
  const { startReconcileJob } = await import('./features/fees/reconcile-job.ts');
  const reconcile = payments ? await startReconcileJob(payments, config.databaseUrl) : null;
  // Batched notices (uploads, notes) go out when due.
  const { startNoticeSweeper } = await import('./features/notices/notice-sweeper.ts');
  const notices = startNoticeSweeper({ mailer, config });
  // Bulk imports run in the background through a pg-boss queue in the same database.
  const { startImportWorker, stopImportWorker } = await import('./features/history/import-queue.ts');
  await startImportWorker(store, {
    dataDir: config.dataDir,
    maxEntryBytes: config.uploadMaxFileBytes,
    databaseUrl: config.databaseUrl,
    storageQuotaBytes: config.storageQuotaBytes,
  });
  // DATABASE_REPLICA_URL: read-only pages read a streaming replica while it keeps up (server/lib/read-replica.ts).
  const { startReadReplica, stopReadReplica } = await import('./lib/read-replica.ts');
  await startReadReplica(config);
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.on('error', reject);
  });
  // Files left by a crash (an original stored just before the process died, an old archive) are
  // swept in the background now and hourly; listening never waits for it.
  const { startOrphanSweeper } = await import('./features/runs/orphan-sweeper.ts');
  const sweeper = startOrphanSweeper({ store, dataDir: config.dataDir, graceSeconds: config.orphanGraceSeconds });
  // A runner hears of a coach's changes once per editing burst (server/features/plans/README.md).
  const { startPlanNoticeSweeper } = await import('./features/plans/plan-notices.ts');
  const planNotices = startPlanNoticeSweeper(mailer, config);
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  fake?.setDeliver(async (payload, signature) => {
    const answer = await fetch(`http://${config.host}:${port}/api/payments/webhook`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': signature },
      body: payload,
    });
    return answer.status;
  });
  return {
    server,
    config,
    url: `http://${config.host}:${port}`,
    sweepNotices: (now) => notices.sweepNow(now),
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      // Mail still being sent for answers already given (sign-up, reset requests).
      await afterAnswerSettled();
      await sweeper.stop();
      await planNotices.stop();
      await notices.stop();
      await stopImportWorker();
      await stopComputePool();
      await catcher?.close();
      await fake?.close();
      await reconcile?.stop();
      await stopReadReplica();
      await db.destroy();
    },
  };
}

const isEntryPoint = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isEntryPoint) {
  try {
    const running = await startServer();
    logger.info(`Pacewright is listening on ${running.url}`);
    const stop = () => void running.close().then(() => process.exit(0));
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(`Pacewright cannot start: ${err.message}`);
      process.exit(1);
    }
    throw err;
  }
}
