import { createColumnHelper, useTable } from '@tanstack/react-table';
import { useMemo } from 'react';
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
import { DataTable } from '../../../components/ui/data-table.tsx';
import { Verdict } from '../../../components/ui/verdict.tsx';
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
/** The columns a phone shows: part, pace run, target and verdict ("rep 3 · 3:18 · 3:30–3:40 · ▲ quick"). */
const primary = { meta: { align: 'right', primary: true } } as const;
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
    helper.accessor('label', { header: 'Part', meta: { primary: true } }),
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
      ...primary,
      cell: ({ row: { original: r } }) => (
        <span className="font-semibold">{dash(formatPace(pacePerUnit(r.actual.pace_s_per_km, unit)))}</span>
      ),
    }),
    helper.display({ id: 'target', header: 'Target', ...primary, cell: ({ row: { original: r } }) => target(r, unit) }),
    helper.accessor('difference_s_per_km', {
      header: () => <SymbolHeader symbol={`± s/${unit}`} words={`Difference from the target, seconds per ${unit}`} />,
      meta: { align: 'right', label: `± s/${unit} from the target` },
      cell: (info) => formatDifference(info.getValue(), unit),
    }),
    helper.display({
      id: 'hr',
      header: () => <SymbolHeader symbol="♥" words="Average heart rate" />,
      meta: { align: 'right', label: 'Average heart rate' },
      cell: ({ row: { original: r } }) => (r.actual.avg_hr === null ? '–' : Math.round(r.actual.avg_hr)),
    }),
    helper.accessor('verdict', {
      header: 'Verdict',
      meta: { primary: true },
      cell: (info) => <Verdict verdict={info.getValue()} />,
    }),
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
  const table = useTable({ features: sortableTableFeatures, columns, data, enableSorting: false });

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
      <DataTable
        table={table}
        caption={`Plan check, part by part, pace per ${unit}`}
        minWidth="min-w-3xl"
        rowHeader="label"
        rowLabel={(row) => row.original.label}
        rowNote={(row) => {
          const note = [row.original.note, row.original.unresolved].filter(Boolean).join('; ');
          return note ? `Part ${row.index + 1}: ${note}.` : null;
        }}
      />
    </>
  );
}
