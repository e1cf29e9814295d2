import { Link } from 'react-router-dom';

const NAV =
  'inline-flex size-11 sm:size-9 items-center justify-center rounded-md border border-line bg-card text-teal hover:border-teal';

type WeekNavProps = {
  title: string;
  previous: string;
  next: string;
  /** Where "This week" leads; hidden when the week shown is the current one. */
  current?: string;
};

/** ◀ week ▶, as on the Plan page; the title is announced when it changes. */
export function WeekNav({ title, previous, next, current }: WeekNavProps) {
  return (
    <div className="flex flex-wrap items-center gap-x-2 gap-y-1">
      <div className="flex items-center gap-1">
        <Link to={previous} className={NAV} aria-label="Previous week">
          ◀
        </Link>
        <h2 className="min-w-44 px-1 text-center font-semibold tabular-nums" aria-live="polite">
          {title}
        </h2>
        <Link to={next} className={NAV} aria-label="Next week">
          ▶
        </Link>
      </div>
      {current && (
        <Link
          to={current}
          className="inline-flex tap-target items-center text-sm font-semibold text-teal underline-offset-2 hover:underline"
        >
          This week
        </Link>
      )}
    </div>
  );
}
