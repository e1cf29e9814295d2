import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { formatDistance } from '../../../../shared/runs/display.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Verdict } from '../../../components/ui/verdict.tsx';
import { paths } from '../../../config/paths.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';
import { formatHoursMinutes } from '../../../lib/format.ts';
import { ZonedDaysAgo } from '../../../components/ui/zoned-time.tsx';
import { formatDay } from '../utils/week-format.ts';

function Figure({ label, children, note }: { label: string; children: ReactNode; note?: ReactNode }) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{label}</dt>
      <dd className="text-lg font-semibold tabular-nums">{children}</dd>
      {note && <dd className="text-sm text-ink-muted">{note}</dd>}
    </div>
  );
}

/** Planned against run, sessions by verdict, the long run and its share of the week. */
export function WeekTotals({ week, unit, viewerIsRunner }: { week: RunnerWeek; unit: Unit; viewerIsRunner: boolean }) {
  const { totals, long_run: longRun } = week;
  const { sessions } = totals;
  const longRunDay = longRun && week.days.find((d) => d.runs.some((r) => r.id === longRun.run_id));
  const runCount = week.days.reduce((n, d) => n + d.runs.length, 0);
  return (
    <dl className="grid grid-cols-1 gap-4 sm:grid-cols-2">
      {totals.planned_distance_m > 0 ? (
        <Figure
          label="Distance: run / planned"
          note={
            totals.plans_without_distance > 0 &&
            `${totals.plans_without_distance} ${totals.plans_without_distance === 1 ? 'plan is' : 'plans are'} given by time only and not in the planned distance.`
          }
        >
          {formatDistance(totals.run_distance_m, unit, 1)} <span className="font-normal text-ink-muted">/</span>{' '}
          {formatDistance(totals.planned_distance_m, unit, 1)} {unit}
        </Figure>
      ) : (
        <Figure
          label="Distance run"
          note={
            totals.plans_without_distance > 0
              ? 'No distance planned: every plan this week is given by time (see moving time).'
              : 'No sessions planned this week.'
          }
        >
          {formatDistance(totals.run_distance_m, unit, 1)} {unit}
        </Figure>
      )}
      {totals.planned_duration_s > 0 && (
        <Figure
          label="Time: moving / planned"
          note="Sessions given by time: the moving time of their runs against the time planned."
        >
          {formatHoursMinutes(totals.moving_s_on_timed_plans)} <span className="font-normal text-ink-muted">/</span>{' '}
          {formatHoursMinutes(totals.planned_duration_s)}
        </Figure>
      )}
      <Figure
        label="Moving time"
        note={
          totals.cross_training_s > 0
            ? `All runs of the week, plus ${formatHoursMinutes(totals.cross_training_s)} of cross-training: ${formatDuration(totals.time_s)} in all (time, not running distance).`
            : 'All runs of the week.'
        }
      >
        {formatDuration(totals.moving_s) || '0:00'}{' '}
        <span className="text-sm font-normal text-ink-muted">
          in {runCount} {runCount === 1 ? 'run' : 'runs'}
        </span>
      </Figure>
      <Figure label="Time at goal pace" note="Moving time in the goal-pace parts of the week’s plans (plan check).">
        {totals.goal_pace_s > 0 ? formatHoursMinutes(totals.goal_pace_s) : '–'}
      </Figure>
      <div className="flex flex-col gap-1 sm:col-span-2">
        <dt className="text-xs font-semibold tracking-wide text-ink-muted uppercase">
          Sessions: {sessions.as_planned} of {totals.sessions_due} due so far as planned
        </dt>
        <dd className="flex flex-wrap gap-x-4 gap-y-1 tabular-nums">
          <Verdict verdict="as planned">as planned: {sessions.as_planned}</Verdict>
          <Verdict verdict="partly">partly: {sessions.partly}</Verdict>
          <Verdict verdict="missed">missed: {sessions.missed}</Verdict>
          {sessions.missed_with_reason > 0 && (
            <Verdict verdict="missed">missed on a marked day (rest, ill, injured): {sessions.missed_with_reason}</Verdict>
          )}
          <Verdict verdict="unplanned">unplanned: {sessions.unplanned}</Verdict>
        </dd>
      </div>
      <Figure
        label="Long run"
        note={longRun ? `${Math.round(longRun.share_of_week * 100)} % of the week’s run distance.` : 'No run this week yet.'}
      >
        {longRun ? (
          <Link
            to={paths.run.getHref(longRun.run_id)}
            className="inline-flex tap-target items-center text-teal underline-offset-2 hover:underline"
          >
            {formatDistance(longRun.distance_m, unit, 1)} {unit}
            {longRunDay && <span className="font-normal"> on {formatDay(longRunDay.date)}</span>}
          </Link>
        ) : (
          '–'
        )}
      </Figure>
      <Figure label="Last upload" note="When the runner last imported a run, of any week.">
        {/* The runner's calendar days, as the week's "today" is (client/README.md, "Whose clock"). */}
        <ZonedDaysAgo iso={week.last_upload} timeZone={week.time_zone} viewerIsRunner={viewerIsRunner} />
      </Figure>
    </dl>
  );
}
