import { randomUUID } from 'node:crypto';
import { mkdir, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import type { Actor } from '../../../shared/auth/permissions.ts';
import {
  MAX_ARCHIVE_ENTRIES,
  MAX_ARCHIVE_UNCOMPRESSED_BYTES,
  MAX_COMPRESSION_RATIO,
  RATIO_CHECK_MIN_BYTES,
  compressionRatio,
  entrySkipReason,
} from '../../../shared/history/archive-rules.ts';
import type { ImportProgress } from '../../../shared/history/schemas.ts';
import { inTransaction } from '../../lib/db.ts';
import { AppError, NotFoundError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import { importFiles } from '../runs/index.ts';
import { recordUploadNotice } from '../notices/index.ts';
import { findUserById } from '../users/index.ts';
import {
  beatHeartbeats,
  claimFile,
  completeFile,
  expireLeases,
  finishImportIfComplete,
  findImportById,
  insertImport,
  listImportedRunIds,
  listOpenFiles,
  markImportFailed,
  markImportRunning,
  releaseFile,
  takeStalledImports,
  toImportProgress,
  type FileClaim,
  type FileOutcome,
  type NewImportFile,
} from './imports.repository.ts';
import { openZip, readZipEntry, zipEntries } from './zip-reader.ts';

/** Where uploaded archives wait for the worker: `DATA_DIR/imports/<id>.zip`, removed when the import ends. */
export function importsDir(dataDir: string): string {
  return path.join(dataDir, 'imports');
}

export function archivePath(dataDir: string, importId: string): string {
  return path.join(importsDir(dataDir), `${importId}.zip`);
}

class ArchiveRefused extends AppError {
  constructor(code: string, message: string, details?: unknown) {
    super(422, code, message, details);
  }
}

const mb = (bytes: number) => `${Math.round(bytes / 1024 / 1024)} MB`;

/** An entry name as people can read it and PostgreSQL can store it (no NUL or control characters). */
function printableName(name: string): string {
  // eslint-disable-next-line no-control-regex
  return name.replace(/[\u0000-\u001f\u007f]/g, '?').slice(0, 500);
}

/**
 * Reads the archive's directory (never its contents) and decides, before anything is stored, whether
 * to take it: refuses non-zips, too many entries, zip bombs and encrypted entries; lists every file
 * entry with the reason it is skipped, if it is. Folder entries are only structure and are left out.
 */
export async function inspectArchive(file: string, maxEntryBytes: number): Promise<NewImportFile[]> {
  let zip;
  try {
    zip = await openZip(file);
  } catch {
    throw new ArchiveRefused(
      'not-a-zip',
      'This file is not a zip archive (or it is damaged). Put your GPX and TCX files in a .zip and upload that.',
    );
  }
  try {
    if (zip.entryCount > MAX_ARCHIVE_ENTRIES) {
      throw new ArchiveRefused(
        'too-many-entries',
        `This archive holds ${zip.entryCount} entries; at most ${MAX_ARCHIVE_ENTRIES} fit in one import. Split it into smaller zips.`,
      );
    }
    const files: NewImportFile[] = [];
    let uncompressed = 0;
    try {
      for await (const entry of zipEntries(zip)) {
        const name = printableName(entry.name);
        if (entry.isEncrypted) {
          throw new ArchiveRefused(
            'encrypted-archive',
            `"${name}" is protected by a password, which Pacewright cannot open. Make the zip again without a password.`,
          );
        }
        uncompressed += entry.uncompressedSize;
        if (uncompressed > MAX_ARCHIVE_UNCOMPRESSED_BYTES) {
          throw new ArchiveRefused(
            'archive-too-large',
            `This archive would unpack to more than ${MAX_ARCHIVE_UNCOMPRESSED_BYTES / 1024 ** 3} GB. Split it into smaller zips.`,
          );
        }
        if (
          entry.uncompressedSize >= RATIO_CHECK_MIN_BYTES &&
          compressionRatio(entry.uncompressedSize, entry.compressedSize) > MAX_COMPRESSION_RATIO
        ) {
          throw new ArchiveRefused(
            'zip-bomb',
            `"${name}" is compressed more than ${MAX_COMPRESSION_RATIO} : 1, which GPS files never are; the archive looks like a zip bomb and was not opened.`,
          );
        }
        if (entry.isDirectory) continue;
        let reason = entrySkipReason(entry.name);
        if (reason === null && entry.uncompressedSize > maxEntryBytes) {
          reason = `larger than ${mb(maxEntryBytes)} once unpacked, more than one run ever needs, skipped`;
        }
        files.push({ position: entry.position, name, skipReason: reason });
      }
    } catch (err) {
      if (err instanceof AppError) throw err;
      throw new ArchiveRefused('not-a-zip', 'This zip archive is damaged, so it cannot be read. Make it again and upload it.');
    }
    if (!files.some((f) => f.skipReason === null)) {
      throw new ArchiveRefused(
        'no-gps-files',
        'This archive holds no GPS files (.gpx, .tcx, .gpx.gz or .tcx.gz), so nothing was imported.',
        { rejected: files.map((f) => ({ file: f.name, error: f.skipReason })) },
      );
    }
    return files;
  } finally {
    zip.close();
  }
}

/**
 * Takes an uploaded archive (already on disk at `uploadedFile`): checks it, keeps it as
 * `DATA_DIR/imports/<id>.zip`, records the import and its files, and queues it for the worker.
 * A refused archive leaves nothing behind: the upload is deleted and no row is written.
 */
export async function createImport(
  actor: Actor,
  upload: { file: string; name: string },
  options: { dataDir: string; maxEntryBytes: number; enqueue: (importId: string, openFiles: number) => Promise<void> },
): Promise<{ id: string }> {
  const id = randomUUID();
  const target = archivePath(options.dataDir, id);
  let openFiles: number;
  try {
    const files = await inspectArchive(upload.file, options.maxEntryBytes);
    openFiles = files.filter((f) => f.skipReason === null).length;
    await mkdir(importsDir(options.dataDir), { recursive: true });
    await rename(upload.file, target);
    await inTransaction((trx) => insertImport({ id, userId: actor.id, archiveName: upload.name, files }, trx));
  } catch (err) {
    await rm(upload.file, { force: true });
    await rm(target, { force: true });
    throw err;
  }
  // The archive and its rows are safe; if queueing fails now, the worker's start-up sweep picks it up.
  await options.enqueue(id, openFiles).catch((err: unknown) => logger.error({ err, importId: id }, 'queueing an import failed'));
  return { id };
}

export async function getImportProgress(actor: Actor, importId: string): Promise<ImportProgress> {
  const row = await findImportById(importId);
  if (!row || row.user_id !== actor.id) throw new NotFoundError('There is no import with this id.');
  return toImportProgress(row);
}

/**
 * What this process holds of bulk-import work, beaten by the heartbeat: files claimed and imports
 * being worked on. A process that dies stops beating, and the lease sweep of any other process
 * gives its work back.
 */
export class ImportHoldings {
  readonly claims = new Map<string, FileClaim>();
  readonly imports = new Map<string, number>();

  hold(claim: FileClaim): void {
    this.claims.set(`${claim.importId}:${claim.position}`, claim);
  }

  let(claim: FileClaim): void {
    this.claims.delete(`${claim.importId}:${claim.position}`);
  }

  enter(importId: string): void {
    this.imports.set(importId, (this.imports.get(importId) ?? 0) + 1);
  }

  leave(importId: string): void {
    const left = (this.imports.get(importId) ?? 1) - 1;
    if (left > 0) this.imports.set(importId, left);
    else this.imports.delete(importId);
  }

  /** One heartbeat: everything held is still alive. */
  beat(): Promise<void> {
    return beatHeartbeats([...this.claims.values()], [...this.imports.keys()]);
  }
}

export interface ImportWorkDeps {
  store: FileStore;
  dataDir: string;
  /** Largest single file taken from an archive, bytes. */
  maxEntryBytes: number;
  /** Files imported at the same time within one import. */
  filesAtOnce: number;
  /** The claims and imports this process's heartbeat keeps alive. */
  holdings: ImportHoldings;
  /** True once the worker is asked to stop: finish the files in hand, start no more. */
  shouldStop: () => boolean;
  /** Original files a user may keep, bytes (STORAGE_QUOTA_MB); files past it are refused. No limit when absent. */
  storageQuotaBytes?: number;
}

const DAMAGED_ENTRY = 'This file is damaged inside the archive, so it could not be read.';

/** The sentence of a file given up by the lease sweep after `maxAttempts` claims (IMPORT_MAX_ATTEMPTS). */
export function givenUpSentence(maxAttempts: number): string {
  return `The import stopped ${maxAttempts} times while reading this file, so it was skipped. Upload it on its own from the Log page to see what is wrong with it.`;
}

function outcomeOf(result: Awaited<ReturnType<typeof importFiles>>): FileOutcome {
  if (result.imported.length > 0) return { status: 'imported', result: { runIds: result.imported.map((r) => r.id) } };
  if (result.duplicates.length > 0) return { status: 'duplicate', result: { runId: result.duplicates[0]!.runId } };
  const error = result.rejected[0]?.error ?? 'This file could not be imported.';
  return { status: 'rejected', result: { error }, error };
}

/**
 * Marks a complete import done and removes its archive before that commits, so "done" always means
 * the archive is gone (a crash in between leaves an import whose files are all done, which the next
 * start or lease sweep finishes without opening the archive).
 */
async function finish(importId: string, dataDir: string): Promise<void> {
  const finished = await inTransaction(async (trx) => {
    if (!(await finishImportIfComplete(importId, trx))) return false;
    await rm(archivePath(dataDir, importId), { force: true });
    return true;
  });
  if (!finished) return;
  // One notice to the coaches for the whole archive (issue 16), queued once: only the finishing call gets here.
  const row = await findImportById(importId);
  if (row)
    await recordUploadNotice(row.user_id, await listImportedRunIds(importId)).catch((err: unknown) =>
      logger.error({ err, importId }, 'recording the upload notice of an import failed'),
    );
}

/** The claim on a file was lost (its lease ran out and another worker holds it now): nothing is stored. */
class ClaimLost extends Error {
  constructor() {
    super('the claim on this import file was lost');
  }
}

/** Passes over the archive per processImport call at most; files left after that wait for the lease sweep. */
const MOST_PASSES = 3;

/**
 * Works through an import's open files, `filesAtOnce` at a time, each through the ordinary
 * `importFiles` (its own transaction; the SHA-256 rule turns a second copy into a duplicate).
 * Each file is claimed before, and an imported file is counted in the transaction that stores its
 * runs, so a stop or crash resumes with exactly the files not yet done. Files given back meanwhile
 * (by the lease sweep) are taken in another pass. Returns when every file is done or the worker is stopping.
 */
export async function processImport(importId: string, deps: ImportWorkDeps): Promise<void> {
  const row = await findImportById(importId);
  if (!row || row.status === 'done' || row.status === 'failed') return;
  const user = await findUserById(row.user_id);
  if (!user) return;
  deps.holdings.enter(importId);
  try {
    await markImportRunning(importId);
    for (let pass = 0; pass < MOST_PASSES && !deps.shouldStop(); pass++) {
      const open = new Map((await listOpenFiles(importId)).map((f) => [f.position, f]));
      if (open.size === 0) break;
      if (!(await importPass(importId, row.archive_name, user, open, deps))) return;
    }
  } finally {
    deps.holdings.leave(importId);
  }
  if (!deps.shouldStop()) await finish(importId, deps.dataDir);
}

/** One pass over the archive, importing the `open` files this worker can claim; false when the archive is gone. */
async function importPass(
  importId: string,
  archiveName: string,
  user: NonNullable<Awaited<ReturnType<typeof findUserById>>>,
  open: Map<number, { position: number; name: string }>,
  deps: ImportWorkDeps,
): Promise<boolean> {
  let zip;
  try {
    zip = await openZip(archivePath(deps.dataDir, importId));
  } catch (err) {
    // Another job of this import (in any worker) finished it and removed the archive meanwhile.
    if ((await findImportById(importId))?.status === 'done') return false;
    logger.error({ err, importId }, 'an import archive could not be opened');
    await markImportFailed(importId, archiveName, 'The uploaded archive is no longer readable; please upload it again.');
    return false;
  }

  const record = async (claim: FileClaim, name: string, outcome: FileOutcome) => {
    const updated = await inTransaction((trx) => completeFile(claim, name, outcome, trx));
    if (updated && updated.done >= updated.total) await finish(importId, deps.dataDir);
  };
  const importOne = async (claim: FileClaim, name: string, data: Buffer) => {
    try {
      let counted: Awaited<ReturnType<typeof completeFile>>;
      const result = await importFiles(user, [{ name, data }], deps.store, {
        storageQuotaBytes: deps.storageQuotaBytes,
        // Stored runs and the file's count commit together: a kill -9 leaves both or neither.
        beforeCommit: async (trx, runIds) => {
          counted = await completeFile(claim, name, { status: 'imported', result: { runIds } }, trx);
          if (!counted) throw new ClaimLost();
        },
      });
      if (result.imported.length > 0) {
        if (counted && counted.done >= counted.total) await finish(importId, deps.dataDir);
      } else await record(claim, name, outcomeOf(result));
    } catch (err) {
      if (err instanceof ClaimLost) {
        logger.warn({ importId, file: name }, 'an import file was taken over by another worker after its lease ran out');
        return;
      }
      // Not the file's fault (the database went away, say): leave it open for the next attempt.
      logger.error({ err, importId, file: name }, 'importing a file from an archive failed');
      await releaseFile(claim).catch(() => undefined);
    } finally {
      deps.holdings.let(claim);
    }
  };

  const inFlight = new Set<Promise<void>>();
  try {
    for await (const entry of zipEntries(zip)) {
      if (deps.shouldStop()) break;
      const file = open.get(entry.position);
      if (!file) continue;
      const claim = await claimFile(importId, file.position);
      if (!claim) continue;
      deps.holdings.hold(claim);
      let data: Buffer;
      try {
        data = await readZipEntry(zip, entry.entry, deps.maxEntryBytes);
      } catch {
        await record(claim, file.name, { status: 'rejected', result: { error: DAMAGED_ENTRY }, error: DAMAGED_ENTRY }).finally(
          () => deps.holdings.let(claim),
        );
        continue;
      }
      const task: Promise<void> = importOne(claim, file.name, data).finally(() => inFlight.delete(task));
      inFlight.add(task);
      if (inFlight.size >= deps.filesAtOnce) await Promise.race(inFlight);
    }
  } finally {
    await Promise.all(inFlight);
    zip.close();
  }
  return true;
}

export interface LeaseSweepResult {
  /** Imports queued again (a file's worker died, or nobody worked on them for a lease). */
  requeued: string[];
  /** Files given up after too many attempts. */
  givenUp: Array<{ importId: string; name: string }>;
}

/**
 * The lease sweep (issue 13 #9), run every few seconds by every job-running process: files whose
 * worker stopped beating are given back (or, after `maxAttempts` claims, rejected with a sentence),
 * and imports nobody works on are handed to `enqueue`, without a restart of anything.
 */
export async function sweepImportLeases(options: {
  leaseSeconds: number;
  maxAttempts: number;
  dataDir: string;
  enqueue: (importId: string) => Promise<void>;
}): Promise<LeaseSweepResult> {
  const expired = await inTransaction((trx) =>
    expireLeases(options.leaseSeconds, options.maxAttempts, givenUpSentence(options.maxAttempts), trx),
  );
  // A file given up may have been an import's last one.
  for (const importId of new Set(expired.givenUp.map((f) => f.importId))) await finish(importId, options.dataDir);
  const stalled = await inTransaction((trx) => takeStalledImports(options.leaseSeconds, trx));
  for (const importId of stalled) await options.enqueue(importId);
  return { requeued: stalled, givenUp: expired.givenUp };
}
