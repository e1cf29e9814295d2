import { formatTolerance } from '../../../../shared/plans/plan-check-display.ts';
import type { PlanCheckAnswer } from '../../../../shared/plans/plan-check-answer.ts';

// Figures follow shared/plans/plan-check.ts (CUT_SHORT_BELOW, EXTENDED_ABOVE, LAP_FIT, REFINE_MAX_M,
// SKIPPED_REP_SLOWER) and shared/plans/race-paces.ts (RECENT_RESULT_DAYS).

/** How the plan check lines the run up with the plan and reaches each verdict. */
export function PlanCheckHow({ method, tolerance }: Pick<PlanCheckAnswer, 'method' | 'tolerance'>) {
  return (
    <details className="rounded-md border border-line bg-paper px-3 py-2 text-sm">
      <summary className="cursor-pointer font-semibold text-teal">How this is computed</summary>
      <ul className="mt-2 list-disc space-y-1.5 pl-5 text-ink-muted marker:text-line-strong">
        <li>
          <strong className="text-ink">Lining up the parts</strong>{' '}
          {method === 'device laps'
            ? 'used this run’s device laps: there was one lap per part, each within 15 % of the planned distance or time.'
            : 'cut the run at the planned distances (or times), each part starting where the one before really ended, then moved each cut to the nearest sharp change of pace within a few hundred metres, in the direction the plan expects. So a rep started 50 m late still lines up with the rep, and everything after it shifts with it.'}{' '}
          Device laps are used whenever their count and amounts fit the plan.
        </li>
        <li>
          <strong className="text-ink">Pace</strong> of a part is its time over its distance, from the recorded distance with only
          light smoothing, so short reps keep their real pace.
        </li>
        <li>
          <strong className="text-ink">On pace</strong> means within the target range widened by the tolerance,{' '}
          {formatTolerance(tolerance)} of the target pace for this runner; the runner or their coach can change it on the profile
          page. Faster is <em>quick</em>, slower is <em>slow</em>. For a heart-rate target the part’s average heart rate is
          compared with the range the same way.
        </li>
        <li>
          <strong className="text-ink">Cut short</strong> means under 90 % of the planned distance or time,{' '}
          <strong className="text-ink">extended</strong> over 110 %; the amount is judged before the pace.{' '}
          <strong className="text-ink">Missed</strong>: the run ended before the part, or a rep was run about as slowly as the
          recoveries around it (more than 12 % slower than its target), so it was skipped.
        </li>
        <li>
          <strong className="text-ink">Difference</strong> is how many seconds per mile or km the part was outside the written
          range (before the tolerance): + slower, − quicker, 0 inside it.
        </li>
        <li>
          <strong className="text-ink">Race paces</strong> in a plan (@ goal, and the race efforts @ MP, @ HMP, @ 10K, @ 5K) come
          from the profile page: @ goal, and the pace of the goal race’s own distance, from the goal race; the others from the
          most recent race result of the last 6 months (else from the goal race), carried to each distance with the Daniels &amp;
          Gilbert (1979) equations — the same pace the Tools page shows for that race effort.
        </li>
        <li>
          <strong className="text-ink">The session</strong> is <em>as planned</em> when every part is on pace, <em>missed</em>{' '}
          when no part is on pace and at least half were missed or cut short, and <em>partly</em> otherwise.
        </li>
      </ul>
    </details>
  );
}
