import { isApiError } from '../../../lib/api-client.ts';
import { Button } from '../../../components/ui/button.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { paths } from '../../../config/paths.ts';
import { useUnsubscribe, useUnsubscribeLink } from '../api/unsubscribe-link.ts';

/** A heading for each way a link can fail; the server's sentence below it says what to do. */
const REFUSED: Record<number, string> = {
  400: 'This link does not work',
  409: 'This link is out of date',
  410: 'This account no longer exists',
};

function Refused({ error }: { error: Error }) {
  const heading = (isApiError(error) && REFUSED[error.status]) || 'Nothing was changed';
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">{heading}</h1>
      <FormAlert>{error.message}</FormAlert>
      <p>Nothing was changed.</p>
      <div>
        <LinkButton to={paths.profile.getHref()}>Choose your e-mails on your profile</LinkButton>
      </div>
    </div>
  );
}

/**
 * The page behind the "Turn these e-mails off" link of every notice (issue 16). It works signed out:
 * the link itself is signed. It shows what the link turns off and asks for one click, so a mail
 * scanner that opens links changes nothing; mail programs use the one-click POST directly.
 */
export function UnsubscribePanel({ token }: { token: string }) {
  const link = useUnsubscribeLink(token);
  const unsubscribe = useUnsubscribe(token);

  if (link.isPending) {
    return (
      <p role="status" className="text-ink-muted">
        Reading the link…
      </p>
    );
  }
  if (link.isError) return <Refused error={link.error} />;
  if (unsubscribe.isError) return <Refused error={unsubscribe.error} />;

  const { label, on } = link.data;
  if (unsubscribe.isSuccess) {
    return (
      <div className="flex flex-col gap-4">
        <h1 className="text-2xl font-bold">E-mails turned off</h1>
        <FormAlert tone="success">
          “{label}” is off: you will get no more of these e-mails. Your other e-mails are unchanged.
        </FormAlert>
        <p className="text-sm text-ink-muted">Changed your mind? You can turn it back on from your profile.</p>
        <div>
          <LinkButton to={paths.profile.getHref()}>Open your profile</LinkButton>
        </div>
      </div>
    );
  }
  if (!on) {
    return (
      <div className="flex flex-col gap-4">
        <h1 className="text-2xl font-bold">Already off</h1>
        <p role="status">“{label}” is already off: you get none of these e-mails.</p>
        <div>
          <LinkButton to={paths.profile.getHref()}>Choose your e-mails on your profile</LinkButton>
        </div>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-bold">Turn off these e-mails?</h1>
      <p>
        This link turns off one kind of e-mail: <strong>{label}</strong>. Your other e-mails are unchanged, and invitations and
        password resets you ask for are always sent.
      </p>
      <div>
        <Button disabled={unsubscribe.isPending} onClick={() => unsubscribe.mutate()}>
          {unsubscribe.isPending ? 'Turning off…' : 'Turn these e-mails off'}
        </Button>
      </div>
    </div>
  );
}
