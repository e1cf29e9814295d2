import { useState } from 'react';
import { describeDistance } from '../../../../shared/race/distances.ts';
import type { Pace, PaceUnit } from '../../../../shared/race/paces.ts';
import {
  RaceResultFormSchema,
  type EquivalentsQuery,
  type EquivalentsResponse,
  type TrainingRangeAnswer,
  type TrainingRangesAnswer,
} from '../../../../shared/race/schemas.ts';
import { describeMarathonEffortRule, EASY_RULE, STEADY_RULE } from '../../../../shared/race/training-ranges.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useEquivalents } from '../api/get-equivalents.ts';
import { usePaces } from '../api/get-paces.ts';
import { useToolForm } from '../hooks/use-tool-form.ts';
import { HowComputedNote } from './how-computed-note.tsx';
import { RaceEntryFields, readRaceEntry } from './race-entry-fields.tsx';
import { ScrollTable, TD, TD_NUM, TH, TH_NUM } from './scroll-table.tsx';

/**
 * One race result → equivalent times at other distances, and training pace ranges named by race effort (plus easy and
 * steady), each with its method named. Paces show in `unit`, the profile's unit.
 */
export function RaceResultTools({ unit }: { unit: PaceUnit }) {
  const [result, setResult] = useState<EquivalentsQuery | null>(null);
  const { onSubmit, fieldErrors } = useToolForm(RaceResultFormSchema, readRaceEntry, setResult, () => setResult(null));

  return (
    <>
      <Card
        title="Race equivalents"
        description="From one recent race, the times it suggests at other distances by two published methods, side by side."
      >
        <form noValidate onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4 lg:items-start">
          <RaceEntryFields
            defaultDistance="half"
            timeLabel="Your time"
            timeHint="h:mm:ss or m:ss, e.g. 1:45:00"
            errors={fieldErrors}
          />
          <div className="sm:col-span-2 lg:col-span-4">
            <Button type="submit">Show equivalents</Button>
          </div>
        </form>
        {result ? (
          <EquivalentsResult result={result} />
        ) : (
          <p className="mt-4 text-sm text-ink-muted">
            Enter a race you ran recently, at full effort, to see its equivalents and the training pace ranges below.
          </p>
        )}
      </Card>
      <Card
        title="Training pace ranges"
        description="Pace ranges for each kind of session, named by race effort, from the same race result."
      >
        {result ? (
          <TrainingRangesResult result={result} unit={unit} />
        ) : (
          <p className="text-sm text-ink-muted">
            Enter a race result above to see your easy and steady ranges and your mile, 5K, 10K, half marathon and marathon
            efforts.
          </p>
        )}
      </Card>
    </>
  );
}

function Loading() {
  return <p className="mt-4 text-sm text-ink-muted">Working it out…</p>;
}

function Failed({ message }: { message: string }) {
  return (
    <div className="mt-4">
      <FormAlert>{message}</FormAlert>
    </div>
  );
}

function EquivalentsResult({ result }: { result: EquivalentsQuery }) {
  const equivalents = useEquivalents(result);
  if (equivalents.isPending) return <Loading />;
  if (equivalents.isError) return <Failed message={equivalents.error.message} />;
  return (
    <div className="mt-5" aria-busy={equivalents.isPlaceholderData}>
      <EquivalentsTable result={result} data={equivalents.data} />
      <HowComputedNote>
        <p>
          <strong className="text-ink">Riegel</strong> (Riegel 1981, American Scientist 69(3)): T₂ = T₁ × (D₂ ÷ D₁)^1.06, one
          power law for every distance. Studies of recreational runners (Vickers &amp; Vertosick 2016) found it too optimistic
          beyond the half marathon.
        </p>
        <p>
          <strong className="text-ink">Daniels &amp; Gilbert</strong> (Daniels &amp; Gilbert 1979, Oxygen Power): the oxygen cost
          of running at your race speed, divided by the share of VO₂max a runner can hold for that long, gives an index; each
          equivalent is the time at that distance with the same index, found numerically from their equations.
        </p>
        <p>
          Both assume you trained for the distance: a fast 5K does not make a marathon without the long runs. Hills, heat and wind
          on the day change the real time.
        </p>
      </HowComputedNote>
    </div>
  );
}

function EquivalentsTable({ result, data }: { result: EquivalentsQuery; data: EquivalentsResponse }) {
  return (
    <ScrollTable label="Race equivalents" className="max-w-3xl">
      <caption className="px-3 py-2 text-left text-sm text-ink-muted">
        From {describeDistance(result.distance_m)} in {formatDuration(result.time_s)}
      </caption>
      <thead>
        <tr>
          <th scope="col" className={TH}>
            Distance
          </th>
          <th scope="col" className={TH_NUM}>
            Riegel <span className="font-normal text-ink-muted">(1981)</span>
          </th>
          <th scope="col" className={TH_NUM}>
            Daniels &amp; Gilbert <span className="font-normal text-ink-muted">(1979)</span>
          </th>
          <th scope="col" className={TH_NUM}>
            Difference <span className="font-normal text-ink-muted">(D&amp;G − Riegel)</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {data.equivalents.map((row) => {
          const isResult = row.distance_m === result.distance_m;
          const difference = Math.round(row.daniels_gilbert_s) - Math.round(row.riegel_s);
          return (
            <tr key={row.distance_m} className={isResult ? 'bg-teal-wash font-semibold' : undefined}>
              <th scope="row" className={TD}>
                {describeDistance(row.distance_m)}
                {isResult && <span className="ml-1.5 text-xs font-semibold text-teal">your race</span>}
              </th>
              <td className={TD_NUM}>{formatDuration(row.riegel_s)}</td>
              <td className={TD_NUM}>{formatDuration(row.daniels_gilbert_s)}</td>
              <td className={TD_NUM}>
                {difference === 0 ? '–' : `${difference > 0 ? '+' : '−'}${formatDuration(Math.abs(difference))}`}
              </td>
            </tr>
          );
        })}
      </tbody>
    </ScrollTable>
  );
}

