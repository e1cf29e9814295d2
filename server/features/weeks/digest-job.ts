import PgBoss from 'pg-boss';
import { ConfigError, type AppConfig } from '../../config.ts';
import { logger } from '../../lib/logger.ts';
import type { Mailer } from '../../lib/mailer.ts';
import { sendDigestRound } from './digest.service.ts';

/** The pg-boss queue (and schedule) name of the weekly digest round. */
export const DIGEST_QUEUE = 'squad-digest';

/**
 * The weekly digests as a pg-boss schedule in the app's database (server/features/jobs/README.md). pg-boss makes
 * one job per schedule slot however many processes watch the clock (its cron check runs in one process at a time
 * and sends with a 60 s singleton key), and a job is fetched by one worker only (SKIP LOCKED); so two workers send
 * each digest once. No retry: a round that failed half-way would e-mail the squads already done a second time.
 * DIGEST_SCHEDULE=off removes the schedule, so no other process keeps firing it.
 */
export async function startDigestJob(mailer: Mailer, config: AppConfig): Promise<{ stop(): Promise<void> }> {
  const boss = new PgBoss({ connectionString: config.databaseUrl, max: 2, application_name: 'pacewright-digest' });
  boss.on('error', (err) => logger.error({ err }, 'the digest queue reported an error'));
  await boss.start();
  const stop = () => boss.stop({ graceful: true, wait: true, timeout: 30_000 });
  try {
    // A round nobody picked up within 12 h is dropped rather than sent days late.
    await boss.createQueue(DIGEST_QUEUE, { name: DIGEST_QUEUE, retryLimit: 0, retentionHours: 12 });
    if (config.digestSchedule === null) {
      await boss.unschedule(DIGEST_QUEUE);
    } else {
      await boss.schedule(DIGEST_QUEUE, config.digestSchedule).catch((err: unknown) => {
        throw new ConfigError(
          `DIGEST_SCHEDULE "${config.digestSchedule}" is not a cron text pg-boss can read: ${(err as Error).message}`,
        );
      });
    }
  } catch (err) {
    await stop();
    throw err;
  }
  await boss.work(DIGEST_QUEUE, async ([job]) => {
    const lines = await sendDigestRound('last', mailer, config);
    const failed = lines.filter((l) => l.outcome === 'failed');
    logger.info(
      {
        job: job?.id,
        sent: lines.filter((l) => l.outcome === 'sent').length,
        off: lines.filter((l) => l.outcome === 'off').length,
        failed,
      },
      'weekly digest round finished',
    );
  });
  return { stop };
}
