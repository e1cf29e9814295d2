import { useState } from 'react';
import { describeDistance } from '../../../../shared/race/distances.ts';
import type { PaceUnit, SplitTable } from '../../../../shared/race/paces.ts';
import { PaceFormSchema, type PacesQuery, type PacesResponse } from '../../../../shared/race/schemas.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import { UNIT_METRES } from '../../../../shared/units.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { readText } from '../../../lib/form.ts';
import { usePaces } from '../api/get-paces.ts';
import { useToolForm } from '../hooks/use-tool-form.ts';
import { HowComputedNote } from './how-computed-note.tsx';
import { RaceEntryFields, readRaceEntry } from './race-entry-fields.tsx';
import { ScrollTable, TD, TD_NUM, TH, TH_NUM } from './scroll-table.tsx';
import { SplitUnitSwitch } from './split-unit-switch.tsx';

type Goal = Omit<PacesQuery, 'unit'>;

/** Goal time → pace per mile and per km, a split table (even or negative split) and 5 km checkpoints. */
export function PaceCalculator({ defaultUnit }: { defaultUnit: PaceUnit }) {
  const [unit, setUnit] = useState<PaceUnit>(defaultUnit);
  const [goal, setGoal] = useState<Goal | null>(null);
  const { onSubmit, fieldErrors } = useToolForm(
    PaceFormSchema,
    (data) => ({ ...readRaceEntry(data), unit, negative_split: readText(data, 'negative_split') }),
    ({ unit: _unit, ...value }) => setGoal(value),
    // Old results beside a refused entry read as if they answered it: clear them (issue 17).
    () => setGoal(null),
  );

  return (
    <Card title="Pace calculator" description="A goal time turned into pace, splits and 5 km checkpoints.">
      <form noValidate onSubmit={onSubmit} className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4 lg:items-start">
        <RaceEntryFields defaultDistance="marathon" timeLabel="Goal time" timeHint="h:mm:ss, e.g. 3:30:00" errors={fieldErrors} />
        <TextField
          label="Negative split (optional)"
          name="negative_split"
          autoComplete="off"
          spellCheck={false}
          placeholder="m:ss"
          hint="How much faster the second half is, e.g. 1:00. Blank: even pace."
          error={fieldErrors.negative_split}
        />
        <SplitUnitSwitch value={unit} onChange={setUnit} />
        <div className="sm:col-span-2 lg:col-span-4">
          <Button type="submit">Show paces</Button>
        </div>
      </form>
      {goal ? (
        <PaceResults query={{ ...goal, unit }} />
      ) : (
        <p className="mt-4 text-sm text-ink-muted">
          Pick a distance and enter a goal time to see the pace per mile and per km, the time at every split and at each 5 km.
        </p>
      )}
    </Card>
  );
}

function PaceResults({ query }: { query: PacesQuery }) {
  const paces = usePaces(query);
  if (paces.isPending) return <p className="mt-4 text-sm text-ink-muted">Working out the splits…</p>;
  if (paces.isError)
    return (
      <div className="mt-4">
        <FormAlert>{paces.error.message}</FormAlert>
      </div>
    );
  const { data } = paces;
  return (
    <div className="mt-5 flex flex-col gap-4" aria-busy={paces.isPlaceholderData}>
      <PaceSummary data={data} />
      <div className="grid gap-4 lg:grid-cols-[3fr_2fr]">
        <SplitsTable table={data.split_table} />
        <CheckpointsTable table={data.split_table} />
      </div>
      <HowComputedNote>
        <p>
          Pace is the goal time divided by the distance. A mile is the international mile, exactly 1609.344 m (1959 yard and pound
          agreement); the marathon is 42.195 km and the half exactly half of it.
        </p>
        <p>
          A negative split cuts the race at halfway and runs each half at its own even pace: the first half takes (goal + negative
          split) ÷ 2 and the second (goal − negative split) ÷ 2. The split that contains halfway mixes the two paces.
        </p>
        <p>Times are rounded to the nearest second for display, so a few splits may not add up to the finish by a second.</p>
      </HowComputedNote>
    </div>
  );
}

