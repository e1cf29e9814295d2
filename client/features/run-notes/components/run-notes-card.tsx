import { useRef } from 'react';
import { NewRunNoteInputSchema, type RunNote } from '../../../../shared/runs/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { CONTROL_CLASSES, FieldShell } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { CardClockWords, CardTime, cardClock, type CardClock } from '../../../components/ui/zoned-time.tsx';
import { cn } from '../../../lib/cn.ts';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useMarkReadOnOpen } from '../../notes/index.ts';
import { UnreadDot } from '../../notes/index.ts';
import { useAddRunNote } from '../api/add-run-note.ts';
import { useRunNotes } from '../api/get-run-notes.ts';

type RunNotesCardProps = {
  runId: string;
  myId: string | undefined;
  ownerId?: string;
  /** The runner's profile zone: when each note was written is shown on the runner's clock, named once in the heading. */
  ownerZone: string;
};

/** The thread between a runner and their coaches about one run. */
export function RunNotesCard({ runId, myId, ownerId, ownerZone }: RunNotesCardProps) {
  // The same query as the thread's (one request): the heading names the runner's clock once for all the notes.
  const { data: notes } = useRunNotes(runId);
  const clock = cardClock(
    (notes ?? []).map((n) => ({ iso: n.created_at, shape: 'date-time' })),
    ownerZone,
    ownerId !== undefined && ownerId === myId,
  );
  return (
    <Card
      title="Notes"
      description={
        <>
          Between the runner and their coaches: nobody else reads them. <CardClockWords clock={clock} />
        </>
      }
    >
      <div className="flex flex-col gap-4">
        <NoteThread runId={runId} myId={myId} clock={clock} />
        <NoteForm runId={runId} canFlag={ownerId !== undefined && ownerId === myId} />
      </div>
    </Card>
  );
}

function NoteThread({ runId, myId, clock }: { runId: string; myId: string | undefined; clock: CardClock }) {
  const { data: notes, isPending, error } = useRunNotes(runId);
  // Opening the run opens its notes: marked read now, their "new" marker kept for this visit.
  useMarkReadOnOpen((notes ?? []).filter((n) => n.unread).map((n) => n.id));
  if (isPending) return <p className="text-ink-muted">Loading the notes…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  if (notes.length === 0) return <p className="text-ink-muted">No notes on this run yet.</p>;
  return (
    <ol aria-label="Notes on this run" className="flex flex-col gap-3">
      {notes.map((note) => (
        <NoteItem key={note.id} note={note} mine={note.author.id === myId} clock={clock} />
      ))}
    </ol>
  );
}

function NoteItem({ note, mine, clock }: { note: RunNote; mine: boolean; clock: CardClock }) {
  return (
    <li
      className={cn('rounded-md border-l-4 bg-paper px-3 py-2', note.author.role === 'coach' ? 'border-tartan' : 'border-teal')}
    >
      <p className="text-sm">
        <span className="font-semibold">{mine ? `${note.author.name} (you)` : note.author.name}</span>
        {note.author.role === 'coach' && <span className="text-ink-muted"> · coach</span>}
        <span className="text-ink-muted">
          {' · '}
          <CardTime iso={note.created_at} clock={clock} />
        </span>
        {note.concern && <span className="font-semibold text-tartan"> · about {note.concern}</span>}{' '}
        {note.unread && <UnreadDot />}
      </p>
      <p className="mt-1 break-words whitespace-pre-wrap">{note.text}</p>
    </li>
  );
}

function NoteForm({ runId, canFlag }: { runId: string; canFlag: boolean }) {
  const mutation = useAddRunNote(runId);
  const formRef = useRef<HTMLFormElement>(null);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: NewRunNoteInputSchema,
    mutation,
    readValues: (data) => ({
      text: readText(data, 'text'),
      ...(canFlag && data.get('concern') ? { concern: String(data.get('concern')) } : {}),
    }),
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
      {canFlag && (
        <FieldShell label="Is it about pain or illness?" hint="Your coach gets an e-mail at once." error={fieldErrors.concern}>
          {(control) => (
            <select name="concern" className={cn(CONTROL_CLASSES, 'min-h-11 px-3 text-base')} {...control}>
              <option value="">No</option>
              <option value="pain">Pain</option>
              <option value="illness">Illness</option>
            </select>
          )}
        </FieldShell>
      )}
      <div>
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Adding…' : 'Add note'}
        </Button>
      </div>
    </form>
  );
}
