import { useState } from 'react';
import { MAX_ARCHIVE_UPLOAD_BYTES } from '../../../../shared/history/archive-rules.ts';
import type { ImportCreated } from '../../../../shared/history/schemas.ts';
import { api } from '../../../lib/api-client.ts';

/** Sends one .zip (part name `file`); the server checks it and answers with the import's id. */
export async function startImport(file: File, onProgress?: (fraction: number) => void): Promise<ImportCreated> {
  const form = new FormData();
  form.append('file', file, file.name);
  return api.upload<ImportCreated>('/imports', form, { onProgress });
}

export type ArchiveUpload =
  | { state: 'idle' }
  | { state: 'sending'; fileName: string; progress: number }
  | { state: 'failed'; fileName: string; error: string };

/**
 * The upload of one history archive, with its progress (state of this page, not server state).
 * `onStarted` receives the new import's id once the server has accepted the archive.
 */
export function useStartImport(onStarted: (importId: string) => void) {
  const [upload, setUpload] = useState<ArchiveUpload>({ state: 'idle' });

  async function send(file: File) {
    if (file.size > MAX_ARCHIVE_UPLOAD_BYTES) {
      setUpload({
        state: 'failed',
        fileName: file.name,
        error: 'A history archive can be at most 1 GB. Split it into smaller zips and bring them in one after another.',
      });
      return;
    }
    setUpload({ state: 'sending', fileName: file.name, progress: 0 });
    try {
      const created = await startImport(file, (progress) => setUpload({ state: 'sending', fileName: file.name, progress }));
      setUpload({ state: 'idle' });
      onStarted(created.import.id);
    } catch (error) {
      setUpload({ state: 'failed', fileName: file.name, error: error instanceof Error ? error.message : 'The upload failed.' });
    }
  }

  return { upload, send };
}
