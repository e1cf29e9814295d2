import { useId } from 'react';
import { ACTIVITY_KIND_LABELS, ACTIVITY_KINDS, type ActivityKind } from '../../../../shared/runs/activity-kind.ts';
import { useHeldChoice } from '../../../lib/use-held-choice.ts';
import { useRenameRun } from '../api/rename-run.ts';

/** The mark beside a ride or a hike in lists and headings; nothing for a run. */
export function ActivityKindMark({ kind }: { kind: ActivityKind }) {
  if (kind === 'run') return null;
  return (
    <span className="ml-1.5 inline-block rounded-sm border border-line-strong px-1.5 text-xs font-semibold text-ink-muted">
      {ACTIVITY_KIND_LABELS[kind]}
    </span>
  );
}

/**
 * What this activity was, as the import decided from the file's sport and speeds: a sentence for a
 * ride or a hike (kept out of running totals and plan checks), and for the owner a choice to change it.
 */
export function ActivityKindLine({ runId, kind, isOwner }: { runId: string; kind: ActivityKind; isOwner: boolean }) {
  const change = useRenameRun();
  const id = useId();
  // The new kind shows at once and while it is saved (not the old one until the server answers); a refused
  // change falls back to the saved kind.
  const { shown, hold, release } = useHeldChoice(kind);
  const sentence =
    kind === 'run'
      ? null
      : `Recorded as a ${ACTIVITY_KIND_LABELS[kind].toLowerCase()}: kept out of running totals, the week review and plan checks.`;
  if (!isOwner) return sentence ? <p className="text-sm text-ink-muted">{sentence}</p> : null;
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm">
      <label htmlFor={id} className="text-ink-muted">
        This activity is a
      </label>
      <select
        id={id}
        value={shown}
        disabled={change.isPending}
        onChange={(event) => {
          const chosen = event.target.value as ActivityKind;
          hold(chosen);
          change.mutate({ id: runId, kind: chosen }, { onError: release });
        }}
        className="min-h-11 rounded-md border border-line-strong bg-paper px-2"
      >
        {ACTIVITY_KINDS.map((k) => (
          <option key={k} value={k}>
            {ACTIVITY_KIND_LABELS[k].toLowerCase()}
          </option>
        ))}
      </select>
      {kind !== 'run' && <span className="text-ink-muted">Kept out of running totals, the week review and plan checks.</span>}
      {change.isError && (
        <span role="alert" className="font-semibold text-tartan">
          Not changed: {change.error.message}
        </span>
      )}
    </div>
  );
}
