import { Link } from 'react-router-dom';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { mondayOf } from '../../../../shared/plans/weeks.ts';
import { CALENDAR_WEEKDAYS as WEEKDAYS, monthWeeks, type YearMonth } from '../../../../shared/runs/calendar.ts';
import { formatDistance, formatLocalDate } from '../../../../shared/runs/display.ts';
import type { RunListItem } from '../../../../shared/runs/schemas.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Verdict } from '../../../components/ui/verdict.tsx';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';

type PlanMonthProps = {
  month: YearMonth;
  plans: Plan[];
  runs: RunListItem[];
  unit: Unit;
  today: string;
  title: string;
  /** The link of a week (its Monday); the signed-in person's Plan by default. */
  weekHref?: (monday: string) => string;
};

/**
 * A month, Monday first: each day's session titles and run distances (no plan checks here, to keep
 * the requests few; the week view has them). A day number opens its week.
 */
export function PlanMonth({ month, plans, runs, unit, today, title, weekHref }: PlanMonthProps) {
  const plansByDate = new Map<string, Plan[]>();
  for (const p of plans) plansByDate.set(p.date, [...(plansByDate.get(p.date) ?? []), p]);
  const runsByDate = new Map<string, RunListItem[]>();
  for (const r of runs) runsByDate.set(r.local_date, [...(runsByDate.get(r.local_date) ?? []), r]);

  return (
    <div
      className="relative -mx-4 overflow-x-auto px-4 sm:-mx-5 sm:px-5"
      role="region"
      aria-label={`${title}, plans and runs`}
      tabIndex={0}
    >
      <table className="w-full min-w-2xl table-fixed text-sm">
        <caption className="sr-only">
          {title}: session plans and run distances in {unit} per day
        </caption>
        <thead className="text-ink-muted">
          <tr>
            {WEEKDAYS.map(([short, long]) => (
              <th key={short} scope="col" className="pb-1 text-left text-xs font-semibold">
                <abbr title={long} className="no-underline">
                  {short}
                </abbr>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {monthWeeks(month).map((week, w) => (
            <tr key={w} className="border-t border-line">
              {week.map((date, d) => (
                <td key={d} className="h-20 p-0.5 align-top">
                  {date && (
                    <MonthDay
                      date={date}
                      plans={plansByDate.get(date) ?? []}
                      runs={runsByDate.get(date) ?? []}
                      unit={unit}
                      today={today}
                      weekHref={weekHref ?? ((monday) => paths.plan.getHref({ week: monday }))}
                    />
                  )}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function MonthDay({
  date,
  plans,
  runs,
  unit,
  today,
  weekHref,
}: {
  date: string;
  plans: Plan[];
  runs: RunListItem[];
  unit: Unit;
  today: string;
  weekHref: (monday: string) => string;
}) {
  const isToday = date === today;
  const missed = date < today && runs.length === 0 && plans.length > 0;
  return (
    <div className={cn('flex h-full flex-col gap-0.5 rounded-sm px-1 py-0.5', isToday && 'ring-1 ring-ink')}>
      <Link
        to={weekHref(mondayOf(date))}
        className={cn('text-xs underline-offset-2 hover:underline', isToday ? 'font-bold text-ink' : 'text-ink-muted')}
        aria-label={`${formatLocalDate(date)}${isToday ? ' (today)' : ''}: open its week`}
      >
        {Number(date.slice(8))}
      </Link>
      {plans.map((p) => (
        <span key={p.id} title={p.text} className="truncate border-l-2 border-teal pl-1 text-xs font-semibold">
          {p.title || 'Session'}
        </span>
      ))}
      {missed && <Verdict verdict="missed" className="text-xs" />}
      {runs.map((run) => (
        <Link
          key={run.id}
          to={paths.run.getHref(run.id)}
          title={run.name}
          className="text-xs font-semibold text-teal tabular-nums underline-offset-2 hover:underline"
        >
          {formatDistance(run.distance_m, unit, 1)} {unit}
          <span className="sr-only">, {run.name}</span>
        </Link>
      ))}
    </div>
  );
}
