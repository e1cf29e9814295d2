import { createColumnHelper, useTable } from '@tanstack/react-table';
import { formatDistance, pacePerUnit } from '../../../../shared/runs/display.ts';
import type { RunLap } from '../../../../shared/runs/types.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { DataTable } from '../../../components/ui/data-table.tsx';
import { sortableTableFeatures, type SortableTableFeatures } from '../../../lib/table.ts';

type LapRow = RunLap & { unit: Unit; pace_s: number | null };

const helper = createColumnHelper<SortableTableFeatures, LapRow>();
const number = { meta: { align: 'right' }, sortUndefined: 'last', sortDescFirst: false } as const;
const primary = { ...number, meta: { align: 'right', primary: true } } as const;
const whole = (value: number | null) => (value === null ? '–' : Math.round(value).toString());

const COLUMNS = helper.columns([
  helper.accessor('index', { header: 'Lap', ...primary }),
  helper.accessor('distance_m', {
    header: 'Distance',
    ...primary,
    cell: (info) => formatDistance(info.getValue(), info.row.original.unit) || '–',
  }),
  helper.accessor('total_time_s', { header: 'Time', ...primary, cell: (info) => formatDuration(info.getValue()) }),
  helper.accessor('pace_s', { header: 'Pace', ...primary, cell: (info) => formatPace(info.getValue()) || '–' }),
  helper.accessor('avg_hr', { header: 'Avg HR', ...number, cell: (info) => whole(info.getValue()) }),
  helper.accessor('max_hr', { header: 'Max HR', ...number, cell: (info) => whole(info.getValue()) }),
]);

/** Laps exactly as the device recorded them; pace here is lap time over lap distance (clock time). */
export function LapsTable({ laps, unit }: { laps: RunLap[]; unit: Unit }) {
  const data = laps.map((lap) => ({
    ...lap,
    unit,
    pace_s: lap.distance_m && lap.distance_m > 0 ? pacePerUnit((lap.total_time_s ?? 0) / (lap.distance_m / 1000), unit) : null,
  }));
  const table = useTable({ features: sortableTableFeatures, columns: COLUMNS, data });
  return (
    <DataTable
      table={table}
      caption={`Device laps, pace per ${unit} from lap time`}
      minWidth="min-w-md"
      rowHeader="index"
      rowLabel={(row) => `lap ${row.original.index}`}
    />
  );
}
