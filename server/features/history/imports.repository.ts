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

/** Files still to import: the pending ones (a file whose worker died is made pending again by the lease sweep). */
export async function listOpenFiles(importId: string, trx: Db = db): Promise<ImportFileRow[]> {
  return trx('import_files').where({ import_id: importId, status: 'pending' }).orderBy('position');
}

/** Marks an import as being worked on (and beats its heartbeat). */
export async function markImportRunning(id: string, trx: Db = db): Promise<void> {
  await trx('imports')
    .where({ id })
    .whereIn('status', ['queued', 'running'])
    .update({ status: 'running', heartbeat_at: trx.fn.now() });
}

/** A file in a worker's hands: `attempt` is the claim's number, which only that claim may complete. */
export interface FileClaim {
  importId: string;
  position: number;
  attempt: number;
}

/** Claims one pending file for this worker; its claim, or null when another worker has it. */
export async function claimFile(importId: string, position: number, trx: Db = db): Promise<FileClaim | null> {
  const rows = await trx('import_files')
    .where({ import_id: importId, position, status: 'pending' })
    .update({
      status: 'working',
      attempts: trx.raw('attempts + 1'),
      claimed_at: trx.fn.now(),
      heartbeat_at: trx.fn.now(),
      claimed_by: PROCESS_LABEL,
    })
    .returning('attempts');
  const attempt = rows[0]?.attempts;
  return attempt === undefined ? null : { importId, position, attempt };
}

/** Gives a claimed file back without counting the attempt (its import failed for a reason that was not the file's). */
export async function releaseFile(claim: FileClaim, trx: Db = db): Promise<void> {
  await trx('import_files')
    .where({ import_id: claim.importId, position: claim.position, status: 'working', attempts: claim.attempt })
    .update({ status: 'pending', attempts: trx.raw('attempts - 1'), claimed_at: null, heartbeat_at: null });
}

/** The heartbeat: the files and imports this process holds are still being worked on. */
export async function beatHeartbeats(claims: readonly FileClaim[], importIds: readonly string[], trx: Db = db): Promise<void> {
  if (claims.length > 0) {
    await trx('import_files')
      .where('status', 'working')
      .whereIn(
        ['import_id', 'position', 'attempts'],
        claims.map((c) => [c.importId, c.position, c.attempt]),
      )
      .update({ heartbeat_at: trx.fn.now() });
  }
  if (importIds.length > 0) {
    await trx('imports').whereIn('id', importIds).whereIn('status', ['queued', 'running']).update({ heartbeat_at: trx.fn.now() });
  }
}

export interface FileOutcome {
  status: 'imported' | 'duplicate' | 'rejected';
  result: Record<string, unknown>;
  error?: string;
}

/**
 * Records a claimed file's outcome and counts it, once: only the claim that holds the file may
 * (a claim whose lease ran out and whose file was given to another worker is not counted a second
 * time). Returns the import after the update, or undefined when the claim was lost.
 */
export async function completeFile(
  claim: FileClaim,
  name: string,
  outcome: FileOutcome,
  trx: Db,
): Promise<ImportRow | undefined> {
  const updated = await trx('import_files')
    .where({ import_id: claim.importId, position: claim.position, status: 'working', attempts: claim.attempt })
    .update({ status: outcome.status, result: JSON.stringify(outcome.result), claimed_at: null, heartbeat_at: null })
    .returning('position');
  if (updated.length === 0) return undefined;
  return countFile(claim.importId, name, outcome, trx);
}

async function countFile(importId: string, name: string, outcome: FileOutcome, trx: Db): Promise<ImportRow | undefined> {
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

export interface ExpiredLeases {
  /** Imports with a file made pending again. */
  reopened: string[];
  /** Files given up after `maxAttempts` claims, counted as rejected with `givenUpError`. */
  givenUp: Array<{ importId: string; name: string }>;
}

/**
 * The lease sweep's first half: every working file whose heartbeat is older than `leaseSeconds`
 * (its worker was killed or lost the database) is made pending again, or, after `maxAttempts`
 * claims, rejected with `givenUpError` and counted, so a file that kills its worker cannot loop.
 * Rows another sweeper holds are skipped (SKIP LOCKED): each expired claim is handled once.
 */
export async function expireLeases(
  leaseSeconds: number,
  maxAttempts: number,
  givenUpError: string,
  trx: Db,
): Promise<ExpiredLeases> {
  const expired: ImportFileRow[] = await trx('import_files')
    .where('status', 'working')
    .andWhereRaw('coalesce(heartbeat_at, claimed_at) < now() - make_interval(secs => ?)', [leaseSeconds])
    .orderBy(['import_id', 'position'])
    .forUpdate()
    .skipLocked();
  const result: ExpiredLeases = { reopened: [], givenUp: [] };
  for (const file of expired) {
    const where = { import_id: file.import_id, position: file.position, status: 'working' as const, attempts: file.attempts };
    if (file.attempts >= maxAttempts) {
      const outcome: FileOutcome = { status: 'rejected', result: { error: givenUpError }, error: givenUpError };
      await trx('import_files')
        .where(where)
        .update({ status: 'rejected', result: JSON.stringify(outcome.result), heartbeat_at: null });
      await countFile(file.import_id, file.name, outcome, trx);
      result.givenUp.push({ importId: file.import_id, name: file.name });
    } else {
      await trx('import_files').where(where).update({ status: 'pending', claimed_at: null, heartbeat_at: null });
      if (!result.reopened.includes(file.import_id)) result.reopened.push(file.import_id);
    }
  }
  return result;
}

/**
 * The lease sweep's second half: unfinished imports nobody works on — no heartbeat for `leaseSeconds`,
 * files still pending (or all done but not yet marked so) and no job of theirs waiting in the queue.
 * Their heartbeat is set to now, so the next sweep leaves them to the job about to be queued.
 */
export async function takeStalledImports(leaseSeconds: number, trx: Db): Promise<string[]> {
  const { rows } = await trx.raw<{ rows: Array<{ job: string | null }> }>("select to_regclass('pgboss.job')::text as job");
  const jobTable = rows[0]?.job;
  const stalled = trx('imports')
    .whereIn('status', ['queued', 'running'])
    .andWhereRaw('coalesce(heartbeat_at, created_at) < now() - make_interval(secs => ?)', [leaseSeconds])
    .andWhere((q) =>
      q
        .whereRaw('done >= total')
        .orWhereExists((f) =>
          f.select(trx.raw('1')).from('import_files').whereRaw("import_id = imports.id and status = 'pending'"),
        ),
    )
    .select('id')
    .forUpdate()
    .skipLocked();
  if (jobTable) {
    stalled.whereNotExists((j) =>
      j
        .select(trx.raw('1'))
        .from(trx.raw(jobTable))
        .whereRaw("name = ? and data->>'importId' = imports.id::text and state in ('created', 'retry')", [IMPORT_QUEUE]),
    );
  }
  const ids = (await stalled).map((r: { id: string }) => r.id);
  if (ids.length > 0) await trx('imports').whereIn('id', ids).update({ heartbeat_at: trx.fn.now() });
  return ids;
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
