import { useEffect, useRef, useState, type FormEvent } from 'react';
import { draftToItems, itemsToDraft, type DraftItem } from '../../../../shared/plans/builder.ts';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { formatShorthand, parseShorthand } from '../../../../shared/plans/shorthand.ts';
import { PLAN_LIMITS } from '../../../../shared/plans/types.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { CONTROL_CLASSES, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { useCreatePlan } from '../api/create-plan.ts';
import { useDeletePlan } from '../api/delete-plan.ts';
import { useUpdatePlan } from '../api/update-plan.ts';
import { useCreateLibrarySession } from '../api/library.ts';
import { PlanChangesList } from './plan-changes-list.tsx';
import { SessionBuilder } from './session-builder.tsx';
import { ShorthandField } from './shorthand-field.tsx';

type SessionEditorProps = {
  /** The plan being changed, or a new session on `date`. */
  plan: Plan | null;
  date: string;
  /** A squad runner's plan (coaches): new sessions are written for them. */
  runnerId?: string;
  onClose: () => void;
  /** After a save, with the stored plan; after a delete, with null. */
  onDone: (plan: Plan | null, message: string) => void;
};

/** The builder's first rows; their keys ("first-1"…) never meet the ones added later ("row-1"…). */
function initialDraft(text: string): DraftItem[] {
  const parsed = parseShorthand(text);
  let n = 0;
  return parsed.ok ? itemsToDraft(parsed.items, () => `first-${++n}`) : [];
}

/**
 * Writing a session two ways kept in sync: the shorthand line, read in the browser on every
 * keystroke, and the form builder. A readable shorthand rebuilds the builder; a builder whose
 * fields can all be read rewrites the shorthand. The shorthand is what is sent.
 */
