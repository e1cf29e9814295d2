import { useRef, useState } from 'react';
import { NamedTokenInputSchema, type ApiToken } from '../../../../shared/auth/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText, useSchemaForm } from '../../../lib/form.ts';
import { formatOnDevice } from '../../../lib/format.ts';
import { DeviceClockNote } from '../../../components/ui/zoned-time.tsx';
import { useCreateToken } from '../api/create-token.ts';
import { useTokens } from '../api/get-tokens.ts';
import { useRevokeToken } from '../api/revoke-token.ts';

export function ApiTokensCard() {
  return (
    <Card
      title="API tokens for scripts"
      description={
        <>
          A token lets your own scripts read and write your data without a browser: send it in the header{' '}
          <code className="rounded bg-paper px-1">Authorization: Bearer &lt;token&gt;</code>. Revoke any token you no longer use.
        </>
      }
    >
      <div className="flex flex-col gap-5">
        <CreateTokenForm />
        <TokenList />
      </div>
    </Card>
  );
}

function CreateTokenForm() {
  const mutation = useCreateToken();
  const formRef = useRef<HTMLFormElement>(null);
  const { onSubmit, fieldErrors, formError } = useSchemaForm({
    schema: NamedTokenInputSchema,
    mutation,
    readValues: (data) => ({ name: readText(data, 'name') }),
    onSuccess: () => formRef.current?.reset(),
  });

  return (
    <div className="flex flex-col gap-3">
      {mutation.data && (
        <NewTokenNotice
          key={mutation.data.id}
          token={mutation.data.token}
          expiresAt={mutation.data.expires_at}
          onDone={mutation.reset}
        />
      )}
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-3 sm:flex-row sm:items-start">
        <TextField
          label="Token name"
          name="name"
          hint="Say what uses it, e.g. “weekly export script”."
          error={fieldErrors.name}
          className="sm:flex-1"
        />
        <Button type="submit" disabled={mutation.isPending} className="sm:mt-6">
          {mutation.isPending ? 'Creating…' : 'Create token'}
        </Button>
      </form>
      {formError && <FormAlert>{formError}</FormAlert>}
    </div>
  );
}

function NewTokenNotice({ token, expiresAt, onDone }: { token: string; expiresAt: string; onDone: () => void }) {
  const [copy, setCopy] = useState<'idle' | 'copied' | 'failed'>('idle');
  return (
    <div role="status" className="flex flex-col gap-2 rounded-md border-l-4 border-tartan bg-tartan-wash p-3">
      <p className="font-semibold text-tartan-deep">Copy this token now: it will not be shown again.</p>
      <code className="block overflow-x-auto rounded bg-card px-2 py-1.5 font-mono text-sm break-all">{token}</code>
      <p className="text-sm">It works until {formatOnDevice(expiresAt)}. Anyone holding it can act as you, so keep it secret.</p>
      <div className="flex flex-wrap gap-2">
        <Button
          variant="secondary"
          onClick={() =>
            navigator.clipboard.writeText(token).then(
              () => setCopy('copied'),
              () => setCopy('failed'),
            )
          }
        >
          {copy === 'copied' ? 'Copied' : 'Copy token'}
        </Button>
        <Button variant="quiet" onClick={onDone}>
          I have copied it
        </Button>
      </div>
      {copy === 'failed' && <p className="text-sm">This browser did not allow copying: select the token and copy it by hand.</p>}
    </div>
  );
}

function TokenList() {
  const { data: tokens, isPending, error } = useTokens();
  const revoke = useRevokeToken();
  const [confirmingId, setConfirmingId] = useState<string | null>(null);
  const captionRef = useRef<HTMLTableCaptionElement>(null);

  if (isPending) return <p className="text-ink-muted">Loading your tokens…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  if (tokens.length === 0) return <p className="text-ink-muted">No tokens yet. Create one above when a script needs access.</p>;

  function confirmRevoke(token: ApiToken) {
    revoke.mutate(token.id, {
      onSuccess: () => {
        setConfirmingId(null);
        // The row with the focused button is gone; keep keyboard users in the list.
        captionRef.current?.focus();
      },
    });
  }

  return (
    <div className="flex flex-col gap-2">
      {revoke.isError && <FormAlert>{revoke.error.message}</FormAlert>}
      <div className="relative overflow-x-auto">
        <table className="w-full min-w-lg text-left text-sm">
          <caption ref={captionRef} tabIndex={-1} className="pb-2 text-left font-semibold">
            Your tokens
          </caption>
          <thead className="border-b border-line text-ink-muted">
            <tr>
              <th scope="col" className="py-1.5 pr-3 font-semibold">
                Name
              </th>
              <th scope="col" className="py-1.5 pr-3 font-semibold">
                Created
              </th>
              <th scope="col" className="py-1.5 pr-3 font-semibold">
                Expires
              </th>
              <th scope="col" className="py-1.5 pr-3 font-semibold">
                Last used
              </th>
              <th scope="col" className="py-1.5 font-semibold">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {tokens.map((token) => (
              <tr key={token.id} className="border-b border-line last:border-0">
                <th scope="row" className="py-2 pr-3 font-semibold">
                  {token.name}
                </th>
                <td className="py-2 pr-3">{formatOnDevice(token.created_at)}</td>
                <td className="py-2 pr-3">{formatOnDevice(token.expires_at)}</td>
                <td className="py-2 pr-3">{token.last_used_at ? formatOnDevice(token.last_used_at) : 'never'}</td>
                <td className="py-2 text-right">
                  {confirmingId === token.id ? (
                    <span className="inline-flex flex-wrap items-center justify-end gap-2">
                      <span>Scripts using it stop working.</span>
                      <Button variant="danger" disabled={revoke.isPending} onClick={() => confirmRevoke(token)}>
                        Revoke “{token.name}”
                      </Button>
                      <Button variant="quiet" autoFocus onClick={() => setConfirmingId(null)}>
                        Keep it
                      </Button>
                    </span>
                  ) : (
                    <Button variant="secondary" onClick={() => setConfirmingId(token.id)} aria-label={`Revoke ${token.name}`}>
                      Revoke
                    </Button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <DeviceClockNote className="text-xs text-ink-muted" />
    </div>
  );
}
