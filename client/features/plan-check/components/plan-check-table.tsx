import { createColumnHelper, useTable } from '@tanstack/react-table';
import { Fragment, useMemo } from 'react';
import { pacePerUnit } from '../../../../shared/runs/display.ts';
import { expandParts } from '../../../../shared/plans/expand.ts';
import {
  formatActualDistance,
  formatDifference,
  formatPaceRange,
  formatPlannedDistance,
  formatRepBlock,
  formatStops,
} from '../../../../shared/plans/plan-check-display.ts';
import type { PlanItem, DistanceUnit } from '../../../../shared/plans/types.ts';
import { formatDuration, formatPace } from '../../../../shared/tracks/format.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';
import { Verdict } from '../../../components/ui/verdict.tsx';
import { cn } from '../../../lib/cn.ts';
import { sortableTableFeatures, type SortableTableFeatures } from '../../../lib/table.ts';
import type { PlanCheckAnswer } from '../../../../shared/plans/plan-check-answer.ts';

type PartRow = PlanCheckAnswer['parts'][number] & {
  /** "rep 4 of 6", "warm-up". */
  label: string;
  /** The unit the plan wrote this part's distance in; distances show in it so planned and run compare. */
  written: DistanceUnit;
};

const helper = createColumnHelper<SortableTableFeatures, PartRow>();
const number = { meta: { align: 'right' } } as const;
const dash = (text: string) => text || '–';

/** A header shown as a symbol but read out in words. */
function SymbolHeader({ symbol, words }: { symbol: string; words: string }) {
  return (
    <>
      <span aria-hidden="true">{symbol}</span>
      <span className="sr-only">{words}</span>
    </>
  );
}

function target(row: PartRow, unit: Unit): string {
  const { planned } = row;
  if (planned.pace_fast_s_per_km !== undefined)
    return formatPaceRange(planned.pace_fast_s_per_km, planned.pace_slow_s_per_km, unit);
  if (planned.hr_low_bpm !== undefined) return `♥ ${planned.hr_low_bpm}–${planned.hr_high_bpm} bpm`;
  return row.unresolved ? 'race pace unknown' : 'by feel';
}

function createColumns(unit: Unit) {
  return helper.columns([
    // Rows are numbered as the summary sentence counts them (a recovery the plan did not write has no row).
    helper.accessor('index', { header: '#', ...number, cell: (info) => info.row.index + 1 }),
    helper.accessor('label', { header: 'Part' }),
    helper.display({
      id: 'planned',
      header: 'Planned',
      ...number,
      cell: ({ row: { original: r } }) =>
        r.planned.distance_m !== undefined
          ? formatPlannedDistance(r.planned.distance_m, r.written)
          : formatDuration(r.planned.duration_s ?? null),
    }),
    helper.display({
      id: 'distance',
      header: 'Distance run',
      ...number,
      cell: ({ row: { original: r } }) => formatActualDistance(r.actual.distance_m, r.written),
    }),
    helper.display({
      id: 'time',
      header: 'Time',
      ...number,
      cell: ({ row: { original: r } }) => dash(formatDuration(r.actual.duration_s)),
    }),
    helper.display({
      id: 'stops',
      header: 'Stops',
      ...number,
      cell: ({ row: { original: r } }) => dash(formatStops(r.actual.stops)),
    }),
    helper.display({
      id: 'pace',
      header: `Moving pace /${unit}`,
      ...number,
      cell: ({ row: { original: r } }) => (
        <span className="font-semibold">{dash(formatPace(pacePerUnit(r.actual.pace_s_per_km, unit)))}</span>
      ),
    }),
    helper.display({ id: 'target', header: 'Target', ...number, cell: ({ row: { original: r } }) => target(r, unit) }),
    helper.accessor('difference_s_per_km', {
      header: () => <SymbolHeader symbol={`± s/${unit}`} words={`Difference from the target, seconds per ${unit}`} />,
      ...number,
      cell: (info) => formatDifference(info.getValue(), unit),
    }),
    helper.display({
      id: 'hr',
      header: () => <SymbolHeader symbol="♥" words="Average heart rate" />,
      ...number,
      cell: ({ row: { original: r } }) => (r.actual.avg_hr === null ? '–' : Math.round(r.actual.avg_hr)),
    }),
    helper.accessor('verdict', { header: 'Verdict', cell: (info) => <Verdict verdict={info.getValue()} /> }),
  ]);
}

