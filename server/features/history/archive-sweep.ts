import { rm } from 'node:fs/promises';
import path from 'node:path';
import { importIdOfArchive, selectLeftoverArchives } from '../../../shared/runs/orphan-files.ts';
import { listFilesWithTimes } from '../../lib/dir-listing.ts';
import { logger } from '../../lib/logger.ts';
import { findImportStatuses } from './imports.repository.ts';
import { importsDir } from './imports.service.ts';

/**
 * Removes bulk-import archives in DATA_DIR/imports that no unfinished import will read again (a crash
 * between the import's end and the archive's removal). Part of the hourly orphan sweep, which
 * jobs/ starts with this step handed in, so runs/ (the sweep) never imports history/.
 */
export async function sweepLeftoverArchives(dataDir: string, now: Date, graceSeconds: number): Promise<string[]> {
  const dir = importsDir(dataDir);
  const files = await listFilesWithTimes(dir);
  const importIds = files.map((f) => importIdOfArchive(f.key)).filter((id) => id !== null);
  const statuses = await findImportStatuses(importIds);
  const leftovers = selectLeftoverArchives(files, statuses, now, graceSeconds);
  for (const name of leftovers) {
    await rm(path.join(dir, name), { force: true });
    logger.warn({ file: path.join(dir, name) }, 'removed a bulk-import archive that no unfinished import needs');
  }
  return leftovers;
}
