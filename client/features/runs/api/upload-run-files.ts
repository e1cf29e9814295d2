import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import type { ImportResult } from '../../../../shared/runs/schemas.ts';
import { api } from '../../../lib/api-client.ts';
import { runKeys } from './run-keys.ts';

/** Uploads one file as its own request (part name `files`); 422 carries the per-file refusal, not an error. */
export async function uploadRunFile(
  file: File,
  onProgress?: (fraction: number) => void,
  importDuplicates = false,
): Promise<ImportResult> {
  const form = new FormData();
  form.append('files', file, file.name);
  const path = importDuplicates ? '/runs?duplicates=import' : '/runs';
  return api.upload<ImportResult>(path, form, { onProgress, answerStatuses: [422] });
}

export type RunUpload = {
  key: string;
  fileName: string;
  /** Fraction of the file sent, 0–1. */
  progress: number;
  state: 'waiting' | 'sending' | 'done' | 'failed';
  result?: ImportResult;
  /** Why the request failed as a whole (too large, network). */
  error?: string;
  /** Kept so a file holding a run already in the log can be imported anyway. */
  file: File;
};

/**
 * Uploads files one after another, each in its own request, keeping a progress bar and the answer
 * per file. This is the state of the uploads on this page, not server state; the runs list is
 * refreshed from the server after each import.
 */
export function useRunUploads() {
  const queryClient = useQueryClient();
  const [uploads, setUploads] = useState<RunUpload[]>([]);
  const queue = useRef<Promise<void>>(Promise.resolve());
  const counter = useRef(0);

  const update = (key: string, change: Partial<RunUpload>) =>
    setUploads((list) => list.map((u) => (u.key === key ? { ...u, ...change } : u)));

  function add(files: File[]) {
    const added = files.map((file) => ({ file, key: `upload-${++counter.current}` }));
    setUploads((list) => [
      ...added.map(({ file, key }) => ({ key, fileName: file.name, progress: 0, state: 'waiting' as const, file })),
      ...list,
    ]);
    for (const { file, key } of added) send(file, key, false);
  }

  function send(file: File, key: string, importDuplicates: boolean) {
    queue.current = queue.current.then(async () => {
      update(key, { state: 'sending', progress: 0 });
      try {
        const result = await uploadRunFile(file, (progress) => update(key, { progress }), importDuplicates);
        update(key, { state: 'done', progress: 1, result });
        if (result.imported.length > 0) await queryClient.invalidateQueries({ queryKey: runKeys.lists() });
      } catch (error) {
        update(key, { state: 'failed', error: error instanceof Error ? error.message : 'The upload failed.' });
      }
    });
  }

  /** Sends a file again, importing the runs that match one already in the log. */
  function importAnyway(key: string) {
    const upload = uploads.find((u) => u.key === key);
    if (upload) send(upload.file, key, true);
  }

  return {
    uploads,
    add,
    importAnyway,
    clear: () => setUploads((list) => list.filter((u) => u.state === 'waiting' || u.state === 'sending')),
  };
}
