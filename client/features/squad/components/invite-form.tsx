import { useRef, useState } from 'react';
import { INVITATION_DAYS, InviteInputSchema } from '../../../../shared/squads/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useInviteRunner } from '../api/invite-runner.ts';

type InviteFormProps = { squadId: string; squadName: string; onClose?: () => void };

/** One e-mail address at a time; the invitation is a single-use link valid for two weeks. */
export function InviteForm({ squadId, squadName, onClose }: InviteFormProps) {
  const mutation = useInviteRunner(squadId);
  const formRef = useRef<HTMLFormElement>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: InviteInputSchema,
    mutation,
    readValues: (data) => ({ email: readText(data, 'email') }),
    onSuccess: (invitation) => {
      setSentTo(invitation.email);
      formRef.current?.reset();
    },
  });
  return (
    <form
      ref={formRef}
      noValidate
      onSubmit={onSubmit}
      aria-label={`Invite a runner to ${squadName}`}
      className="flex flex-col gap-3"
    >
      <div className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField
          label="Runner’s e-mail"
          name="email"
          type="email"
          autoComplete="off"
          autoFocus
          hint={`They get a link valid for ${INVITATION_DAYS} days, usable once. New runners sign up through it; others accept after signing in.`}
          error={fieldErrors.email}
          className="sm:flex-1"
          onChange={() => setSentTo(null)}
        />
        <div className="flex gap-2 sm:mt-6">
          <Button type="submit" disabled={mutation.isPending}>
            {mutation.isPending ? 'Sending…' : 'Send invitation'}
          </Button>
          {onClose && (
            <Button variant="secondary" onClick={onClose}>
              Close
            </Button>
          )}
        </div>
      </div>
      {formError && <FormAlert>{formError}</FormAlert>}
      {sentTo && !mutation.isPending && <FormAlert tone="success">Invitation sent to {sentTo}.</FormAlert>}
    </form>
  );
}
