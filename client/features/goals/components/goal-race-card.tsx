import { useState } from 'react';
import { formatRaceTime, goalRaceFormFor } from '../../../../shared/goals/forms.ts';
import type { GoalRace } from '../../../../shared/goals/schemas.ts';
import { describeDistance } from '../../../../shared/race/distances.ts';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useSchemaForm } from '../../../lib/form.ts';
import { useClearGoalRace } from '../api/clear-goal-race.ts';
import { useGoalRace } from '../api/get-goal-race.ts';
import { useSaveGoalRace } from '../api/save-goal-race.ts';
import { formatRacePace } from '../utils/race-pace.ts';
import { RaceFields, readRaceFields } from './race-fields.tsx';

type GoalRaceCardProps = {
  unit: Unit;
  /** Today in the profile's time zone: a goal race is on this day or later. */
  today: string;
  /** Called after the goal race is saved or cleared (race paces in plans follow it). */
  onChanged?: () => void;
};

/** The race the runner trains for: set, change or clear it. */
export function GoalRaceCard({ unit, today, onChanged }: GoalRaceCardProps) {
  const goal = useGoalRace();
  const save = useSaveGoalRace();
  const clear = useClearGoalRace();
  const [confirmingClear, setConfirmingClear] = useState(false);

  return (
    <Card
      title="Goal race"
      description="The race you are training for. Plans that say @ goal, @ MP, @ HMP, @ 10K or @ 5K take their paces from it and from your race results below."
    >
      {goal.isPending ? (
        <p role="status" className="text-ink-muted">
          Loading your goal race…
        </p>
      ) : goal.isError ? (
        <FormAlert>Your goal race could not be loaded: {goal.error.message}</FormAlert>
      ) : (
        <div className="flex flex-col gap-4">
          {goal.data ? (
            <p className="tabular-nums">
              <strong>{goal.data.name}</strong> · {formatLocalDate(goal.data.date)} · {describeDistance(goal.data.distance_m)} ·
              goal {formatRaceTime(goal.data.goal_time_s)} ({formatRacePace(goal.data.distance_m, goal.data.goal_time_s, unit)})
            </p>
          ) : (
            <p className="text-ink-muted">No goal race yet. Set one below: name, date, distance and goal time.</p>
          )}
          {/* A new form after clearing, so its fields start empty again. */}
          <GoalRaceForm
            key={goal.data ? 'set' : 'none'}
            goal={goal.data}
            today={today}
            save={save}
            onSaved={() => {
              setConfirmingClear(false);
              clear.reset();
              onChanged?.();
            }}
          />
          {goal.data &&
            (confirmingClear ? (
              <div role="group" aria-label="Clear the goal race" className="flex flex-col gap-2">
                <FormAlert>
                  Clear “{goal.data.name}”? Plans with race paces will have no goal to take them from.
                  {clear.isError && <> Not cleared: {clear.error.message}</>}
                </FormAlert>
                <div className="flex gap-2">
                  <Button
                    variant="danger"
                    disabled={clear.isPending}
                    onClick={() =>
                      clear.mutate(undefined, {
                        onSuccess: () => {
                          setConfirmingClear(false);
                          save.reset();
                          onChanged?.();
                        },
                      })
                    }
                  >
                    {clear.isPending ? 'Clearing…' : 'Clear goal race'}
                  </Button>
                  <Button variant="secondary" onClick={() => setConfirmingClear(false)}>
                    Keep it
                  </Button>
                </div>
              </div>
            ) : (
              <div>
                <Button variant="quiet" onClick={() => setConfirmingClear(true)}>
                  Clear goal race…
                </Button>
              </div>
            ))}
        </div>
      )}
    </Card>
  );
}

type GoalRaceFormProps = {
  goal: GoalRace | null;
  today: string;
  save: ReturnType<typeof useSaveGoalRace>;
  onSaved: () => void;
};

function GoalRaceForm({ goal, today, save, onSaved }: GoalRaceFormProps) {
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: goalRaceFormFor(today),
    mutation: save,
    readValues: readRaceFields,
    onSuccess: onSaved,
  });
  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2">
      {formError && (
        <div className="sm:col-span-2">
          <FormAlert>{formError}</FormAlert>
        </div>
      )}
      <TextField
        label="Race name"
        name="name"
        autoComplete="off"
        defaultValue={goal?.name ?? ''}
        placeholder="e.g. Lakeside Marathon"
        error={fieldErrors.name}
      />
      <TextField label="Race date" name="date" type="date" min={today} defaultValue={goal?.date ?? ''} error={fieldErrors.date} />
      <RaceFields
        defaultDistanceM={goal?.distance_m}
        defaultTime={goal ? formatRaceTime(goal.goal_time_s) : undefined}
        timeName="goal_time_s"
        timeLabel="Goal time"
        errors={fieldErrors}
      />
      <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={save.isPending}>
          {save.isPending ? 'Saving…' : 'Save goal race'}
        </Button>
        {save.isSuccess && <p role="status">Goal race saved.</p>}
      </div>
    </form>
  );
}