function TrainingRangesResult({ result, unit }: { result: EquivalentsQuery; unit: PaceUnit }) {
  // Training ranges come with the pace answer for the same race; the split unit does not change them.
  const paces = usePaces({ ...result, unit: 'km', negative_split_s: 0 });
  if (paces.isPending) return <Loading />;
  if (paces.isError) return <Failed message={paces.error.message} />;
  return (
    <div aria-busy={paces.isPlaceholderData}>
      <p className="mb-3 rounded-md border-l-4 border-tartan bg-tartan-wash px-3 py-2 text-sm text-tartan-deep">
        These ranges are starting points, not a prescription. A qualified coach adapts them to you: to heat, hills, fatigue,
        illness and how you respond. Easy days go by feel first; slow down whenever the effort says so.
      </p>
      <TrainingRangesTable answer={paces.data.training_ranges} unit={unit} />
      <HowComputedNote>
        <p>
          <strong className="text-ink">Race efforts</strong> (mile, 5K, 10K, half marathon and marathon effort) are the paces of
          your equivalent times in the race equivalents table above, by Riegel (1981) and by Daniels &amp; Gilbert (1979) side by
          side; each range runs from one model’s pace to the other’s, and is a single pace at your own race’s distance.
        </p>
        <p>
          A session plan that says <strong className="text-ink">@ MP, @ HMP, @ 10K or @ 5K</strong> targets the Daniels &amp;
          Gilbert pace of that row, taken from the goal race and race results on your profile: the same number you see here for
          the same result.
        </p>
        <p>
          <strong className="text-ink">Easy</strong> is {describeMarathonEffortRule(EASY_RULE)} and{' '}
          <strong className="text-ink">steady</strong> {describeMarathonEffortRule(STEADY_RULE)} (the Daniels &amp; Gilbert
          marathon effort). These widths are <strong className="text-ink">our own choice</strong>, not a published rule: easy is
          wide so recovery days fit, and steady fills the gap up to marathon effort.
        </p>
      </HowComputedNote>
    </div>
  );
}

function paceIn(pace: Pace, unit: PaceUnit): string {
  return formatPace(unit === 'mi' ? pace.s_per_mi : pace.s_per_km);
}

function rangeIn(range: TrainingRangeAnswer, unit: PaceUnit): string {
  const slow = paceIn(range.slow, unit);
  const fast = paceIn(range.fast, unit);
  return slow === fast ? fast : `${slow}–${fast}`;
}

function TrainingRangesTable({ answer, unit }: { answer: TrainingRangesAnswer; unit: PaceUnit }) {
  const per = unit === 'mi' ? 'mile' : 'km';
  return (
    <ScrollTable label="Training pace ranges">
      <thead>
        <tr>
          <th scope="col" className={TH}>
            Session
          </th>
          <th scope="col" className={TH_NUM}>
            Range <span className="font-normal text-ink-muted">per {per}</span>
          </th>
          <th scope="col" className={TH_NUM}>
            Riegel <span className="font-normal text-ink-muted">(1981)</span>
          </th>
          <th scope="col" className={TH_NUM}>
            Daniels &amp; Gilbert <span className="font-normal text-ink-muted">(1979)</span>
          </th>
          <th scope="col" className={TH}>
            Set by
          </th>
          <th scope="col" className={TH}>
            For
          </th>
        </tr>
      </thead>
      <tbody>
        {answer.ranges.map((range) => {
          const isResult = range.basis === 'race-equivalent' && range.distance_m === answer.result.distance_m;
          return (
            <tr key={range.kind} className={isResult ? 'bg-teal-wash' : undefined}>
              <th scope="row" className={TD}>
                {range.label}
                {range.basis === 'race-equivalent' && range.shorthand && (
                  <span className="block text-xs font-normal text-ink-muted">in a plan: @ {range.shorthand}</span>
                )}
                {isResult && <span className="block text-xs font-semibold text-teal">your race</span>}
              </th>
              <td className={TD_NUM}>{rangeIn(range, unit)}</td>
              <td className={TD_NUM}>{range.basis === 'race-equivalent' ? paceIn(range.riegel, unit) : '–'}</td>
              <td className={TD_NUM}>{range.basis === 'race-equivalent' ? paceIn(range.daniels_gilbert, unit) : '–'}</td>
              <td className="min-w-48 border-t border-line px-3 py-1.5 text-ink-muted">
                {range.basis === 'race-equivalent' ? (
                  range.source
                ) : (
                  <>
                    {describeMarathonEffortRule(range)}
                    <span className="block text-xs">{range.source}</span>
                  </>
                )}
              </td>
              <td className="min-w-56 border-t border-line px-3 py-1.5 text-ink-muted">{range.purpose}</td>
            </tr>
          );
        })}
      </tbody>
    </ScrollTable>
  );
}
