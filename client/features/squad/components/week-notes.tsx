import { useRef } from 'react';
import { NewRunNoteInputSchema } from '../../../../shared/runs/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { CONTROL_CLASSES, FieldShell } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { CardTime, type CardClock } from '../../../components/ui/zoned-time.tsx';
import { cn } from '../../../lib/cn.ts';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { UnreadDot } from '../../notes/index.ts';
import { useAddWeekNote } from '../api/add-week-note.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';

type WeekNotesProps = {
  week: RunnerWeek;
  meId: string;
  otherSide: string;
  /** The card's clock (the runner's zone), named once in the card's heading: each note shows a bare time. */
  clock: CardClock;
};

/** The week's notes, oldest first, from the runner and their coaches; both sides read and write them. */
export function WeekNotes({ week, meId, otherSide, clock }: WeekNotesProps) {
  const mutation = useAddWeekNote(week.runner_id, week.start);
  const formRef = useRef<HTMLFormElement>(null);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: NewRunNoteInputSchema,
    mutation,
    readValues: (data) => ({ text: readText(data, 'text') }),
    onSuccess: () => formRef.current?.reset(),
  });
  return (
    <div className="flex flex-col gap-4 text-sm">
      {week.notes.length === 0 ? (
        <p className="text-ink-muted">No notes on this week yet. A note here is seen by {otherSide}.</p>
      ) : (
        <ol className="flex flex-col gap-3" aria-label="Notes on this week">
          {week.notes.map((note) => (
            <li
              key={note.id}
              className={cn(
                'rounded-md border px-3 py-2',
                note.author.id === meId ? 'border-line bg-paper' : 'border-line bg-white',
              )}
            >
              <p className="text-xs text-ink-muted">
                <span className="font-semibold text-ink">{note.author.id === meId ? 'You' : note.author.name}</span>
                {note.author.role === 'coach' && note.author.id !== meId && ' (coach)'} ·{' '}
                <CardTime iso={note.created_at} clock={clock} />
                {note.concern && <span className="font-semibold text-tartan"> · about {note.concern}</span>}{' '}
                {note.unread && <UnreadDot />}
              </p>
              <p className="mt-1 break-words whitespace-pre-wrap">{note.text}</p>
            </li>
          ))}
        </ol>
      )}
      <form ref={formRef} noValidate onSubmit={onSubmit} aria-label="Write a note" className="flex flex-col gap-2">
        <FieldShell label="Note on this week" error={fieldErrors.text} hint={`Seen by ${otherSide} and by you.`}>
          {(control) => (
            <textarea name="text" rows={3} className={cn(CONTROL_CLASSES, 'w-full px-3 py-2 text-base')} {...control} />
          )}
        </FieldShell>
        <Button type="submit" disabled={mutation.isPending} className="self-start">
          {mutation.isPending ? 'Saving…' : 'Add note'}
        </Button>
        {formError && <FormAlert>{formError}</FormAlert>}
      </form>
    </div>
  );
}
