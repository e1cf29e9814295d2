import { useRef, useState } from 'react';
import { ChangePasswordInputSchema, PASSWORD_MIN_LENGTH } from '../../../../shared/auth/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useChangePassword } from '../api/change-password.ts';
import { useSignOutEverywhere } from '../api/sign-out-everywhere.ts';

/** Profile card: choose a new password, and end every session on every device. */
export function PasswordAndSessionsCard() {
  return (
    <Card
      title="Password and sign-ins"
      description="A new password signs you out on every other device and ends your API tokens; this browser stays signed in."
    >
      <div className="flex flex-col gap-6">
        <ChangePasswordForm />
        <SignOutEverywhere />
      </div>
    </Card>
  );
}

function ChangePasswordForm() {
  const mutation = useChangePassword();
  const formRef = useRef<HTMLFormElement>(null);
  const [saved, setSaved] = useState(false);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: ChangePasswordInputSchema,
    mutation,
    readValues: (data) => ({
      current_password: readText(data, 'current_password'),
      new_password: readText(data, 'new_password'),
    }),
    onSuccess: () => {
      formRef.current?.reset();
      setSaved(true);
    },
  });

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} onChange={() => setSaved(false)} className="flex flex-col gap-3">
      {formError && <FormAlert>{formError}</FormAlert>}
      <TextField
        label="Current password"
        name="current_password"
        type="password"
        autoComplete="current-password"
        required
        error={fieldErrors.current_password}
      />
      <TextField
        label="New password"
        name="new_password"
        type="password"
        autoComplete="new-password"
        required
        minLength={PASSWORD_MIN_LENGTH}
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. A few unrelated words make a strong one.`}
        error={fieldErrors.new_password}
      />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={mutation.isPending}>
          {mutation.isPending ? 'Changing…' : 'Change password'}
        </Button>
        {saved && (
          <p role="status" className="text-sm font-semibold text-teal">
            Password changed. Other devices are signed out.
          </p>
        )}
      </div>
    </form>
  );
}

function SignOutEverywhere() {
  const mutation = useSignOutEverywhere();
  const [confirming, setConfirming] = useState(false);
  return (
    <div className="flex flex-col gap-2 border-t border-line pt-4">
      <p className="text-sm text-ink-muted">
        Lost a phone, or signed in on a shared computer? End every session of your account, this one included. Scripts keep their
        API tokens: revoke those below.
      </p>
      {mutation.isError && <FormAlert>{mutation.error.message}</FormAlert>}
      {confirming ? (
        <div className="flex flex-wrap gap-2">
          <Button variant="danger" disabled={mutation.isPending} onClick={() => mutation.mutate()}>
            {mutation.isPending ? 'Signing out…' : 'Yes, sign out on every device'}
          </Button>
          <Button variant="quiet" onClick={() => setConfirming(false)}>
            Keep my sessions
          </Button>
        </div>
      ) : (
        <div>
          <Button variant="secondary" onClick={() => setConfirming(true)}>
            Sign out everywhere
          </Button>
        </div>
      )}
    </div>
  );
}
