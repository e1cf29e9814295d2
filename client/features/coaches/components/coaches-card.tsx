import { useRef, useState } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useMyCoaches, type CoachAccess } from '../api/get-my-coaches.ts';
import { useLeaveSquad } from '../api/leave-squad.ts';

/** Who besides the runner can read their data, and the way out of each squad. */
export function CoachesCard({ myId }: { myId: string }) {
  return (
    <Card
      title="Who can read my data"
      description="Your runs, plans and weeks are yours. Besides you, only the coaches of squads you belong to can read them."
    >
      <CoachList myId={myId} />
    </Card>
  );
}

function CoachList({ myId }: { myId: string }) {
  const { data: coaches, isPending, error } = useMyCoaches();
  const leave = useLeaveSquad();
  const [confirmingSquad, setConfirmingSquad] = useState<string | null>(null);
  const listRef = useRef<HTMLUListElement>(null);

  if (isPending) return <p className="text-ink-muted">Loading who can read your data…</p>;
  if (error) return <FormAlert>{error.message}</FormAlert>;
  if (coaches.length === 0)
    return <p className="text-ink-muted">Only you. When you accept a coach’s invitation to a squad, the coach is listed here.</p>;

  function confirmLeave(entry: CoachAccess) {
    leave.mutate(
      { squadId: entry.squad.id, runnerId: myId },
      {
        onSuccess: () => {
          setConfirmingSquad(null);
          // The row with the focused button is gone; keep keyboard users in the list.
          listRef.current?.focus();
        },
      },
    );
  }

  return (
    <div className="flex flex-col gap-2">
      {leave.isError && <FormAlert>{leave.error.message}</FormAlert>}
      <ul ref={listRef} tabIndex={-1} aria-label="Coaches who can read my data" className="flex flex-col">
        {coaches.map((entry) => (
          <li
            key={entry.squad.id}
            className="flex flex-wrap items-center justify-between gap-3 border-b border-line py-2.5 last:border-0"
          >
            <div className="min-w-0">
              <p className="font-semibold">{entry.coach.name}</p>
              <p className="text-sm break-all text-ink-muted">
                {entry.coach.email} · coach of {entry.squad.name}
              </p>
            </div>
            {confirmingSquad === entry.squad.id ? (
              <span className="inline-flex flex-wrap items-center gap-2">
                <span className="text-sm">{entry.coach.name} will no longer read your data.</span>
                <Button variant="danger" disabled={leave.isPending} onClick={() => confirmLeave(entry)}>
                  Leave {entry.squad.name}
                </Button>
                <Button variant="quiet" autoFocus onClick={() => setConfirmingSquad(null)}>
                  Stay
                </Button>
              </span>
            ) : (
              <Button
                variant="secondary"
                onClick={() => setConfirmingSquad(entry.squad.id)}
                aria-label={`Leave squad ${entry.squad.name}`}
              >
                Leave squad
              </Button>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}
