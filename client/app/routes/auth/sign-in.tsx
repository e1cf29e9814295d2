import { SignInForm } from '../../../features/auth/components/sign-in-form.tsx';

export default function SignInRoute() {
  return (
    <>
      <title>Sign in · Pacewright</title>
      <h1 className="mb-5 text-2xl font-bold">Sign in</h1>
      <SignInForm />
    </>
  );
}
