import { ZonedTime } from '../../../components/ui/zoned-time.tsx';
import { usePlanChanges } from '../api/get-plan-changes.ts';

type PlanChangesListProps = {
  planId: string;
  /** The plan owner's profile zone: each change is shown on the runner's clock (client/README.md, "Whose clock"). */
  ownerZone: string;
  viewerIsRunner: boolean;
};

/** The record of changes of one session: who, when, what (newest first). */
export function PlanChangesList({ planId, ownerZone, viewerIsRunner }: PlanChangesListProps) {
  const changes = usePlanChanges(planId);
  if (changes.isPending) return <p className="text-sm text-ink-muted">Loading the changes…</p>;
  if (changes.error) return <p className="text-sm text-ink-muted">{changes.error.message}</p>;
  return (
    <section aria-label="Changes to this session" className="flex flex-col gap-1">
      <h3 className="font-semibold">Changes</h3>
      <ol className="flex flex-col gap-1 text-sm">
        {changes.data.map((c) => (
          <li key={c.id} className="break-words">
            <span className="text-ink-muted tabular-nums">
              <ZonedTime iso={c.created_at} timeZone={ownerZone} viewerIsRunner={viewerIsRunner} />
            </span>{' '}
            · <span className="font-semibold">{c.actor_name}</span>: {c.summary}
          </li>
        ))}
      </ol>
    </section>
  );
}
