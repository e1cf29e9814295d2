import PgBoss from 'pg-boss';
import type Stripe from 'stripe';
import { logger } from '../../lib/logger.ts';
import { reconcileSubscriptions } from './fees.service.ts';

const QUEUE = 'fees-reconcile';
/** Every night at 03:15 UTC (pg-boss cron, UTC by default): a quiet hour for the service and for us. */
const NIGHTLY = '15 3 * * *';

/**
 * The nightly reconcile as a pg-boss schedule in the app's database: one process of a cluster runs it (pg-boss
 * takes the schedule once per minute slot), and it reports differences in the log; it changes nothing by itself.
 */
export async function startReconcileJob(stripe: Stripe, databaseUrl: string): Promise<{ stop(): Promise<void> }> {
  const boss = new PgBoss({ connectionString: databaseUrl, max: 2, application_name: 'pacewright-fees' });
  boss.on('error', (err) => logger.error({ err }, 'the fees reconcile queue reported an error'));
  await boss.start();
  await boss.createQueue(QUEUE, { name: QUEUE, retryLimit: 2, retryDelay: 600 });
  await boss.schedule(QUEUE, NIGHTLY);
  await boss.work(QUEUE, async () => {
    await reconcileSubscriptions(stripe);
  });
  return { stop: () => boss.stop({ graceful: true, wait: true, timeout: 30_000 }) };
}
