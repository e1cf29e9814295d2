import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths.ts';
import type { RunnerWeek } from '../../../../shared/weeks/week-answer.ts';
import { flagWords } from '../utils/week-format.ts';

/** Each flag in words with its reason and where the rule comes from; flags describe, the coach decides. */
export function WeekFlags({ week }: { week: RunnerWeek }) {
  return (
    <div className="flex flex-col gap-3 text-sm">
      {week.flags.length === 0 ? (
        <p>
          <span className="font-semibold">No flags this week.</span>{' '}
          <span className="text-ink-muted">
            Weekly distance, load, easy-run paces and the long run all sit inside the rules described below.
          </span>
        </p>
      ) : (
        <ul className="flex flex-col gap-3">
          {week.flags.map((flag, i) => (
            <li key={`${flag.code}-${flag.run_id ?? flag.plan_id ?? i}`} className="border-l-4 border-tartan pl-3">
              <h3 className="font-semibold first-letter:uppercase">{flagWords(flag.code)}</h3>
              <p className="mt-0.5">{flag.message}</p>
              <p className="mt-1 text-xs text-ink-muted">
                <span className="font-semibold">Source:</span> {flag.source}
                {flag.run_id && (
                  <>
                    {' · '}
                    <Link
                      to={paths.run.getHref(flag.run_id)}
                      className="font-semibold text-teal underline-offset-2 hover:underline"
                    >
                      Open the run
                    </Link>
                  </>
                )}
              </p>
            </li>
          ))}
        </ul>
      )}
      <p className="text-ink-muted">
        Flags describe what the numbers show, not a diagnosis. They are raised for weekly distance more than 10 % above the week
        before, an acute:chronic ratio above 1.5, an easy run quicker than the easy range, and a planned long run with no run that
        day.
      </p>
    </div>
  );
}
