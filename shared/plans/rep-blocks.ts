/**
 * Intervals at a glance (issue #14): one summary per repeated step of a repeat block — each rep's
 * moving pace, how many were on pace, their average, the fastest and slowest, and the change from
 * the first rep to the last. Paces in seconds per km, like the rest of the plan check.
 */
import type { PartCheck } from './plan-check.ts';
import type { DistanceUnit, ExpandedPart } from './types.ts';

export interface RepBlock {
  /** The plan item (a repeat) and the step within its round this block summarises. */
  item_index: number;
  step: number;
  kind: ExpandedPart['kind'];
  /** One rep's planned amount, as written. */
  amount: { distance_m: number; unit: DistanceUnit } | { duration_s: number };
  /** Reps in the check, and how many of them were run (not missed) and on pace. */
  reps: number;
  run: number;
  on_pace: number;
  /** Each rep's moving pace in order; null for a rep not run. */
  paces_s_per_km: Array<number | null>;
  /** Moving time over distance of the reps run (a longer rep weighs more); null with none run. */
  average_s_per_km: number | null;
  fastest_s_per_km: number | null;
  slowest_s_per_km: number | null;
  /** Last rep run minus first rep run (negative = got quicker); null with fewer than two run. */
  first_to_last_s_per_km: number | null;
}

type CheckedRow = Pick<PartCheck, 'index' | 'kind' | 'verdict' | 'actual'>;

/**
 * The rep blocks of a check: for every repeat with two rounds or more, each step that is not a
 * recovery jog. `planned` is the plan's expanded list (expandParts); `checked` the check's rows,
 * matched by `index`. Blocks with no row in the check (a plan whose parts were all dropped) are left out.
 */
export function repBlocks(planned: readonly ExpandedPart[], checked: readonly CheckedRow[]): RepBlock[] {
  const rows = new Map(checked.map((row) => [row.index, row]));
  const blocks = new Map<string, { part: ExpandedPart; rows: CheckedRow[] }>();
  for (const part of planned) {
    if (!part.repeat || part.repeat.rounds < 2 || part.kind === 'recovery jog') continue;
    const row = rows.get(part.index);
    if (!row) continue;
    const key = `${part.item_index}:${part.repeat.step}`;
    const block = blocks.get(key) ?? { part, rows: [] };
    block.rows.push(row);
    blocks.set(key, block);
  }
  return [...blocks.values()].map(({ part, rows: reps }) => {
    const ran = reps.filter((r) => r.verdict !== 'missed' && r.actual.pace_s_per_km !== null && r.actual.distance_m > 0);
    const paces = ran.map((r) => r.actual.pace_s_per_km!);
    const moving = ran.reduce((s, r) => s + (r.actual.moving_s ?? r.actual.duration_s), 0);
    const distance = ran.reduce((s, r) => s + r.actual.distance_m, 0);
    return {
      item_index: part.item_index,
      step: part.repeat!.step,
      kind: part.kind,
      amount:
        part.amount.type === 'distance'
          ? { distance_m: part.amount.distance_m, unit: part.amount.unit }
          : { duration_s: part.amount.duration_s },
      reps: reps.length,
      run: ran.length,
      on_pace: reps.filter((r) => r.verdict === 'on pace').length,
      paces_s_per_km: reps.map((r) => (ran.includes(r) ? r.actual.pace_s_per_km : null)),
      average_s_per_km: distance > 0 && moving > 0 ? moving / (distance / 1000) : null,
      fastest_s_per_km: paces.length > 0 ? Math.min(...paces) : null,
      slowest_s_per_km: paces.length > 0 ? Math.max(...paces) : null,
      first_to_last_s_per_km: paces.length >= 2 ? paces.at(-1)! - paces[0]! : null,
    };
  });
}
