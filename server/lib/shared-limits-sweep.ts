import { logger } from './logger.ts';
import { sweepEndedLimits } from './shared-limits.repository.ts';

/** How often a process clears ended windows and run-out leases, at most (on the next counted request). */
export const SHARED_LIMITS_SWEEP_EVERY_MS = 60_000;
let lastSweep = 0;

/**
 * Clears rows of the shared limits that no longer count, at most once a minute per process and never
 * in the way of the request that triggers it: every web process does it, so no worker is needed for it.
 */
export function sweepSharedLimitsNowAndThen(now = Date.now()): void {
  if (now - lastSweep < SHARED_LIMITS_SWEEP_EVERY_MS) return;
  lastSweep = now;
  sweepEndedLimits().catch((err: unknown) => logger.warn({ err }, 'sweeping ended rate-limit windows failed'));
}
