import { Link } from 'react-router-dom';
import { Card } from '../../../components/ui/card.tsx';
import { CardClockWords, CardTime, cardClock, ZonedTime } from '../../../components/ui/zoned-time.tsx';
import { paths } from '../../../config/paths.ts';
import { useUnread } from '../api/unread.ts';
import { UnreadDot } from './unread-dot.tsx';

/** At most this many new notes are listed on the card; the navigation count has them all. */
const SHOWN = 5;

type NewNotesCardProps = {
  /** Keep only the notes about this runner (the signed-in runner on their Log: their own clock)… */
  about?: string;
  /** …or leave out the notes about this runner (a coach's own, on the Squad page). */
  notAbout?: string;
  weekHref: (runnerId: string, start: string) => string;
};

/** New notes from the other side, each linking to where it was written (the run, or the week). */
export function NewNotesCard({ about, notAbout, weekHref }: NewNotesCardProps) {
  const unread = useUnread();
  const items = (unread?.items ?? []).filter(
    (i) => (about === undefined || i.runner_id === about) && (notAbout === undefined || i.runner_id !== notAbout),
  );
  if (items.length === 0) return null;
  const shown = items.slice(0, SHOWN);
  // Notes about one runner name that runner's clock once, in the heading; about several, each line names its own.
  const first = shown[0]!;
  const clock = shown.every((i) => i.runner_id === first.runner_id)
    ? cardClock(
        shown.map((i) => ({ iso: i.created_at, shape: 'date-time' })),
        first.runner_time_zone,
        first.runner_id === about,
      )
    : null;
  return (
    <Card
      title={`New notes · ${items.length}`}
      description={
        <>Written to you and not opened yet. Opening a run or week marks them read. {clock && <CardClockWords clock={clock} />}</>
      }
    >
      <ul className="flex flex-col gap-2 text-sm">
        {shown.map((item) => (
          <li key={item.id} className="flex flex-wrap items-baseline gap-x-2">
            <UnreadDot />
            <Link
              className="font-semibold text-teal underline-offset-2 hover:underline"
              to={item.run_id ? paths.run.getHref(item.run_id) : weekHref(item.runner_id, item.week_start ?? '')}
            >
              {item.author_name} on {item.run_id ? 'a run' : 'a week'}
            </Link>
            <span className="text-ink-muted">
              {clock ? (
                <CardTime iso={item.created_at} clock={clock} />
              ) : (
                <ZonedTime iso={item.created_at} timeZone={item.runner_time_zone} viewerIsRunner={item.runner_id === about} />
              )}
            </span>
            <span className="w-full break-words text-ink-muted">“{item.excerpt}”</span>
          </li>
        ))}
      </ul>
      {items.length > SHOWN && <p className="mt-2 text-sm text-ink-muted">and {items.length - SHOWN} more.</p>}
    </Card>
  );
}
