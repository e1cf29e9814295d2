import { useEffect, useRef, useState, type FocusEvent, type FormEvent } from 'react';
import { toFieldErrors, toFieldIssues } from '../../../../shared/api/field-issues.ts';
import { draftToItems, itemsToDraft, type DraftItem } from '../../../../shared/plans/builder.ts';
import { CreatePlanInputSchema, UpdatePlanInputSchema, type Plan } from '../../../../shared/plans/schemas.ts';
import { formatShorthand, parseShorthand } from '../../../../shared/plans/shorthand.ts';
import { PLAN_LIMITS } from '../../../../shared/plans/types.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { CONTROL_CLASSES, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { useDraft } from '../../../lib/use-draft.ts';
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
  /** The signed-in person: what is typed is kept on this device per person and per session until saved. */
  userId: string;
  /** A squad runner's plan (coaches): new sessions are written for them. */
  runnerId?: string;
  /** The plan owner's profile zone (the runner's, or the signed-in person's own): its record of changes is read on it. */
  ownerZone: string;
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

/** What the editor keeps over a reload: the fields and the builder's rows (which may hold text not yet readable). */
type EditorDraft = { date: string; title: string; notes: string; text: string; items: DraftItem[] };

/** The fields the server names in its answers, each shown beside its control. */
const FIELDS = ['date', 'title', 'notes', 'text'] as const;
type Field = (typeof FIELDS)[number];
const isField = (name: string): name is Field => (FIELDS as readonly string[]).includes(name);

/** The highest "row-N" among restored rows, so rows added after a reload get new keys. */
function highestRow(items: readonly DraftItem[]): number {
  return Math.max(0, ...[...JSON.stringify(items).matchAll(/"row-(\d+)"/g)].map((m) => Number(m[1])));
}

/**
 * Writing a session two ways kept in sync: the shorthand line, read in the browser on every
 * keystroke, and the form builder. A readable shorthand rebuilds the builder; a builder whose
 * fields can all be read rewrites the shorthand. The shorthand is what is sent.
 */
