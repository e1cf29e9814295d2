import { Link } from 'react-router-dom';
import { formatDistance, pacePerUnit } from '../../../../shared/runs/display.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import type { WeekPlan } from '../../../../shared/weeks/week-review.ts';
import { Verdict } from '../../../components/ui/verdict.tsx';
import { paths } from '../../../config/paths.ts';
import { cn } from '../../../lib/cn.ts';
import type { RunnerWeek, WeekDayRun } from '../api/types.ts';
import { formatDay, formatHoursMinutes } from '../utils/week-format.ts';

type WeekDaysProps = { week: RunnerWeek; unit: Unit };

/** The seven days side by side on a wide screen (a list of days on a phone): plans above, runs below. */
export function WeekDays({ week, unit }: WeekDaysProps) {
  return (
    <ol className="grid grid-cols-1 gap-2 lg:grid-cols-7">
      {week.days.map((day) => {
        const isToday = day.date === week.today;
        const missed = day.date < week.today && day.runs.length === 0;
        return (
          <li
            key={day.date}
            aria-label={formatDay(day.date, true)}
            className={cn(
              'flex min-w-0 flex-col gap-2 rounded-md border bg-white p-2 lg:min-h-36',
              isToday ? 'border-ink ring-1 ring-ink' : 'border-line',
            )}
          >
            <h3 className="flex items-baseline justify-between gap-1 text-sm">
              <span className={cn('font-semibold', !isToday && 'text-ink-muted')}>{formatDay(day.date)}</span>
              {isToday && <span className="text-xs font-bold tracking-wide uppercase">today</span>}
            </h3>
            {day.plans.map((plan) => (
              <PlanEntry key={plan.id} plan={plan} unit={unit} missed={missed} />
            ))}
            {day.runs.map((run) => (
              <RunEntry key={run.id} run={run} unit={unit} />
            ))}
            {day.plans.length === 0 && day.runs.length === 0 && <p className="text-sm text-ink-muted">Rest: nothing planned.</p>}
          </li>
        );
      })}
    </ol>
  );
}

function PlanEntry({ plan, unit, missed }: { plan: WeekPlan; unit: Unit; missed: boolean }) {
  const amounts = [
    plan.planned_distance_m !== null && `${formatDistance(plan.planned_distance_m, unit, 1)} ${unit}`,
    plan.planned_duration_s !== null && formatHoursMinutes(plan.planned_duration_s),
  ].filter(Boolean);
  return (
    <article className="flex flex-col gap-0.5 border-l-2 border-teal pl-2">
      <p className="text-xs font-semibold tracking-wide text-ink-muted uppercase">planned</p>
      <h4 className="text-sm leading-snug font-semibold break-words">{plan.title || 'Session'}</h4>
      <p className="text-xs text-ink-muted tabular-nums">
        {amounts.join(' + ') || 'no amount given'}
        {plan.is_long_run && ' · long run'}
        {plan.easy_only && ' · easy'}
      </p>
      {missed && <Verdict verdict="missed" className="text-sm" />}
    </article>
  );
}

function RunEntry({ run, unit }: { run: WeekDayRun; unit: Unit }) {
  const pace = formatPace(pacePerUnit(run.pace_s_per_km, unit));
  return (
    <div className="flex flex-col gap-0.5 rounded-sm bg-paper px-2 py-1">
      <Link
        to={paths.run.getHref(run.id)}
        className="text-sm font-semibold text-teal tabular-nums underline-offset-2 hover:underline"
      >
        {formatDistance(run.distance_m, unit)} {unit}
        <span className="font-normal text-ink-muted"> · {run.name}</span>
      </Link>
      <p className="text-xs text-ink-muted tabular-nums">
        {formatDuration(run.moving_s)} moving{pace && ` · ${pace} /${unit}`}
        {run.trimp !== null && ` · TRIMP ${Math.round(run.trimp)}`}
      </p>
      {run.session_verdict ? (
        <Verdict verdict={run.session_verdict} className="text-xs" />
      ) : (
        <span className="text-xs text-ink-muted">not checked</span>
      )}
    </div>
  );
}
