import type { Response } from 'express';
import { logger } from './logger.ts';

/** Work started after an answer went out, until it settles. */
const pending = new Set<Promise<void>>();

/**
 * Runs `task` once the answer has been sent (or the connection closed), so its duration never shows
 * in the answer's timing: the reset request and the sign-up answer at once whether or not the
 * address has an account, and look it up and send mail afterwards (issue 13 #7). A failure is
 * logged; the person already has their answer.
 */
export function afterAnswer(res: Response, what: string, task: () => Promise<void>): void {
  // Counted from now, not from the answer, so whoever waits for the work cannot miss it.
  const answered = new Promise<void>((resolve) => res.once('close', resolve));
  const work: Promise<void> = answered
    .then(task)
    .catch((err: unknown) => logger.error({ err }, `${what} failed after answering`))
    .finally(() => pending.delete(work));
  pending.add(work);
}

/** Resolves when every task started by `afterAnswer` so far (and any they started) has settled: for shutdown and tests. */
export async function afterAnswerSettled(): Promise<void> {
  while (pending.size > 0) await Promise.allSettled([...pending]);
}
