import type { QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { INVITATION_GONE } from '../../../../shared/squads/invitation-status.ts';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { LinkButton } from '../../../components/ui/link-button.tsx';
import { paths } from '../../../config/paths.ts';
import { meQueryOptions, useMe } from '../../../features/auth/api/get-me.ts';
import { invitationQueryOptions, useInvitation } from '../../../features/invitations/api/get-invitation.ts';
import { AcceptInvitation } from '../../../features/invitations/components/accept-invitation.tsx';
import { InvitationSummary } from '../../../features/invitations/components/invitation-summary.tsx';

/** The first of the two choices looks like the primary button. */
const PRIMARY_LINK =
  'inline-flex min-h-11 sm:min-h-9 items-center rounded-md bg-teal px-3.5 py-1.5 text-sm font-semibold text-white hover:bg-teal-deep';

export const createLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    // prefetch, not ensure: a forged link's 400 is shown as its sentence on this page.
    await Promise.all([
      queryClient.ensureQueryData(meQueryOptions()),
      queryClient.prefetchQuery(invitationQueryOptions(params.token ?? '')),
    ]);
    return null;
  };

/**
 * `/invite/:token`, open to everyone. Signed out, the invited person creates an account (the form
 * prefilled with the invited address) or signs in; either way `?next=` brings them back here, now
 * signed in, to accept with one click. Accepting is always an explicit click on this page, never a
 * side effect of signing up, so nobody joins a squad without having read what it means.
 */
export default function InviteRoute() {
  const token = useParams().token ?? '';
  const me = useMe();
  const invitation = useInvitation(token);
  const navigate = useNavigate();
  const back = paths.invite.getHref(token);

  if (invitation.isPending) {
    return (
      <p role="status" className="text-ink-muted">
        Reading the invitation…
      </p>
    );
  }
  if (invitation.isError) {
    return (
      <div className="flex flex-col gap-4">
        <title>Invitation · Pacewright</title>
        <h1 className="text-2xl font-bold">This invitation cannot be used</h1>
        <FormAlert>{invitation.error.message}</FormAlert>
        <div>
          <LinkButton to={me ? paths.log.getHref() : paths.signIn.getHref()}>{me ? 'Go to your log' : 'Sign in'}</LinkButton>
        </div>
      </div>
    );
  }

  const { data } = invitation;
  return (
    <div className="flex flex-col gap-5">
      <title>{`Join ${data.squad.name} · Pacewright`}</title>
      <InvitationSummary invitation={data} />
      {data.status !== 'open' ? (
        <>
          <FormAlert>{INVITATION_GONE[data.status]}</FormAlert>
          <div>
            <LinkButton to={me ? paths.log.getHref() : paths.signIn.getHref()}>{me ? 'Go to your log' : 'Sign in'}</LinkButton>
          </div>
        </>
      ) : !me ? (
        <div className="flex flex-col gap-3">
          <p>To join, use a runner account. After creating it or signing in you come back here to accept.</p>
          <div className="flex flex-wrap gap-3">
            <Link to={paths.signUp.getHref(back, data.email)} className={PRIMARY_LINK}>
              Create an account
            </Link>
            <LinkButton to={paths.signIn.getHref(back)}>I already have an account</LinkButton>
          </div>
        </div>
      ) : me.role === 'runner' && me.email.toLowerCase() !== data.email.toLowerCase() ? (
        // An invitation is bound to the address it was sent to (issue 13 #11).
        <FormAlert>
          This invitation was sent to {data.email}, and you are signed in as {me.email}. Sign out and sign in with the invited
          address, or ask your coach to invite {me.email} instead.
        </FormAlert>
      ) : me.role === 'runner' ? (
        <div className="flex flex-col gap-3">
          <p>
            You are signed in as <span className="font-semibold">{me.name}</span> ({me.email}).
          </p>
          <AcceptInvitation token={token} onAccepted={() => navigate(paths.log.getHref(), { replace: true })} />
        </div>
      ) : (
        <FormAlert>
          Invitations are for runner accounts, and you are signed in as {me.name}, a {me.role}. Sign out, then open this link
          again to accept it with a runner account.
        </FormAlert>
      )}
    </div>
  );
}
