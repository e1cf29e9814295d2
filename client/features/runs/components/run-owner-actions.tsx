import { useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { RenameRunInputSchema } from '../../../../shared/runs/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { CONTROL_CLASSES } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';
import { useDeleteRun } from '../api/delete-run.ts';
import { useRenameRun } from '../api/rename-run.ts';

/** Rename inline and delete after a confirmation; shown to the run's owner only (the server checks again). */
export function RunOwnerActions({ runId, name }: { runId: string; name: string }) {
  const [mode, setMode] = useState<'idle' | 'renaming' | 'confirming-delete'>('idle');
  const [nameError, setNameError] = useState<string | null>(null);
  const rename = useRenameRun();
  const remove = useDeleteRun();
  const navigate = useNavigate();

  function onRename(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = RenameRunInputSchema.safeParse({ name: new FormData(event.currentTarget).get('name') });
    if (!parsed.success || parsed.data.name === undefined) {
      setNameError(parsed.error?.issues[0]?.message ?? 'Give the run a name.');
      return;
    }
    setNameError(null);
    rename.mutate({ id: runId, name: parsed.data.name }, { onSuccess: () => setMode('idle') });
  }

  if (mode === 'renaming') {
    const error = nameError ?? (rename.isError ? rename.error.message : null);
    return (
      <form onSubmit={onRename} noValidate className="flex w-full flex-wrap items-start gap-2">
        <label htmlFor="run-name" className="sr-only">
          Run name
        </label>
        <input
          id="run-name"
          name="name"
          defaultValue={name}
          maxLength={120}
          autoFocus
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'run-name-error' : undefined}
          className={cn(CONTROL_CLASSES, 'min-w-0 flex-1 px-3 py-1.5 text-base sm:max-w-md')}
        />
        <Button type="submit" disabled={rename.isPending}>
          {rename.isPending ? 'Saving…' : 'Save name'}
        </Button>
        <Button variant="secondary" onClick={() => setMode('idle')}>
          Cancel
        </Button>
        {error && (
          <p id="run-name-error" role="alert" className="w-full text-sm font-semibold text-tartan">
            {error}
          </p>
        )}
      </form>
    );
  }

  if (mode === 'confirming-delete') {
    return (
      <div className="flex w-full flex-col gap-2" role="group" aria-label="Delete this run">
        <FormAlert>
          Delete “{name}”? Its splits, laps and the original file go too. This cannot be undone.
          {remove.isError && <> Not deleted: {remove.error.message}</>}
        </FormAlert>
        <div className="flex gap-2">
          <Button
            variant="danger"
            disabled={remove.isPending}
            onClick={() => remove.mutate(runId, { onSuccess: () => navigate(paths.log.getHref(), { replace: true }) })}
          >
            {remove.isPending ? 'Deleting…' : 'Delete run'}
          </Button>
          <Button variant="secondary" onClick={() => setMode('idle')}>
            Keep it
          </Button>
        </div>
      </div>
    );
  }

  return (
    <div className="flex gap-2">
      <Button variant="secondary" onClick={() => setMode('renaming')}>
        Rename
      </Button>
      <Button variant="secondary" onClick={() => setMode('confirming-delete')}>
        Delete…
      </Button>
    </div>
  );
}
