import { lazy, Suspense } from 'react';
import type { FuelSchedule, HourTotals } from '../../../../shared/fuel/schedule.ts';
import { ResponsiveTable, type TableColumn } from '../../../components/ui/responsive-table.tsx';
import { formatAmount, formatTimeFromStart, statusText } from '../utils/fuel-format.ts';

const FuelHoursChart = lazy(() => import('./fuel-hours-chart.tsx'));

function range(t: { low: number; high: number | null }): string {
  return t.high === null ? `${formatAmount(t.low)}+` : `${formatAmount(t.low)}–${formatAmount(t.high)}`;
}

function hourLabel(h: HourTotals): string {
  return `${formatTimeFromStart(h.from_s)}–${formatTimeFromStart(h.to_s)}`;
}

type FuelHoursProps = { schedule: FuelSchedule; chart?: boolean };

/**
 * Per clock hour: carbohydrate, fluid and sodium planned against the hour's target (the last, partial hour's target
 * prorated), each with its status word and glyph; the whole run's totals last. A bar chart of carbohydrate follows,
 * with this table as its fallback.
 */
type HourRow = {
  label: string;
  whole: boolean;
  values: Record<Nutrient, number>;
  targets: Record<Nutrient, { low: number; high: number | null }>;
  status: Record<Nutrient, HourTotals['status']['fluid']>;
  caffeine_mg: number;
};
type Nutrient = 'carbohydrate' | 'fluid' | 'sodium';
const NUTRIENTS: ReadonlyArray<{ key: Nutrient; words: string; unit: string }> = [
  { key: 'carbohydrate', words: 'carbs', unit: 'g' },
  { key: 'fluid', words: 'fluid', unit: 'ml' },
  { key: 'sodium', words: 'sodium', unit: 'mg' },
];

/** Hour, then planned / target / status per nutrient, then caffeine. Phones show the carbohydrate; the rest opens per row. */
const COLUMNS: TableColumn<HourRow>[] = [
  { id: 'hour', header: 'hour', primary: true, rowHeader: true, cell: (r) => r.label },
  ...NUTRIENTS.flatMap(({ key, words, unit }): TableColumn<HourRow>[] => [
    {
      id: `${key}-planned`,
      header: `${words} ${unit} planned`,
      align: 'right',
      primary: key === 'carbohydrate',
      cell: (r) => formatAmount(r.values[key]),
    },
    {
      id: `${key}-target`,
      header: `${words} ${unit} target`,
      align: 'right',
      primary: key === 'carbohydrate',
      cell: (r) => <span className="text-ink-muted print:text-black">{range(r.targets[key])}</span>,
    },
    { id: `${key}-status`, header: `${words} status`, primary: key === 'carbohydrate', cell: (r) => statusText(r.status[key]) },
  ]),
  { id: 'caffeine', header: 'caffeine mg', align: 'right', cell: (r) => formatAmount(r.caffeine_mg, { dashZero: true }) },
];

export function FuelHours({ schedule, chart = true }: FuelHoursProps) {
  const rows: HourRow[] = [
    ...schedule.hours.map((h) => ({
      label: hourLabel(h),
      whole: false,
      values: { carbohydrate: h.carbohydrate_g, fluid: h.fluid_ml, sodium: h.sodium_mg },
      targets: h.targets,
      status: h.status,
      caffeine_mg: h.caffeine_mg,
    })),
    {
      label: 'whole run',
      whole: true,
      values: {
        carbohydrate: schedule.totals.carbohydrate_g,
        fluid: schedule.totals.fluid_ml,
        sodium: schedule.totals.sodium_mg,
      },
      targets: schedule.target_totals,
      status: schedule.status,
      caffeine_mg: schedule.totals.caffeine_mg,
    },
  ];
  const bars = schedule.hours.map((h) => ({
    label: hourLabel(h),
    carbohydrate: Math.round(h.carbohydrate_g),
    low: Math.round(h.targets.carbohydrate.low),
    high: h.targets.carbohydrate.high === null ? null : Math.round(h.targets.carbohydrate.high),
  }));
  const description = schedule.hours
    .map((h) => `${hourLabel(h)}: ${Math.round(h.carbohydrate_g)} g planned, target ${range(h.targets.carbohydrate)} g`)
    .join('; ');
  return (
    <div className="flex flex-col gap-3">
      <ResponsiveTable
        caption="Hourly totals against the targets"
        columns={COLUMNS}
        rows={rows}
        rowKey={(r) => r.label}
        rowLabel={(r) => r.label}
      />
      <p className="text-xs text-ink-muted">
        ✓ within the target range · ▽ under it · △ over it. A last hour shorter than 60 minutes has its target prorated.
        {schedule.totals.caffeine_mg_per_kg !== null && schedule.totals.caffeine_mg > 0 && (
          <> Caffeine over the run: {formatAmount(schedule.totals.caffeine_mg_per_kg, { digits: 2 })} mg per kg of body mass.</>
        )}
      </p>
      {chart && (
        <figure className="flex flex-col gap-1 print:hidden">
          <figcaption className="text-xs font-semibold tracking-wide text-ink-muted uppercase">
            Carbohydrate per hour, planned and target
          </figcaption>
          <div role="img" aria-label={`${description}. The same figures are in the table above.`}>
            <Suspense fallback={<p className="py-12 text-center text-ink-muted">Drawing the chart…</p>}>
              <FuelHoursChart bars={bars} />
            </Suspense>
          </div>
        </figure>
      )}
    </div>
  );
}
