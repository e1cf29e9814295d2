import { db, type Db, type ImportFileRow, type ImportRow } from '../../lib/db.ts';
import type { ImportProgress } from '../../../shared/history/schemas.ts';
import { PROCESS_LABEL } from '../../lib/process-label.ts';

export function toImportProgress(row: ImportRow): ImportProgress {
  return {
    id: row.id,
    status: row.status,
    total: row.total,
    done: row.done,
    imported: row.imported,
    duplicates: row.duplicates,
    rejected: row.rejected,
  };
}

export interface NewImportFile {
  position: number;
  name: string;
  /** Set when the entry was skipped while checking the archive. */
  skipReason: string | null;
}

/** Inserts an import and one row per file entry; entries skipped up front count as done and rejected. */
export async function insertImport(
  values: { id: string; userId: string; archiveName: string; files: NewImportFile[] },
  trx: Db,
): Promise<ImportRow> {
  const skipped = values.files.filter((f) => f.skipReason !== null);
  const [row] = await trx('imports')
    .insert({
      id: values.id,
      user_id: values.userId,
      archive_name: values.archiveName.slice(0, 255),
      status: 'queued',
      total: values.files.length,
      done: skipped.length,
      rejected: JSON.stringify(skipped.map((f) => ({ file: f.name, error: f.skipReason! }))) as unknown as ImportRow['rejected'],
    })
    .returning('*');
  // Batches keep each statement well under PostgreSQL's 65 535 bound parameters.
  const rows = values.files.map((f) => ({
    import_id: values.id,
    position: f.position,
    name: f.name,
    status: f.skipReason === null ? ('pending' as const) : ('rejected' as const),
    result: f.skipReason === null ? null : JSON.stringify({ error: f.skipReason }),
  }));
  for (let i = 0; i < rows.length; i += 1000) await trx('import_files').insert(rows.slice(i, i + 1000));
  return row as ImportRow;
}

export async function findImportById(id: string, trx: Db = db): Promise<ImportRow | undefined> {
  return trx('imports').where({ id }).first();
}

/** Imports left unfinished (by a restart or a crash), oldest first. */
export async function listUnfinishedImportIds(trx: Db = db): Promise<string[]> {
  const rows = await trx('imports').whereIn('status', ['queued', 'running']).orderBy('created_at').select('id');
  return rows.map((r) => r.id);
}

export async function markImportRunning(id: string, trx: Db = db): Promise<void> {
  await trx('imports').where({ id, status: 'queued' }).update({ status: 'running' });
}

export async function markImportFailed(id: string, file: string, error: string, trx: Db = db): Promise<void> {
  await trx('imports')
    .where({ id })
    .whereIn('status', ['queued', 'running'])
    .update({
      status: 'failed',
      finished_at: trx.fn.now(),
      rejected: trx.raw("rejected || jsonb_build_array(jsonb_build_object('file', ?::text, 'error', ?::text))", [file, error]),
    });
}

/** Marks the import done when every file is; returns whether it is. */
/** Every run an import created, in the order of its files. */
export async function listImportedRunIds(importId: string, trx: Db = db): Promise<string[]> {
  const rows = await trx('import_files').where({ import_id: importId, status: 'imported' }).orderBy('position').select('result');
  return rows.flatMap((r) => {
    const ids = (r.result as { runIds?: unknown } | null)?.runIds;
    return Array.isArray(ids) ? ids.filter((id): id is string => typeof id === 'string') : [];
  });
}

export async function finishImportIfComplete(id: string, trx: Db = db): Promise<boolean> {
  const rows = await trx('imports')
    .where({ id })
    .whereIn('status', ['queued', 'running'])
    .whereRaw('done >= total')
    .update({ status: 'done', finished_at: trx.fn.now() })
    .returning('id');
  return rows.length > 0;
}

/**
 * Files still to import: pending ones, and ones claimed by a worker that stopped answering more
 * than `leaseSeconds` ago (a process killed mid-file).
 */
