import { createHash } from 'node:crypto';
import tzLookup from '@photostructure/tz-lookup';
import { runFileName } from '../../../shared/runs/file-names.ts';
import { analyseTrack, type RunAnalysis } from '../../../shared/tracks/analyse.ts';
import { lapCoverageProblem } from '../../../shared/tracks/lap-coverage.ts';
import { localDateTime } from '../../../shared/runs/local-time.ts';
import { estimateRunEnergy } from '../../../shared/tracks/energy.ts';
import { heartRateZones, timeInZones } from '../../../shared/tracks/heart-rate.ts';
import { seriesPositions } from '../../../shared/tracks/series.ts';
import { trimpOfSeries } from '../../../shared/weeks/trimp.ts';
import { METRES_PER_MILE } from '../../../shared/units.ts';
import type { Actor } from '../../../shared/auth/permissions.ts';
import { DistanceReportSchema, type ImportResult, type ListRunsQuery } from '../../../shared/runs/schemas.ts';
import { activityKindOf, type ActivityKind } from '../../../shared/runs/activity-kind.ts';
import { isSameRun, SAME_RUN_START_S } from '../../../shared/runs/duplicates.ts';
import { originalContentType } from '../../../shared/runs/original-download.ts';
import { splitsToCsv } from '../../../shared/runs/splits-csv.ts';
import type { Split, SplitUnit } from '../../../shared/tracks/types.ts';
import { db, isUniqueViolation, type NoteConcern, type RunRow, type RunSplitRow, type UserRow } from '../../lib/db.ts';
import { NotFoundError, ValidationError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import { assertCanReadRunner } from '../squads/runner-access.ts';
import { decodeColumns, encodeColumns } from './track-blob.ts';
import { insertRunNote, listRunNotes } from './run-notes.repository.ts';
import { findReadNoteIds } from '../notes/notes.repository.ts';
import { recordNoteNotice, type NoticeDeps } from '../notices/notices.service.ts';
import {
  findReferencedStorageKeys,
  holdOriginalFilesSharedLock,
  withOriginalFilesExclusiveLock,
} from './original-files.repository.ts';
import { ImportRejection } from './parse/import-rejection.ts';
import { parseTrackFile, type ParsedRun } from './parse/parse-track-file.ts';
import {
  deleteRunAndOrphanFile,
  findFirstRunOfSourceFile,
  findRunById,
  findRunParts,
  findRunTrack,
  findRunWithParts,
  findRunsStartingNear,
  findActivityIndexesOfSourceFile,
  findSourceFileById,
  findSourceFileBySha,
  findSplits,
  insertRunWhole,
  insertSourceFile,
  listRunsOf,
  renameRun,
  toRunListItem,
} from './runs.repository.ts';

export interface UploadedFile {
  name: string;
  data: Buffer;
}

/** Time zone of the run's first position (tz-lookup), else the runner's profile time zone. */
function timeZoneOf(parsed: ParsedRun, fallback: string): { zone: string; source: 'start position' | 'profile' } {
  const { lat, lon, length } = parsed.track.columns;
  let first = 0;
  while (first < length && Number.isNaN(lat[first])) first++;
  if (first < length) {
    try {
      const zone = tzLookup(lat[first]!, lon[first]!);
      // Open sea answers a nautical Etc/GMT±N zone; the runner's own zone is a better guess there.
      if (!zone.startsWith('Etc/')) return { zone, source: 'start position' };
    } catch {
      // Out-of-range positions were already dropped; keep the profile zone if the lookup still fails.
    }
  }
  return { zone: fallback, source: 'profile' };
}

/**
 * Figures that depend on the profile at import time (heart rates, weight): time in heart-rate zones
 * and the ACSM energy estimate. Stored with the inputs used, so the run page can say what they came from.
 */
function profileDependentFigures(user: UserRow, analysis: RunAnalysis) {
  const { series, summary } = analysis;
  const zones = heartRateZones(user.max_hr, user.resting_hr);
  const energy = estimateRunEnergy(summary.distance_m, summary.moving_s, user.weight_kg);
  const trimp =
    series.hr && user.resting_hr !== null && user.max_hr !== null
      ? trimpOfSeries(series.t, series.hr, series.moving, user.resting_hr, user.max_hr, user.sex)
      : null;
  return {
    trimp: trimp
      ? {
          ...trimp,
          resting_hr: user.resting_hr,
          max_hr: user.max_hr,
          method: 'Banister TRIMP, summed interval by interval over moving time',
        }
      : null,
    hr_zones:
      zones && series.hr
        ? {
            method: zones.method,
            max_hr: user.max_hr,
            resting_hr: user.resting_hr,
            zones: zones.zones,
            seconds: timeInZones(series.t, series.hr, series.moving, zones.zones),
          }
        : null,
    energy: energy ? { ...energy, weight_kg: user.weight_kg, method: 'ACSM running equation, level, 5 kcal per litre O2' } : null,
  };
}

function buildRunRecord(user: UserRow, sourceFileId: string, parsed: ParsedRun, analysis: RunAnalysis) {
  const { summary, series } = analysis;
  const tz = timeZoneOf(parsed, user.time_zone);
  const local = localDateTime(summary.started_at_t, tz.zone);
  const run: Omit<RunRow, 'id' | 'created_at'> = {
    user_id: user.id,
    source_file_id: sourceFileId,
    activity_index: parsed.activity_index,
    name: parsed.name?.trim().slice(0, 120) || `Run ${local.date} ${local.time}`,
    sport: parsed.sport,
    activity_kind: activityKindOf(parsed.sport, summary),
    started_at: new Date(summary.started_at_t),
    ended_at: new Date(summary.ended_at_t),
    local_date: local.date,
    local_time: local.time,
    time_zone: tz.zone,
    time_zone_source: tz.source,
    distance_m: summary.distance_m,
    distance_source: summary.distance_source,
    elapsed_s: summary.elapsed_s,
    moving_s: summary.moving_s,
    ascent_m: summary.ascent_m,
    descent_m: summary.descent_m,
    avg_hr: summary.avg_hr,
    max_hr: summary.max_hr,
    avg_cad: summary.avg_cad,
    points: summary.points,
    segments: summary.segments,
    details: {
      cleaning: parsed.track.report,
      format: parsed.format,
      distance: DistanceReportSchema.parse(summary.distance_report),
      ...profileDependentFigures(user, analysis),
    },
  };
  const { lat, lon } = seriesPositions(parsed.track, series);
  const columns: Record<string, Float64Array> = { t: series.t, d: series.d, lat, lon };
  if (series.ele_smooth) columns.ele = series.ele_smooth;
  if (series.hr) columns.hr = series.hr;
  if (series.cad) columns.cad = series.cad;
  columns.moving = Float64Array.from(series.moving);
  const blob = encodeColumns(columns);
  const toSplitRow = (s: Split): Omit<RunSplitRow, 'run_id'> => ({
    unit: s.unit,
    split_index: s.index,
    distance_m: s.distance_m,
    start_at: new Date(s.start_t),
    end_at: new Date(s.end_t),
    elapsed_s: s.elapsed_s,
    moving_s: s.moving_s,
    pace_s: s.pace_s,
    flat_pace_s: s.flat_pace_s,
    avg_hr: s.avg_hr,
    max_hr: s.max_hr,
    avg_cad: s.avg_cad,
    elev_gain_m: s.elev_gain_m,
    elev_loss_m: s.elev_loss_m,
  });
  return {
    run,
    children: {
      track: { columns: blob.columns, point_count: blob.pointCount, data: blob.data },
      splits: [...analysis.splits.mi, ...analysis.splits.km].map(toSplitRow),
      laps: parsed.laps.map((l, i) => ({
        lap_index: i + 1,
        start_at: new Date(l.start_t),
        total_time_s: l.total_time_s,
        distance_m: l.distance_m,
        avg_hr: l.avg_hr,
        max_hr: l.max_hr,
      })),
      fastest: analysis.fastest.map((f) => ({
        distance_m: f.distance_m,
        time_s: f.time_s,
        pace_s_per_km: f.pace_s_per_km,
        start_at: new Date(f.start_t),
        end_at: new Date(f.end_t),
        start_distance_m: f.start_distance_m,
      })),
    },
  };
}

const GENERIC_REJECTION =
  'This file could not be read as a GPS track. If it came from a watch, please send it to us so we can look.';

/**
 * Imports uploaded files for `user`: each file is parsed, computed and stored in its own transaction
 * (the run rows and the original file together), so a file is imported whole or not at all.
 * A file whose content was uploaded before is reported as a duplicate of the existing run.
 */
export async function importFiles(
  user: UserRow,
  files: UploadedFile[],
  store: FileStore,
  options: { importDuplicates?: boolean } = {},
): Promise<ImportResult> {
  const result: ImportResult = { imported: [], duplicates: [], rejected: [] };
  const sameFile = (file: string, runId: string) => ({ file, runId, reason: 'same file' as const, activity: null });
  for (const file of files) {
    const sha256 = createHash('sha256').update(file.data).digest('hex');
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
    let parsed: ParsedRun[];
    let analyses: RunAnalysis[];
    try {
      parsed = parseTrackFile(file.data);
      analyses = parsed.map((p) => analyseTrack(p.track));
      // A track that cannot be what its own laps record is refused whole: nothing half-imported.
      parsed.forEach((p, i) => {
        const problem = lapCoverageProblem(analyses[i]!.summary, p.laps, p.track.report);
        if (problem) throw new ImportRejection('track-not-laps', parsed.length > 1 ? `Activity ${i + 1}: ${problem}` : problem);
      });
    } catch (err) {
      if (!(err instanceof ImportRejection)) logger.warn({ err, file: file.name }, 'import failed unexpectedly');
      result.rejected.push({ file: file.name, error: err instanceof ImportRejection ? err.message : GENERIC_REJECTION });
      continue;
    }
    // The same run in another file: each activity on its own (start within 5 s, distance within 2 %).
    const keep: number[] = [];
    for (let i = 0; i < parsed.length; i++) {
      if (present.has(parsed[i]!.activity_index)) continue;
      const mine = { started_at_t: analyses[i]!.summary.started_at_t, distance_m: analyses[i]!.summary.distance_m };
      const stored = options.importDuplicates
        ? undefined
        : (await findRunsStartingNear(user.id, mine.started_at_t, SAME_RUN_START_S * 1000)).find((r) =>
            isSameRun(mine, { started_at_t: r.started_at.getTime(), distance_m: r.distance_m }),
          );
      if (stored)
        result.duplicates.push({
          file: file.name,
          runId: stored.id,
          reason: 'same run',
          activity: parsed.length > 1 ? i + 1 : null,
        });
      else keep.push(i);
    }
    if (keep.length === 0) {
      // With "import anyway", only activities of this very file already stored are left out.
      if (existing) {
        const run = await findFirstRunOfSourceFile(existing.id);
        if (run) result.duplicates.push(sameFile(file.name, run.id));
      }
      continue;
    }
    const storageKey = existing?.storage_key ?? `${user.id}/${sha256}`;
    try {
      const rows = await db.transaction(async (trx) => {
        const inserted: RunRow[] = [];
        if (existing) {
          // The original is stored already and referenced by its other runs.
          for (const i of keep) {
            const record = buildRunRecord(user, existing.id, parsed[i]!, analyses[i]!);
            inserted.push(await insertRunWhole(record.run, record.children, trx));
          }
          return inserted;
        }
        const source = await insertSourceFile(
          {
            user_id: user.id,
            original_name: file.name.slice(0, 255),
            sha256,
            size_bytes: String(file.data.length),
            storage_key: storageKey,
            format: parsed[0]!.format,
          },
          trx,
        );
        for (const i of keep) {
          const record = buildRunRecord(user, source.id, parsed[i]!, analyses[i]!);
          inserted.push(await insertRunWhole(record.run, record.children, trx));
        }
        // Last step inside the transaction: if storing the original fails, no row is committed.
        // The shared lock keeps the orphan sweeper off this file until the rows are committed.
        await holdOriginalFilesSharedLock(trx);
        await store.put(storageKey, file.data);
        return inserted;
      });
      result.imported.push(...rows.map((r) => ({ ...toRunListItem(r), file: file.name })));
    } catch (err) {
      if (isUniqueViolation(err)) {
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
  const { parts } = found!;
  const splits = parts.splits.map(toSplit);
  return {
    id: run.id,
    owner_id: run.user_id,
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
    details: run.details,
  };
}

export async function splitsCsvOf(actor: Actor, runId: string, unit: SplitUnit): Promise<{ csv: string; filename: string }> {
  const run = await getReadableRun(actor, runId);
  const splits = (await findSplits(run.id, unit)).map(toSplit);
  return { csv: splitsToCsv(splits, unit), filename: runFileName(run.local_date, run.name, `splits-${unit}`, 'csv') };
}

export async function listRuns(actor: Actor, query: ListRunsQuery) {
  const ownerId = query.runner_id ?? actor.id;
  await assertCanReadRunner(actor, ownerId);
  const { rows, total } = await listRunsOf(ownerId, query);
  return { runs: rows.map(toRunListItem), total, page: query.page, per_page: query.per_page };
}

/** Renames a run and/or changes its kind (run, ride, hike); only the owner may. */
export async function renameOwnRun(actor: Actor, runId: string, changes: { name?: string; kind?: ActivityKind }) {
  await getOwnRun(actor, runId);
  return toRunListItem((await renameRun(runId, changes))!);
}

/** Deletes the run and, when no other run came from the same file, the original file too. */
export async function deleteOwnRun(actor: Actor, runId: string, store: FileStore): Promise<void> {
  const run = await getOwnRun(actor, runId);
  const orphan = await db.transaction((trx) => deleteRunAndOrphanFile(run, trx));
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
  const columns = decodeColumns(row.columns, row.point_count, row.data);
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
    t: pick(columns.t),
    d: pick(columns.d),
    lat: pick(columns.lat),
    lon: pick(columns.lon),
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

/** The stored series and device laps of a run the caller has already been allowed to read. */
export async function loadRunSeriesAndLaps(run: Pick<RunRow, 'id'>) {
  const row = await findRunTrack(run.id);
  if (!row) throw new NotFoundError('This run has no stored track.');
  const columns = decodeColumns(row.columns, row.point_count, row.data);
  const { laps } = await findRunParts(run.id);
  return {
    series: { t: columns.t!, d: columns.d!, hr: columns.hr ?? null, moving: columns.moving ?? null },
    laps: laps.map((l) => ({ start_t: l.start_at.getTime(), total_time_s: l.total_time_s, distance_m: l.distance_m })),
  };
}
