import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { useDeleteAccount } from '../api/delete-account.ts';

const WHAT_GOES = [
  'your runs, their splits and the original watch files',
  'your session plans, goal race, race results and fuel plans and items',
  'notes you wrote and notes written to you',
  'your place in any squad; squads you coach, with their invitations',
  'your API tokens and your sign-in',
];

/** "Delete my account": what goes, the password, then a last confirmation before anything is removed. */
export function DeleteAccountCard({ role }: { role: string }) {
  const [password, setPassword] = useState('');
  const [confirming, setConfirming] = useState(false);
  const [error, setError] = useState<string | undefined>();
  const mutation = useDeleteAccount();

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    if (!password) {
      setError('Type your password to confirm.');
      return;
    }
    setError(undefined);
    setConfirming(true);
  }

  function onConfirm() {
    mutation.mutate(
      { password },
      {
        onError: (e) => {
          setConfirming(false);
          setError(e.message);
        },
      },
    );
  }

  return (
    <Card title="Delete my account" description="This cannot be undone. Download your data first if you want to keep it.">
      <p className="text-sm font-semibold">What goes, at once and for good:</p>
      <ul className="mb-3 ml-5 list-disc text-sm">
        {WHAT_GOES.map((line) => (
          <li key={line}>{line}</li>
        ))}
        {role === 'coach' && <li>your runners keep their own runs and plans; they leave your squads</li>}
      </ul>
      <form aria-label="Delete my account" onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
        <TextField
          label="Your password"
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(event) => {
            setPassword(event.target.value);
            setConfirming(false);
            if (error) setError(undefined);
          }}
          error={error}
          className="max-w-sm"
        />
        {!confirming ? (
          <Button type="submit" variant="danger" className="self-start">
            Delete my account…
          </Button>
        ) : (
          <div
            role="alertdialog"
            aria-label="Last confirmation"
            className="flex flex-col gap-2 rounded-md border border-tartan p-3"
          >
            <p className="text-sm font-semibold">Delete your account and everything in it now? This is the last step.</p>
            <div className="flex flex-wrap gap-2">
              <Button variant="danger" onClick={onConfirm} disabled={mutation.isPending}>
                {mutation.isPending ? 'Deleting…' : 'Yes, delete everything'}
              </Button>
              <Button variant="secondary" onClick={() => setConfirming(false)} autoFocus>
                Keep my account
              </Button>
            </div>
          </div>
        )}
      </form>
    </Card>
  );
}
