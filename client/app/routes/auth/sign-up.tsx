import { SignUpForm } from '../../../features/auth/components/sign-up-form.tsx';

export default function SignUpRoute() {
  return (
    <>
      <title>Create your account · Pacewright</title>
      <h1 className="mb-5 text-2xl font-bold">Create your account</h1>
      <SignUpForm />
    </>
  );
}
