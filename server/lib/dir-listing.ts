import { readdir, stat } from 'node:fs/promises';
import path from 'node:path';
import type { StoredFileInfo } from '../../shared/runs/orphan-files.ts';

/** The plain files in `dir` with their modification times; none when the folder does not exist yet. */
export async function listFilesWithTimes(dir: string): Promise<StoredFileInfo[]> {
  let names: string[];
  try {
    names = (await readdir(dir, { withFileTypes: true })).filter((e) => e.isFile()).map((e) => e.name);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
  const files = await Promise.all(
    names.map(async (name) => {
      const info = await stat(path.join(dir, name)).catch(() => null);
      return info ? { key: name, modifiedAt: info.mtime } : null;
    }),
  );
  return files.filter((f) => f !== null);
}
