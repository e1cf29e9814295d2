import type { RequestHandler } from 'express';
import type { AppConfig } from '../../config.ts';
import { authorize, requireActor } from '../../lib/authorize.ts';
import { AppError } from '../../lib/errors.ts';
import { perUserRateLimit } from '../../lib/per-user-rate-limit.ts';
import { takeUploadSlot } from '../../lib/upload-slots.ts';
import { storageUsedBy } from './storage-quota.repository.ts';
import { StorageFullError } from './upload-to-disk.ts';

/** What the guards learnt about the uploader's storage before the body, for the receiver's running check. */
export interface StorageLocals {
  storage?: { used: number; quota: number; left: number };
}

const minutes = (ms: number) => Math.round(ms / 60_000);

/**
 * The checks an upload passes before a byte of its body is read (issue 13): the caller is signed in
 * and may upload (401/403 otherwise), has not sent too many uploads lately (429), has fewer than
 * `uploadsAtOncePerUser` uploads arriving (429) and has storage left (413). One set per route, named
 * by `route`, so the single-file upload and the bulk import share nothing but the numbers. Both counts
 * live in PostgreSQL (server/lib/README.md, "Shared limits"): every web process enforces one limit.
 */
export function uploadGuards(
  config: AppConfig,
  options: { route: 'run-files' | 'import-archives'; checkStorage: boolean },
): RequestHandler[] {
  const perUserRate = perUserRateLimit({
    name: `${options.route}-uploads`,
    ...config.uploadRateLimit,
    code: 'too-many-uploads',
    message: `You have sent ${config.uploadRateLimit.max} uploads in the last ${minutes(config.uploadRateLimit.windowMs)} minutes, the most Pacewright takes. Please wait a few minutes; for a whole history use the bulk import.`,
  });

  const oneAtATime: RequestHandler = async (_req, res, next) => {
    const userId = requireActor(res).id;
    const taken = await takeUploadSlot(options.route, userId, config.uploadsAtOncePerUser, config.uploadSlotLeaseMs);
    if ('held' in taken) {
      res.set('Retry-After', '10');
      throw new AppError(
        429,
        'uploads-in-progress',
        `You already have ${taken.held} uploads arriving. Wait until they are finished, then send the next files.`,
      );
    }
    // Held until the answer is sent or the connection drops, whichever comes first.
    res.once('close', () => taken.slot.release());
    next();
  };

  const storageLeft: RequestHandler = async (_req, res, next) => {
    const user = requireActor(res);
    const used = (await storageUsedBy(user.id)).bytes;
    const quota = config.storageQuotaBytes;
    if (used >= quota) throw new StorageFullError(used, quota);
    (res.locals as StorageLocals).storage = { used, quota, left: quota - used };
    next();
  };

  return [authorize('own-data'), perUserRate, oneAtATime, ...(options.checkStorage ? [storageLeft] : [])];
}
