import type { RunDetail } from '../../../shared/runs/types.ts';
import { runFileName } from '../../../shared/runs/file-names.ts';
import { METRES_PER_MILE } from '../../../shared/units.ts';
import type { ActivityKind } from '../../../shared/runs/activity-kind.ts';
import { isSameRun, SAME_RUN_START_S } from '../../../shared/runs/duplicates.ts';
import { originalContentType } from '../../../shared/runs/original-download.ts';
import { randomUUID, webcrypto } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { MessageChannel } from 'node:worker_threads';
import type { Actor } from '../../../shared/auth/permissions.ts';
import type { ImportResult, ListRunsQuery, StorageUsage } from '../../../shared/runs/schemas.ts';
import { splitsToCsv } from '../../../shared/runs/splits-csv.ts';
import {
  decodeRunListCursor,
  encodeRunListCursor,
  RUN_LIST_CURSOR_ERROR,
  type RunListCursor,
} from '../../../shared/runs/list-cursor.ts';
import { overQuotaReason } from '../../../shared/runs/upload-limits.ts';
import type { Split, SplitUnit } from '../../../shared/tracks/types.ts';
import {
  inTransaction,
  isUniqueViolation,
  type Db,
  type NoteConcern,
  type RunRow,
  type RunSplitRow,
  type UserRow,
} from '../../lib/db.ts';
import { NotFoundError, ValidationError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import {
  ComputeAccountBusyError,
  ComputeBusyError,
  ComputeCrashError,
  ComputeTimeoutError,
  computeArrivingImportJob,
  computeImportJob,
  computeLimits,
} from '../compute/index.ts';
import { NOT_READ_WHILE_ARRIVING, type HandedOverTrack, type ImportComputeOutput } from './import-compute.ts';
import { assertCanReadRunner } from '../squads/index.ts';
import { readyAnswer, type ReadyAnswer } from '../week-cache/index.ts';
import { decodeColumns, gzipPackedColumns } from './track-blob.ts';
import { insertRunNote, listRunNotes } from './run-notes.repository.ts';
import { findReadNoteIds } from '../notes/index.ts';
import { recordNoteNotice, type NoticeDeps } from '../notices/index.ts';
import {
  findReferencedStorageKeys,
  holdOriginalFilesSharedLock,
  withOriginalFilesExclusiveLock,
} from './original-files.repository.ts';
import { runOwnerProfile, type RunRecord, type StoredTrack } from './run-record.ts';
import {
  deleteRunAndOrphanFile,
  findFirstRunOfSourceFile,
  findRunById,
  findRunLaps,
  findRunTrack,
  findRunWithParts,
  findRunsStartingNear,
  findActivityIndexesOfSourceFile,
  findSourceFileById,
  findSourceFileBySha,
  findSplits,
  insertRunRows,
  insertRunTrack,
  insertSourceFile,
  listRunsOf,
  lockRunsOf,
  renameRun,
} from './runs.repository.ts';
import { toRunListItem } from './run-list.ts';
import type { ReceivedFile } from './upload-to-disk.ts';
import { lockStorageOf, storageUsedBy } from './storage-quota.repository.ts';

const GENERIC_REJECTION =
  'This file could not be read as a GPS track. If it came from a watch, please send it to us so we can look.';

/**
 * A file to import: bytes in memory (an archive entry, a script) or a streamed upload waiting on
 * disk with the SHA-256 taken while it arrived (and, when its request had room, the same bytes in
 * memory shared with the compute threads: upload-to-disk.ts).
 */
export type UploadedFile = { name: string; data: Buffer } | ReceivedFile;

export interface ImportOptions {
  /** Original files the user may keep, bytes; a file that does not fit is refused. No limit when absent. */
  storageQuotaBytes?: number;
  /** Import activities that match a stored run anyway (`?duplicates=import`). */
  importDuplicates?: boolean;
  /**
   * Runs in a file's transaction once its runs are inserted, before the original is stored and the
   * transaction commits (a bulk import counts the file here, so runs and count commit together).
   * What it throws aborts that file (nothing is stored) and comes out of importFiles unchanged.
   */
  beforeCommit?: (trx: Db, runIds: string[]) => Promise<void>;
}

/** An error thrown by `beforeCommit`, carried through the transaction's rollback. */
class BeforeCommitFailed extends Error {
  constructor(readonly reason: unknown) {
    super('beforeCommit failed');
  }
}

async function sha256Of(file: UploadedFile): Promise<string> {
  if ('sha256' in file) return file.sha256;
  // WebCrypto hashes on libuv's thread pool: a 60 MB entry never holds up the event loop.
  return Buffer.from(await webcrypto.subtle.digest('SHA-256', file.data)).toString('hex');
}

const sizeOf = (file: UploadedFile) => ('data' in file ? file.data.length : file.size);

let readWhileArriving = 0;
/** Files whose runs (or refusal) came from the job that read them while they arrived, since start (tests, bench). */
export function filesReadWhileArriving(): number {
  return readWhileArriving;
}

/**
 * The port a compute job sends a file of one run's track on as soon as its series is built (import-compute.ts,
 * `handOver`): `track` is that track, or null once `close` is called (the job ended without one, or failed).
 */
function handOverChannel() {
  const { port1, port2 } = new MessageChannel();
  let settle!: (track: HandedOverTrack | null) => void;
  const track = new Promise<HandedOverTrack | null>((resolve) => (settle = resolve));
  port1.once('message', (message: HandedOverTrack) => {
    settle(message);
    port1.close();
  });
  return {
    port: port2,
    track,
    close: () => {
      settle(null);
      port1.close();
    },
  };
}
type HandOverChannel = ReturnType<typeof handOverChannel>;

/** The hand-over port of each job reading a file while it arrives (its promise is the file's `early`). */
const arrivingHandOvers = new WeakMap<Promise<unknown>, HandOverChannel>();

/**
 * Starts reading an upload's first file while it arrives (parse/arriving.ts), when a compute thread is free
 * now; undefined when none is (the file is then read after it has arrived, as before). `computeRuns` takes
 * its answer; a file that turns out a duplicate never needs it, so its failure is never left unhandled.
 */
export function startArrivingImport(
  user: UserRow,
  arriving: { memory: SharedArrayBuffer; control: SharedArrayBuffer },
  writer: { askToYield(): void },
): Promise<ImportComputeOutput> | undefined {
  const { arrivalStallMs, arrivalWaitMs } = computeLimits();
  const limits = { stallMs: arrivalStallMs, totalWaitMs: arrivalWaitMs };
  const channel = handOverChannel();
  const input = { source: { arriving: { ...arriving, limits } }, owner: runOwnerProfile(user), handOver: channel.port };
  const job = computeArrivingImportJob(user.id, input, () => writer.askToYield());
  if (!job) {
    channel.close();
    return undefined;
  }
  job.catch(() => undefined);
  // A file that turns out a duplicate is never stored: its port closes when its job ends.
  job.then(
    (out) => (!out.ok || !out.records.some((r) => r.children.track.handed_over)) && channel.close(),
    () => channel.close(),
  );
  arrivingHandOvers.set(job, channel);
  return job;
}

/**
 * A file of one run is stored beside its analysis (its track as soon as its series exists; README "The store beside
 * the analysis"); `STORE_BESIDE_ANALYSIS=0` stores every file after its analysis, as before (bench before/after, tests).
 */
const storeBesideAnalysis = () => process.env.STORE_BESIDE_ANALYSIS !== '0';

type ComputedRuns = { ok: true; format: string; records: RunRecord[] } | { ok: false; error: string };

/**
 * A file's parse and analysis under way: `done` is their answer (a refusal as a sentence); `early` is the track
 * of a file of one run as soon as its series is built, before the rest of the analysis, or null when none comes.
 */
interface RunningCompute {
  early: Promise<HandedOverTrack | null>;
  done: Promise<ComputedRuns>;
}

function startComputeRuns(user: UserRow, file: UploadedFile): RunningCompute {
  let settleEarly!: (track: HandedOverTrack | null) => void;
  const early = new Promise<HandedOverTrack | null>((resolve) => (settleEarly = resolve));
  const done = computeRuns(user, file, (track) => settleEarly(track)).finally(() => settleEarly(null));
  // Always awaited by whoever stores the file; this only keeps a path that throws first from an unhandled rejection.
  done.catch(() => undefined);
  return { early, done };
}

/** The records with the bytes of a track the job handed over ahead of its answer put back. */
async function withHandedOverTracks(records: RunRecord[], channel: HandOverChannel | undefined): Promise<RunRecord[]> {
  if (!records.some((r) => r.children.track.handed_over)) return records;
  const early = await channel?.track;
  if (!early) throw new Error('a compute job handed a track over that never arrived');
  return records.map((r) =>
    r.children.track.handed_over && r.run.activity_index === early.activity_index
      ? { ...r, children: { ...r.children, track: early.track } }
      : r,
  );
}

/** Parsing and analysis in a compute worker; a rejection of the file comes back as a sentence. */
async function computeRuns(user: UserRow, file: UploadedFile, onTrack: (track: HandedOverTrack) => void): Promise<ComputedRuns> {
  // The memory the bytes wait in stays counted while the job reads them, even if the client has gone.
  const letGo = 'holdBytes' in file ? file.holdBytes?.() : undefined;
  let channel: HandOverChannel | undefined;
  const listen = (next: HandOverChannel | undefined) => {
    channel = next;
    void next?.track.then((track) => track && onTrack(track));
  };
  try {
    // Read while it arrived, unless that job gave up (then it is read now, as any file).
    let out: ImportComputeOutput | undefined;
    if ('early' in file && file.early) {
      listen(arrivingHandOvers.get(file.early));
      out = (await file.early) as ImportComputeOutput;
    }
    if (out && !(!out.ok && out.code === NOT_READ_WHILE_ARRIVING)) readWhileArriving++;
    else {
      if (out) logger.debug({ file: file.name, reason: out.message }, 'not read while arriving');
      channel?.close();
      listen(handOverChannel());
      out = await computeImportJob(user.id, {
        // Bytes already in memory cross to the thread without a copy (shared memory) or a read back from disk.
        source: 'data' in file ? { data: file.data } : file.bytes ? { data: file.bytes } : { path: file.path },
        owner: runOwnerProfile(user),
        handOver: channel!.port,
      });
    }
    if (!out.ok) return { ok: false, error: out.message };
    return { ok: true, format: out.format, records: await withHandedOverTracks(out.records, channel) };
  } catch (err) {
    if (err instanceof ComputeBusyError || err instanceof ComputeAccountBusyError) throw err;
    if (err instanceof ComputeTimeoutError) {
      return {
        ok: false,
        error: `Reading this file took longer than ${Math.round(err.limitMs / 1000)} seconds, more than one run may take. Split it into single runs and upload those.`,
      };
    }
    if (err instanceof ComputeCrashError) {
      return {
        ok: false,
        error: 'Reading this file needed more memory than one run may use. Split it into single runs and upload those.',
      };
    }
    logger.warn({ err, file: file.name }, 'import failed unexpectedly');
    return { ok: false, error: GENERIC_REJECTION };
  } finally {
    channel?.close();
    letGo?.();
  }
}

/**
 * When each step of storing one file ended, ms after its import began (LOG_LEVEL=debug logs them per file:
 * "import steps"): where the time between the body's last byte and the answer goes (tests/bench/README.md).
 */
function stepClock() {
  const began = performance.now();
  const steps: Record<string, number> = {};
  return {
    /** Ms since the epoch when the import began: comparable with another process's clock. */
    beganAt: performance.timeOrigin + began,
    steps,
    mark: (step: string) => {
      steps[step] = Math.round((performance.now() - began) * 10) / 10;
    },
  };
}

/** The same file was stored by another upload while this one was being read. */
class StoredMeanwhile extends Error {
  constructor() {
    super('stored meanwhile');
  }
}

/** A file that does not fit in the user's storage quota (checked under the user's storage lock). */
class OverQuota extends Error {
  constructor(readonly used: number) {
    super('over quota');
  }
}

/**
 * Imports uploaded files for `user`: each file is parsed and analysed in a compute worker, then
 * stored in its own transaction (the run rows and the original file together), so a file is
 * imported whole or not at all. A file whose content was uploaded before is reported as a
 * duplicate of the existing run; one that would pass the storage quota is refused.
 */
export async function importFiles(
  user: UserRow,
  files: UploadedFile[],
  store: FileStore,
  options: ImportOptions = {},
): Promise<ImportResult> {
  const result: ImportResult = { imported: [], duplicates: [], rejected: [] };
  const sameFile = (file: string, runId: string) => ({ file, runId, reason: 'same file' as const, activity: null });
  for (const file of files) {
    const clock = stepClock();
    const sha256 = await sha256Of(file);
    const existing = await findSourceFileBySha(user.id, sha256);
    // Activities of this very file already stored; with "import anyway" the others still come in
    // (a multi-activity file whose one activity matched a run from another file).
    const present = new Set<number>();
    if (existing) {
      const run = await findFirstRunOfSourceFile(existing.id);
      if (!options.importDuplicates || !run) {
        if (run) result.duplicates.push(sameFile(file.name, run.id));
        continue;
      }
      for (const index of await findActivityIndexesOfSourceFile(existing.id)) present.add(index);
    }
    clock.mark('checked');
    const running = startComputeRuns(user, file);
    // A new file of one run: its track comes ahead of the rest of the analysis and is stored meanwhile.
    const handedOver =
      existing || !storeBesideAnalysis() ? null : await Promise.race([running.early, running.done.then(() => null)]);
    let plan: StorePlan;
    if (handedOver) {
      clock.mark('track handed over');
      // When the analysis itself answered (the 'computed' step is when the transaction got to wait for it).
      void running.done.then(() => clock.mark('analysis answered'));
      plan = {
        overlapped: true,
        format: handedOver.format,
        runs: [{ ...handedOver, activity: null }],
        analysed: async () => {
          const computed = await running.done;
          clock.mark('computed');
          if (!computed.ok) throw new RefusedAfterAll(computed.error);
          // The start and distance the same-run check used are the run's own (summarizeRun's, read early).
          for (const run of plan.runs) {
            const record = computed.records.find((r) => r.run.activity_index === run.activity_index);
            if (!record || !sameFacts(record, run)) throw new FactsChanged(computed.records);
          }
          return computed.records;
        },
      };
    } else {
      const computed = await running.done;
      clock.mark('computed');
      if (!computed.ok) {
        result.rejected.push({ file: file.name, error: computed.error });
        continue;
      }
      plan = analysedPlan(computed.format, computed.records);
    }
    const size = sizeOf(file);
    const storageKey = existing?.storage_key ?? `${user.id}/${sha256}`;
    // Each track's columns crossed from the thread packed (handed over, not copied); they are gzipped on
    // libuv's pool from now on, beside the transaction's first statements, and awaited for its track row.
    const blobs = new Map<StoredTrack, Promise<Buffer>>();
    const blobOf = (track: StoredTrack) => {
      let blob = blobs.get(track);
      if (!blob) {
        blob = gzipPackedColumns(track.raw, track.data_layout);
        // When each blob is ready is a logged step; a blob no statement awaits (a refused or failed file) must
        // not end as an unhandled rejection.
        blob.then(
          () => clock.mark('gzipped'),
          () => undefined,
        );
        blobs.set(track, blob);
      }
      return blob;
    };
    for (const run of plan.runs) blobOf(run.track);
    const trackRow = (track: StoredTrack) => {
      const { columns, point_count, data_layout } = track;
      return { columns, point_count, data_layout, data: blobOf(track) };
    };
    const storeWith = (plan: StorePlan) =>
      inTransaction(async (trx) => {
        clock.mark('transaction began');
        // The same-run check and the insert are one step per runner: two different files of one run
        // uploaded at the same instant (two requests, two compute workers) are checked one after the
        // other, and the second sees the first's committed run (lockRunsOf waits for its commit).
        await lockRunsOf(user.id, trx);
        // The same bytes stored meanwhile by another upload (it held the lock first): the same file.
        if (!existing && (await findSourceFileBySha(user.id, sha256, trx))) throw new StoredMeanwhile();
        // The same run in another file: each activity on its own (start within 5 s, distance within 2 %).
        const sameRun: ImportResult['duplicates'] = [];
        const keep: RunToStore[] = [];
        for (const run of plan.runs) {
          if (present.has(run.activity_index)) continue;
          const stored = options.importDuplicates
            ? undefined
            : (await findRunsStartingNear(user.id, run.started_at_t, SAME_RUN_START_S * 1000, trx)).find((r) =>
                isSameRun(run, { started_at_t: r.started_at.getTime(), distance_m: r.distance_m }),
              );
          if (stored) sameRun.push({ file: file.name, runId: stored.id, reason: 'same run', activity: run.activity });
          else keep.push(run);
        }
        const inserted: RunRow[] = [];
        if (keep.length === 0) {
          // Nothing to store, but a file the analysis refuses is refused, as when it was stored after the analysis.
          await plan.analysed();
          return { inserted, sameRun };
        }
        clock.mark('same-run checked');
        let sourceFileId = existing?.id;
        if (!existing) {
          if (options.storageQuotaBytes !== undefined) {
            await lockStorageOf(user.id, trx);
            const used = (await storageUsedBy(user.id, trx)).bytes;
            if (used + size > options.storageQuotaBytes) throw new OverQuota(used);
          }
          const source = await insertSourceFile(
            {
              user_id: user.id,
              original_name: file.name.slice(0, 255),
              sha256,
              size_bytes: String(size),
              storage_key: storageKey,
              format: plan.format,
            },
            trx,
          );
          sourceFileId = source.id;
        }
        // A run's id is chosen here, so its track row can go in before the run's own row (checked at commit).
        const runIds = new Map(keep.map((run) => [run, randomUUID()]));
        // While the rest of the run is still being analysed, when its track came ahead.
        if (plan.overlapped) for (const run of keep) await insertRunTrack(runIds.get(run)!, trackRow(run.track), trx, clock.mark);
        const records = await plan.analysed();
        for (const run of keep) {
          const record = records.find((r) => r.run.activity_index === run.activity_index)!;
          const id = runIds.get(run)!;
          inserted.push(
            await insertRunRows({ ...record.run, id, source_file_id: sourceFileId! }, record.children, trx, clock.mark),
          );
          if (!plan.overlapped) await insertRunTrack(id, trackRow(run.track), trx, clock.mark);
        }
        if (options.beforeCommit) {
          try {
            await options.beforeCommit(
              trx,
              inserted.map((r) => r.id),
            );
          } catch (err) {
            throw new BeforeCommitFailed(err);
          }
        }
        // The original is stored already and referenced by its other runs: no new storage is used.
        if (existing) return { inserted, sameRun };
        // Last step inside the transaction: if storing the original fails, no row is committed.
        // The shared lock keeps the orphan sweeper off this file until the rows are committed.
        await holdOriginalFilesSharedLock(trx);
        if ('data' in file) await store.put(storageKey, file.data);
        else if (store.putFile) await store.putFile(storageKey, file.path);
        else await store.put(storageKey, await readFile(file.path));
        clock.mark('original stored');
        return { inserted, sameRun };
      });
    try {
      let outcome: Awaited<ReturnType<typeof storeWith>>;
      try {
        outcome = await storeWith(plan);
      } catch (err) {
        if (!(err instanceof FactsChanged)) throw err;
        // Never expected (the early facts are summarizeRun's own): nothing was committed; store it after the analysis.
        logger.warn({ file: file.name }, 'the start or distance of a run changed after its track was handed over');
        outcome = await storeWith(analysedPlan(plan.format, err.records));
      }
      clock.mark('committed');
      logger.debug({ file: file.name, began_at: clock.beganAt, ms: clock.steps }, 'import steps');
      result.duplicates.push(...outcome.sameRun);
      if (outcome.inserted.length === 0) {
        // With "import anyway", only activities of this very file already stored are left out.
        if (existing) {
          const run = await findFirstRunOfSourceFile(existing.id);
          if (run) result.duplicates.push(sameFile(file.name, run.id));
        }
        continue;
      }
      result.imported.push(...outcome.inserted.map((r) => ({ ...toRunListItem(r), file: file.name })));
    } catch (err) {
      if (err instanceof BeforeCommitFailed) throw err.reason;
      // A file the analysis refuses is refused in its words whatever else went wrong meanwhile, as when the
      // store began after the analysis (its track came ahead; this awaits its answer).
      const refused = err instanceof RefusedAfterAll ? err : await refusalOf(running);
      if (refused) {
        result.rejected.push({ file: file.name, error: refused.message });
        continue;
      }
      if (err instanceof OverQuota) {
        result.rejected.push({ file: file.name, error: overQuotaReason(err.used, size, options.storageQuotaBytes!) });
        continue;
      }
      if (err instanceof StoredMeanwhile || isUniqueViolation(err)) {
        const again = await findSourceFileBySha(user.id, sha256);
        const run = again && (await findFirstRunOfSourceFile(again.id));
        if (run) result.duplicates.push(sameFile(file.name, run.id));
        continue;
      }
      // Nothing was committed; make sure no stray original is left either, and tell the runner.
      logger.error({ err, file: file.name }, 'storing an import failed');
      if (!existing) await deleteOriginalUnlessReferenced(storageKey, store).catch(() => undefined);
      result.rejected.push({
        file: file.name,
        error: 'This file could not be saved just now. Nothing was stored; please try again.',
      });
    }
  }
  return result;
}

/** A run of a file about to be stored: what the same-run check needs, and its track. */
interface RunToStore {
  activity_index: number;
  started_at_t: number;
  distance_m: number;
  /** Its number in a file of several runs (1-based), for a same-run answer; null in a file of one. */
  activity: number | null;
  track: StoredTrack;
}

/**
 * How a file's runs are stored: from the analysis's records (`overlapped` false), or from a track handed over
 * ahead of the analysis (`overlapped`), whose rows come from `analysed` once the analysis answers.
 */
interface StorePlan {
  overlapped: boolean;
  format: string;
  runs: RunToStore[];
  /** The records of the file's runs; throws RefusedAfterAll when the analysis refused the file. */
  analysed: () => Promise<RunRecord[]>;
}

function analysedPlan(format: string, records: RunRecord[]): StorePlan {
  return {
    overlapped: false,
    format,
    runs: records.map((record, i) => ({
      activity_index: record.run.activity_index,
      started_at_t: new Date(record.run.started_at).getTime(),
      distance_m: record.run.distance_m,
      activity: records.length > 1 ? i + 1 : null,
      track: record.children.track,
    })),
    analysed: async () => records,
  };
}

function sameFacts(record: RunRecord, run: RunToStore): boolean {
  return new Date(record.run.started_at).getTime() === run.started_at_t && Object.is(record.run.distance_m, run.distance_m);
}

/** The analysis refused the file after its track had come ahead: its sentence is the answer, nothing is stored. */
class RefusedAfterAll extends Error {}

/** The run's start or distance differed from what its handed-over track said: stored again after the analysis. */
class FactsChanged extends Error {
  constructor(readonly records: RunRecord[]) {
    super('facts changed');
  }
}

/** The analysis's refusal of a file, once it has answered; undefined when it did not refuse it. */
async function refusalOf(running: RunningCompute): Promise<RefusedAfterAll | undefined> {
  const computed = await running.done;
  return computed.ok ? undefined : new RefusedAfterAll(computed.error);
}

/** The storage a user keeps and may keep, for the profile. */
export async function storageOf(actor: Actor, quotaBytes: number): Promise<StorageUsage> {
  const used = await storageUsedBy(actor.id);
  return { used_bytes: used.bytes, quota_bytes: quotaBytes, files: used.files };
}

/** The run if `actor` may read it; 404 otherwise (also for ids of other people's runs). */
export async function getReadableRun(actor: Actor, runId: string): Promise<RunRow> {
  return readableOr404(actor, await findRunById(runId));
}

async function readableOr404<T extends { user_id: string }>(actor: Actor, found: T | undefined): Promise<T> {
  if (!found) throw new NotFoundError('There is no run with this id.');
  await assertCanReadRunner(actor, found.user_id, 'There is no run with this id.');
  return found;
}

/** Only the owner may change or delete a run. */
async function getOwnRun(actor: Actor, runId: string): Promise<RunRow> {
  const run = await getReadableRun(actor, runId);
  if (run.user_id !== actor.id) throw new NotFoundError('There is no run with this id.');
  return run;
}

export function toSplit(row: RunSplitRow): Split {
  return {
    index: row.split_index,
    unit: row.unit,
    distance_m: row.distance_m,
    start_t: row.start_at.getTime(),
    end_t: row.end_at.getTime(),
    elapsed_s: row.elapsed_s,
    moving_s: row.moving_s,
    pace_s: row.pace_s,
    flat_pace_s: row.flat_pace_s,
    avg_hr: row.avg_hr,
    max_hr: row.max_hr,
    avg_cad: row.avg_cad,
    elev_gain_m: row.elev_gain_m,
    elev_loss_m: row.elev_loss_m,
  };
}

export async function describeRun(actor: Actor, runId: string) {
  // The run and its parts in one query; nothing of it is answered unless the actor may read it.
  const found = await findRunWithParts(runId);
  const run = await readableOr404(actor, found?.run);
  const { parts, ownerTimeZone } = found!;
  const splits = parts.splits.map(toSplit);
  return {
    id: run.id,
    owner_id: run.user_id,
    owner_time_zone: ownerTimeZone,
    name: run.name,
    sport: run.sport,
    kind: run.activity_kind,
    summary: {
      ...toRunListItem(run),
      ended_at: run.ended_at.toISOString(),
      time_zone_source: run.time_zone_source,
      distance_source: run.distance_source,
      pace_s_per_mi: run.moving_s > 0 && run.distance_m > 0 ? run.moving_s / (run.distance_m / METRES_PER_MILE) : null,
      descent_m: run.descent_m,
      max_hr: run.max_hr,
      avg_cad: run.avg_cad,
      points: run.points,
      segments: run.segments,
    },
    splits: { mi: splits.filter((s) => s.unit === 'mi'), km: splits.filter((s) => s.unit === 'km') },
    laps: parts.laps.map((l) => ({
      index: l.lap_index,
      started_at: l.start_at.toISOString(),
      total_time_s: l.total_time_s,
      distance_m: l.distance_m,
      avg_hr: l.avg_hr,
      max_hr: l.max_hr,
    })),
    fastest_sections: parts.fastest.map((f) => ({
      distance_m: f.distance_m,
      time_s: f.time_s,
      pace_s_per_km: f.pace_s_per_km,
      started_at: f.start_at.toISOString(),
      start_distance_m: f.start_distance_m,
    })),
    // Stored JSON written at import (see above); the API tests parse every answer against RunDetailSchema.
    details: run.details as RunDetail['details'],
  };
}

/**
 * The run page as ready JSON: kept per run for its owner at their input counter (server/features/week-cache,
 * "Ready answers"); anyone else's read (a coach, an admin) is built and checked each time.
 */
export function readyRunPage(actor: Actor, inputsCounter: string, runId: string): Promise<ReadyAnswer> {
  return readyAnswer(`run-page:${runId}`, actor.id, inputsCounter, async () => {
    const answer = await describeRun(actor, runId);
    return { owner: answer.owner_id, answer };
  });
}

/** The runs list as ready JSON: the caller's own list is kept per query at their input counter; other lists are built each time. */
export function readyRunList(actor: Actor, inputsCounter: string, query: ListRunsQuery): Promise<ReadyAnswer> {
  const ownerId = query.runner_id ?? actor.id;
  // The parsed query (every field, defaults filled in, in the schema's order) names the page.
  return readyAnswer(`run-list:${actor.id}:${JSON.stringify(query)}`, actor.id, inputsCounter, async () => ({
    owner: ownerId,
    answer: await listRuns(actor, query),
  }));
}

export async function splitsCsvOf(actor: Actor, runId: string, unit: SplitUnit): Promise<{ csv: string; filename: string }> {
  const run = await getReadableRun(actor, runId);
  const splits = (await findSplits(run.id, unit)).map(toSplit);
  return { csv: splitsToCsv(splits, unit), filename: runFileName(run.local_date, run.name, `splits-${unit}`, 'csv') };
}

export async function listRuns(actor: Actor, query: ListRunsQuery) {
  const ownerId = query.runner_id ?? actor.id;
  await assertCanReadRunner(actor, ownerId);
  const after = query.after === undefined ? null : readListCursor(query);
  const { rows, total, next } = await listRunsOf(ownerId, query, after);
  return {
    runs: rows.map(toRunListItem),
    total,
    page: query.page,
    per_page: query.per_page,
    next_cursor: next ? encodeRunListCursor(next) : null,
  };
}

/** The cursor of `after`, which must come from this list in the same sort and order (shared/runs/list-cursor.ts). */
function readListCursor(query: ListRunsQuery): RunListCursor {
  const cursor = decodeRunListCursor(query.after ?? '');
  if (!cursor || cursor.sort !== query.sort || cursor.order !== query.order) {
    throw new ValidationError(RUN_LIST_CURSOR_ERROR, [{ field: 'after', message: RUN_LIST_CURSOR_ERROR }]);
  }
  if (query.page !== 1) {
    const message = 'Ask for a page number or for the runs after a link, not both.';
    throw new ValidationError(message, [{ field: 'page', message }]);
  }
  return cursor;
}

/** Renames a run and/or changes its kind (run, ride, hike); only the owner may. */
export async function renameOwnRun(actor: Actor, runId: string, changes: { name?: string; kind?: ActivityKind }) {
  await getOwnRun(actor, runId);
  return toRunListItem((await renameRun(runId, changes))!);
}

/** Deletes the run and, when no other run came from the same file, the original file too. */
export async function deleteOwnRun(actor: Actor, runId: string, store: FileStore): Promise<void> {
  const run = await getOwnRun(actor, runId);
  const orphan = await inTransaction((trx) => deleteRunAndOrphanFile(run, trx));
  if (orphan) await deleteOriginalUnlessReferenced(orphan.storage_key, store);
}

/**
 * Removes a stored original unless a row names it again by now: an upload of the same content
 * may have committed in between (same key), and its file must stay. Checked under the lock
 * imports hold while they store (decision 37).
 */
async function deleteOriginalUnlessReferenced(storageKey: string, store: FileStore): Promise<void> {
  await withOriginalFilesExclusiveLock(async (trx) => {
    if ((await findReferencedStorageKeys([storageKey], trx)).has(storageKey)) return;
    await store.delete(storageKey);
  });
}

export async function originalFileOf(actor: Actor, runId: string, store: FileStore) {
  const run = await getReadableRun(actor, runId);
  const file = await findSourceFileById(run.source_file_id);
  if (!file) throw new NotFoundError('The original file of this run is missing.');
  const data = await store.get(file.storage_key);
  return { name: file.original_name, data, contentType: originalContentType(file.format, data.subarray(0, 2)) };
}

/** The series for charts and the route outline, thinned to at most `maxPoints` points. */
export async function trackOf(actor: Actor, runId: string, maxPoints = 2000) {
  const run = await getReadableRun(actor, runId);
  const row = await findRunTrack(run.id);
  if (!row) throw new NotFoundError();
  const columns = decodeColumns(row.columns, row.point_count, row.data, row.data_layout);
  const step = Math.max(1, Math.ceil(row.point_count / maxPoints));
  const pick = (c: Float64Array | undefined) => {
    if (!c) return null;
    const out: Array<number | null> = [];
    for (let i = 0; i < c.length; i += step) out.push(Number.isFinite(c[i]!) ? c[i]! : null);
    return out;
  };
  return {
    points: row.point_count,
    step,
    // Time, distance and position columns are written for every run at import (NaN where unknown).
    t: pick(columns.t) ?? [],
    d: pick(columns.d) ?? [],
    lat: pick(columns.lat) ?? [],
    lon: pick(columns.lon) ?? [],
    ele: pick(columns.ele),
    hr: pick(columns.hr),
  };
}

/** Notes on a run: the runner and anyone who may read the run (their coaches, admins) read and write them. */
export async function notesOf(actor: Actor, runId: string) {
  const run = await getReadableRun(actor, runId);
  const notes = await listRunNotes(run.id);
  const read = await findReadNoteIds(
    actor.id,
    notes.map((n) => n.id),
  );
  return notes.map((n) => ({ ...n, unread: n.author.id !== actor.id && !read.has(n.id) }));
}

/** Only the runner flags their own note as about pain or illness. */
export async function addNote(actor: Actor, runId: string, text: string, concern: NoteConcern | null, notices: NoticeDeps) {
  const run = await getReadableRun(actor, runId);
  if (concern && run.user_id !== actor.id)
    throw new ValidationError('Only the runner flags a note as about pain or illness.', [
      { field: 'concern', message: 'Only the runner flags a note as about pain or illness.' },
    ]);
  const note = await insertRunNote(run.id, actor.id, text, concern);
  await recordNoteNotice({ id: note.id, kind: 'run-note', runner_id: run.user_id, author_id: actor.id, concern }, notices).catch(
    (err: unknown) => logger.error({ err, note: note.id }, 'recording a note notice failed'),
  );
  return note;
}

/** The device laps of a run the caller has already been allowed to read, as the plan check reads them. */
export async function loadRunLaps(run: Pick<RunRow, 'id'>) {
  const laps = await findRunLaps(run.id);
  return laps.map((l) => ({ start_t: l.start_at.getTime(), total_time_s: l.total_time_s, distance_m: l.distance_m }));
}
