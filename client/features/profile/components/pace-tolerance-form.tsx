import { z } from 'zod';
import { PaceToleranceSchema } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useProfile } from '../api/get-profile.ts';
import { useUpdatePaceTolerance } from '../api/update-pace-tolerance.ts';

const PERCENT_MESSAGE = 'Enter the tolerance in per cent, e.g. 2 for ±2 %.';

/** The field is written in per cent (2 = ±2 %); the API takes a share (0.02), checked by the shared schema. */
const PaceToleranceFormSchema = z.object({
  pace_tolerance: z
    .string({ error: PERCENT_MESSAGE })
    .transform((text) => Number(text.trim().replace(',', '.').replace(/%$/, '').trim()) / 100)
    .pipe(z.number({ error: PERCENT_MESSAGE }).pipe(PaceToleranceSchema)),
});

/** Percent with at most one decimal: 0.02 → "2", 0.025 → "2.5". */
const toPercent = (share: number) => String(Number((share * 100).toFixed(1)));

/** How far from a target pace still counts as on pace in the plan check. */
export function PaceToleranceForm({ onSaved }: { onSaved?: () => void }) {
  const profile = useProfile();
  const mutation = useUpdatePaceTolerance(profile.id);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: PaceToleranceFormSchema,
    mutation,
    readValues: (data) => ({ pace_tolerance: readText(data, 'pace_tolerance') }),
    onSuccess: onSaved,
  });
  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-3">
      {formError && <FormAlert>{formError}</FormAlert>}
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField
          label="Tolerance (± %)"
          name="pace_tolerance"
          inputMode="decimal"
          autoComplete="off"
          defaultValue={toPercent(profile.pace_tolerance)}
          hint="From 0.5 to 10. With ±2 %, a target of 7:00 /mi counts as on pace from about 6:52 to 7:08 /mi."
          error={fieldErrors.pace_tolerance}
          className="sm:max-w-xs sm:flex-1"
        />
        <Button type="submit" disabled={mutation.isPending} className="sm:mt-6">
          {mutation.isPending ? 'Saving…' : 'Save tolerance'}
        </Button>
      </div>
      {mutation.isSuccess && <p role="status">Tolerance saved: ±{toPercent(mutation.data)} %.</p>}
    </form>
  );
}
