/**
 * Which stored files no longer belong to anything: originals left by an upload that died between
 * storing the file and committing its rows, and bulk-import archives left by a crash or a finished
 * import. Only files of the shapes the app itself writes are ever chosen, so a shared bucket or a
 * stray file someone put in DATA_DIR is never touched.
 */

/** A stored file and when it was last written. */
export interface StoredFileInfo {
  key: string;
  modifiedAt: Date;
}

export type ImportStatus = 'queued' | 'running' | 'done' | 'failed';

/** Originals are stored as `<user id>/<SHA-256 of the bytes>` (see importFiles). */
const ORIGINAL_KEY = /^([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})\/([0-9a-f]{64})$/;
/** Archives wait as `<import id>.zip`; multer writes `upload-<uuid>.part` while the upload arrives. */
const ARCHIVE_NAME = /^([0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})\.zip$/;
const PARTIAL_UPLOAD_NAME = /^upload-[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}\.part$/;

/** The owner and content hash an original's key is made of, or null for a key the app never writes. */
export function parseOriginalKey(key: string): { userId: string; sha256: string } | null {
  const match = ORIGINAL_KEY.exec(key);
  return match ? { userId: match[1]!, sha256: match[2]! } : null;
}

/** The import an archive file name belongs to, or null for any other name. */
export function importIdOfArchive(fileName: string): string | null {
  return ARCHIVE_NAME.exec(fileName)?.[1] ?? null;
}

function checkGrace(graceSeconds: number): void {
  if (!Number.isFinite(graceSeconds) || graceSeconds < 0) throw new RangeError('graceSeconds must be 0 or more');
}

/**
 * True when the file was last written more than `graceSeconds` before `now`. A file with an
 * unreadable time, or one from the future (a skewed clock), is treated as new and kept.
 */
function isPastGrace(file: StoredFileInfo, now: Date, graceSeconds: number): boolean {
  const age = now.getTime() - file.modifiedAt.getTime();
  return Number.isFinite(age) && age > graceSeconds * 1000;
}

/**
 * Keys of originals no `source_files.storage_key` names (`referencedKeys`) and older than the
 * grace period; the grace protects an upload on another process that has stored its file but
 * not yet committed its rows.
 */
export function selectOrphanOriginals(
  stored: readonly StoredFileInfo[],
  referencedKeys: ReadonlySet<string>,
  now: Date,
  graceSeconds: number,
): string[] {
  checkGrace(graceSeconds);
  return stored
    .filter((f) => parseOriginalKey(f.key) !== null && !referencedKeys.has(f.key) && isPastGrace(f, now, graceSeconds))
    .map((f) => f.key);
}

/**
 * Names of files in DATA_DIR/imports nothing will read again, older than the grace period:
 * archives whose import row is gone (an account deleted, a crash before the row was committed) or
 * finished (done or failed; the worker never opens those again), and half-received uploads.
 * `statusOfImport` holds the status of every import that still has a row.
 */
export function selectLeftoverArchives(
  files: readonly StoredFileInfo[],
  statusOfImport: ReadonlyMap<string, ImportStatus>,
  now: Date,
  graceSeconds: number,
): string[] {
  checkGrace(graceSeconds);
  return files
    .filter((f) => {
      if (!isPastGrace(f, now, graceSeconds)) return false;
      if (PARTIAL_UPLOAD_NAME.test(f.key)) return true;
      const importId = importIdOfArchive(f.key);
      if (importId === null) return false;
      const status = statusOfImport.get(importId);
      return status === undefined || status === 'done' || status === 'failed';
    })
    .map((f) => f.key);
}

/**
 * Names of files in DATA_DIR/uploads (single-file uploads waiting for their request to finish)
 * older than the grace period: a request removes its own when it ends, so these were left by a crash.
 */
export function selectLeftoverUploads(files: readonly StoredFileInfo[], now: Date, graceSeconds: number): string[] {
  checkGrace(graceSeconds);
  return files.filter((f) => PARTIAL_UPLOAD_NAME.test(f.key) && isPastGrace(f, now, graceSeconds)).map((f) => f.key);
}
