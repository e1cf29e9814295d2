/** How each column of the squad overview is made. */
export function SquadOverviewHow() {
  return (
    <details className="rounded-md border border-line bg-paper px-3 py-2 text-sm">
      <summary className="cursor-pointer font-semibold text-teal">How this is computed</summary>
      <ul className="mt-2 list-disc space-y-1.5 pl-5 text-ink-muted marker:text-line-strong">
        <li>
          <strong className="text-ink">The week</strong> is each runner’s own week holding the dates shown (most start on Monday;
          a runner can choose another first day), in the runner’s local dates.
        </li>
        <li>
          <strong className="text-ink">Planned</strong> adds up the parts of the week’s session plans given as a distance; parts
          given only as a time are not turned into a distance. <strong className="text-ink">Run</strong> adds up the recorded
          distance of the week’s runs.
        </li>
        <li>
          <strong className="text-ink">Sessions as planned</strong> counts runs whose plan check found every part on pace and of
          the planned amount, out of the session plans of the week.
        </li>
        <li>
          <strong className="text-ink">Flags</strong>: weekly distance more than 10 % above the week before (a rule of thumb, no
          published source); load of the last 7 days above 1.5 × the average week of the last 4 (acute:chronic ratio, Gabbett
          2016); an easy run quicker than the runner’s easy range; a long run with no run that day. Each flag’s reason is in the
          runner’s week review. Flags describe what the numbers show; you decide what they mean for your runner.
        </li>
        <li>
          <strong className="text-ink">Last upload</strong> is when the runner last imported a run, in the runner’s own calendar
          days (their profile’s time zone, as their week is); when this device’s calendar would count otherwise, the cell names
          the runner’s clock. <strong className="text-ink">12 weeks</strong> is the run distance of each week up to this one,
          oldest on the left.
        </li>
      </ul>
    </details>
  );
}
