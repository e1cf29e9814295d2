import { useRef } from 'react';
import { NewRunNoteInputSchema, type RunNote } from '../../../../shared/runs/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { CONTROL_CLASSES, FieldShell } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { cn } from '../../../lib/cn.ts';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { formatDateTime } from '../../../lib/format.ts';
import { useAddRunNote } from '../api/add-run-note.ts';
import { useRunNotes } from '../api/get-run-notes.ts';

/** The thread between a runner and their coaches about one run. */
export function RunNotesCard({ runId, myId }: { runId: string; myId: string | undefined }) {
  return (
    <Card title="Notes" description="Between the runner and their coaches: nobody else reads them.">
      <div className="flex flex-col gap-4">
        <NoteThread runId={runId} myId={myId} />
        <NoteForm runId={runId} />
      </div>
    </Card>
  );
}

function NoteThread({ runId, myId }: { runId: string; myId: string | undefined }) {
  const { data: notes, isPending, error } = useRunNotes(runId);
  if (isPending) return <p className="text-ink-muted">Loading the notes…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  if (notes.length === 0) return <p className="text-ink-muted">No notes on this run yet.</p>;
  return (
    <ol aria-label="Notes on this run" className="flex flex-col gap-3">
      {notes.map((note) => (
        <NoteItem key={note.id} note={note} mine={note.author.id === myId} />
      ))}
    </ol>
  );
}

function NoteItem({ note, mine }: { note: RunNote; mine: boolean }) {
  return (
    <li
      className={cn('rounded-md border-l-4 bg-paper px-3 py-2', note.author.role === 'coach' ? 'border-tartan' : 'border-teal')}
    >
      <p className="text-sm">
        <span className="font-semibold">{mine ? `${note.author.name} (you)` : note.author.name}</span>
        {note.author.role === 'coach' && <span className="text-ink-muted"> · coach</span>}
        <span className="text-ink-muted">
          {' · '}
          <time dateTime={note.created_at}>{formatDateTime(note.created_at)}</time>
        </span>
      </p>
      <p className="mt-1 break-words whitespace-pre-wrap">{note.text}</p>
    </li>
  );
}

function NoteForm({ runId }: { runId: string }) {
  const mutation = useAddRunNote(runId);
  const formRef = useRef<HTMLFormElement>(null);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: NewRunNoteInputSchema,
    mutation,
    readValues: (data) => ({ text: readText(data, 'text') }),
    onSuccess: () => formRef.current?.reset(),
  });

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-3">
      {formError && <FormAlert>{formError}</FormAlert>}
      <FieldShell label="Write a note" hint="How it felt, what to change next time, a question." error={fieldErrors.text}>
        {(control) => (
          <textarea
            name="text"
            rows={3}
            maxLength={4000}
            className={cn(CONTROL_CLASSES, 'w-full px-3 py-2 text-base')}
            {...control}
          />
        )}
      </FieldShell>
      <div>
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Adding…' : 'Add note'}
        </Button>
      </div>
    </form>
  );
}
