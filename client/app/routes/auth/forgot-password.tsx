import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths.ts';
import { ForgotPasswordForm } from '../../../features/password-reset/components/forgot-password-form.tsx';

export default function ForgotPasswordRoute() {
  return (
    <>
      <title>Forgot your password · Pacewright</title>
      <h1 className="mb-2 text-2xl font-bold">Forgot your password?</h1>
      <p className="mb-5 text-ink-muted">
        Enter the e-mail address of your account and we send you a link to choose a new password.
      </p>
      <ForgotPasswordForm />
      <p className="mt-4 text-sm text-ink-muted">
        Remembered it?{' '}
        <Link to={paths.signIn.getHref()} className="font-semibold text-teal underline">
          Sign in
        </Link>
      </p>
    </>
  );
}
