import { Link, useNavigate, useParams } from 'react-router-dom';
import { Button } from '../../../components/ui/button.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { paths, resolveNext } from '../../../config/paths.ts';
import { useConfirmSignUp } from '../../../features/auth/api/sign-up.ts';

/**
 * `/sign-up/confirm/:token`, opened from the sign-up e-mail. One click makes the account (a mail
 * scanner that merely opens the link makes nothing), then the page the sign-up started from opens.
 */
export default function SignUpConfirmRoute() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const mutation = useConfirmSignUp();

  return (
    <>
      <title>Finish creating your account · Pacewright</title>
      <h1 className="mb-5 text-2xl font-bold">Finish creating your account</h1>
      <div className="flex flex-col gap-4">
        {mutation.isError && <FormAlert>{mutation.error.message}</FormAlert>}
        <p>Your e-mail address is confirmed by this link. One click and your account is ready.</p>
        <div>
          <Button
            disabled={mutation.isPending}
            onClick={() => mutation.mutate(token, { onSuccess: ({ next }) => navigate(resolveNext(next), { replace: true }) })}
          >
            {mutation.isPending ? 'Creating account…' : 'Create my account'}
          </Button>
        </div>
        <p className="text-sm text-ink-muted">
          Already have your account?{' '}
          <Link to={paths.signIn.getHref()} className="font-semibold text-teal underline">
            Sign in
          </Link>
        </p>
      </div>
    </>
  );
}
