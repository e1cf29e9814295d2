import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { HEALTH_REFRESH_MS, useHealth } from '../api/get-health.ts';

const TIME_FORMAT = new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit', second: '2-digit' });

function Status({ label, up }: { label: string; up: boolean }) {
  return (
    <div className="flex items-baseline justify-between gap-4 border-b border-line py-1.5 last:border-0">
      <dt>{label}</dt>
      <dd className={up ? 'font-semibold text-teal' : 'font-semibold text-tartan'}>
        <span aria-hidden="true">{up ? '●' : '○'}</span> {up ? 'up' : 'down'}
      </dd>
    </div>
  );
}

/** What GET /api/health reports, refreshed every half minute. */
export function ServiceHealth() {
  const { data, error, dataUpdatedAt, isPending } = useHealth();

  if (isPending) return <p className="text-ink-muted">Asking the service…</p>;
  if (error) return <FormAlert>The service did not answer: {error.message}</FormAlert>;

  return (
    <div>
      <dl>
        <Status label="API" up />
        <Status label="Database" up={data.db === 'up'} />
      </dl>
      <p className="mt-2 text-sm text-ink-muted">
        Checked at <span className="tabular-nums">{TIME_FORMAT.format(dataUpdatedAt)}</span>; checks again every{' '}
        {HEALTH_REFRESH_MS / 1000} seconds.
      </p>
    </div>
  );
}
