import { cn } from '../../../lib/cn.ts';
import { useEffect, useId, useRef } from 'react';
import type { ImportProgress } from '../../../../shared/history/schemas.ts';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isImportFinished, useImport } from '../api/get-import.ts';
import { useStartImport } from '../api/start-import.ts';

type HistoryImportProps = {
  /** The import shown (from the address, so the bar survives a reload); null before any. */
  importId: string | null;
  onStarted: (importId: string) => void;
  /** Called once when the import shown finishes (to refresh the run list). */
  onFinished: () => void;
};

const BAR =
  'h-2 w-full appearance-none overflow-hidden rounded-full bg-line [&::-moz-progress-bar]:bg-teal [&::-webkit-progress-bar]:bg-line [&::-webkit-progress-value]:bg-teal';

/** "Bring in a whole history": pick a .zip, watch it upload, then watch the background import file by file. */
export function HistoryImport({ importId, onStarted, onFinished }: HistoryImportProps) {
  const { upload, send } = useStartImport(onStarted);
  const hintId = useId();
  const sending = upload.state === 'sending';

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center gap-3">
        <label className={cn('inline-flex rounded-md', sending ? 'cursor-not-allowed' : 'cursor-pointer')}>
          <span className="inline-flex min-h-11 items-center rounded-md border border-line bg-card px-3.5 py-1.5 text-sm font-semibold text-ink hover:border-teal hover:text-teal sm:min-h-9">
            Bring in a whole history (.zip)
          </span>
          <input
            type="file"
            accept=".zip,application/zip"
            aria-describedby={hintId}
            disabled={sending}
            className="sr-only"
            onChange={(event) => {
              const file = event.target.files?.[0];
              if (file) void send(file);
              event.target.value = '';
            }}
          />
        </label>
        <p id={hintId} className="text-sm text-ink-muted">
          A .zip of GPX or TCX files (also .gpx.gz, .tcx.gz), up to 5 000 files and 1 GB. Files already in your log are recognised
          and left alone.
        </p>
      </div>

      {upload.state === 'sending' && (
        <div className="flex items-center gap-2 text-sm">
          <progress
            max={100}
            value={Math.round(upload.progress * 100)}
            aria-label={`Upload of ${upload.fileName}`}
            className={BAR}
          />
          <span className="w-32 shrink-0 text-right text-ink-muted tabular-nums">
            {upload.progress < 1 ? `sending ${Math.round(upload.progress * 100)} %` : 'checking the zip…'}
          </span>
        </div>
      )}
      {upload.state === 'failed' && (
        <FormAlert>
          {upload.fileName}: {upload.error}
        </FormAlert>
      )}

      {importId && <ImportProgressPanel key={importId} importId={importId} onFinished={onFinished} />}
    </div>
  );
}

function ImportProgressPanel({ importId, onFinished }: { importId: string; onFinished: () => void }) {
  const { data: progress, error } = useImport(importId);
  const finished = isImportFinished(progress);
  const reported = useRef(false);
  useEffect(() => {
    if (finished && !reported.current) {
      reported.current = true;
      onFinished();
    }
  }, [finished, onFinished]);

  if (error) return <FormAlert>{error.message}</FormAlert>;
  if (!progress) return <p className="text-sm text-ink-muted">Looking up the import…</p>;
  return <ImportProgressView progress={progress} />;
}

const STATUS_WORDS: Record<ImportProgress['status'], string> = {
  queued: 'Waiting for its turn…',
  running: 'Importing…',
  done: 'Finished.',
  failed: 'Stopped: the archive could not be read to the end.',
};

export function ImportProgressView({ progress }: { progress: ImportProgress }) {
  const percent = progress.total > 0 ? Math.round((progress.done / progress.total) * 100) : 0;
  return (
    <div className="flex flex-col gap-2 rounded-md border border-line bg-paper p-3 text-sm">
      <div className="flex items-center gap-2">
        <progress max={progress.total} value={progress.done} aria-label="Files imported from the archive" className={BAR} />
        <span className="w-12 shrink-0 text-right text-ink-muted tabular-nums">{percent} %</span>
      </div>
      <p role="status" className="tabular-nums">
        <span className="font-semibold">{STATUS_WORDS[progress.status]}</span> {progress.done} of {progress.total} files done ·{' '}
        {progress.imported} imported · {progress.duplicates} already in your log · {progress.rejected.length} refused
      </p>
      {progress.rejected.length > 0 && (
        <details>
          <summary className="cursor-pointer text-tartan-deep">
            Why {progress.rejected.length === 1 ? 'one file was' : `${progress.rejected.length} files were`} refused
          </summary>
          <ul aria-label="Refused files" className="mt-1 flex max-h-64 flex-col gap-0.5 overflow-y-auto">
            {progress.rejected.map((r, i) => (
              <li key={i} className="break-words">
                <span className="font-semibold">{r.file}</span>: {r.error}
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
