import { useState } from 'react';
import { CUSTOM_RACE_DISTANCE, distanceChoiceFor, GOAL_DISTANCE_CHOICES } from '../../../../shared/goals/forms.ts';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { readText } from '../../../lib/form.ts';

type RaceFieldsProps = {
  /** The stored distance, when editing. */
  defaultDistanceM?: number;
  /** The stored time as h:mm:ss, when editing. */
  defaultTime?: string;
  timeName: 'goal_time_s' | 'time_s';
  timeLabel: string;
  errors: Record<string, string>;
};

/** Date, distance (a listed race or metres) and time (h:mm:ss), named as shared/goals/forms.ts reads them. */
export function RaceFields({ defaultDistanceM, defaultTime, timeName, timeLabel, errors }: RaceFieldsProps) {
  const [distance, setDistance] = useState(defaultDistanceM === undefined ? 'marathon' : distanceChoiceFor(defaultDistanceM));
  const custom = distance === CUSTOM_RACE_DISTANCE;
  return (
    <>
      <SelectField
        label="Distance"
        name="distance_m"
        value={distance}
        onChange={(event) => setDistance(event.target.value)}
        error={custom ? undefined : errors.distance_m}
      >
        {GOAL_DISTANCE_CHOICES.map((choice) => (
          <option key={choice.id} value={choice.id}>
            {choice.label}
          </option>
        ))}
        <option value={CUSTOM_RACE_DISTANCE}>Other distance (metres)…</option>
      </SelectField>
      {custom && (
        <TextField
          label="Distance in metres"
          name="custom_distance_m"
          inputMode="decimal"
          autoComplete="off"
          placeholder="e.g. 30000"
          defaultValue={
            defaultDistanceM !== undefined && distanceChoiceFor(defaultDistanceM) === CUSTOM_RACE_DISTANCE ? defaultDistanceM : ''
          }
          error={errors.custom_distance_m ?? errors.distance_m}
        />
      )}
      <TextField
        label={timeLabel}
        name={timeName}
        autoComplete="off"
        spellCheck={false}
        placeholder="h:mm:ss"
        defaultValue={defaultTime ?? ''}
        hint="As h:mm:ss, e.g. 3:05:00 (or m:ss for short races)."
        error={errors[timeName]}
        className="tabular-nums"
      />
    </>
  );
}

/** The race fields of a submitted form, blank text as undefined. */
export function readRaceFields(data: FormData) {
  return {
    name: readText(data, 'name'),
    date: readText(data, 'date'),
    distance_m: readText(data, 'distance_m'),
    custom_distance_m: readText(data, 'custom_distance_m'),
    goal_time_s: readText(data, 'goal_time_s'),
    time_s: readText(data, 'time_s'),
  };
}
