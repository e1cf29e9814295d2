import { Fragment } from 'react';
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
    // Phones: seven columns of at least 44 px (the card's padding is given back); a day is one link to its week.
    <div className="relative -mx-3 sm:-mx-5 sm:px-5">
      <table className="w-full table-fixed text-sm">
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
                <td key={d} className="h-20 p-0 align-top sm:p-0.5">
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
    <div className={cn('relative flex h-full flex-col gap-0.5 rounded-sm px-0.5 py-0.5 sm:px-1', isToday && 'ring-1 ring-ink')}>
      <Link
        to={weekHref(mondayOf(date))}
        className={cn(
          'min-h-6 text-xs underline-offset-2 hover:underline max-sm:absolute max-sm:inset-0 max-sm:px-0.5 max-sm:py-0.5 sm:block',
          isToday ? 'font-bold text-ink' : 'text-ink-muted',
        )}
        aria-label={`${formatLocalDate(date)}${isToday ? ' (today)' : ''}: open its week`}
      >
        {Number(date.slice(8))}
      </Link>
      {plans.map((p) => (
        <span key={p.id} title={p.text} className="truncate border-l-2 border-teal pl-1 text-xs font-semibold max-sm:mt-4">
          <span className="max-sm:sr-only">{p.title || 'Session'}</span>
        </span>
      ))}
      {missed && <Verdict verdict="missed" className="text-xs" />}
      {runs.map((run) => (
        <Fragment key={run.id}>
          <span className="text-xs font-semibold text-teal tabular-nums sm:hidden" aria-hidden="true">
            {formatDistance(run.distance_m, unit, 1)}
          </span>
          <Link
            to={paths.run.getHref(run.id)}
            title={run.name}
            className="hidden min-h-6 text-xs font-semibold text-teal tabular-nums underline-offset-2 hover:underline sm:block"
          >
            {formatDistance(run.distance_m, unit, 1)} {unit}
            <span className="sr-only">, {run.name}</span>
          </Link>
        </Fragment>
      ))}
    </div>
  );
}
