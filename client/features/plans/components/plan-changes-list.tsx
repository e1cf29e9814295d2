import { CardClockWords, CardTime, cardClock } from '../../../components/ui/zoned-time.tsx';
import { usePlanChanges } from '../api/get-plan-changes.ts';

type PlanChangesListProps = {
  planId: string;
  /** The plan owner's profile zone: changes are shown on the runner's clock, named once (client/README.md, "Whose clock"). */
  ownerZone: string;
  viewerIsRunner: boolean;
};

/** The record of changes of one session: who, when, what (newest first). */
export function PlanChangesList({ planId, ownerZone, viewerIsRunner }: PlanChangesListProps) {
  const changes = usePlanChanges(planId);
  if (changes.isPending) return <p className="text-sm text-ink-muted">Loading the changes…</p>;
  if (changes.error) return <p className="text-sm text-ink-muted">{changes.error.message}</p>;
  const clock = cardClock(
    changes.data.map((c) => ({ iso: c.created_at, shape: 'date-time' })),
    ownerZone,
    viewerIsRunner,
  );
  return (
    <section aria-label="Changes to this session" className="flex flex-col gap-1">
      <h3 className="font-semibold">Changes</h3>
      <CardClockWords clock={clock} className="text-xs text-ink-muted" />
      <ol className="flex flex-col gap-1 text-sm">
        {changes.data.map((c) => (
          <li key={c.id} className="break-words">
            <span className="text-ink-muted tabular-nums">
              <CardTime iso={c.created_at} clock={clock} />
            </span>{' '}
            · <span className="font-semibold">{c.actor_name}</span>: {c.summary}
          </li>
        ))}
      </ol>
    </section>
  );
}
