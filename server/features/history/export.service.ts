import { ZipArchive } from 'archiver';
import { Readable, type Writable } from 'node:stream';
import { finished } from 'node:stream/promises';
import {
  allSplitsCsvHeader,
  allSplitsCsvLines,
  runCsvLine,
  runsCsvHeader,
  safeFileName,
  type ExportRun,
} from '../../../shared/history/export-csv.ts';
import type { SplitUnit } from '../../../shared/tracks/types.ts';
import type { RunRow, UserRow } from '../../lib/db.ts';
import { logger } from '../../lib/logger.ts';
import type { FileStore } from '../../lib/storage.ts';
import { findGoalRace, listRaceResults, toGoalRace, toRaceResult } from '../goals/index.ts';
import { toPlan } from '../plans/index.ts';
import { toSplit } from '../runs/index.ts';
import { toProfile } from '../users/index.ts';
import {
  findSplitsOfRuns,
  listPlansOfRunner,
  listRowsIfTableExists,
  listRunNotesFor,
  listRunRowsIfTableExists,
  listWeekNotesFor,
  pageRunsOf,
  pageSourceFilesOf,
  type RunCursor,
} from './export.repository.ts';

/** Runs (and original files) read per query: a 5-year history never sits in memory at once. */
const PAGE_SIZE = 200;

/** Path of an original file inside the export; the source id keeps two "run.gpx" apart. */
function originalPath(sourceFileId: string, originalName: string): string {
  return `originals/${sourceFileId}-${safeFileName(originalName)}`;
}

async function* runPages(userId: string): AsyncGenerator<Array<RunRow & { original_name: string }>> {
  let cursor: RunCursor | null = null;
  while (true) {
    const page = await pageRunsOf(userId, cursor, PAGE_SIZE);
    if (page.length === 0) return;
    yield page;
    const last = page[page.length - 1]!;
    cursor = { startedAt: last.started_at, id: last.id };
  }
}

async function* runsCsv(userId: string): AsyncGenerator<string> {
  yield runsCsvHeader();
  for await (const page of runPages(userId)) {
    yield page
      .map((run) =>
        runCsvLine({ ...run, original_file: originalPath(run.source_file_id, run.original_name) } satisfies ExportRun),
      )
      .join('');
  }
}

async function* splitsCsv(userId: string, unit: SplitUnit): AsyncGenerator<string> {
  yield allSplitsCsvHeader(unit);
  for await (const page of runPages(userId)) {
    const splits = await findSplitsOfRuns(
      page.map((r) => r.id),
      unit,
    );
    const byRun = new Map<string, typeof splits>();
    for (const split of splits) byRun.set(split.run_id, [...(byRun.get(split.run_id) ?? []), split]);
    yield page.map((run) => allSplitsCsvLines(run.id, (byRun.get(run.id) ?? []).map(toSplit), unit)).join('');
  }
}

const json = (value: unknown) => Buffer.from(JSON.stringify(value, null, 2) + '\n');

/**
 * Writes the user's whole history as a zip to `out`, streamed: CSVs are generated page by page
 * as the archive reaches them and each original is fetched from the store only when its turn
 * comes. Resolves when the archive is complete; on a failure mid-way `out` is destroyed.
 */
export async function streamExport(user: UserRow, store: FileStore, out: Writable): Promise<void> {
  try {
    await writeExport(user, store, out);
  } catch (err) {
    // The response has begun: all that is left is to cut it, so the download shows as failed, not complete.
    logger.error({ err, userId: user.id }, 'an export failed mid-way');
    out.destroy(err as Error);
  }
}

async function writeExport(user: UserRow, store: FileStore, out: Writable): Promise<void> {
  const archive = new ZipArchive({ zlib: { level: 6 } });
  archive.on('warning', (err) => logger.warn({ err }, 'export warning'));
  archive.on('error', (err) => out.destroy(err));
  archive.pipe(out);
  const done = finished(out);

  archive.append(Readable.from(runsCsv(user.id)), { name: 'runs.csv' });
  archive.append(Readable.from(splitsCsv(user.id, 'mi')), { name: 'splits-mi.csv' });
  archive.append(Readable.from(splitsCsv(user.id, 'km')), { name: 'splits-km.csv' });
  archive.append(json(toProfile(user)), { name: 'profile.json' });
  const goal = await findGoalRace(user.id);
  archive.append(json(goal ? toGoalRace(goal) : null), { name: 'goal-race.json' });
  archive.append(json((await listRaceResults(user.id)).map(toRaceResult)), { name: 'race-results.json' });
  archive.append(json((await listPlansOfRunner(user.id)).map(toPlan)), { name: 'plans.json' });
  const [runNotes, weekNotes] = await Promise.all([listRunNotesFor(user.id), listWeekNotesFor(user.id)]);
  archive.append(json({ run_notes: runNotes, week_notes: weekNotes }), { name: 'notes.json' });
  // Fuel tables come from the fuel feature's migration; an install without them exports no fuel file.
  const fuelPlans = await listRowsIfTableExists('fuel_plans', 'runner_id', user.id);
  if (fuelPlans) {
    archive.append(
      json({
        fuel_items: await listRowsIfTableExists('fuel_items', 'user_id', user.id),
        fuel_plans: fuelPlans,
        fuel_taken: await listRunRowsIfTableExists('fuel_taken', user.id),
      }),
      { name: 'fuel-plans.json' },
    );
  }
  const checkins = await listRunRowsIfTableExists('run_checkins', user.id);
  if (checkins) archive.append(json(checkins), { name: 'run-checkins.json' });

  // Originals: a page of file rows at a time; each file's bytes are read when the zip reaches it.
  let afterId: string | null = null;
  while (true) {
    const files = await pageSourceFilesOf(user.id, afterId, PAGE_SIZE);
    if (files.length === 0) break;
    for (const file of files) {
      const lazy = Readable.from(
        (async function* () {
          yield await store.get(file.storage_key);
        })(),
      );
      archive.append(lazy, { name: originalPath(file.id, file.original_name), date: file.created_at });
    }
    afterId = files[files.length - 1]!.id;
  }
  await archive.finalize();
  await done;
}
