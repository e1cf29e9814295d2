import { formatDistance } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { missedLabel, type MissedReason, type WeekDayMark } from '../../../../shared/weeks/day-marks.ts';
import type { WeekPlan } from '../../../../shared/weeks/week-review.ts';
import { Verdict } from '../../../components/ui/verdict.tsx';
import type { CardClock } from '../../../components/ui/zoned-time.tsx';
import { cn } from '../../../lib/cn.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';
import { UnreadDot } from '../../notes/index.ts';
import { WeekRunEntry } from './week-run-entry.tsx';
import { formatHoursMinutes } from '../../../lib/format.ts';
import { formatDay } from '../utils/week-format.ts';

type WeekDaysProps = { week: RunnerWeek; unit: Unit; meId: string; clock: CardClock };

/**
 * The seven days, one row each: on a wide screen the day, its plans and its runs side by side (the runs carry the
 * runner's own words, so they get the room); on a phone the same stacked.
 */
export function WeekDays({ week, unit, meId, clock }: WeekDaysProps) {
  return (
    <ol className="grid grid-cols-1 gap-2">
      {week.days.map((day) => {
        const isToday = day.date === week.today;
        const missed = day.date < week.today && day.runs.length === 0;
        return (
          <li
            key={day.date}
            aria-label={formatDay(day.date, true)}
            className={cn(
              'grid min-w-0 grid-cols-1 gap-2 rounded-md border bg-white p-2 lg:grid-cols-[7rem_minmax(0,1fr)_minmax(0,2fr)] lg:gap-4',
              isToday ? 'border-ink ring-1 ring-ink' : 'border-line',
            )}
          >
            <h3 className="flex items-baseline justify-between gap-1 text-sm lg:flex-col lg:justify-start">
              <span className={cn('font-semibold', !isToday && 'text-ink-muted')}>{formatDay(day.date)}</span>
              {day.unread_notes > 0 && <UnreadDot label={`${day.unread_notes} new`} />}
              {isToday && <span className="text-xs font-bold tracking-wide uppercase">today</span>}
            </h3>
            <div className="flex min-w-0 flex-col gap-2">
              {day.day_marks.map((mark) => (
                <DayMarkEntry key={mark.date} mark={mark} />
              ))}
              {day.plans.map((plan) => (
                <PlanEntry key={plan.id} plan={plan} unit={unit} missed={missed ? (day.day_marks[0]?.kind ?? null) : undefined} />
              ))}
              {day.plans.length === 0 && day.day_marks.length === 0 && <p className="text-sm text-ink-muted">Nothing planned.</p>}
            </div>
            <div className="flex min-w-0 flex-col gap-2">
              {day.runs.map((run) => (
                <WeekRunEntry key={run.id} run={run} unit={unit} meId={meId} runnerId={week.runner_id} clock={clock} />
              ))}
              {day.runs.length === 0 && day.date <= week.today && <p className="text-sm text-ink-muted">No run.</p>}
            </div>
          </li>
        );
      })}
    </ol>
  );
}

const MARK_WORDS: Record<WeekDayMark['kind'], string> = {
  rest: 'Rest day',
  ill: 'Ill',
  injured: 'Injured',
  'cross-training': 'Cross-training',
};

function DayMarkEntry({ mark }: { mark: WeekDayMark }) {
  return (
    <p className="rounded-sm border border-line bg-paper px-2 py-1 text-xs">
      <span className="font-semibold">{MARK_WORDS[mark.kind]}</span>
      {mark.minutes !== null && <span className="tabular-nums"> · {mark.minutes} min</span>}
      {mark.note && <span className="text-ink-muted"> · {mark.note}</span>}
    </p>
  );
}

/** `missed`: undefined when not missed, else the day's mark kind ("missed — ill") or null for a plain miss. */
function PlanEntry({ plan, unit, missed }: { plan: WeekPlan; unit: Unit; missed: MissedReason | null | undefined }) {
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
      {missed !== undefined && (
        <Verdict verdict="missed" className="text-sm">
          {missedLabel(missed)}
        </Verdict>
      )}
    </article>
  );
}
