import { useId, useState, type DragEvent } from 'react';
import { Link } from 'react-router-dom';
import type { ImportResult } from '../../../../shared/runs/schemas.ts';
import { formatDistance } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';
import { useRunUploads, type RunUpload } from '../api/upload-run-files.ts';

const ACCEPT = '.gpx,.tcx,.gz';

/** Drop zone and file picker; each file goes up on its own with its own progress bar and answer. */
export function RunUpload({ unit }: { unit: Unit }) {
  const { uploads, add, clear, importAnyway } = useRunUploads();
  const [dragging, setDragging] = useState(false);
  const hintId = useId();
  const finished = uploads.some((u) => u.state === 'done' || u.state === 'failed');

  function onDrop(event: DragEvent<HTMLDivElement>) {
    event.preventDefault();
    setDragging(false);
    const files = Array.from(event.dataTransfer.files);
    if (files.length) add(files);
  }

  return (
    <div className="flex flex-col gap-3">
      <div
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={cn(
          'flex flex-col items-center gap-2 rounded-lg border-2 border-dashed px-4 py-6 text-center transition-colors',
          dragging ? 'border-teal bg-teal-wash' : 'border-line-strong bg-paper',
        )}
      >
        <p className="font-semibold">Drop watch files here</p>
        <p id={hintId} className="text-sm text-ink-muted">
          GPX or TCX, also gzip-compressed (.gpx.gz, .tcx.gz); several at once.
        </p>
        <label className="inline-flex cursor-pointer rounded-md">
          <span className="inline-flex min-h-11 items-center rounded-md bg-teal px-3.5 py-1.5 text-sm font-semibold text-white hover:bg-teal-deep sm:min-h-9">
            Choose files
          </span>
          <input
            type="file"
            accept={ACCEPT}
            multiple
            aria-describedby={hintId}
            className="sr-only"
            onChange={(event) => {
              const files = Array.from(event.target.files ?? []);
              if (files.length) add(files);
              event.target.value = '';
            }}
          />
        </label>
      </div>
      {uploads.length > 0 && (
        <div className="flex flex-col gap-1">
          <ul aria-label="Uploads" className="flex flex-col divide-y divide-line">
            {uploads.map((upload) => (
              <UploadRow key={upload.key} upload={upload} unit={unit} onImportAnyway={() => importAnyway(upload.key)} />
            ))}
          </ul>
          {finished && (
            <Button variant="quiet" className="self-end" onClick={clear}>
              Clear finished
            </Button>
          )}
        </div>
      )}
    </div>
  );
}

type OutcomeProps = { upload: RunUpload; unit: Unit; onImportAnyway: () => void };

function UploadRow({ upload, unit, onImportAnyway }: OutcomeProps) {
  const percent = Math.round(upload.progress * 100);
  return (
    <li className="grid grid-cols-1 gap-x-4 gap-y-1 py-2 text-sm sm:grid-cols-[minmax(0,14rem)_9rem_minmax(0,1fr)] sm:items-center">
      <span className="truncate font-semibold" title={upload.fileName}>
        {upload.fileName}
      </span>
      <span className="flex items-center gap-2">
        <progress
          max={100}
          value={percent}
          aria-label={`Upload of ${upload.fileName}`}
          className="h-1.5 w-full appearance-none overflow-hidden rounded-full bg-line [&::-moz-progress-bar]:bg-teal [&::-webkit-progress-bar]:bg-line [&::-webkit-progress-value]:bg-teal"
        />
        <span className="w-10 shrink-0 text-right text-xs whitespace-nowrap text-ink-muted tabular-nums">{percent} %</span>
      </span>
      <span role="status" className="min-w-0">
        <UploadOutcome upload={upload} unit={unit} onImportAnyway={onImportAnyway} />
      </span>
    </li>
  );
}

function UploadOutcome({ upload, unit, onImportAnyway }: OutcomeProps) {
  if (upload.state === 'waiting') return <span className="text-ink-muted">waiting…</span>;
  if (upload.state === 'sending')
    return <span className="text-ink-muted">{upload.progress < 1 ? 'sending…' : 'computing splits…'}</span>;
  if (upload.state === 'failed') return <span className="text-tartan-deep">refused: {upload.error}</span>;
  return <ResultLines result={upload.result!} unit={unit} onImportAnyway={onImportAnyway} />;
}

/**
 * One line per run in the file (a TCX can hold several), per duplicate and per refusal. A run found
 * in the log by its start and distance (not the same bytes) can be imported anyway.
 */
function ResultLines({ result, unit, onImportAnyway }: { result: ImportResult; unit: Unit; onImportAnyway: () => void }) {
  const sameRun = result.duplicates.some((dup) => dup.reason === 'same run');
  return (
    <span className="flex flex-col">
      {result.imported.map((run) => (
        <span key={run.id}>
          imported →{' '}
          <Link to={paths.run.getHref(run.id)} className="font-semibold text-teal underline-offset-2 hover:underline">
            {run.name}
          </Link>{' '}
          <span className="text-ink-muted tabular-nums">
            {formatDistance(run.distance_m, unit)} {unit} · {formatDuration(run.moving_s)}
          </span>
        </span>
      ))}
      {result.duplicates.map((dup) => (
        <span key={`${dup.runId}-${dup.activity ?? 0}`}>
          {dup.activity !== null && `activity ${dup.activity}: `}
          {dup.reason === 'same file'
            ? 'this file is already in your log'
            : 'already in your log (same start within 5 s, distance within 2 %)'}{' '}
          →{' '}
          <Link to={paths.run.getHref(dup.runId)} className="font-semibold text-teal underline-offset-2 hover:underline">
            open the existing run
          </Link>
        </span>
      ))}
      {sameRun && (
        <Button variant="quiet" className="self-start" onClick={onImportAnyway}>
          Import anyway
        </Button>
      )}
      {result.rejected.map((rej, i) => (
        <span key={i} className="text-tartan-deep">
          refused: {rej.error}
        </span>
      ))}
    </span>
  );
}
