import { Link } from 'react-router-dom';
import type { SessionVerdict } from '../../../../shared/plans/plan-check.ts';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { plannedVolume, weekDates } from '../../../../shared/plans/weeks.ts';
import { formatDistance } from '../../../../shared/runs/display.ts';
import type { RunListItem } from '../../../../shared/runs/schemas.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Verdict } from '../../../components/ui/verdict.tsx';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';

const DAY_NAME = new Intl.DateTimeFormat('en-GB', { weekday: 'short', day: 'numeric', month: 'short', timeZone: 'UTC' });
const DAY_LONG = new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', timeZone: 'UTC' });

/** "Mon 7 Dec" for a `YYYY-MM-DD`. */
export function formatDay(date: string, long = false): string {
  return (long ? DAY_LONG : DAY_NAME).format(new Date(`${date}T00:00:00Z`));
}

type PlanWeekProps = {
  monday: string;
  plans: Plan[];
  runs: RunListItem[];
  unit: Unit;
  today: string;
  /** The plan check's session verdict of each run shown, by run id, as they arrive. */
  checks: ReadonlyMap<string, SessionVerdict>;
  onEdit: (plan: Plan) => void;
  onNew: (date: string) => void;
};

/** "4 h 35 min", "50 min". */
function formatHoursMinutes(seconds: number): string {
  const minutes = Math.round(seconds / 60);
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return h > 0 ? `${h} h${m > 0 ? ` ${m} min` : ''}` : `${m} min`;
}

function groupBy<T>(list: T[], key: (item: T) => string): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const item of list) map.set(key(item), [...(map.get(key(item)) ?? []), item]);
  return map;
}

/**
 * Monday to Sunday: each day its session plans (title and shorthand) and its runs (distance, and
 * the plan check's session verdict in words with a glyph). Seven columns on a wide screen, a list
 * of days on a phone.
 */
export function PlanWeek({ monday, plans, runs, unit, today, checks, onEdit, onNew }: PlanWeekProps) {
  const plansByDate = groupBy(plans, (p) => p.date);
  const runsByDate = groupBy(runs, (r) => r.local_date);
  const planned = plans.reduce(
    (sum, p) => {
      const v = plannedVolume(p.parts);
      return { distance_m: sum.distance_m + v.distance_m, duration_s: sum.duration_s + v.duration_s };
    },
    { distance_m: 0, duration_s: 0 },
  );
  const runDistance = runs.reduce((sum, r) => sum + r.distance_m, 0);

  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-muted tabular-nums">
        Planned:{' '}
        <span className="font-semibold text-ink">
          {formatDistance(planned.distance_m, unit, 1)} {unit}
          {planned.duration_s > 0 && ` + ${formatHoursMinutes(planned.duration_s)} of timed parts`}
        </span>{' '}
        · Run:{' '}
        <span className="font-semibold text-ink">
          {formatDistance(runDistance, unit, 1)} {unit}
        </span>{' '}
        in {runs.length} {runs.length === 1 ? 'run' : 'runs'}
      </p>
      <ol className="grid grid-cols-1 gap-2 lg:grid-cols-7">
        {weekDates(monday).map((date) => (
          <Day
            key={date}
            date={date}
            plans={plansByDate.get(date) ?? []}
            runs={runsByDate.get(date) ?? []}
            unit={unit}
            today={today}
            checks={checks}
            onEdit={onEdit}
            onNew={onNew}
          />
        ))}
      </ol>
    </div>
  );
}

type DayProps = Omit<PlanWeekProps, 'monday'> & { date: string };

function Day({ date, plans, runs, unit, today, checks, onEdit, onNew }: DayProps) {
  const isToday = date === today;
  const missed = date < today && runs.length === 0;
  const label = formatDay(date);
  return (
    <li
      aria-label={formatDay(date, true)}
      className={cn(
        'flex min-w-0 flex-col gap-2 rounded-md border bg-white p-2 lg:min-h-40',
        isToday ? 'border-ink ring-1 ring-ink' : 'border-line',
      )}
    >
      <h3 className="flex items-baseline justify-between gap-1 text-sm">
        <span className={cn('font-semibold', !isToday && 'text-ink-muted')}>{label}</span>
        {isToday && <span className="text-xs font-bold tracking-wide uppercase">today</span>}
      </h3>
      {plans.map((plan) => (
        <article key={plan.id} className="flex flex-col gap-0.5 border-l-2 border-teal pl-2">
          <h4 className="text-sm leading-snug font-semibold break-words">{plan.title || 'Session'}</h4>
          <p className="text-xs leading-snug break-words text-ink-muted tabular-nums">{plan.text}</p>
          {plan.notes && <p className="text-xs break-words text-ink-muted italic">{plan.notes}</p>}
          <div className="flex flex-wrap items-center justify-between gap-1">
            {missed ? <Verdict verdict="missed" className="text-sm" /> : <span />}
            <Button
              variant="quiet"
              className="min-h-7 px-0 py-0 text-xs"
              onClick={() => onEdit(plan)}
              aria-label={`Edit ${plan.title || 'session'} on ${label}`}
            >
              Edit
            </Button>
          </div>
        </article>
      ))}
      {runs.map((run) => {
        const verdict = checks.get(run.id);
        return (
          <div key={run.id} className="flex flex-col gap-0.5 rounded-sm bg-paper px-2 py-1">
            <Link
              to={paths.run.getHref(run.id)}
              className="text-sm font-semibold text-teal tabular-nums underline-offset-2 hover:underline"
            >
              {formatDistance(run.distance_m, unit)} {unit}
              <span className="font-normal text-ink-muted"> · {run.name}</span>
            </Link>
            {verdict ? (
              <Verdict verdict={verdict} className="text-xs" />
            ) : (
              <span className="text-xs text-ink-muted">checking…</span>
            )}
          </div>
        );
      })}
      {plans.length === 0 && runs.length === 0 && <p className="text-sm text-ink-muted">Nothing planned.</p>}
      <Button
        variant="quiet"
        className="mt-auto min-h-7 self-start px-0 py-0 text-xs"
        onClick={() => onNew(date)}
        aria-label={`New session on ${label}`}
      >
        + Add session
      </Button>
    </li>
  );
}
