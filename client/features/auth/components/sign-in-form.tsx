import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { LoginInputSchema } from '../../../../shared/auth/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { paths, resolveNext } from '../../../config/paths.ts';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useSignIn } from '../api/sign-in.ts';

export function SignInForm() {
  const [searchParams] = useSearchParams();
  const next = searchParams.get('next');
  const navigate = useNavigate();
  const mutation = useSignIn();
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: LoginInputSchema,
    mutation,
    readValues: (data) => ({ email: readText(data, 'email'), password: readText(data, 'password') }),
    onSuccess: () => navigate(resolveNext(next), { replace: true }),
  });

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      {formError && <FormAlert>{formError}</FormAlert>}
      <TextField label="E-mail" name="email" type="email" autoComplete="email" required error={fieldErrors.email} />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete="current-password"
        required
        error={fieldErrors.password}
      />
      <p className="-mt-2 text-sm">
        <Link
          to={paths.forgotPassword.getHref()}
          className="inline-flex tap-target items-center font-semibold text-teal underline"
        >
          Forgot your password?
        </Link>
      </p>
      <Button type="submit" disabled={mutation.isPending}>
        {mutation.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
      <p className="text-sm text-ink-muted">
        New to Pacewright?{' '}
        <Link
          to={paths.signUp.getHref(next ?? undefined)}
          className="inline-flex tap-target items-center font-semibold text-teal underline"
        >
          Create an account
        </Link>
      </p>
    </form>
  );
}
