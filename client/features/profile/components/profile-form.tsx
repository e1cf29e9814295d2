import { UpdateProfileInputSchema, type Profile } from '../../../../shared/users/schemas.ts';
import { TIME_ZONES, canonicalTimeZone } from '../../../../shared/users/time-zones.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useProfile } from '../api/get-profile.ts';
import { useUpdateProfile } from '../api/update-profile.ts';

// The current IANA names (Asia/Kolkata, not Asia/Calcutta): browsers' own Intl list still has outdated ones.
const DEVICE_ZONE_AS_REPORTED = Intl.DateTimeFormat().resolvedOptions().timeZone;
const DEVICE_TIME_ZONE = canonicalTimeZone(DEVICE_ZONE_AS_REPORTED) ?? DEVICE_ZONE_AS_REPORTED;

/** Blank clears the value; anything else goes to the schema as a number (NaN gets the schema's message). */
function readNumber(data: FormData, name: string): number | null {
  const text = readText(data, name);
  return text === undefined ? null : Number(text.trim().replace(',', '.'));
}

function readProfileValues(data: FormData) {
  return {
    name: readText(data, 'name'),
    birth_year: readNumber(data, 'birth_year'),
    resting_hr: readNumber(data, 'resting_hr'),
    max_hr: readNumber(data, 'max_hr'),
    weight_kg: readNumber(data, 'weight_kg'),
    time_zone: readText(data, 'time_zone'),
  };
}

export function ProfileForm({ onSaved }: { onSaved?: (profile: Profile) => void }) {
  const profile = useProfile();
  const mutation = useUpdateProfile();
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: UpdateProfileInputSchema,
    mutation,
    readValues: readProfileValues,
    onSuccess: onSaved,
  });
  // A saved zone outside the list (a fixed offset such as Etc/GMT+5) stays selectable.
  const timeZones = TIME_ZONES.includes(profile.time_zone) ? TIME_ZONES : [profile.time_zone, ...TIME_ZONES];

  return (
    <form noValidate onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2">
      {formError && (
        <div className="sm:col-span-2">
          <FormAlert>{formError}</FormAlert>
        </div>
      )}
      <TextField
        label="Name"
        name="name"
        autoComplete="name"
        defaultValue={profile.name}
        error={fieldErrors.name}
        className="sm:col-span-2"
      />
      <TextField
        label="Birth year"
        name="birth_year"
        inputMode="numeric"
        autoComplete="bday-year"
        defaultValue={profile.birth_year ?? ''}
        hint="Optional."
        error={fieldErrors.birth_year}
      />
      <TextField
        label="Weight (kg)"
        name="weight_kg"
        inputMode="decimal"
        defaultValue={profile.weight_kg ?? ''}
        hint="Optional."
        error={fieldErrors.weight_kg}
      />
      <TextField
        label="Resting heart rate (bpm)"
        name="resting_hr"
        inputMode="numeric"
        defaultValue={profile.resting_hr ?? ''}
        hint="Taken on waking, before getting up."
        error={fieldErrors.resting_hr}
      />
      <TextField
        label="Maximum heart rate (bpm)"
        name="max_hr"
        inputMode="numeric"
        defaultValue={profile.max_hr ?? ''}
        hint="The highest you have seen in a hard effort; heart-rate zones and TRIMP use both values."
        error={fieldErrors.max_hr}
      />
      <SelectField
        label="Time zone"
        name="time_zone"
        defaultValue={profile.time_zone}
        hint={`Dates your runs and weeks. This device is set to ${DEVICE_TIME_ZONE}.`}
        error={fieldErrors.time_zone}
        className="sm:col-span-2"
      >
        {timeZones.map((zone) => (
          <option key={zone} value={zone}>
            {zone.replaceAll('_', ' ')}
          </option>
        ))}
      </SelectField>
      <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Saving…' : 'Save profile'}
        </Button>
        {mutation.isSuccess && <p role="status">Profile saved.</p>}
      </div>
    </form>
  );
}