export async function listOpenFiles(importId: string, leaseSeconds: number, trx: Db = db): Promise<ImportFileRow[]> {
  return trx('import_files')
    .where({ import_id: importId })
    .andWhere((q) =>
      q
        .where('status', 'pending')
        .orWhere((w) =>
          w.where('status', 'working').andWhereRaw('claimed_at < now() - make_interval(secs => ?)', [leaseSeconds]),
        ),
    )
    .orderBy('position');
}

/** Claims one open file for this worker; false when another worker has it. */
export async function claimFile(importId: string, position: number, leaseSeconds: number, trx: Db = db): Promise<boolean> {
  const rows = await trx('import_files')
    .where({ import_id: importId, position })
    .andWhere((q) =>
      q
        .where('status', 'pending')
        .orWhere((w) =>
          w.where('status', 'working').andWhereRaw('claimed_at < now() - make_interval(secs => ?)', [leaseSeconds]),
        ),
    )
    .update({ status: 'working', claimed_at: trx.fn.now(), claimed_by: PROCESS_LABEL })
    .returning('position');
  return rows.length > 0;
}

/** Gives a claimed file back (its import failed for a reason that was not the file's). */
export async function releaseFile(importId: string, position: number, trx: Db = db): Promise<void> {
  await trx('import_files')
    .where({ import_id: importId, position, status: 'working' })
    .update({ status: 'pending', claimed_at: null });
}

export interface FileOutcome {
  status: 'imported' | 'duplicate' | 'rejected';
  result: Record<string, unknown>;
  error?: string;
}

/**
 * Records a claimed file's outcome and counts it, once: a file whose claim was lost (taken over
 * after its lease ran out) is not counted a second time. Returns the import after the update.
 */
export async function completeFile(
  importId: string,
  position: number,
  name: string,
  outcome: FileOutcome,
  trx: Db,
): Promise<ImportRow | undefined> {
  const updated = await trx('import_files')
    .where({ import_id: importId, position, status: 'working' })
    .update({ status: outcome.status, result: JSON.stringify(outcome.result), claimed_at: null })
    .returning('position');
  if (updated.length === 0) return undefined;
  const [row] = await trx('imports')
    .where({ id: importId })
    .update({
      done: trx.raw('done + 1'),
      imported: trx.raw('imported + ?', [outcome.status === 'imported' ? 1 : 0]),
      duplicates: trx.raw('duplicates + ?', [outcome.status === 'duplicate' ? 1 : 0]),
      rejected:
        outcome.status === 'rejected'
          ? trx.raw("rejected || jsonb_build_array(jsonb_build_object('file', ?::text, 'error', ?::text))", [
              name,
              outcome.error ?? '',
            ])
          : trx.raw('rejected'),
    })
    .returning('*');
  return row as ImportRow | undefined;
}

/** The status of each of `ids` that still has an import row (the orphan sweeper asks about archives on disk). */
export async function findImportStatuses(ids: readonly string[], trx: Db = db): Promise<Map<string, ImportRow['status']>> {
  if (ids.length === 0) return new Map();
  const rows = await trx('imports').whereIn('id', ids).select('id', 'status');
  return new Map(rows.map((r) => [r.id, r.status]));
}

/** The pg-boss queue of bulk imports (its jobs carry `{ importId }`). */
export const IMPORT_QUEUE = 'history-import';

/**
 * Deletes every pg-boss row (waiting, active, finished or archived) whose job names one of `importIds`, so nothing
 * of a deleted account outlives it in the queue's tables (issue 13 #15). The queue's schema exists only once a
 * worker or a send has started pg-boss; without it there is nothing to delete.
 */
export async function deleteImportJobs(importIds: readonly string[], trx: Db = db): Promise<void> {
  if (importIds.length === 0) return;
  const { rows } = await trx.raw<{ rows: Array<{ job: string | null; archive: string | null }> }>(
    "select to_regclass('pgboss.job')::text as job, to_regclass('pgboss.archive')::text as archive",
  );
  for (const table of [rows[0]?.job, rows[0]?.archive]) {
    if (!table) continue;
    await trx.raw(`delete from ${table} where name = ? and data->>'importId' = any(?::text[])`, [IMPORT_QUEUE, [...importIds]]);
  }
}
