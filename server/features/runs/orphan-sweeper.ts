import { rm } from 'node:fs/promises';
import path from 'node:path';
import { selectLeftoverUploads, selectOrphanOriginals } from '../../../shared/runs/orphan-files.ts';
import { listFilesWithTimes } from '../../lib/dir-listing.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import { findReferencedStorageKeys, withOriginalFilesExclusiveLock } from './original-files.repository.ts';
import { uploadsTempDir } from './upload-to-disk.ts';

/**
 * Removes files a crash left behind: an original stored by an upload whose transaction never
 * committed (the process was killed between storing the file and COMMIT), uploads half-received,
 * and (through `sweepArchives`) bulk-import archives no import will read again. Runs at server start and then every hour.
 */

export interface SweepOptions {
  store: FileStore;
  dataDir: string;
  /** Files written less than this long ago are kept: another process may be about to commit their rows. */
  graceSeconds: number;
  /** Checked between batches so a server that is closing is not held up by a long sweep. */
  shouldStop?: () => boolean;
  /**
   * The bulk-import archives' step (history's `sweepLeftoverArchives`), handed in by jobs/ so this
   * feature never imports history/ (which imports runs/); without it no archive is looked at.
   */
  sweepArchives?: (now: Date) => Promise<string[]>;
}

export interface SweepResult {
  originals: string[];
  archives: string[];
  uploads: string[];
}

/** Stored originals are looked up this many at a time. */
const BATCH_SIZE = 500;
const SWEEP_EVERY_MS = 60 * 60 * 1000;
/** After a failed sweep (the database not reachable yet, say) the next try comes sooner. */
const RETRY_AFTER_FAILURE_MS = 60 * 1000;

async function* inBatches<T>(items: AsyncIterable<T>, size: number): AsyncGenerator<T[]> {
  let batch: T[] = [];
  for await (const item of items) {
    batch.push(item);
    if (batch.length >= size) {
      yield batch;
      batch = [];
    }
  }
  if (batch.length > 0) yield batch;
}

async function sweepOrphanOriginals(options: SweepOptions, now: Date): Promise<string[]> {
  const removed: string[] = [];
  for await (const batch of inBatches(options.store.list(), BATCH_SIZE)) {
    if (options.shouldStop?.()) break;
    const referenced = await findReferencedStorageKeys(batch.map((f) => f.key));
    const candidates = selectOrphanOriginals(batch, referenced, now, options.graceSeconds);
    if (candidates.length === 0) continue;
    // Re-checked under the lock: an import that stored one of these files meanwhile has committed by now.
    await withOriginalFilesExclusiveLock(async (trx) => {
      const referencedNow = await findReferencedStorageKeys(candidates, trx);
      for (const key of candidates) {
        if (referencedNow.has(key)) continue;
        try {
          await options.store.delete(key);
          removed.push(key);
          logger.warn({ key }, 'removed an original file that no run refers to (left by an interrupted upload)');
        } catch (err) {
          logger.error({ err, key }, 'removing an orphan original file failed; the next sweep tries again');
        }
      }
    });
  }
  return removed;
}

async function sweepLeftoverUploads(options: SweepOptions, now: Date): Promise<string[]> {
  const dir = uploadsTempDir(options.dataDir);
  const leftovers = selectLeftoverUploads(await listFilesWithTimes(dir), now, options.graceSeconds);
  for (const name of leftovers) {
    await rm(path.join(dir, name), { force: true });
    logger.warn({ file: path.join(dir, name) }, 'removed an upload a crash left behind');
  }
  return leftovers;
}

/** One sweep over the stored originals, DATA_DIR/imports and DATA_DIR/uploads; returns what it removed. */
export async function sweepOrphans(options: SweepOptions): Promise<SweepResult> {
  // One "now" for the whole sweep: files written while it lists look new and are kept.
  const now = new Date();
  const originals = await sweepOrphanOriginals(options, now);
  const archives = options.shouldStop?.() || !options.sweepArchives ? [] : await options.sweepArchives(now);
  const uploads = options.shouldStop?.() ? [] : await sweepLeftoverUploads(options, now);
  logger.info(
    {
      removedOriginals: originals.length,
      removedArchives: archives.length,
      removedUploads: uploads.length,
      graceSeconds: options.graceSeconds,
    },
    'orphan sweep finished',
  );
  return { originals, archives, uploads };
}

export interface OrphanSweeper {
  /** Stops the timer and waits for a sweep in progress (it ends at its next batch). */
  stop(): Promise<void>;
}

/** Sweeps now (in the background, never delaying the server's start) and then every hour. */
export function startOrphanSweeper(options: Omit<SweepOptions, 'shouldStop'>, everyMs = SWEEP_EVERY_MS): OrphanSweeper {
  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<void> = Promise.resolve();
  const schedule = (delayMs: number) => {
    if (stopped) return;
    timer = setTimeout(() => {
      running = sweepOrphans({ ...options, shouldStop: () => stopped }).then(
        () => schedule(everyMs),
        (err: unknown) => {
          logger.error({ err }, 'the orphan sweep failed; it will be tried again');
          schedule(Math.min(everyMs, RETRY_AFTER_FAILURE_MS));
        },
      );
    }, delayMs);
    // The sweep never keeps the process alive on its own.
    timer.unref();
  };
  schedule(0);
  return {
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await running;
    },
  };
}
