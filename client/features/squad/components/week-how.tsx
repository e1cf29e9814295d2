import { describeMarathonEffortRule, EASY_RULE } from '../../../../shared/race/training-ranges.ts';

// Figures follow shared/weeks/week-review.ts (VOLUME_JUMP_FRACTION, LOAD_SPIKE_RATIO, LONG_RUN_MIN_DURATION_S,
// LONG_RUN_MIN_SHARE), shared/weeks/load.ts and shared/weeks/trimp.ts.

/** How each number of the week review is made, with its source. */
export function WeekHow() {
  return (
    <ul className="list-disc space-y-1.5 pl-5 text-sm text-ink-muted marker:text-line-strong">
      <li>
        <strong className="text-ink">The week</strong> runs from the runner’s chosen first day (Monday unless they chose another)
        for seven days, in the runner’s local dates.
      </li>
      <li>
        <strong className="text-ink">Planned distance</strong> adds up the parts of each session plan given as a distance, with
        repeats unrolled. Parts given as a time are summed separately: turning a time into a distance would need a pace.{' '}
        <strong className="text-ink">Run distance</strong> and <strong className="text-ink">moving time</strong> add up the week’s
        runs as recorded.
      </li>
      <li>
        <strong className="text-ink">Sessions</strong> count each run by its plan check: <em>as planned</em> when every part was
        on pace and of the planned amount, <em>partly</em> otherwise, <em>missed</em> when almost nothing matched, and{' '}
        <em>unplanned</em> for a run with no session plan. A session plan on a past day with no run that day counts as missed.
      </li>
      <li>
        <strong className="text-ink">The long run</strong> is the week’s longest run by distance; its share is its distance over
        the week’s run distance. A planned long run is the plan with the most planned time if that is 90 minutes or more, else the
        plan with the most planned distance if that is at least a quarter of the week’s (common practice, not a published
        threshold).
      </li>
      <li>
        <strong className="text-ink">TRIMP</strong> (training impulse, Banister 1991; Morton, Fitz-Clarke &amp; Banister 1990)
        weights each minute by the heart rate’s share of the heart-rate reserve, from the runner’s resting and maximum heart rate
        on their profile: minutes × x × a·e<sup>b·x</sup>. Runs without heart rate have no TRIMP and are left out.
      </li>
      <li>
        <strong className="text-ink">Acute:chronic ratio</strong> (Gabbett 2016, Br J Sports Med 50:273–280): TRIMP of the 7 days
        ending on the week’s last day (or today, if earlier) divided by a quarter of the TRIMP of the 28 days ending then; the 7
        days are one of the 28 (coupled). Lolli et al. (2019) and Impellizzeri et al. (2020) question what it predicts, so read it
        as how quickly load rose.
      </li>
      <li>
        <strong className="text-ink">Weekly distance up</strong> is flagged above 10 % more than the week before: a rule of thumb
        with no published source; a trial in novice runners (Buist et al. 2008) found no fewer injuries with it.{' '}
        <strong className="text-ink">Easy run too fast</strong>: a run whose plan is all easy running, with a mean pace quicker
        than the fast end of the runner’s easy range: {describeMarathonEffortRule(EASY_RULE)}, marathon effort being the pace
        their plans’ @ MP resolves to (from their goal race or a recent result, Daniels &amp; Gilbert equations); the width of the
        range is our own choice, as on the Tools page.
      </li>
    </ul>
  );
}
