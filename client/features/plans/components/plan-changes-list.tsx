import { usePlanChanges } from '../api/get-plan-changes.ts';

const WHEN = new Intl.DateTimeFormat('en-GB', {
  weekday: 'short',
  day: 'numeric',
  month: 'short',
  hour: '2-digit',
  minute: '2-digit',
});

/** The record of changes of one session: who, when, what (newest first). */
export function PlanChangesList({ planId }: { planId: string }) {
  const changes = usePlanChanges(planId);
  if (changes.isPending) return <p className="text-sm text-ink-muted">Loading the changes…</p>;
  if (changes.error) return <p className="text-sm text-ink-muted">{changes.error.message}</p>;
  return (
    <section aria-label="Changes to this session" className="flex flex-col gap-1">
      <h3 className="font-semibold">Changes</h3>
      <ol className="flex flex-col gap-1 text-sm">
        {changes.data.map((c) => (
          <li key={c.id} className="break-words">
            <span className="text-ink-muted tabular-nums">{WHEN.format(new Date(c.created_at))}</span> ·{' '}
            <span className="font-semibold">{c.actor_name}</span>: {c.summary}
          </li>
        ))}
      </ol>
    </section>
  );
}