export function SessionEditor({ plan, date: initialDate, runnerId, onClose, onDone }: SessionEditorProps) {
  const counter = useRef(0);
  const nextId = () => `row-${++counter.current}`;
  const [date, setDate] = useState(plan?.date ?? initialDate);
  const [title, setTitle] = useState(plan?.title ?? '');
  const [notes, setNotes] = useState(plan?.notes ?? '');
  const [text, setText] = useState(plan?.text ?? '');
  const [draft, setDraft] = useState<DraftItem[]>(() => initialDraft(plan?.text ?? ''));
  const [confirmDelete, setConfirmDelete] = useState(false);
  const [submitted, setSubmitted] = useState(false);
  const shorthandRef = useRef<HTMLInputElement>(null);
  const create = useCreatePlan();
  const update = useUpdatePlan();
  const remove = useDeletePlan();

  useEffect(() => {
    shorthandRef.current?.focus();
    shorthandRef.current?.scrollIntoView({ block: 'center' });
  }, []);

  const parsed = parseShorthand(text);
  const read = draftToItems(draft);
  const builderErrors = read.ok ? {} : read.errors;

  function changeText(next: string) {
    setText(next);
    const result = parseShorthand(next);
    if (result.ok) setDraft(itemsToDraft(result.items, nextId));
  }

  function changeDraft(next: DraftItem[]) {
    setDraft(next);
    const result = draftToItems(next);
    if (result.ok) setText(formatShorthand(result.items));
  }

  const mutation = plan ? update : create;
  const serverError = mutation.error ?? remove.error;
  const blocked = !parsed.ok || !read.ok;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setSubmitted(true);
    if (blocked || !date) return;
    const done = (saved: Plan) => onDone(saved, plan ? 'Session saved.' : 'Session added.');
    if (plan) update.mutate({ id: plan.id, date, title: title.trim(), notes: notes.trim(), text }, { onSuccess: done });
    else {
      create.mutate(
        {
          date,
          text,
          ...(title.trim() ? { title: title.trim() } : {}),
          ...(notes.trim() ? { notes: notes.trim() } : {}),
          ...(runnerId ? { runner_id: runnerId } : {}),
        },
        { onSuccess: done },
      );
    }
  }

  const heading = plan ? `Edit session${plan.title ? `: ${plan.title}` : ''}` : 'New session';
  return (
    <Card
      title={heading}
      description="Write it in shorthand or build it part by part: each follows the other."
      actions={
        <Button variant="quiet" onClick={onClose}>
          Close
        </Button>
      }
    >
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label={heading}>
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
          <TextField
            label="Date"
            type="date"
            required
            value={date}
            onChange={(e) => setDate(e.target.value)}
            error={submitted && !date ? 'Pick the day of the session.' : undefined}
            hint={plan ? 'Change it to move the session to another day.' : undefined}
          />
          <TextField
            label="Title (optional)"
            value={title}
            maxLength={PLAN_LIMITS.maxTitleLength}
            onChange={(e) => setTitle(e.target.value)}
            placeholder="Track 800s"
          />
        </div>
        <ShorthandField value={text} onChange={changeText} result={parsed} inputRef={shorthandRef} />

        <section aria-labelledby="builder-heading" className="flex flex-col gap-2">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h3 id="builder-heading" className="font-semibold">
              Builder
            </h3>
            {!parsed.ok && text.trim() !== '' && draft.length > 0 && (
              <p className="text-sm text-ink-muted">Showing the last shorthand that could be read.</p>
            )}
          </div>
          <SessionBuilder draft={draft} errors={builderErrors} onChange={changeDraft} nextId={nextId} />
        </section>

        <div className="flex flex-col gap-1">
          <label htmlFor="session-notes" className="text-sm font-semibold">
            Notes (optional)
          </label>
          <textarea
            id="session-notes"
            rows={2}
            value={notes}
            maxLength={PLAN_LIMITS.maxTextLength}
            onChange={(e) => setNotes(e.target.value)}
            placeholder="On the track, lane 3; jog the recoveries, do not walk."
            className={`${CONTROL_CLASSES} w-full px-3 py-2 text-base`}
          />
        </div>

        {submitted && blocked && (
          <FormAlert>
            {!parsed.ok
              ? `The session cannot be read yet: ${parsed.error.message}`
              : 'Some builder fields cannot be read: see the messages beside them.'}
          </FormAlert>
        )}
        {serverError && (
          <FormAlert>
            {serverError.message}
            {isApiError(serverError) && serverError.fieldIssues.length > 0 && (
              <> {serverError.fieldIssues.map((issue) => `${issue.field}: ${issue.message}`).join(' ')}</>
            )}
          </FormAlert>
        )}

        <div className="flex flex-wrap items-center gap-2">
          <Button type="submit" disabled={mutation.isPending}>
            {mutation.isPending ? 'Saving…' : plan ? 'Save changes' : 'Save session'}
          </Button>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          {plan &&
            (confirmDelete ? (
              <span className="ml-auto flex flex-wrap items-center gap-2" role="group" aria-label="Confirm delete">
                <span className="text-sm font-semibold">Delete this session plan?</span>
                <Button
                  variant="danger"
                  disabled={remove.isPending}
                  onClick={() => remove.mutate(plan.id, { onSuccess: () => onDone(null, 'Session deleted.') })}
                >
                  Yes, delete
                </Button>
                <Button variant="secondary" onClick={() => setConfirmDelete(false)}>
                  Keep it
                </Button>
              </span>
            ) : (
              <Button variant="danger" className="ml-auto" onClick={() => setConfirmDelete(true)}>
                Delete session
              </Button>
            ))}
        </div>
      </form>
      {plan && (
        <div className="mt-4 flex flex-col gap-4 border-t border-line pt-4">
          <SaveToLibrary planId={plan.id} defaultName={plan.title} />
          <PlanChangesList planId={plan.id} />
        </div>
      )}
    </Card>
  );
}

/** Keeps this session (parts and fuel plan) in the signed-in person's library under a name. */
function SaveToLibrary({ planId, defaultName }: { planId: string; defaultName: string }) {
  const [name, setName] = useState(defaultName);
  const create = useCreateLibrarySession();
  return (
    <form
      noValidate
      aria-label="Save to library"
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate({ name, plan_id: planId });
      }}
    >
      <TextField
        label="Library name"
        value={name}
        maxLength={80}
        onChange={(e) => setName(e.target.value)}
        hint="Keeps the parts and the fuel plan, to add on other days or for other runners."
        className="w-72 max-w-full"
      />
      <Button type="submit" variant="secondary" disabled={create.isPending}>
        Save to library
      </Button>
      {create.isSuccess && (
        <p role="status" className="text-sm text-teal">
          Saved to your library as “{create.data.name}”.
        </p>
      )}
      {create.error && <FormAlert>{create.error.message}</FormAlert>}
    </form>
  );
}
