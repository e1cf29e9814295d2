import { useState, type DragEvent } from 'react';
import { Link } from 'react-router-dom';
import type { SessionVerdict } from '../../../../shared/plans/plan-check.ts';
import { planByline } from '../../../../shared/plans/plan-changes.ts';
import type { DayMark } from '../../../../shared/plans/prescribe-schemas.ts';
import type { Plan } from '../../../../shared/plans/schemas.ts';
import { crossTrainingSeconds, missedLabel, type MissedReason } from '../../../../shared/weeks/day-marks.ts';
import { mondayOf, plannedVolume, weekDates } from '../../../../shared/plans/weeks.ts';
import { formatDistance } from '../../../../shared/runs/display.ts';
import { formatHoursMinutes } from '../../../lib/format.ts';
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
  /** Moves a session to another day of the week (drag and drop, or "Move to…"). */
  onMove: (plan: Plan, date: string) => void;
  /** Opens the day-mark form for a day. */
  onMarkDay: (date: string) => void;
  /** The week's day marks (rest, ill, injured, cross-training). */
  dayMarks: DayMark[];
  /** Now and the viewer's time zone, for "changed Tue". */
  now: Date;
  timeZone: string;
  /** The id of the session whose move is pending, to show it as moving. */
  movingId?: string | null;
};

const PLAN_DRAG_TYPE = 'application/x-pacewright-plan';

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
export function PlanWeek(props: PlanWeekProps) {
  const { monday, plans, runs, unit, dayMarks } = props;
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
  const crossTraining = crossTrainingSeconds(dayMarks);

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
        {crossTraining > 0 && (
          <>
            {' '}
            · Cross-training: <span className="font-semibold text-ink">{formatHoursMinutes(crossTraining)}</span> (time, not
            distance)
          </>
        )}
      </p>
      <ol className="grid grid-cols-1 gap-2 lg:grid-cols-7">
        {weekDates(monday).map((date) => (
          <Day
            key={date}
            {...props}
            date={date}
            plans={plansByDate.get(date) ?? []}
            runs={runsByDate.get(date) ?? []}
            mark={dayMarks.find((m) => m.date === date) ?? null}
          />
        ))}
      </ol>
    </div>
  );
}

type DayProps = Omit<PlanWeekProps, 'monday' | 'dayMarks'> & { date: string; mark: DayMark | null };

const MARK_WORDS: Record<DayMark['kind'], string> = {
  rest: 'Rest day',
  ill: 'Ill',
  injured: 'Injured',
  'cross-training': 'Cross-training',
};