export function SessionEditor({ plan, date: initialDate, userId, runnerId, ownerZone, onClose, onDone }: SessionEditorProps) {
  const fresh = (): EditorDraft => ({
    date: plan?.date ?? initialDate,
    title: plan?.title ?? '',
    notes: plan?.notes ?? '',
    text: plan?.text ?? '',
    items: initialDraft(plan?.text ?? ''),
  });
  const stored = useDraft<EditorDraft>(`session:${userId}:${plan ? plan.id : `new:${runnerId ?? 'own'}:${initialDate}`}`, fresh);
  const { date, title, notes, text, items: draft } = stored.value;
  const patch = (change: Partial<EditorDraft>) => stored.update((d) => ({ ...d, ...change }));
  const setDate = (next: string) => patch({ date: next });
  const setTitle = (next: string) => patch({ title: next });
  const setNotes = (next: string) => patch({ notes: next });
  const counter = useRef(highestRow(draft));
  const nextId = () => `row-${++counter.current}`;
  const [confirmDelete, setConfirmDelete] = useState(false);
  const [submitted, setSubmitted] = useState(false);
  const [touched, setTouched] = useState<ReadonlySet<string>>(new Set());
  const [answered, setAnswered] = useState<Partial<Record<Field, string>>>({});
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
    const result = parseShorthand(next);
    patch(result.ok ? { text: next, items: itemsToDraft(result.items, nextId) } : { text: next });
  }

  function changeDraft(next: DraftItem[]) {
    const result = draftToItems(next);
    patch(result.ok ? { items: next, text: formatShorthand(result.items) } : { items: next });
  }

  const mutation = plan ? update : create;
  const serverError = mutation.error ?? remove.error;
  const blocked = !parsed.ok || !read.ok;

  // The same schema the server uses, on every change: a field's message shows once it was left or a save tried.
  const body = plan
    ? { date, title: title.trim(), notes: notes.trim(), text }
    : {
        date,
        text,
        ...(title.trim() ? { title: title.trim() } : {}),
        ...(notes.trim() ? { notes: notes.trim() } : {}),
      };
  const checked = (plan ? UpdatePlanInputSchema : CreatePlanInputSchema).safeParse(body);
  const checkedErrors = checked.success ? {} : toFieldErrors(toFieldIssues(checked.error));
  const problem = (field: Field): string | undefined => {
    if (answered[field]) return answered[field];
    if (!submitted && !touched.has(field)) return undefined;
    if (field === 'date' && !date) return 'Pick the day of the session.';
    // The shorthand field shows its own reading as it is typed.
    return field === 'text' && !parsed.ok ? undefined : checkedErrors[field];
  };
  const problems = FIELDS.filter((f) => problem(f) !== undefined);

  function onLeave(event: FocusEvent<HTMLFormElement>) {
    const name = (event.target as Element).getAttribute('name');
    if (name && !touched.has(name)) setTouched(new Set(touched).add(name));
  }

  function onEdit(event: FormEvent<HTMLFormElement>) {
    const name = (event.target as Element).getAttribute('name');
    if (name && isField(name) && answered[name]) setAnswered(({ [name]: _done, ...rest }) => rest);
  }

  /** The server's answers put beside the fields they name; anything else stays in the alert. */
  function placeAnswers(error: Error) {
    const found: Partial<Record<Field, string>> = {};
    for (const { field, message } of isApiError(error) ? error.fieldIssues : []) {
      if (isField(field)) found[field] ??= message;
    }
    setAnswered(found);
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setSubmitted(true);
    setAnswered({});
    if (blocked || !date || !checked.success) return;
    const done = (saved: Plan) => {
      stored.clear();
      onDone(saved, plan ? 'Session saved.' : 'Session added.');
    };
    if (plan)
      update.mutate(
        { id: plan.id, date, title: title.trim(), notes: notes.trim(), text },
        { onSuccess: done, onError: placeAnswers },
      );
    else create.mutate({ ...body, ...(runnerId ? { runner_id: runnerId } : {}) }, { onSuccess: done, onError: placeAnswers });
  }

  /** Closing on purpose drops what was typed; a reload or a refused save keeps it. */
  function close() {
    stored.clear();
    onClose();
  }

  const unplaced = isApiError(serverError)
    ? serverError.fieldIssues.filter((issue) => !isField(issue.field)).map((issue) => issue.message)
    : [];

  const heading = plan ? `Edit session${plan.title ? `: ${plan.title}` : ''}` : 'New session';
  return (
    <Card
      title={heading}
      description="Write it in shorthand or build it part by part: each follows the other."
      actions={
        <Button variant="quiet" onClick={close}>
          Close
        </Button>
      }
    >
      <form
        onSubmit={onSubmit}
        onBlur={onLeave}
        onChange={onEdit}
        noValidate
        className="flex flex-col gap-4"
        aria-label={heading}
      >
        {stored.restored && (
          <div className="flex flex-col gap-2">
            <FormAlert tone="success">Restored what you entered earlier on this device; it is not saved yet.</FormAlert>
            <div>
              <Button
                variant="quiet"
                onClick={() => {
                  setAnswered({});
                  setSubmitted(false);
                  stored.discard(fresh());
                }}
              >
                {plan ? 'Start again from the saved session' : 'Start again from empty'}
              </Button>
            </div>
          </div>
        )}
        <div className="grid grid-cols-1 gap-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
          <TextField
            label="Date"
            name="date"
            type="date"
            required
            value={date}
            onChange={(e) => setDate(e.target.value)}
            error={problem('date')}
            hint={plan ? 'Change it to move the session to another day.' : undefined}
          />
          <TextField
            label="Title (optional)"
            name="title"
            error={problem('title')}
            value={title}
            maxLength={PLAN_LIMITS.maxTitleLength}
            onChange={(e) => setTitle(e.target.value)}
            placeholder="Track 800s"
          />
        </div>
        <ShorthandField
          value={text}
          onChange={changeText}
          result={parsed}
          inputRef={shorthandRef}
          name="text"
          problem={problem('text')}
        />

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
            name="notes"
            aria-invalid={problem('notes') ? true : undefined}
            aria-describedby={problem('notes') ? 'session-notes-problem' : undefined}
            rows={2}
            value={notes}
            maxLength={PLAN_LIMITS.maxTextLength}
            onChange={(e) => setNotes(e.target.value)}
            placeholder="On the track, lane 3; jog the recoveries, do not walk."
            className={`${CONTROL_CLASSES} w-full px-3 py-2 text-base`}
          />
          {problem('notes') && (
            <p id="session-notes-problem" className="text-sm font-semibold text-tartan">
              {problem('notes')}
            </p>
          )}
        </div>

        {submitted && (blocked || (!serverError && problems.length > 0)) && (
          <FormAlert>
            {!parsed.ok
              ? `The session cannot be read yet: ${parsed.error.message}`
              : !read.ok
                ? 'Some builder fields cannot be read: see the messages beside them.'
                : 'Not saved yet: see the messages beside the fields.'}
          </FormAlert>
        )}
        {serverError && (
          <FormAlert>
            Not saved:{' '}
            {problems.length > 0
              ? 'see the messages beside the fields.'
              : unplaced.length > 0
                ? unplaced.join(' ')
                : serverError.message}{' '}
            Everything you entered is still here.
          </FormAlert>
        )}

        <div className="flex flex-wrap items-center gap-2">
          <Button type="submit" disabled={mutation.isPending}>
            {mutation.isPending ? 'Saving…' : plan ? 'Save changes' : 'Save session'}
          </Button>
          <Button variant="secondary" onClick={close}>
            Cancel
          </Button>
          {plan &&
            (confirmDelete ? (
              <span className="ml-auto flex flex-wrap items-center gap-2" role="group" aria-label="Confirm delete">
                <span className="text-sm font-semibold">Delete this session plan?</span>
                <Button
                  variant="danger"
                  disabled={remove.isPending}
                  onClick={() =>
                    remove.mutate(plan.id, {
                      onSuccess: () => {
                        stored.clear();
                        onDone(null, 'Session deleted.');
                      },
                    })
                  }
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
          <PlanChangesList planId={plan.id} ownerZone={ownerZone} viewerIsRunner={runnerId === undefined} />
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
