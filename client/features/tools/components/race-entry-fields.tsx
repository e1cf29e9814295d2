import { useState } from 'react';
import { RACE_DISTANCE_CHOICES } from '../../../../shared/race/distances.ts';
import { CUSTOM_DISTANCE } from '../../../../shared/race/schemas.ts';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { readText } from '../../../lib/form.ts';

type RaceEntryFieldsProps = {
  /** Id of the distance picked at first, e.g. "marathon". */
  defaultDistance: string;
  timeLabel: string;
  timeHint: string;
  errors: Record<string, string>;
};

/** Distance (a standard race or a custom one in km or mi) and a time as h:mm:ss, named as the shared form schemas expect. */
export function RaceEntryFields({ defaultDistance, timeLabel, timeHint, errors }: RaceEntryFieldsProps) {
  const [distance, setDistance] = useState(defaultDistance);
  return (
    <>
      <SelectField
        label="Distance"
        name="distance"
        value={distance}
        onChange={(e) => setDistance(e.target.value)}
        error={errors.distance}
      >
        {RACE_DISTANCE_CHOICES.map((choice) => (
          <option key={choice.id} value={choice.id}>
            {choice.label}
          </option>
        ))}
        <option value={CUSTOM_DISTANCE}>Other distance…</option>
      </SelectField>
      {distance === CUSTOM_DISTANCE && (
        <div className="grid grid-cols-[1fr_5.5rem] items-start gap-2">
          <TextField
            label="Other distance"
            name="custom_distance"
            inputMode="decimal"
            autoComplete="off"
            placeholder="e.g. 30"
            error={errors.custom_distance}
          />
          <SelectField label="Unit" name="custom_unit" defaultValue="km" error={errors.custom_unit}>
            <option value="km">km</option>
            <option value="mi">mi</option>
          </SelectField>
        </div>
      )}
      <TextField
        label={timeLabel}
        name="time"
        autoComplete="off"
        spellCheck={false}
        placeholder="h:mm:ss"
        hint={timeHint}
        error={errors.time}
        className="tabular-nums"
      />
    </>
  );
}

/** The race fields of a submitted form, as the shared schemas read them (blank text becomes undefined). */
export function readRaceEntry(data: FormData) {
  return {
    distance: readText(data, 'distance'),
    custom_distance: readText(data, 'custom_distance'),
    custom_unit: readText(data, 'custom_unit'),
    time: readText(data, 'time'),
  };
}
