import { useState, type FormEvent } from 'react';
import type { LibrarySession } from '../../../../shared/plans/prescribe-schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useAssignSession } from '../api/assign-session.ts';
import { useDeleteLibrarySession, useLibrary, useUpdateLibrarySession } from '../api/library.ts';
import { formatDay } from './plan-week.tsx';

type Runner = { id: string; name: string };

type LibraryCardProps = {
  /** Who a session is added for by default: the runner whose plan is open (or the signed-in runner). */
  forRunner: Runner;
  /** The coach's squad runners, for "Apply to…"; empty for a runner (their own plan only). */
  squadRunners: Runner[];
  /** The day offered first. */
  defaultDate: string;
  /** After an apply: the sentence to show, and the batch to undo. */
  onApplied: (message: string, batchId: string, date: string) => void;
};

/**
 * "From the library": the signed-in person's named sessions. Each can be added on a date to the
 * runner whose plan is open, or (coaches) applied to some or all of their squad runners at once.
 */
export function LibraryCard({ forRunner, squadRunners, defaultDate, onApplied }: LibraryCardProps) {
  const library = useLibrary();
  const [applying, setApplying] = useState<string | null>(null);
  const [editing, setEditing] = useState<string | null>(null);
  const remove = useDeleteLibrarySession();
  const sessions = library.data ?? [];
  return (
    <Card
      title="From the library"
      description="Your named sessions. Keep one with “Save to library” in the session form; add it here on any day."
    >
      {library.isPending && <p className="text-sm text-ink-muted">Loading your library…</p>}
      {library.error && <FormAlert>{library.error.message}</FormAlert>}
      {library.isSuccess && sessions.length === 0 && (
        <p className="text-sm text-ink-muted">Your library is empty. Open a session and choose “Save to library”.</p>
      )}
      <ul className="flex flex-col divide-y divide-line">
        {sessions.map((s) => (
          <li key={s.id} className="flex flex-col gap-2 py-2">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <div className="min-w-0">
                <p className="font-semibold break-words">{s.name}</p>
                <p className="text-sm break-words text-ink-muted tabular-nums">
                  {s.text}
                  {s.has_fuel_plan && ' · with fuel plan'}
                </p>
              </div>
              <div className="flex flex-wrap gap-2">
                <Button
                  variant="secondary"
                  aria-expanded={applying === s.id}
                  onClick={() => setApplying(applying === s.id ? null : s.id)}
                  aria-label={`Apply ${s.name} to…`}
                >
                  {/* The visible word begins the spoken name (axe label-content-name-mismatch). */}
                  Apply…
                </Button>
                <Button
                  variant="quiet"
                  onClick={() => setEditing(editing === s.id ? null : s.id)}
                  aria-label={`Rename ${s.name}`}
                >
                  Rename
                </Button>
                <Button
                  variant="quiet"
                  disabled={remove.isPending}
                  onClick={() => remove.mutate(s.id)}
                  aria-label={`Delete ${s.name} from the library`}
                >
                  Delete
                </Button>
              </div>
            </div>
            {editing === s.id && <RenameForm session={s} onDone={() => setEditing(null)} />}
            {applying === s.id && (
              <ApplyForm
                session={s}
                forRunner={forRunner}
                squadRunners={squadRunners}
                defaultDate={defaultDate}
                onApplied={(message, batchId, date) => {
                  setApplying(null);
                  onApplied(message, batchId, date);
                }}
              />
            )}
          </li>
        ))}
      </ul>
    </Card>
  );
}

function RenameForm({ session, onDone }: { session: LibrarySession; onDone: () => void }) {
  const [name, setName] = useState(session.name);
  const update = useUpdateLibrarySession();
  return (
    <form
      noValidate
      aria-label={`Rename ${session.name}`}
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        update.mutate({ id: session.id, name }, { onSuccess: onDone });
      }}
    >
      <TextField label="New name" value={name} maxLength={80} onChange={(e) => setName(e.target.value)} />
      <Button type="submit" disabled={update.isPending}>
        Save name
      </Button>
      {update.error && <FormAlert>{update.error.message}</FormAlert>}
    </form>
  );
}

type ApplyFormProps = Omit<LibraryCardProps, 'onApplied'> & {
  session: LibrarySession;
  onApplied: (message: string, batchId: string, date: string) => void;
};

function ApplyForm({ session, forRunner, squadRunners, defaultDate, onApplied }: ApplyFormProps) {
  const everyone = squadRunners.some((r) => r.id === forRunner.id) ? squadRunners : [forRunner, ...squadRunners];
  const [chosen, setChosen] = useState<Set<string>>(() => new Set([forRunner.id]));
  const [date, setDate] = useState(defaultDate);
  const assign = useAssignSession();
  const toggle = (id: string) =>
    setChosen((c) => {
      const next = new Set(c);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const runnerIds = everyone.filter((r) => chosen.has(r.id)).map((r) => r.id);
    assign.mutate(
      { runner_ids: runnerIds, date, library_id: session.id },
      {
        onSuccess: (result) => {
          const n = result.plans.length;
          const who = n === 1 ? (everyone.find((r) => r.id === runnerIds[0])?.name ?? '1 runner') : `${n} runners`;
          onApplied(`Added “${session.name}” to ${who} on ${formatDay(date)}.`, result.batch_id, date);
        },
      },
    );
  }

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label={`Apply ${session.name}`}
      className="flex flex-col gap-3 rounded-md bg-paper p-3"
    >
      <TextField
        label="Date"
        type="date"
        required
        value={date}
        onChange={(e) => setDate(e.target.value)}
        className="w-48 max-w-full"
      />
      {everyone.length > 1 && (
        <fieldset className="flex flex-col gap-1">
          <legend className="text-sm font-semibold">Runners</legend>
          <div className="flex flex-wrap gap-2">
            <Button variant="quiet" className="min-h-9 px-0" onClick={() => setChosen(new Set(everyone.map((r) => r.id)))}>
              The whole squad
            </Button>
            <Button variant="quiet" className="min-h-9 px-0" onClick={() => setChosen(new Set())}>
              None
            </Button>
          </div>
          <div className="grid grid-cols-1 gap-1 sm:grid-cols-2">
            {everyone.map((r) => (
              <label key={r.id} className="flex min-h-11 items-center gap-2 text-sm">
                <input type="checkbox" className="size-5" checked={chosen.has(r.id)} onChange={() => toggle(r.id)} />
                {r.name}
              </label>
            ))}
          </div>
        </fieldset>
      )}
      {assign.error && <FormAlert>{assign.error.message}</FormAlert>}
      <div>
        <Button type="submit" disabled={assign.isPending || chosen.size === 0}>
          {chosen.size === 1 ? 'Add to 1 runner' : `Add to ${chosen.size} runners`}
        </Button>
      </div>
    </form>
  );
}
