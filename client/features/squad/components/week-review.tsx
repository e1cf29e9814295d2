import { Fragment, type ReactNode } from 'react';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { addDays } from '../../../../shared/weeks/weeks.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { CardClockWords, CardTime, cardClock, type CardClock, type CardMoment } from '../../../components/ui/zoned-time.tsx';
import { useMarkReadOnOpen } from '../../notes/index.ts';
import { runnerWeekCsvHref } from '../api/get-runner-week.ts';
import { useSetWeekReviewed } from '../api/set-week-reviewed.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';
import { formatWeekRange } from '../utils/week-format.ts';
import { WeekDays } from './week-days.tsx';
import { WeekFlags } from './week-flags.tsx';
import { WeekHow } from './week-how.tsx';
import { WeekLoad } from './week-load.tsx';
import { DownloadLink } from '../../../components/ui/download-link.tsx';
import { WeekNav } from './week-nav.tsx';
import { WeekNotes } from './week-notes.tsx';
import { WeekTotals } from './week-totals.tsx';

type WeekReviewProps = {
  week: RunnerWeek;
  unit: Unit;
  meId: string;
  /** The coach sees "Mark reviewed"; the runner sees who reviewed. */
  viewer: 'coach' | 'runner';
  /** Link to the week holding `date`, or to the current week when no date. */
  weekHref: (date?: string) => string;
  /** Extra links at the start of the toolbar (e.g. back to the squad). */
  lead?: ReactNode;
};

/** One runner's week: the days, totals, load, flags, notes, and how every number is made. */
export function WeekReview({ week, unit, meId, viewer, weekHref, lead }: WeekReviewProps) {
  // Opening the week opens its notes: they are marked read now and keep their "new" marker for this visit.
  useMarkReadOnOpen([
    ...week.notes.filter((n) => n.unread).map((n) => n.id),
    ...week.days.flatMap((d) => d.runs.flatMap((r) => r.notes.filter((n) => n.unread).map((n) => n.id))),
  ]);
  const isCurrent = week.today >= week.start && week.today <= week.end;
  // Each card names the runner's clock once (when this device reads any of its times otherwise), its lines show bare times.
  const viewerIsRunner = meId === week.runner_id;
  const daysClock = cardClock(daysMoments(week), week.time_zone, viewerIsRunner);
  const notesClock = cardClock(
    week.notes.map((n) => ({ iso: n.created_at, shape: 'date-time' })),
    week.time_zone,
    viewerIsRunner,
  );
  return (
    <div className="flex flex-col gap-4">
      <Card>
        <div className="mb-3 flex flex-wrap items-center gap-3">
          {lead}
          <WeekNav
            title={formatWeekRange(week.start)}
            previous={weekHref(addDays(week.start, -7))}
            next={weekHref(addDays(week.start, 7))}
            current={isCurrent ? undefined : weekHref()}
          />
          <div className="flex flex-wrap items-center gap-2 lg:ml-auto">
            <DownloadLink href={runnerWeekCsvHref(week.runner_id, week.start)}>Download CSV</DownloadLink>
            {viewer === 'coach' && <ReviewToggle week={week} meId={meId} />}
          </div>
        </div>
        <CardClockWords clock={daysClock} className="mb-2 block text-xs text-ink-muted" />
        <Reviewers week={week} meId={meId} clock={daysClock} />
        <WeekDays week={week} unit={unit} meId={meId} clock={daysClock} />
      </Card>

      <div className="grid grid-cols-1 gap-4 lg:grid-cols-2 lg:items-start">
        <div className="flex min-w-0 flex-col gap-4">
          <Card title="Planned and run">
            <WeekTotals week={week} unit={unit} viewerIsRunner={meId === week.runner_id} />
          </Card>
          <Card title="Flags">
            <WeekFlags week={week} />
          </Card>
        </div>
        <div className="flex min-w-0 flex-col gap-4">
          <Card title="Load">
            <WeekLoad week={week} unit={unit} />
          </Card>
          <Card
            title={week.unread_notes > 0 ? `Notes · ${week.unread_notes} new` : 'Notes'}
            description={notesClock.named ? <CardClockWords clock={notesClock} /> : undefined}
          >
            <WeekNotes
              week={week}
              meId={meId}
              otherSide={viewer === 'coach' ? week.runner.name : 'your coach'}
              clock={notesClock}
            />
          </Card>
        </div>
      </div>

      <Card title="How this is computed">
        <WeekHow />
      </Card>
    </div>
  );
}

function ReviewToggle({ week, meId }: { week: RunnerWeek; meId: string }) {
  const review = useSetWeekReviewed();
  const reviewed = week.reviewed_by.some((r) => r.coach_id === meId);
  const toggle = () => review.mutate({ runnerId: week.runner_id, start: week.start, reviewed: !reviewed });
  return (
    <>
      {reviewed ? (
        <Button variant="secondary" onClick={toggle} disabled={review.isPending} aria-label="Reviewed ✓ — undo">
          <span className="font-semibold text-teal">Reviewed ✓</span>
          <span className="font-normal text-ink-muted">— undo</span>
        </Button>
      ) : (
        <Button onClick={toggle} disabled={review.isPending}>
          {review.isPending ? 'Saving…' : 'Mark reviewed'}
        </Button>
      )}
      {review.isError && <FormAlert>{review.error.message}</FormAlert>}
    </>
  );
}

/** The moments the days card shows: who reviewed and when, and per run its start, check-in and notes. */
function daysMoments(week: RunnerWeek): CardMoment[] {
  return [
    ...week.reviewed_by.map((r) => ({ iso: r.reviewed_at, shape: 'date' as const })),
    ...week.days.flatMap((d) =>
      d.runs.flatMap((run) => [
        // A start counts toward the card's clock only when it is dated on that clock (not a run away from home).
        ...(run.time_zone === week.time_zone ? [{ iso: run.started_at, shape: 'time' as const }] : []),
        ...(run.checkin ? [{ iso: run.checkin.updated_at, shape: 'date-time' as const }] : []),
        ...run.notes.map((n) => ({ iso: n.created_at, shape: 'date-time' as const })),
      ]),
    ),
  ];
}

/** Who has reviewed the week, for both sides to see. */
function Reviewers({ week, meId, clock }: { week: RunnerWeek; meId: string; clock: CardClock }) {
  if (week.reviewed_by.length === 0) return null;
  return (
    <p className="mb-3 text-sm text-ink-muted">
      <span aria-hidden="true" className="font-semibold text-teal">
        ✓{' '}
      </span>
      Reviewed by{' '}
      {week.reviewed_by.map((r, i) => (
        <Fragment key={r.coach_id}>
          {i > 0 && ', '}
          {r.coach_id === meId ? 'you' : r.coach_name} on <CardTime iso={r.reviewed_at} clock={clock} shape="date" />
        </Fragment>
      ))}
      .
    </p>
  );
}