function PaceSummary({ data }: { data: PacesResponse }) {
  const table = data.split_table;
  const [first, second] = table.halves;
  return (
    <dl className="grid gap-x-6 gap-y-2 rounded-md bg-teal-wash px-4 py-3 tabular-nums sm:grid-cols-[auto_1fr]">
      <dt className="font-semibold">
        {describeDistance(data.distance_m)} in {formatDuration(data.time_s)}
      </dt>
      <dd>
        <span className="text-lg font-semibold">{formatPace(data.pace.s_per_mi)} /mi</span>
        <span className="text-ink-muted"> · </span>
        <span className="text-lg font-semibold">{formatPace(data.pace.s_per_km)} /km</span>
        {table.negative_split_s === 0 && <span className="text-ink-muted"> even pace</span>}
      </dd>
      {table.negative_split_s > 0 && (
        <>
          <dt className="text-ink-muted">First half</dt>
          <dd>
            {formatDuration(first.time_s)} · {formatPace(first.pace.s_per_mi)} /mi · {formatPace(first.pace.s_per_km)} /km
          </dd>
          <dt className="text-ink-muted">Second half</dt>
          <dd>
            {formatDuration(second.time_s)} · {formatPace(second.pace.s_per_mi)} /mi · {formatPace(second.pace.s_per_km)} /km
            <span className="text-ink-muted"> ({formatDuration(table.negative_split_s)} faster)</span>
          </dd>
        </>
      )}
    </dl>
  );
}

function SplitsTable({ table }: { table: SplitTable }) {
  const unitM = UNIT_METRES[table.unit];
  return (
    <div className="min-w-0">
      <h3 className="mb-2 font-semibold">Splits per {table.unit === 'mi' ? 'mile' : 'km'}</h3>
      <ScrollTable label={`Splits per ${table.unit}`} className="max-h-[28rem]">
        <thead>
          <tr>
            <th scope="col" className={TH_NUM}>
              {table.unit}
            </th>
            <th scope="col" className={TH_NUM}>
              Split
            </th>
            <th scope="col" className={TH_NUM}>
              Pace /{table.unit}
            </th>
            <th scope="col" className={TH_NUM}>
              Clock
            </th>
          </tr>
        </thead>
        <tbody>
          {table.splits.map((split, i) => {
            const isFinish = i === table.splits.length - 1;
            return (
              <tr key={split.n} className={isFinish ? 'font-semibold' : undefined}>
                <th scope="row" className={TD_NUM}>
                  {isFinish ? `Finish ${(split.distance_m / unitM).toFixed(2)}` : split.n}
                </th>
                <td className={TD_NUM}>{formatDuration(split.split_s)}</td>
                <td className={TD_NUM}>{formatPace(split.pace_s_per_unit)}</td>
                <td className={TD_NUM}>{formatDuration(split.cumulative_s)}</td>
              </tr>
            );
          })}
        </tbody>
      </ScrollTable>
    </div>
  );
}

function CheckpointsTable({ table }: { table: SplitTable }) {
  return (
    <div className="min-w-0">
      <h3 className="mb-2 font-semibold">Every 5 km</h3>
      <ScrollTable label="Checkpoints every 5 km" className="max-h-[28rem]">
        <thead>
          <tr>
            <th scope="col" className={TH}>
              At
            </th>
            <th scope="col" className={TH_NUM}>
              Since last
            </th>
            <th scope="col" className={TH_NUM}>
              Clock
            </th>
          </tr>
        </thead>
        <tbody>
          {table.checkpoints.map((checkpoint, i) => (
            <tr key={checkpoint.distance_m} className={i === table.checkpoints.length - 1 ? 'font-semibold' : undefined}>
              <th scope="row" className={TD}>
                {i === table.checkpoints.length - 1 ? 'Finish' : `${checkpoint.distance_m / 1000} km`}
              </th>
              <td className={TD_NUM}>{formatDuration(checkpoint.segment_s)}</td>
              <td className={TD_NUM}>{formatDuration(checkpoint.cumulative_s)}</td>
            </tr>
          ))}
        </tbody>
      </ScrollTable>
    </div>
  );
}
