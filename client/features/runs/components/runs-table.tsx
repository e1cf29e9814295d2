import { createColumnHelper, functionalUpdate, useTable, type SortingState, type Updater } from '@tanstack/react-table';
import { ActivityKindMark } from './activity-kind.tsx';
import { Link } from 'react-router-dom';
import { formatDistance, formatLocalDate, formatPaceIn, formatShortDate } from '../../../../shared/runs/display.ts';
import type { RunListSorting } from '../../../../shared/runs/list-sort.ts';
import type { RunListItem, RunListSort } from '../../../../shared/runs/schemas.ts';
import { formatDuration } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { DataTable } from '../../../components/ui/data-table.tsx';
import { paths } from '../../../config/paths.ts';
import { sortableTableFeatures, type SortableTableFeatures } from '../../../lib/table.ts';

type RunRow = RunListItem & { unit: Unit; when: string };

const helper = createColumnHelper<SortableTableFeatures, RunRow>();
const number = { meta: { align: 'right' }, sortUndefined: 'last' } as const;

const COLUMNS = helper.columns([
  helper.accessor('when', {
    header: 'Date',
    sortFn: 'alphanumeric',
    meta: { primary: true },
    cell: (info) => (
      <span className="tabular-nums">
        <span className="sm:hidden">{formatShortDate(info.row.original.local_date)}</span>
        <span className="hidden sm:inline">
          {formatLocalDate(info.row.original.local_date)} <span className="text-ink-muted">{info.row.original.local_time}</span>
        </span>
      </span>
    ),
  }),
  helper.accessor('name', {
    header: 'Name',
    enableSorting: false,
    meta: { primary: true },
    cell: (info) => (
      <>
        <Link
          to={paths.run.getHref(info.row.original.id)}
          className="inline-flex tap-target items-center align-bottom font-semibold text-teal underline-offset-2 hover:underline sm:inline-block sm:max-w-64 sm:truncate"
        >
          {info.getValue()}
        </Link>
        <ActivityKindMark kind={info.row.original.kind} />
      </>
    ),
  }),
  helper.accessor('distance_m', {
    header: 'Distance',
    ...number,
    meta: { align: 'right', primary: true },
    cell: (info) => `${formatDistance(info.getValue(), info.row.original.unit)} ${info.row.original.unit}`,
  }),
  helper.accessor('moving_s', { header: 'Moving', ...number, cell: (info) => formatDuration(info.getValue()) }),
  helper.accessor('pace_s_per_km', {
    header: 'Pace',
    ...number,
    meta: { align: 'right', primary: true },
    sortDescFirst: false,
    cell: (info) => {
      return formatPaceIn(info.getValue(), info.row.original.unit) || '–';
    },
  }),
  helper.accessor('ascent_m', {
    header: 'Climb',
    ...number,
    enableSorting: false,
    cell: (info) => (info.getValue() === null ? '–' : `${Math.round(info.getValue()!)} m`),
  }),
]);

/** The column that shows each of the API's sorts. */
const SORT_COLUMNS: Record<RunListSort, string> = {
  date: 'when',
  distance: 'distance_m',
  duration: 'moving_s',
  pace: 'pace_s_per_km',
};

function sortOfColumn(columnId: string): RunListSort | undefined {
  return (Object.keys(SORT_COLUMNS) as RunListSort[]).find((sort) => SORT_COLUMNS[sort] === columnId);
}

type RunsTableProps = {
  runs: RunListItem[];
  unit: Unit;
  /** The order the server sent this page in (over all runs, not just this page). */
  sorting: RunListSorting;
  /** A header click: the page asks the server for the runs in the new order. */
  onSortingChange: (sorting: RunListSorting) => void;
};

/** One page of runs in the server's order; the headers re-order all runs, so the table never sorts rows itself. */
export function RunsTable({ runs, unit, sorting, onSortingChange }: RunsTableProps) {
  const data = runs.map((run) => ({ ...run, unit, when: `${run.local_date} ${run.local_time}` }));
  const tableSorting: SortingState = [{ id: SORT_COLUMNS[sorting.sort], desc: sorting.order === 'desc' }];
  const changeSorting = (updater: Updater<SortingState>) => {
    const [next] = functionalUpdate(updater, tableSorting);
    const sort = next && sortOfColumn(next.id);
    if (sort) onSortingChange({ sort, order: next.desc ? 'desc' : 'asc' });
  };
  const table = useTable({
    features: sortableTableFeatures,
    columns: COLUMNS,
    data,
    manualSorting: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    state: { sorting: tableSorting },
    onSortingChange: changeSorting,
  });
  return <DataTable table={table} caption="Your runs" minWidth="min-w-xl" rowLabel={(row) => row.original.name} />;
}
