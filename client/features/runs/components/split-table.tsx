import { createColumnHelper, useTable } from '@tanstack/react-table';
import { useMemo } from 'react';
import { formatDistance } from '../../../../shared/runs/display.ts';
import { findSplitExtremes } from '../../../../shared/runs/split-marks.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import type { Split } from '../../../../shared/tracks/types.ts';
import { CLIMB_UNIT, climbIn } from '../../../../shared/units.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { DataTable } from '../../../components/ui/data-table.tsx';
import { sortableTableFeatures, type SortableTableFeatures } from '../../../lib/table.ts';

type SplitRow = Split & { mark: 'fastest' | 'slowest' | null };

const helper = createColumnHelper<SortableTableFeatures, SplitRow>();
const number = { meta: { align: 'right' }, sortUndefined: 'last', sortDescFirst: false } as const;
/** The columns a phone shows (#, distance, moving, pace); the rest open under a row. */
const primary = { ...number, meta: { align: 'right', primary: true } } as const;
const whole = (value: number | null) => (value === null ? '–' : Math.round(value).toString());
const blankIfNull = (text: string) => text || '–';

/** A header shown as a symbol but read out in words. */
function SymbolHeader({ symbol, words }: { symbol: string; words: string }) {
  return (
    <>
      <span aria-hidden="true">{symbol}</span>
      <span className="sr-only">{words}</span>
    </>
  );
}

/** The columns for one unit: climb and descent in feet with miles, metres with kilometres. */
function columnsFor(unit: Unit) {
  const climb = CLIMB_UNIT[unit];
  const climbWords = climb === 'ft' ? 'feet' : 'metres';
  const inUnit = (metres: number | null) => (metres === null ? '–' : climbIn(metres, unit).toString());
  return helper.columns([
    helper.accessor('index', { header: '#', ...primary, cell: (info) => info.getValue() }),
    helper.accessor('distance_m', {
      header: 'Distance',
      ...primary,
      cell: (info) => formatDistance(info.getValue(), info.row.original.unit),
    }),
    helper.accessor('elapsed_s', { header: 'Clock', ...number, cell: (info) => formatDuration(info.getValue()) }),
    helper.accessor('moving_s', { header: 'Moving', ...primary, cell: (info) => formatDuration(info.getValue()) }),
    helper.accessor('pace_s', {
      header: 'Pace',
      ...primary,
      cell: (info) => {
        const mark = info.row.original.mark;
        return (
          <span className="inline-flex items-baseline gap-1.5">
            {mark && (
              <span
                className={
                  mark === 'fastest'
                    ? 'rounded-sm bg-tartan-wash px-1 text-xs font-semibold text-tartan-deep'
                    : 'rounded-sm bg-paper px-1 text-xs font-semibold text-ink-muted'
                }
              >
                {mark}
              </span>
            )}
            <span className="font-semibold">{blankIfNull(formatPace(info.getValue()))}</span>
          </span>
        );
      },
    }),
    helper.accessor('flat_pace_s', {
      header: 'Flat-eq. pace',
      ...number,
      cell: (info) => blankIfNull(formatPace(info.getValue())),
    }),
    helper.accessor('avg_hr', {
      header: () => <SymbolHeader symbol="avg ♥" words="Average heart rate" />,
      ...number,
      meta: { align: 'right', label: 'Average heart rate' },
      cell: (info) => whole(info.getValue()),
    }),
    helper.accessor('max_hr', {
      header: () => <SymbolHeader symbol="max ♥" words="Maximum heart rate" />,
      ...number,
      meta: { align: 'right', label: 'Maximum heart rate' },
      cell: (info) => whole(info.getValue()),
    }),
    helper.accessor('elev_gain_m', {
      header: () => <SymbolHeader symbol={`↑ ${climb}`} words={`Climb in ${climbWords}`} />,
      ...number,
      meta: { align: 'right', label: `Climb in ${climbWords}` },
      cell: (info) => inUnit(info.getValue()),
    }),
    helper.accessor('elev_loss_m', {
      header: () => <SymbolHeader symbol={`↓ ${climb}`} words={`Descent in ${climbWords}`} />,
      ...number,
      meta: { align: 'right', label: `Descent in ${climbWords}` },
      cell: (info) => inUnit(info.getValue()),
    }),
  ]);
}
const COLUMNS = { mi: columnsFor('mi'), km: columnsFor('km') };

/** The hero of the run page: one row per mile or kilometre, the fastest and slowest full split named. */
export function SplitTable({ splits, unit, unitLabel }: { splits: Split[]; unit: Unit; unitLabel: string }) {
  const data = useMemo<SplitRow[]>(() => {
    const { fastest, slowest } = findSplitExtremes(splits);
    return splits.map((s) => ({ ...s, mark: s.index === fastest ? 'fastest' : s.index === slowest ? 'slowest' : null }));
  }, [splits]);
  const table = useTable({ features: sortableTableFeatures, columns: COLUMNS[unit], data });

  return (
    <DataTable
      table={table}
      caption={`Splits per ${unitLabel}; pace is per ${unitLabel} from moving time`}
      minWidth="min-w-2xl"
      rowHeader="index"
      rowLabel={(row) => `split ${row.original.index}`}
      rowClassName={(row) => (row.original.mark === 'fastest' ? 'bg-tartan-wash/40' : undefined)}
    />
  );
}
