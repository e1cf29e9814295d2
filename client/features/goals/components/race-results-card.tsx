import { useRef, useState } from 'react';
import { formatRaceTime, raceResultFormFor } from '../../../../shared/goals/forms.ts';
import type { RaceResult } from '../../../../shared/goals/schemas.ts';
import { describeDistance } from '../../../../shared/race/distances.ts';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useSchemaForm } from '../../../lib/form.ts';
import { useAddRaceResult } from '../api/add-race-result.ts';
import { useDeleteRaceResult } from '../api/delete-race-result.ts';
import { useRaceResults } from '../api/get-race-results.ts';
import { formatRacePace } from '../utils/race-pace.ts';
import { RaceFields, readRaceFields } from './race-fields.tsx';

type RaceResultsCardProps = {
  unit: Unit;
  /** Today in the profile's time zone: a race result is on this day or earlier. */
  today: string;
  /** Called after a result is added or deleted (race paces in plans follow the most recent one). */
  onChanged?: () => void;
};

/** Races run: the most recent of the last six months sets the race paces of plans. */
export function RaceResultsCard({ unit, today, onChanged }: RaceResultsCardProps) {
  const add = useAddRaceResult();
  const [formKey, setFormKey] = useState(0);
  return (
    <Card
      title="Race results"
      description="Races you have run. The most recent result of the last 6 months sets the @ MP, @ HMP, @ 10K and @ 5K paces of your plans (carried to each distance with the Daniels & Gilbert equations); without one, they come from the goal race."
    >
      <div className="flex flex-col gap-5">
        <ResultList unit={unit} onChanged={onChanged} />
        <div>
          <h3 className="mb-2 font-semibold">Add a result</h3>
          <RaceResultForm
            key={formKey}
            today={today}
            add={add}
            onAdded={() => {
              // A fresh form for the next result; the mutation (and its "added" note) lives here.
              setFormKey((k) => k + 1);
              onChanged?.();
            }}
          />
          {add.isSuccess && (
            <p role="status" className="mt-2">
              Result added.
            </p>
          )}
        </div>
      </div>
    </Card>
  );
}

function ResultList({ unit, onChanged }: Omit<RaceResultsCardProps, 'today'>) {
  const { data: results, isPending, error } = useRaceResults();
  const remove = useDeleteRaceResult();
  const [confirmingId, setConfirmingId] = useState<string | null>(null);
  const captionRef = useRef<HTMLTableCaptionElement>(null);

  if (isPending) return <p className="text-ink-muted">Loading your race results…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  if (results.length === 0) return <p className="text-ink-muted">No race results yet. Add your latest race below.</p>;

  function confirmDelete(result: RaceResult) {
    remove.mutate(result.id, {
      onSuccess: () => {
        setConfirmingId(null);
        // The row with the focused button is gone; keep keyboard users in the list.
        captionRef.current?.focus();
        onChanged?.();
      },
    });
  }

  const th = 'py-1.5 pr-3 font-semibold whitespace-nowrap';
  const td = 'py-2 pr-3 whitespace-nowrap';
  return (
    <div className="flex flex-col gap-2">
      {remove.isError && <FormAlert>{remove.error.message}</FormAlert>}
      <div className="relative overflow-x-auto">
        <table className="w-full min-w-lg text-left text-sm">
          <caption ref={captionRef} tabIndex={-1} className="pb-2 text-left font-semibold">
            Your race results, newest first
          </caption>
          <thead className="border-b border-line text-ink-muted">
            <tr>
              <th scope="col" className={th}>
                Date
              </th>
              <th scope="col" className={th}>
                Race
              </th>
              <th scope="col" className={th}>
                Distance
              </th>
              <th scope="col" className={`${th} text-right`}>
                Time
              </th>
              <th scope="col" className={`${th} text-right`}>
                Pace
              </th>
              <th scope="col" className="py-1.5 font-semibold">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {results.map((result) => {
              const label = result.name || `${describeDistance(result.distance_m)} on ${formatLocalDate(result.date)}`;
              return (
                <tr key={result.id} className="border-b border-line last:border-0">
                  <td className={td}>{formatLocalDate(result.date)}</td>
                  <th scope="row" className={`${td} font-semibold`}>
                    {result.name || '–'}
                  </th>
                  <td className={td}>{describeDistance(result.distance_m)}</td>
                  <td className={`${td} text-right tabular-nums`}>{formatRaceTime(result.time_s)}</td>
                  <td className={`${td} text-right tabular-nums`}>{formatRacePace(result.distance_m, result.time_s, unit)}</td>
                  <td className="py-2 text-right">
                    {confirmingId === result.id ? (
                      <span className="inline-flex flex-wrap items-center justify-end gap-2">
                        <Button variant="danger" disabled={remove.isPending} onClick={() => confirmDelete(result)}>
                          Delete “{label}”
                        </Button>
                        <Button variant="quiet" autoFocus onClick={() => setConfirmingId(null)}>
                          Keep it
                        </Button>
                      </span>
                    ) : (
                      <Button variant="secondary" onClick={() => setConfirmingId(result.id)} aria-label={`Delete ${label}`}>
                        Delete
                      </Button>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}

type RaceResultFormProps = { today: string; add: ReturnType<typeof useAddRaceResult>; onAdded: () => void };

function RaceResultForm({ today, add, onAdded }: RaceResultFormProps) {
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: raceResultFormFor(today),
    mutation: add,
    readValues: readRaceFields,
    onSuccess: onAdded,
  });
  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2">
      {formError && (
        <div className="sm:col-span-2">
          <FormAlert>{formError}</FormAlert>
        </div>
      )}
      <TextField label="Race name" name="name" autoComplete="off" hint="Optional." error={fieldErrors.name} />
      <TextField label="Race date" name="date" type="date" max={today} error={fieldErrors.date} />
      <RaceFields timeName="time_s" timeLabel="Finish time" errors={fieldErrors} />
      <div className="sm:col-span-2">
        <Button type="submit" disabled={add.isPending}>
          {add.isPending ? 'Adding…' : 'Add result'}
        </Button>
      </div>
    </form>
  );
}
