import { UpdateProfileInputSchema } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { SelectField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useProfile } from '../api/get-profile.ts';
import { useUpdateProfile } from '../api/update-profile.ts';

/** Day numbers as the API stores them (0 = Sunday), listed from Monday, the default. */
const WEEK_DAYS = [
  { value: 1, label: 'Monday' },
  { value: 2, label: 'Tuesday' },
  { value: 3, label: 'Wednesday' },
  { value: 4, label: 'Thursday' },
  { value: 5, label: 'Friday' },
  { value: 6, label: 'Saturday' },
  { value: 0, label: 'Sunday' },
] as const;

function readWeekAndLoadValues(data: FormData) {
  const day = readText(data, 'week_starts_on');
  const sex = readText(data, 'sex');
  return { week_starts_on: day === undefined ? undefined : Number(day), sex: sex ?? null };
}

/** The first day of the runner's week, and the one fact the heart-rate load needs besides heart rates. */
export function WeekAndLoadForm() {
  const profile = useProfile();
  const mutation = useUpdateProfile();
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: UpdateProfileInputSchema,
    mutation,
    readValues: readWeekAndLoadValues,
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      {formError && <FormAlert>{formError}</FormAlert>}
      <SelectField
        label="My week starts on"
        name="week_starts_on"
        defaultValue={profile.week_starts_on}
        hint="Weekly totals, the week review and its flags count from this day."
        error={fieldErrors.week_starts_on}
        className="sm:max-w-xs"
      >
        {WEEK_DAYS.map((day) => (
          <option key={day.value} value={day.value}>
            {day.label}
          </option>
        ))}
      </SelectField>
      <SelectField
        label="Sex (only for the heart-rate load, Banister TRIMP)"
        name="sex"
        defaultValue={profile.sex ?? ''}
        hint={
          <>
            Banister published different weightings of heart rate for women and men (Banister 1991; Morton, Fitz-Clarke &amp;
            Banister 1990), so the load of the same run differs a little. Nothing else uses it. Not given: the men’s weighting is
            used, which gives the lower load, and the week says it was assumed.
          </>
        }
        error={fieldErrors.sex}
        className="sm:max-w-md"
      >
        <option value="">Not given</option>
        <option value="female">Female</option>
        <option value="male">Male</option>
      </SelectField>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Saving…' : 'Save week and load'}
        </Button>
        {mutation.isSuccess && <p role="status">Saved.</p>}
      </div>
    </form>
  );
}
