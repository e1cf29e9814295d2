import { logger } from '../../lib/logger.ts';
import { sendDueNotices, type NoticeDeps } from './notices.service.ts';

/**
 * Sends batched notices when they fall due. Every NOTICE_SWEEP_SECONDS the server looks for due
 * batches with one query on the partial index of unsent notices; the state lives in the `notices`
 * table, so a restart loses nothing and several processes never send a batch twice (rows are locked
 * while sent). An upload notice thus leaves 60–65 s after the last file of the batch.
 */
export const NOTICE_SWEEP_SECONDS = 5;

export interface NoticeSweeper {
  /** Runs one sweep now (tests drive it; the timer also calls it). */
  sweepNow(now?: Date): ReturnType<typeof sendDueNotices>;
  stop(): Promise<void>;
}

export function startNoticeSweeper(deps: NoticeDeps, everySeconds = NOTICE_SWEEP_SECONDS): NoticeSweeper {
  let running: Promise<unknown> = Promise.resolve();
  let stopped = false;
  const sweepNow = (now?: Date) => {
    const sweep = running.then(() => sendDueNotices(deps, now ?? new Date()));
    running = sweep.catch(() => undefined);
    return sweep;
  };
  const timer = setInterval(() => {
    if (stopped) return;
    sweepNow().catch((err: unknown) => logger.warn({ err }, 'the notice sweep failed; it tries again shortly'));
  }, everySeconds * 1000);
  timer.unref();
  return {
    sweepNow,
    async stop() {
      stopped = true;
      clearInterval(timer);
      await running;
    },
  };
}
