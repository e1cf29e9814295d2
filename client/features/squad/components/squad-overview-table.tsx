import { createColumnHelper, useTable } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import { formatDistance } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { DataTable } from '../../../components/ui/data-table.tsx';
import { paths } from '../../../config/paths.ts';
import { sortableTableFeatures, type SortableTableFeatures } from '../../../lib/table.ts';
import type { OverviewRow } from '../api/types.ts';
import { ZonedDaysAgo } from '../../../components/ui/zoned-time.tsx';
import { formatHoursMinutes } from '../../../lib/format.ts';
import { flagWords } from '../utils/week-format.ts';
import { VolumeSparkline } from './volume-sparkline.tsx';

type Row = {
  source: OverviewRow;
  unit: Unit;
  runner: string;
  planned: number;
  run: number;
  /** Share of planned sessions run as planned; undefined when nothing was planned (sorts last). */
  as_planned: number | undefined;
  flag_count: number;
  /** Milliseconds of the last upload; undefined when never (sorts last). */
  last_upload: number | undefined;
  reviewed: number;
};

const helper = createColumnHelper<SortableTableFeatures, Row>();
const number = { meta: { align: 'right' }, sortUndefined: 'last' } as const;

const distance = (metres: number, unit: Unit) => `${formatDistance(metres, unit, 1)} ${unit}`;

const COLUMNS = helper.columns([
  helper.accessor('runner', {
    header: 'Runner',
    sortFn: 'alphanumeric',
    meta: { primary: true },
    cell: (info) => {
      const { runner, start } = info.row.original.source;
      return (
        <span className="flex flex-col items-start">
          <Link
            to={paths.weekReview.getHref(runner.id, start)}
            className="inline-flex tap-target items-center font-semibold text-teal underline-offset-2 hover:underline"
            aria-label={`${runner.name}: week review`}
          >
            {runner.name}
          </Link>
          <Link
            to={paths.runnerPlan.getHref(runner.id, { week: start })}
            className="inline-flex tap-target items-center text-xs text-teal underline-offset-2 hover:underline"
            aria-label={`${runner.name}: plan`}
          >
            Plan
          </Link>
        </span>
      );
    },
  }),
  helper.accessor('planned', {
    header: 'Planned',
    ...number,
    cell: (info) => {
      const { planned_distance_m: planned, planned_duration_s: time, sessions_planned: sessions } = info.row.original.source;
      // Plans given by time keep their time (a time is not turned into a distance without a pace).
      const parts = [planned > 0 && distance(planned, info.row.original.unit), time > 0 && formatHoursMinutes(time)].filter(
        Boolean,
      );
      if (parts.length > 0) return <span>{parts.join(' + ')}</span>;
      return <span className="text-ink-muted">{sessions > 0 ? 'no amount' : 'nothing'}</span>;
    },
  }),
  helper.accessor('run', {
    header: 'Run',
    ...number,
    meta: { align: 'right', primary: true },
    cell: (info) => <span className="font-semibold">{distance(info.getValue(), info.row.original.unit)}</span>,
  }),
  helper.accessor('as_planned', {
    header: 'Sessions as planned',
    ...number,
    cell: (info) => {
      // Counted over the sessions due by the runner's today, not the days still ahead.
      const { sessions_as_planned: done, sessions_due: planned, sessions_planned: all } = info.row.original.source;
      return all === 0 ? (
        <span className="text-ink-muted">none planned</span>
      ) : planned === 0 ? (
        <span className="text-ink-muted">none due yet</span>
      ) : (
        <span aria-label={`${done} of ${planned}`}>
          {done}/{planned}
        </span>
      );
    },
  }),
  helper.accessor('flag_count', {
    header: 'Flags',
    sortUndefined: 'last',
    meta: { primary: true },
    cell: (info) => {
      const { flags } = info.row.original.source;
      if (flags.length === 0) return <span className="text-ink-muted">none</span>;
      return (
        <span className="inline-flex items-baseline gap-1.5" title={flags.map((f) => f.message).join('\n\n')}>
          <span className="font-semibold text-tartan tabular-nums">{flags.length}</span>
          <span className="whitespace-normal">{flags.map((f) => flagWords(f.code)).join(', ')}</span>
        </span>
      );
    },
  }),
  helper.accessor('last_upload', {
    header: 'Last upload',
    ...number,
    // The runner's calendar days, as their week and today are (the row's own zone), not the coach's.
    cell: (info) => {
      const { last_upload: at, time_zone: timeZone } = info.row.original.source;
      return <ZonedDaysAgo iso={at} timeZone={timeZone} viewerIsRunner={false} />;
    },
  }),
  helper.accessor('reviewed', {
    header: 'Reviewed',
    meta: { align: 'right', primary: true },
    cell: (info) =>
      info.getValue() ? (
        <span className="font-semibold text-teal">
          <span aria-hidden="true">✓</span>
          <span className="sr-only">reviewed</span>
        </span>
      ) : (
        <span className="text-ink-muted">
          <span aria-hidden="true">–</span>
          <span className="sr-only">not reviewed</span>
        </span>
      ),
  }),
  helper.display({
    id: 'volume',
    header: '12 weeks',
    cell: (info) => <VolumeSparkline values={info.row.original.source.volume_12_weeks} unit={info.row.original.unit} />,
  }),
]);

type SquadOverviewTableProps = { rows: OverviewRow[]; unit: Unit; caption: string };

/** One row per runner for the chosen week; every column but the sparkline sorts. */
export function SquadOverviewTable({ rows, unit, caption }: SquadOverviewTableProps) {
  const data: Row[] = rows.map((source) => ({
    source,
    unit,
    runner: source.runner.name,
    planned: source.planned_distance_m,
    run: source.run_distance_m,
    as_planned: source.sessions_due > 0 ? source.sessions_as_planned / source.sessions_due : undefined,
    flag_count: source.flags.length,
    last_upload: source.last_upload ? Date.parse(source.last_upload) : undefined,
    reviewed: source.reviewed ? 1 : 0,
  }));
  const table = useTable({ features: sortableTableFeatures, columns: COLUMNS, data });
  return (
    <DataTable table={table} caption={caption} minWidth="min-w-3xl" rowHeader="runner" rowLabel={(row) => row.original.runner} />
  );
}
