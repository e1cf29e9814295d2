import { useState } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { formatOnDevice } from '../../../lib/format.ts';
import { DeviceClockNote } from '../../../components/ui/zoned-time.tsx';
import { useRemoveMember } from '../api/remove-member.ts';
import type { SquadDetail } from '../api/types.ts';
import { useWithdrawInvitation } from '../api/withdraw-invitation.ts';

const STATUS_WORDS = {
  open: 'waiting',
  accepted: 'accepted',
  revoked: 'withdrawn',
  expired: 'expired',
} as const;

/** The squad's runners (with "Remove from squad", confirmed) and its invitations (open ones can be withdrawn). */
export function SquadPeople({ squad }: { squad: SquadDetail }) {
  return (
    <div className="flex flex-col gap-2">
      <div className="grid gap-5 md:grid-cols-2">
        <Members squad={squad} />
        <Invitations squad={squad} />
      </div>
      <DeviceClockNote className="text-xs text-ink-muted" />
    </div>
  );
}

function Members({ squad }: { squad: SquadDetail }) {
  const remove = useRemoveMember();
  const [confirmingId, setConfirmingId] = useState<string | null>(null);
  return (
    <section aria-labelledby="squad-members" className="flex min-w-0 flex-col gap-2">
      <h3 id="squad-members" className="font-semibold">
        Runners ({squad.members.length})
      </h3>
      {remove.isError && <FormAlert>{remove.error.message}</FormAlert>}
      {squad.members.length === 0 ? (
        <p className="text-sm text-ink-muted">Nobody has joined yet. Runners appear here once they accept an invitation.</p>
      ) : (
        <ul className="divide-y divide-line text-sm">
          {squad.members.map((m) => (
            <li key={m.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <div className="min-w-0">
                <p className="font-semibold">{m.name}</p>
                <p className="break-all text-ink-muted">
                  {m.email} · joined {formatOnDevice(m.joined_at)}
                </p>
              </div>
              {confirmingId === m.id ? (
                <span role="group" aria-label={`Confirm removing ${m.name}`} className="flex flex-wrap items-center gap-2">
                  <span>You will no longer see {m.name}’s runs.</span>
                  <Button
                    variant="danger"
                    disabled={remove.isPending}
                    onClick={() =>
                      remove.mutate({ squadId: squad.id, runnerId: m.id }, { onSuccess: () => setConfirmingId(null) })
                    }
                  >
                    Yes, remove
                  </Button>
                  <Button variant="quiet" autoFocus onClick={() => setConfirmingId(null)}>
                    Keep
                  </Button>
                </span>
              ) : (
                <Button variant="secondary" onClick={() => setConfirmingId(m.id)} aria-label={`Remove from squad: ${m.name}`}>
                  Remove from squad
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

function Invitations({ squad }: { squad: SquadDetail }) {
  const withdraw = useWithdrawInvitation();
  // Newest first is how the server lists them; open ones matter most, so they lead.
  const invitations = [...squad.invitations].sort((a, b) => Number(b.status === 'open') - Number(a.status === 'open'));
  return (
    <section aria-labelledby="squad-invitations" className="flex min-w-0 flex-col gap-2">
      <h3 id="squad-invitations" className="font-semibold">
        Invitations ({invitations.filter((i) => i.status === 'open').length} waiting)
      </h3>
      {withdraw.isError && <FormAlert>{withdraw.error.message}</FormAlert>}
      {invitations.length === 0 ? (
        <p className="text-sm text-ink-muted">No invitations yet. Use “Invite runners” to send the first.</p>
      ) : (
        <ul className="divide-y divide-line text-sm">
          {invitations.map((i) => (
            <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
              <div className="min-w-0">
                <p className="font-semibold break-all">{i.email}</p>
                <p className="text-ink-muted">
                  {STATUS_WORDS[i.status]}
                  {i.status === 'open' && ` · link valid until ${formatOnDevice(i.expires_at)}`}
                </p>
              </div>
              {i.status === 'open' && (
                <Button
                  variant="secondary"
                  disabled={withdraw.isPending}
                  onClick={() => withdraw.mutate({ squadId: squad.id, invitationId: i.id })}
                  aria-label={`Withdraw the invitation to ${i.email}`}
                >
                  Withdraw
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
