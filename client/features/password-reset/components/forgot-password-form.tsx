import { PasswordResetRequestSchema } from '../../../../shared/auth/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useRequestPasswordReset } from '../api/request-password-reset.ts';

/** Asks for a reset link. The answer is the same for every address, so it never tells who has an account. */
export function ForgotPasswordForm() {
  const mutation = useRequestPasswordReset();
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: PasswordResetRequestSchema,
    mutation,
    readValues: (data) => ({ email: readText(data, 'email') }),
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      {formError && <FormAlert>{formError}</FormAlert>}
      {mutation.isSuccess && <FormAlert tone="success">{mutation.data.message}</FormAlert>}
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="email"
        required
        hint="The link works once, for one hour."
        error={fieldErrors.email}
      />
      <Button type="submit" disabled={mutation.isPending}>
        {mutation.isPending ? 'Sending…' : 'Send me a link'}
      </Button>
    </form>
  );
}
