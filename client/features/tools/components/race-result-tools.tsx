import { useState } from 'react';
import { describeDistance } from '../../../../shared/race/distances.ts';
import type { TrainingPaces } from '../../../../shared/race/paces.ts';
import { RaceResultFormSchema, type EquivalentsQuery, type EquivalentsResponse } from '../../../../shared/race/schemas.ts';
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

/** One race result → equivalent times at other distances, and training pace ranges, each with its method named. */
export function RaceResultTools() {
  const [result, setResult] = useState<EquivalentsQuery | null>(null);
  const { onSubmit, fieldErrors } = useToolForm(RaceResultFormSchema, readRaceEntry, setResult);

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
      <Card title="Training pace ranges" description="Pace ranges for each kind of session, derived from the same race result.">
        {result ? (
          <TrainingPacesResult result={result} />
        ) : (
          <p className="text-sm text-ink-muted">
            Enter a race result above to see pace ranges for easy, steady and hard sessions.
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

function TrainingPacesResult({ result }: { result: EquivalentsQuery }) {
  // Training ranges come with the pace answer for the same race; the split unit does not change them.
  const paces = usePaces({ ...result, unit: 'km', negative_split_s: 0 });
  if (paces.isPending) return <Loading />;
  if (paces.isError) return <Failed message={paces.error.message} />;
  return (
    <div aria-busy={paces.isPlaceholderData}>
      <p className="mb-3 rounded-md border-l-4 border-tartan bg-tartan-wash px-3 py-2 text-sm text-tartan-deep">
        These ranges are common-practice starting points, not a prescription. A qualified coach adapts them to you: to heat,
        hills, fatigue, illness and how you respond. Easy days go by feel first; slow down whenever the effort says so.
      </p>
      <TrainingPacesTable paces={paces.data.training_paces} />
      <HowComputedNote>
        <p>
          Your race gives a Daniels &amp; Gilbert index of{' '}
          <strong className="text-ink">{paces.data.training_paces.index.toFixed(1)}</strong> (an effective VO₂max in ml per kg per
          minute, from their 1979 oxygen-cost and sustainable-fraction equations).
        </p>
        <p>
          Each range is a band of that index — for example 60–74 % for easy running. Its ends are the speeds whose oxygen cost, by
          the same equations, equals that share of the index.
        </p>
        <p>
          The bands themselves are <strong className="text-ink">common practice</strong> in coaching, not taken from a published
          table we have checked; only the equations are from Daniels &amp; Gilbert (1979).
        </p>
      </HowComputedNote>
    </div>
  );
}

function TrainingPacesTable({ paces }: { paces: TrainingPaces }) {
  return (
    <ScrollTable label="Training pace ranges">
      <thead>
        <tr>
          <th scope="col" className={TH}>
            Session
          </th>
          <th scope="col" className={TH_NUM}>
            Per km
          </th>
          <th scope="col" className={TH_NUM}>
            Per mile
          </th>
          <th scope="col" className={TH_NUM}>
            Band
          </th>
          <th scope="col" className={TH}>
            For
          </th>
        </tr>
      </thead>
      <tbody>
        {paces.ranges.map((range) => (
          <tr key={range.kind}>
            <th scope="row" className={TD}>
              {range.label}
            </th>
            <td className={TD_NUM}>
              {formatPace(range.slow.s_per_km)}–{formatPace(range.fast.s_per_km)}
            </td>
            <td className={TD_NUM}>
              {formatPace(range.slow.s_per_mi)}–{formatPace(range.fast.s_per_mi)}
            </td>
            <td className={TD_NUM}>
              {Math.round(range.vo2max_fraction_low * 100)}–{Math.round(range.vo2max_fraction_high * 100)} %
              <span className="block text-xs text-ink-muted">{range.source}</span>
            </td>
            <td className="min-w-56 border-t border-line px-3 py-1.5 text-ink-muted">{range.purpose}</td>
          </tr>
        ))}
      </tbody>
    </ScrollTable>
  );
}
