import { Link } from 'react-router-dom';
import type { GoalRace } from '../../../../shared/goals/schemas.ts';
import { daysToRace, taperWeek, taperWeeks } from '../../../../shared/plans/goal-race.ts';
import { paceFromGoal } from '../../../../shared/race/paces.ts';
import { formatLocalDate } from '../../../../shared/runs/display.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { paths } from '../../../config/paths.ts';

type GoalRaceLineProps = { goalRace: GoalRace | null; unit: Unit; today: string };

function countdown(days: number): string {
  if (days === 0) return 'race day';
  if (days < 0) return `${-days} ${days === -1 ? 'day' : 'days'} ago`;
  return `${days} ${days === 1 ? 'day' : 'days'} to go`;
}

/** "Lakeside Marathon · 18 Apr 2027 · goal 3:05:00 (7:04 /mi) · 138 days to go", and the taper week when in it. */
export function GoalRaceLine({ goalRace, unit, today }: GoalRaceLineProps) {
  if (!goalRace) {
    return (
      <p className="text-ink-muted">
        No goal race yet.{' '}
        <Link to={paths.profile.getHref()} className="font-semibold text-teal underline underline-offset-2">
          Set one on your profile
        </Link>{' '}
        to see the days to go, the taper weeks and race paces such as “@ goal” in your sessions.
      </p>
    );
  }
  const pace = paceFromGoal(goalRace.distance_m, goalRace.goal_time_s);
  const days = daysToRace(today, goalRace.date);
  const taper = taperWeek(today, goalRace.date, goalRace.distance_m);
  return (
    <div className="flex flex-col gap-1">
      <p className="flex flex-wrap items-baseline gap-x-2 gap-y-1 tabular-nums">
        <span className="text-lg font-semibold">{goalRace.name}</span>
        <Sep />
        <span>{formatLocalDate(goalRace.date)}</span>
        <Sep />
        <span>
          goal {formatDuration(goalRace.goal_time_s)}{' '}
          <span className="text-ink-muted">
            ({formatPace(unit === 'mi' ? pace.s_per_mi : pace.s_per_km)} /{unit})
          </span>
        </span>
        {Number.isFinite(days) && (
          <>
            <Sep />
            <span className="font-semibold">{countdown(days)}</span>
          </>
        )}
        {taper && (
          <>
            <Sep />
            <span className="rounded-sm bg-teal-wash px-1.5 font-semibold text-teal-deep">
              taper week {taper.week} of {taper.of}
            </span>
          </>
        )}
      </p>
      <p className="text-sm text-ink-muted">
        Taper: the last {taperWeeks(goalRace.distance_m)} {taperWeeks(goalRace.distance_m) === 1 ? 'week' : 'weeks'} before the
        race (3 before a marathon, 2 before a half, 1 before shorter races). That is common practice, not a rule: your coach may
        choose otherwise.
      </p>
    </div>
  );
}

function Sep() {
  return (
    <span aria-hidden="true" className="text-line-strong">
      ·
    </span>
  );
}
