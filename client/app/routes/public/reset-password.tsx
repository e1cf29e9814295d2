import { Link, useNavigate, useParams } from 'react-router-dom';
import { paths } from '../../../config/paths.ts';
import { ResetPasswordForm } from '../../../features/password-reset/components/reset-password-form.tsx';
import type { SignInNotice } from '../auth/sign-in.tsx';

/** `/reset-password/:token`, opened from the e-mail; open whether or not someone is signed in. */
export default function ResetPasswordRoute() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const notice: SignInNotice = { passwordChanged: true };

  return (
    <>
      <title>Choose a new password · Pacewright</title>
      <h1 className="mb-5 text-2xl font-bold">Choose a new password</h1>
      <ResetPasswordForm token={token} onChanged={() => navigate(paths.signIn.getHref(), { replace: true, state: notice })} />
      <p className="mt-4 text-sm text-ink-muted">
        Link expired or already used?{' '}
        <Link to={paths.forgotPassword.getHref()} className="font-semibold text-teal underline">
          Ask for a new one
        </Link>
      </p>
    </>
  );
}
