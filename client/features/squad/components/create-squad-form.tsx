import { CreateSquadInputSchema } from '../../../../shared/squads/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useCreateSquad } from '../api/create-squad.ts';

type CreateSquadFormProps = { onCreated: (squad: { id: string; name: string }) => void; autoFocus?: boolean };

/** Names a new squad; the coach invites runners to it next. */
export function CreateSquadForm({ onCreated, autoFocus }: CreateSquadFormProps) {
  const mutation = useCreateSquad();
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: CreateSquadInputSchema,
    mutation,
    readValues: (data) => ({ name: readText(data, 'name') }),
    onSuccess: onCreated,
  });
  return (
    <form noValidate onSubmit={onSubmit} aria-label="New squad" className="flex flex-col gap-3 text-left">
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField
          label="Squad name"
          name="name"
          autoComplete="off"
          autoFocus={autoFocus}
          hint="Your club or training group, e.g. “Tuesday track group”."
          error={fieldErrors.name}
          className="sm:flex-1"
        />
        <Button type="submit" disabled={mutation.isPending} className="sm:mt-6">
          {mutation.isPending ? 'Creating…' : 'Create squad'}
        </Button>
      </div>
      {formError && <FormAlert>{formError}</FormAlert>}
    </form>
  );
}
