import type { ScheduledIntake } from '../../../../shared/fuel/schedule.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { ResponsiveTable, type TableColumn } from '../../../components/ui/responsive-table.tsx';
import { formatAmount } from '../utils/fuel-format.ts';

type FuelScheduleTableProps = { intakes: readonly ScheduledIntake[]; unit: Unit; showTimeOfDay: boolean };

/**
 * Every planned intake: where (mile and km), when (clock from the start, and time of day), what, and
 * what it carries. Phones show where, when, what and the carbohydrate; a row opens into the rest.
 */
export function FuelScheduleTable({ intakes, unit, showTimeOfDay }: FuelScheduleTableProps) {
  const other: Unit = unit === 'mi' ? 'km' : 'mi';
  const at = (x: ScheduledIntake, u: Unit) => (u === 'mi' ? x.distance_mi : x.distance_km).toFixed(2);
  const columns: TableColumn<ScheduledIntake>[] = [
    { id: 'at', header: `at ${unit}`, align: 'right', primary: true, cell: (x) => at(x, unit) },
    {
      id: 'at-other',
      header: `at ${other}`,
      align: 'right',
      cell: (x) => <span className="text-ink-muted print:text-black">{at(x, other)}</span>,
    },
    { id: 'clock', header: 'clock', align: 'right', primary: true, cell: (x) => x.clock },
    ...(showTimeOfDay
      ? [
          {
            id: 'time-of-day',
            header: 'time of day',
            align: 'right',
            cell: (x) => x.time_of_day ?? '',
          } as TableColumn<ScheduledIntake>,
        ]
      : []),
    { id: 'take', header: 'take', primary: true, rowHeader: true, cell: (x) => x.label },
    {
      id: 'carbs',
      header: 'carbs g',
      align: 'right',
      primary: true,
      cell: (x) => formatAmount(x.carbohydrate_g, { digits: 1, dashZero: true }),
    },
    { id: 'fluid', header: 'fluid ml', align: 'right', cell: (x) => formatAmount(x.fluid_ml, { dashZero: true }) },
    { id: 'sodium', header: 'sodium mg', align: 'right', cell: (x) => formatAmount(x.sodium_mg, { dashZero: true }) },
    { id: 'caffeine', header: 'caffeine mg', align: 'right', cell: (x) => formatAmount(x.caffeine_mg, { dashZero: true }) },
    { id: 'refill', header: 'refill', cell: (x) => (x.refill ? 'refill first' : '') },
  ];
  return (
    <ResponsiveTable
      caption="Fuel schedule: each intake by distance and clock"
      columns={columns}
      rows={intakes}
      rowKey={(x, i) => `${x.time_s}-${x.rule_index}-${i}`}
      rowLabel={(x) => `${x.label} at ${at(x, unit)} ${unit}`}
    />
  );
}
