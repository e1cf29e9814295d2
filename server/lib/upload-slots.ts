import { logger } from './logger.ts';
import { sweepSharedLimitsNowAndThen } from './shared-limits-sweep.ts';
import { claimUploadSlot, releaseUploadSlot, renewUploadSlot } from './shared-limits.repository.ts';

/** A slot held for one upload while it arrives. `release` is safe to call more than once. */
export interface HeldSlot {
  release(): void;
}

/**
 * Takes one of a user's `max` slots of `kind` (one kind per upload route) for an upload that starts
 * arriving, or answers how many are held when none is free. The slot is a row in PostgreSQL, so every
 * web process counts the same uploads; it is leased for `leaseMs` and renewed every third of that
 * while held, so the slots of a process that dies (kill -9, a lost machine) free themselves when their
 * lease runs out, without a restart or a sweep (README.md, "Shared limits").
 */
export async function takeUploadSlot(
  kind: string,
  userId: string,
  max: number,
  leaseMs: number,
): Promise<{ slot: HeldSlot } | { held: number }> {
  sweepSharedLimitsNowAndThen();
  const claimed = await claimUploadSlot(kind, userId, max, leaseMs);
  if (!('id' in claimed)) return claimed;
  const { id } = claimed;
  let released = false;
  const renewal = setInterval(
    () => {
      renewUploadSlot(id, leaseMs)
        .then((renewed) => {
          if (!renewed && !released) logger.warn({ kind, userId }, 'an upload slot ran out before its upload ended');
        })
        .catch((err: unknown) => logger.warn({ err, kind, userId }, 'renewing an upload slot failed'));
    },
    Math.max(1, Math.floor(leaseMs / 3)),
  );
  // A renewal timer must not keep a stopping process alive; the lease covers whatever it leaves.
  renewal.unref();
  return {
    slot: {
      release() {
        if (released) return;
        released = true;
        clearInterval(renewal);
        releaseUploadSlot(id).catch((err: unknown) =>
          logger.warn({ err, kind, userId }, 'releasing an upload slot failed; its lease frees it'),
        );
      },
    },
  };
}