function Day({
  date,
  plans,
  runs,
  unit,
  today,
  checks,
  onEdit,
  onNew,
  onMove,
  onMarkDay,
  mark,
  now,
  timeZone,
  movingId,
}: DayProps) {
  const isToday = date === today;
  const missed = date < today && runs.length === 0;
  const label = formatDay(date);
  const [dropping, setDropping] = useState(false);
  const accepts = (event: DragEvent) => event.dataTransfer.types.includes(PLAN_DRAG_TYPE);
  return (
    <li
      aria-label={formatDay(date, true)}
      onDragOver={(event) => {
        if (!accepts(event)) return;
        event.preventDefault();
        event.dataTransfer.dropEffect = 'move';
        setDropping(true);
      }}
      onDragLeave={() => setDropping(false)}
      onDrop={(event) => {
        setDropping(false);
        const raw = event.dataTransfer.getData(PLAN_DRAG_TYPE);
        if (!raw) return;
        event.preventDefault();
        const dragged = JSON.parse(raw) as Plan;
        if (dragged.date !== date) onMove(dragged, date);
      }}
      className={cn(
        'flex min-w-0 flex-col gap-2 rounded-md border bg-white p-2 lg:min-h-40',
        isToday ? 'border-ink ring-1 ring-ink' : 'border-line',
        dropping && 'border-teal bg-teal-wash ring-2 ring-teal',
      )}
    >
      <h3 className="flex items-baseline justify-between gap-1 text-sm">
        <span className={cn('font-semibold', !isToday && 'text-ink-muted')}>{label}</span>
        {isToday && <span className="text-xs font-bold tracking-wide uppercase">today</span>}
      </h3>
      {mark && (
        <p className="rounded-sm border border-line bg-paper px-2 py-1 text-xs">
          <span className="font-semibold">{MARK_WORDS[mark.kind]}</span>
          {mark.minutes !== null && <span className="tabular-nums"> · {mark.minutes} min</span>}
          {mark.note && <span className="text-ink-muted"> · {mark.note}</span>}
        </p>
      )}
      {plans.map((plan) => (
        <SessionCard
          key={plan.id}
          plan={plan}
          label={label}
          missed={missed ? (mark?.kind ?? null) : undefined}
          onEdit={onEdit}
          onMove={onMove}
          now={now}
          timeZone={timeZone}
          moving={movingId === plan.id}
        />
      ))}
      {runs.map((run) => {
        const verdict = checks.get(run.id);
        return (
          <div key={run.id} className="flex flex-col gap-0.5 rounded-sm bg-paper px-2 py-1">
            <Link
              to={paths.run.getHref(run.id)}
              className="inline-flex tap-target items-center text-sm font-semibold text-teal tabular-nums underline-offset-2 hover:underline"
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
      {plans.length === 0 && runs.length === 0 && !mark && <p className="text-sm text-ink-muted">Nothing planned.</p>}
      <div className="mt-auto flex flex-wrap gap-x-3 whitespace-nowrap">
        <Button
          variant="quiet"
          className="min-h-11 px-0 py-0 text-xs sm:min-h-7"
          onClick={() => onNew(date)}
          aria-label={`Add session on ${label}`}
        >
          <span aria-hidden="true">+</span> Add session
        </Button>
        <Button
          variant="quiet"
          className="min-h-11 px-0 py-0 text-xs sm:min-h-7"
          onClick={() => onMarkDay(date)}
          aria-label={`${mark ? 'Change mark' : 'Mark day'}: ${label} as rest, ill, injured or cross-training`}
        >
          {mark ? 'Change mark' : 'Mark day'}
        </Button>
      </div>
    </li>
  );
}

type SessionCardProps = {
  plan: Plan;
  label: string;
  /** Set when the session was missed: the day's mark kind ("missed — ill") or null for a plain miss. */
  missed: MissedReason | null | undefined;
  onEdit: (plan: Plan) => void;
  onMove: (plan: Plan, date: string) => void;
  now: Date;
  timeZone: string;
  moving: boolean;
};

/** One session: title, shorthand, byline; draggable to another day, or "Move to…" with the week's days as buttons. */
function SessionCard({ plan, label, missed, onEdit, onMove, now, timeZone, moving }: SessionCardProps) {
  const [choosing, setChoosing] = useState(false);
  const monday = mondayOf(plan.date);
  return (
    <article
      draggable
      onDragStart={(event) => {
        event.dataTransfer.setData(PLAN_DRAG_TYPE, JSON.stringify(plan));
        event.dataTransfer.effectAllowed = 'move';
      }}
      aria-label={`${plan.title || 'Session'} on ${label}`}
      className={cn('flex cursor-grab flex-col gap-0.5 border-l-2 border-teal pl-2', moving && 'opacity-50')}
    >
      <h4 className="text-sm leading-snug font-semibold break-words">{plan.title || 'Session'}</h4>
      <p className="text-xs leading-snug break-words text-ink-muted tabular-nums">{plan.text}</p>
      {plan.notes && <p className="text-xs break-words text-ink-muted italic">{plan.notes}</p>}
      <p className="text-xs text-ink-muted">{planByline(plan, now, timeZone)}</p>
      <div className="flex flex-wrap items-center justify-between gap-1">
        {missed !== undefined ? (
          <Verdict verdict="missed" className="text-sm">
            {missedLabel(missed)}
          </Verdict>
        ) : (
          <span />
        )}
        <span className="flex flex-wrap gap-x-3">
          <Button
            variant="quiet"
            className="min-h-11 px-0 py-0 text-xs whitespace-nowrap sm:min-h-7"
            aria-expanded={choosing}
            onClick={() => setChoosing((c) => !c)}
            aria-label={`Move to another day: ${plan.title || 'session'} on ${label}`}
          >
            Move to…
          </Button>
          <Button
            variant="quiet"
            className="min-h-11 px-0 py-0 text-xs sm:min-h-7"
            onClick={() => onEdit(plan)}
            aria-label={`Edit ${plan.title || 'session'} on ${label}`}
          >
            Edit
          </Button>
        </span>
      </div>
      {choosing && (
        <div
          role="group"
          aria-label={`Move ${plan.title || 'session'} to`}
          className="grid grid-cols-2 gap-1.5 pt-1 lg:grid-cols-1"
        >
          {weekDates(monday).map((day) => (
            <Button
              key={day}
              variant="secondary"
              className="min-h-11 px-2 text-sm"
              disabled={day === plan.date}
              onClick={() => {
                setChoosing(false);
                onMove(plan, day);
              }}
            >
              {formatDay(day)}
            </Button>
          ))}
        </div>
      )}
    </article>
  );
}
