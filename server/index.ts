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

/** What every role builds from the configuration: file store, outgoing mail, the payment client. */
async function startServices(config: AppConfig, env: NodeJS.ProcessEnv) {
  const { createStoreFromEnv } = await import('./lib/storage.ts');
  const store = await createStoreFromEnv(config.dataDir, env);
  // Development and tests: catch outgoing mail on loopback and show it at /api/dev/outbox.
  const { startMailCatcher } = await import('./features/mail/mail-catcher.ts');
  const wantsCatcher = !config.smtpUrl && config.env !== 'production';
  const catcher = wantsCatcher
    ? await startMailCatcher(config.mailCatcherPort).catch((err: unknown) => {
        // A worker beside `npm start` on one machine: the web process's catcher on that port takes its mail.
        if (config.role === 'worker' && (err as { code?: unknown }).code === 'EADDRINUSE') return null;
        throw err;
      })
    : null;
  const mailConfig = catcher ? { ...config, mailCatcherPort: catcher.port } : config;
  const { createSmtpMailer } = await import('./lib/mailer.ts');
  const mailer = createSmtpMailer(mailConfig);
  // Parsing, analysis and plan checks run in worker threads (server/features/runs/README.md): web
  // processes for single uploads and reads, workers for bulk imports.
  const { configureComputePool, stopComputePool } = await import('./features/compute/compute-pool.ts');
  configureComputePool({ threads: config.computeThreads, nice: config.computeNice });
  // Bcrypt runs in a pool of its own (server/features/auth/README.md), closed with the compute pool.
  const { stopPasswordPool } = await import('./features/auth/password-pool.ts');
  const stopPools = async () => {
    await stopComputePool();
    await stopPasswordPool();
  };
  return { store, catcher, mailer, stopComputePool: stopPools };
}

/**
 * Starts the web server (config from the environment). Only this module calls `listen`. With ROLE=all
 * (the default) it also runs the background jobs; with ROLE=web it runs none (README "Scaling out").
 */
export async function startServer(env: NodeJS.ProcessEnv = process.env): Promise<RunningServer> {
  const config = loadConfig(env);
  if (config.role === 'worker')
    throw new ConfigError('ROLE=worker serves no HTTP: start it with `npm run worker` (or startWorker).');
  logStrayRejections();
  // Imported after the config check so a bad production config fails before any connection is made.
  const { createApp } = await import('./app.ts');
  const { closeDatabase } = await import('./lib/db.ts');
  const { store, catcher, mailer, stopComputePool } = await startServices(config, env);
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
  const app = createApp({
    config,
    store,
    mailer,
    payments,
    clientDir: path.join(ROOT, 'dist/client'),
  });
  // DATABASE_REPLICA_URL: read-only pages read a streaming replica while it keeps up (server/lib/read-replica.ts).
  const { startReadReplica, stopReadReplica } = await import('./lib/read-replica.ts');
  await startReadReplica(config);
  const { startBackgroundJobs } = await import('./features/jobs/background-jobs.ts');
  const jobs = config.role === 'all' ? await startBackgroundJobs({ config, store, mailer, payments }) : null;
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.on('error', reject);
  });
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
  logger.info(
    { role: config.role, jobs: jobs?.names ?? [] },
    jobs ? 'background jobs are running in this process' : 'background jobs are off in this process (ROLE=web)',
  );
  const { sendDueNotices } = await import('./features/notices/notices.service.ts');
  const { stopImportSender } = await import('./features/history/import-queue.ts');
  return {
    server,
    config,
    url: `http://${config.host}:${port}`,
    sweepNotices: (now) => sendDueNotices({ mailer, config }, now ?? new Date()),
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeAllConnections();
      // Mail still being sent for answers already given (sign-up, reset requests).
      await afterAnswerSettled();
      await jobs?.stop();
      await stopImportSender();
      await stopComputePool();
      await catcher?.close();
      await fake?.close();
      await stopReadReplica();
      await closeDatabase();
    },
  };
}

export interface RunningWorker {
  config: AppConfig;
  jobs: string[];
  close(): Promise<void>;
}

/**
 * Starts a worker (`npm run worker`): the background jobs and no HTTP. Any number of workers and web
 * processes may share one database. Outside production without PAYMENTS_URL there is no payment
 * service to compare with (each web process's local fake is its own), so the nightly reconcile is off.
 */
export async function startWorker(env: NodeJS.ProcessEnv = process.env): Promise<RunningWorker> {
  const config = loadConfig({ ...env, ROLE: 'worker' });
  logStrayRejections();
  const { closeDatabase } = await import('./lib/db.ts');
  const { store, catcher, mailer, stopComputePool } = await startServices(config, env);
  const { createPaymentsClient } = await import('./features/fees/payments-client.ts');
  const payments = createPaymentsClient(config);
  const { startBackgroundJobs } = await import('./features/jobs/background-jobs.ts');
  const jobs = await startBackgroundJobs({ config, store, mailer, payments });
  return {
    config,
    jobs: jobs.names,
    async close() {
      await jobs.stop();
      await stopComputePool();
      await catcher?.close();
      await closeDatabase();
    },
  };
}

const isEntryPoint = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isEntryPoint) {
  try {
    const worker = loadConfig().role === 'worker';
    const running = worker ? await startWorker() : await startServer();
    if ('url' in running) logger.info(`Pacewright is listening on ${running.url}`);
    else logger.info({ jobs: running.jobs }, 'Pacewright worker is running (no HTTP)');
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