/**
 * Labels and written units of the checked parts, by expanded index ("rep 4 of 6"). A repeated step is
 * counted among the rows the check has, so five recoveries between six reps read "recovery jog 5 of 5".
 */
function describeParts(
  items: readonly PlanItem[],
  checked: ReadonlyArray<{ index: number }>,
): Map<number, { label: string; written: DistanceUnit | null }> {
  const expanded = expandParts(items);
  const rows = checked.map((c) => expanded[c.index]).filter((p) => p !== undefined);
  const out = new Map<number, { label: string; written: DistanceUnit | null }>();
  for (const part of rows) {
    const same = part.repeat ? rows.filter((p) => p.item_index === part.item_index && p.repeat?.step === part.repeat!.step) : [];
    out.set(part.index, {
      label: part.repeat ? `${part.kind} ${same.indexOf(part) + 1} of ${same.length}` : part.kind,
      written: part.amount.type === 'distance' ? part.amount.unit : null,
    });
  }
  return out;
}

type PlanCheckTableProps = { check: PlanCheckAnswer; unit: Unit };

/**
 * One row per expanded part, in the plan's order (so not sortable): planned and run amounts, pace and
 * target in the reader's unit, the difference from the target range, heart rate and the verdict. A
 * part's note (a skipped rep, a race pace that could not be resolved) shows on a line under it.
 */
export function PlanCheckTable({ check, unit }: PlanCheckTableProps) {
  const described = describeParts(check.plan?.parts ?? [], check.parts);
  const data: PartRow[] = check.parts.map((part) => ({
    ...part,
    label: described.get(part.index)?.label ?? part.kind,
    written: described.get(part.index)?.written ?? unit,
  }));
  const columns = useMemo(() => createColumns(unit), [unit]);
  const table = useTable({ features: sortableTableFeatures, columns, data });

  return (
    <>
      {check.rep_blocks.length > 0 && (
        <ul className="mb-2 space-y-1 text-sm" aria-label="Reps at a glance">
          {check.rep_blocks.map((block) => (
            <li key={`${block.item_index}:${block.step}`} className="break-words tabular-nums">
              {formatRepBlock(block, unit)}
            </li>
          ))}
        </ul>
      )}
      <div className="relative -mx-4 overflow-x-auto px-4 sm:-mx-5 sm:px-5">
        <table className="w-full min-w-3xl text-sm">
          <caption className="sr-only">{`Plan check, part by part, pace per ${unit}`}</caption>
          <thead className="border-b border-line-strong text-ink-muted">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <th
                    key={header.id}
                    scope="col"
                    className={cn(
                      'py-1.5 pr-3 font-semibold whitespace-nowrap last:pr-0',
                      header.column.columnDef.meta?.align === 'right' ? 'text-right' : 'text-left',
                    )}
                  >
                    <table.FlexRender header={header} />
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => {
              const note = [row.original.note, row.original.unresolved].filter(Boolean).join('; ');
              return (
                <Fragment key={row.id}>
                  <tr className={cn('border-line', note ? '' : 'border-b last:border-0')}>
                    {row.getAllCells().map((cell) => {
                      const right = cell.column.columnDef.meta?.align === 'right';
                      const className = cn(
                        'py-1.5 pr-3 whitespace-nowrap last:pr-0',
                        right ? 'text-right tabular-nums' : 'text-left',
                      );
                      return cell.column.id === 'index' ? (
                        <th key={cell.id} scope="row" className={cn(className, 'font-semibold')}>
                          <table.FlexRender cell={cell} />
                        </th>
                      ) : (
                        <td key={cell.id} className={className}>
                          <table.FlexRender cell={cell} />
                        </td>
                      );
                    })}
                  </tr>
                  {note && (
                    <tr className="border-b border-line last:border-0">
                      <td />
                      <td colSpan={columns.length - 1} className="pb-1.5 text-ink-muted">
                        Part {row.index + 1}: {note}.
                      </td>
                    </tr>
                  )}
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </div>
    </>
  );
}
