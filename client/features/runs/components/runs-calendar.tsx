import { Fragment } from 'react';
import { Link } from 'react-router-dom';
import {
  CALENDAR_WEEKDAYS as WEEKDAYS,
  formatYearMonth,
  monthWeeks,
  shiftMonth,
  type YearMonth,
} from '../../../../shared/runs/calendar.ts';
import { formatDistance } from '../../../../shared/runs/display.ts';
import type { RunListSorting } from '../../../../shared/runs/list-sort.ts';
import type { RunListItem } from '../../../../shared/runs/schemas.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';

const MONTH_NAMES = new Intl.DateTimeFormat('en-GB', { month: 'long', year: 'numeric', timeZone: 'UTC' });

type RunsCalendarProps = {
  month: YearMonth;
  runs: RunListItem[];
  unit: Unit;
  /** Today's `YYYY-MM-DD`, outlined. */
  today: string;
  /** Other search parameters of the page to keep when changing month. */
  page: number;
  /** The list page's keyset cursor, kept with `page`. */
  after?: string;
  sorting?: RunListSorting;
};

/** A month, Monday first: each day its distance linked to its run(s), and each week's total. No coloured cells. */
export function RunsCalendar({ month, runs, unit, today, page, after, sorting }: RunsCalendarProps) {
  const byDate = new Map<string, RunListItem[]>();
  for (const run of runs) byDate.set(run.local_date, [...(byDate.get(run.local_date) ?? []), run]);
  const weeks = monthWeeks(month);
  const title = MONTH_NAMES.format(new Date(Date.UTC(month.year, month.month - 1, 1)));
  const monthTotal = runs.reduce((sum, r) => sum + r.distance_m, 0);
  const nav =
    'inline-flex size-11 shrink-0 sm:size-8 items-center justify-center rounded-md border border-line bg-card text-teal hover:border-teal';

  return (
    <div className="flex flex-col gap-2">
      <div className="flex items-center gap-2">
        <Link
          to={paths.log.getHref({ month: formatYearMonth(shiftMonth(month, -1)), page, after, ...sorting })}
          className={nav}
          aria-label="Previous month"
        >
          ◀
        </Link>
        <h3 className="min-w-28 text-center font-semibold sm:min-w-36" aria-live="polite">
          {title}
        </h3>
        <Link
          to={paths.log.getHref({ month: formatYearMonth(shiftMonth(month, 1)), page, after, ...sorting })}
          className={nav}
          aria-label="Next month"
        >
          ▶
        </Link>
        <span className="ml-auto text-sm text-ink-muted tabular-nums">
          {runs.length} {runs.length === 1 ? 'run' : 'runs'} · {formatDistance(monthTotal, unit, 1)} {unit}
        </span>
      </div>
      {/* Phones: seven columns of at least 44 px (the card's padding is given back), week totals on a line under each week. */}
      <div className="relative -mx-3 overflow-x-auto sm:-mx-5 sm:px-5">
        <table className="w-full table-fixed text-sm tabular-nums sm:min-w-sm">
          <caption className="sr-only">
            {title}: distance in {unit} per day, and per week
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
              <th scope="col" className="hidden w-14 pb-1 text-right text-xs font-semibold sm:table-cell">
                Week
              </th>
            </tr>
          </thead>
          <tbody>
            {weeks.map((week, w) => {
              const weekTotal = week.reduce(
                (sum, date) => sum + (date ? (byDate.get(date) ?? []).reduce((s, r) => s + r.distance_m, 0) : 0),
                0,
              );
              const total = weekTotal > 0 ? formatDistance(weekTotal, unit, 1) : null;
              return (
                <Fragment key={w}>
                  <tr className="border-t border-line">
                    {week.map((date, d) => (
                      <td key={d} className="h-14 p-0 align-top sm:p-0.5">
                        {date && <Day date={date} runs={byDate.get(date) ?? []} unit={unit} isToday={date === today} />}
                      </td>
                    ))}
                    <td className="hidden p-0.5 pt-1.5 text-right align-top font-semibold sm:table-cell">
                      {total ?? <span className="text-line-strong">·</span>}
                    </td>
                  </tr>
                  <tr className="sm:hidden">
                    <td colSpan={7} className="pb-1 text-right text-xs text-ink-muted">
                      Week <span className="font-semibold text-ink">{total ? `${total} ${unit}` : '–'}</span>
                    </td>
                  </tr>
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </div>
    </div>
  );
}

function Day({ date, runs, unit, isToday }: { date: string; runs: RunListItem[]; unit: Unit; isToday: boolean }) {
  const day = Number(date.slice(8));
  return (
    <div className={cn('flex h-full flex-col rounded-sm px-0.5 py-0.5 sm:px-1', isToday && 'ring-1 ring-ink')}>
      <span className={cn('text-xs', isToday ? 'font-bold text-ink' : 'text-ink-muted')}>
        {day}
        {isToday && <span className="sr-only"> (today)</span>}
      </span>
      {runs.length === 0 ? (
        <span className="text-line-strong" aria-hidden="true">
          ·
        </span>
      ) : (
        runs.map((run) => (
          <Link
            key={run.id}
            to={paths.run.getHref(run.id)}
            title={run.name}
            className="flex min-h-11 items-center font-semibold text-teal underline-offset-2 hover:underline sm:inline sm:min-h-6"
          >
            {formatDistance(run.distance_m, unit, 1)}
            <span className="sr-only">
              {' '}
              {unit}, {run.name}
            </span>
          </Link>
        ))
      )}
    </div>
  );
}
