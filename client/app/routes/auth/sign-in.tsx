import { useLocation, useSearchParams } from 'react-router-dom';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { SignInForm } from '../../../features/auth/components/sign-in-form.tsx';

/** Set by the reset-password page when it sends people here. */
export type SignInNotice = { passwordChanged?: boolean };

export default function SignInRoute() {
  const notice = useLocation().state as SignInNotice | null;
  // Set by "Delete my account" (a full page load, so it travels in the address).
  const deleted = useSearchParams()[0].get('deleted') === '1';
  return (
    <>
      <title>Sign in · Pacewright</title>
      <h1 className="mb-5 text-2xl font-bold">Sign in</h1>
      {notice?.passwordChanged && (
        <div className="mb-4">
          <FormAlert tone="success">Your password has been changed. Sign in with the new one.</FormAlert>
        </div>
      )}
      {deleted && (
        <div className="mb-4">
          <FormAlert tone="success">Your account and everything in it have been deleted.</FormAlert>
        </div>
      )}
      <SignInForm />
    </>
  );
}
