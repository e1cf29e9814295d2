import { z } from 'zod';
import { NewPasswordSchema, PASSWORD_MIN_LENGTH } from '../../../../shared/auth/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useResetPassword } from '../api/reset-password.ts';

/** The server checks the password with the same shared schema; the second field only guards against a typo. */
const ResetPasswordFormSchema = z
  .object({ password: NewPasswordSchema, confirm: z.string({ error: 'Type the new password again.' }) })
  .refine((p) => p.password === p.confirm, { message: 'The two passwords differ. Type the same one twice.', path: ['confirm'] })
  .transform(({ password }) => ({ password }));

export function ResetPasswordForm({ token, onChanged }: { token: string; onChanged: () => void }) {
  const mutation = useResetPassword(token);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: ResetPasswordFormSchema,
    mutation,
    readValues: (data) => ({ password: readText(data, 'password'), confirm: readText(data, 'confirm') }),
    onSuccess: onChanged,
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      {formError && <FormAlert>{formError}</FormAlert>}
      <TextField
        label="New password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        minLength={PASSWORD_MIN_LENGTH}
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. A few unrelated words make a strong one.`}
        error={fieldErrors.password}
      />
      <TextField
        label="New password again"
        name="confirm"
        type="password"
        autoComplete="new-password"
        required
        error={fieldErrors.confirm}
      />
      <Button type="submit" disabled={mutation.isPending}>
        {mutation.isPending ? 'Saving…' : 'Save new password'}
      </Button>
    </form>
  );
}
