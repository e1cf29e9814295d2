import { Button } from '../../../components/ui/button.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useAcceptInvitation, type JoinedSquad } from '../api/accept-invitation.ts';

type AcceptInvitationProps = { token: string; onAccepted: (squad: JoinedSquad) => void };

/** The signed-in runner's one click; a refusal (used, withdrawn, expired, forged) shows the server's sentence. */
export function AcceptInvitation({ token, onAccepted }: AcceptInvitationProps) {
  const mutation = useAcceptInvitation(token);
  return (
    <div className="flex flex-col gap-3">
      {mutation.isError && <FormAlert>{mutation.error.message}</FormAlert>}
      <Button disabled={mutation.isPending} onClick={() => mutation.mutate(undefined, { onSuccess: onAccepted })}>
        {mutation.isPending ? 'Accepting…' : 'Accept invitation'}
      </Button>
    </div>
  );
}
