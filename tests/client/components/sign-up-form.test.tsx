import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SIGN_UP_SENT_MESSAGE } from '../../../shared/auth/schemas.ts';
import { SignUpForm } from '../../../client/features/auth/components/sign-up-form.tsx';
import { descriptionOf, fakeServer, renderAt } from '../support/render.tsx';

afterEach(() => vi.unstubAllGlobals());

const user = { id: '7b0b1f5e-8c1d-4a55-9a43-2f4d2c8b9e10', email: 'ivy@example.test', name: 'Ivy Runner', role: 'runner' };

async function fillIn(values: { name?: string; email?: string; password?: string }) {
  const u = userEvent.setup();
  if (values.name !== undefined) await u.type(screen.getByLabelText('Name'), values.name);
  if (values.email !== undefined) await u.type(screen.getByLabelText('E-mail'), values.email);
  if (values.password !== undefined) await u.type(screen.getByLabelText('Password'), values.password);
  return u;
}

describe('SignUpForm', () => {
  it('checks the fields before sending: nothing is sent and each message stands at its field', async () => {
    const sent = fakeServer(() => ({ status: 500 }));
    renderAt('/sign-up', <SignUpForm />);
    const u = await fillIn({ name: 'Ivy Runner', email: 'not-an-address', password: 'short' });
    await u.click(screen.getByRole('button', { name: 'Create account' }));

    expect(sent.filter((r) => r.path.startsWith('/api/auth'))).toEqual([]);
    const email = screen.getByLabelText('E-mail');
    expect(email.getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(email)).toBe('Enter a valid e-mail address, like name@example.com.');
    const password = screen.getByLabelText('Password');
    expect(password.getAttribute('aria-invalid')).toBe('true');
    // The hint stays, the problem follows it.
    expect(descriptionOf(password)).toMatch(/^At least \d+ characters\..* Use at least \d+ characters for the password\.$/);
    expect(screen.getByLabelText('Name').getAttribute('aria-invalid')).toBeNull();
    expect(descriptionOf(screen.getByLabelText('Name'))).toBe('');
    // Focus goes to the first field that needs attention.
    expect(document.activeElement).toBe(email);
  });

  it('sends the sign-up with the chosen role and shows the same "check your e-mail" answer', async () => {
    const sent = fakeServer((r) =>
      r.path === '/api/auth/register'
        ? { status: 201, body: { user: { ...user, role: 'coach' }, confirmation: 'sent' } }
        : { status: 200, body: {} },
    );
    renderAt('/sign-up', <SignUpForm />);
    const u = await fillIn({ name: 'Ivy Runner', email: 'ivy@example.test', password: 'a long enough secret' });
    await u.click(screen.getByRole('radio', { name: /Coach/ }));
    await u.click(screen.getByRole('button', { name: 'Create account' }));

    expect(await screen.findByRole('status')).toHaveProperty('textContent', SIGN_UP_SENT_MESSAGE);
    const register = sent.filter((r) => r.path === '/api/auth/register');
    expect(register).toHaveLength(1);
    expect(register[0]!.method).toBe('POST');
    expect(register[0]!.body).toEqual({
      name: 'Ivy Runner',
      email: 'ivy@example.test',
      password: 'a long enough secret',
      role: 'coach',
    });
    // Nobody is signed in yet: the page stays.
    expect(screen.getByTestId('current-path').textContent).toBe('/sign-up');

    // "Sign up again" brings the form back.
    await u.click(screen.getByRole('button', { name: 'Sign up again' }));
    expect(screen.getByRole('button', { name: 'Create account' })).toBeTruthy();
  });

  it('through an invitation to this address: sends the token and opens the invitation at once', async () => {
    const sent = fakeServer((r) =>
      r.path === '/api/auth/register' ? { status: 201, body: { user, confirmation: 'not-needed' } } : { status: 200, body: {} },
    );
    renderAt('/sign-up?next=%2Finvite%2Finv_abc', <SignUpForm />);
    const u = await fillIn({ name: 'Ivy Runner', email: 'ivy@example.test', password: 'a long enough secret' });
    await u.click(screen.getByRole('button', { name: 'Create account' }));

    await vi.waitFor(() => expect(screen.getByTestId('current-path').textContent).toBe('/invite/inv_abc'));
    const register = sent.find((r) => r.path === '/api/auth/register')!;
    expect(register.body).toMatchObject({ next: '/invite/inv_abc', invitation: 'inv_abc', role: 'runner' });
  });

  it("puts the server's field problem beside its field and keeps what was typed", async () => {
    fakeServer((r) =>
      r.path === '/api/auth/register'
        ? {
            status: 400,
            body: {
              error: 'Some fields need attention.',
              code: 'validation-failed',
              details: [{ field: 'email', message: 'Use an address that can receive e-mail.' }],
            },
          }
        : { status: 200, body: {} },
    );
    renderAt('/sign-up', <SignUpForm />);
    const u = await fillIn({ name: 'Ivy Runner', email: 'ivy@example.test', password: 'a long enough secret' });
    await u.click(screen.getByRole('button', { name: 'Create account' }));

    expect(await screen.findByText('Use an address that can receive e-mail.')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(screen.getByLabelText('E-mail'))).toBe('Use an address that can receive e-mail.');
    expect(screen.getByRole('alert').textContent).toBe('Some fields need attention: see the messages beside them.');
    expect(document.activeElement).toBe(screen.getByLabelText('E-mail'));
    expect((screen.getByLabelText('Name') as HTMLInputElement).value).toBe('Ivy Runner');
    expect((screen.getByLabelText('E-mail') as HTMLInputElement).value).toBe('ivy@example.test');
  });
});
