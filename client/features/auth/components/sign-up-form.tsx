import { useId } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import {
  NextPathSchema,
  PASSWORD_MIN_LENGTH,
  RegisterInputSchema,
  SIGN_UP_SENT_MESSAGE,
} from '../../../../shared/auth/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { paths, resolveNext } from '../../../config/paths.ts';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { useSignUp } from '../api/sign-up.ts';

const ROLE_CHOICES = [
  { value: 'runner', label: 'Runner', description: 'I log my runs and train for a goal race.' },
  { value: 'coach', label: 'Coach', description: 'I also guide a squad of runners and write their plans.' },
] as const;

/** The invitation token when the sign-up started from an invitation page (`?next=/invite/inv_…`). */
function invitationTokenIn(next: string | null): string | undefined {
  const token = next?.match(/^\/invite\/([^/?#]+)$/)?.[1];
  return token ? decodeURIComponent(token) : undefined;
}

export function SignUpForm() {
  const [searchParams] = useSearchParams();
  const next = searchParams.get('next');
  const navigate = useNavigate();
  const mutation = useSignUp();
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: RegisterInputSchema,
    mutation,
    readValues: (data) => ({
      name: readText(data, 'name'),
      email: readText(data, 'email'),
      password: readText(data, 'password'),
      role: readText(data, 'role'),
      // Opened again from the e-mailed link (an invitation the sign-up started from).
      next: next && NextPathSchema.safeParse(next).success ? next : undefined,
      // An invitation to this very address already proved it: the account is made at once.
      invitation: invitationTokenIn(next),
    }),
    onSuccess: ({ confirmation }) => {
      if (confirmation === 'not-needed') navigate(resolveNext(next), { replace: true });
    },
  });
  const id = useId();
  const roleErrorId = `${id}-role-error`;

  // The same answer whether or not the address has an account (issue 13 #7): the e-mail says which.
  if (mutation.isSuccess && mutation.data.confirmation === 'sent')
    return (
      <div className="flex flex-col gap-2 rounded-md border-l-4 border-teal bg-teal-wash p-3">
        <p role="status" className="font-semibold">
          {mutation.data.message ?? SIGN_UP_SENT_MESSAGE}
        </p>
        <p className="text-sm">
          Wrong address?{' '}
          <button type="button" className="font-semibold text-teal underline" onClick={() => mutation.reset()}>
            Sign up again
          </button>
        </p>
      </div>
    );

  return (
    <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
      {formError && <FormAlert>{formError}</FormAlert>}
      <TextField label="Name" name="name" autoComplete="name" required error={fieldErrors.name} />
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="email"
        required
        defaultValue={searchParams.get('email') ?? undefined}
        error={fieldErrors.email}
      />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        minLength={PASSWORD_MIN_LENGTH}
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. A few unrelated words make a strong one.`}
        error={fieldErrors.password}
      />
      <fieldset
        role="radiogroup"
        aria-labelledby={`${id}-role-legend`}
        className="flex flex-col gap-2"
        aria-describedby={fieldErrors.role ? roleErrorId : undefined}
        aria-invalid={fieldErrors.role ? true : undefined}
      >
        <legend id={`${id}-role-legend`} className="mb-1 text-sm font-semibold">
          I sign up as
        </legend>
        {ROLE_CHOICES.map((choice) => (
          <label
            key={choice.value}
            className="flex cursor-pointer items-start gap-3 rounded-md border border-line bg-white px-3 py-2 has-checked:border-teal has-checked:bg-teal-wash"
          >
            <input
              type="radio"
              name="role"
              value={choice.value}
              defaultChecked={choice.value === 'runner'}
              aria-describedby={`${id}-${choice.value}`}
              className="mt-1 accent-teal"
            />
            <span className="flex flex-col">
              <span className="font-semibold">{choice.label}</span>
              <span id={`${id}-${choice.value}`} className="text-sm text-ink-muted">
                {choice.description}
              </span>
            </span>
          </label>
        ))}
        {fieldErrors.role && (
          <p id={roleErrorId} className="text-sm font-semibold text-tartan">
            {fieldErrors.role}
          </p>
        )}
      </fieldset>
      <Button type="submit" disabled={mutation.isPending}>
        {mutation.isPending ? 'Creating account…' : 'Create account'}
      </Button>
      <p className="text-sm text-ink-muted">
        Already have an account?{' '}
        <Link to={paths.signIn.getHref(next ?? undefined)} className="font-semibold text-teal underline">
          Sign in
        </Link>
      </p>
    </form>
  );
}
