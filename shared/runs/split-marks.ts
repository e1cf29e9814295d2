import type { Split } from '../tracks/types.ts';
import { UNIT_METRES } from '../units.ts';

/** A split within half a metre of the unit counts as full (boundaries are interpolated at exactly k × unit). */
const FULL_SPLIT_TOLERANCE_M = 0.5;

export interface SplitExtremes {
  /** `index` of the full split with the quickest moving pace, or null. */
  fastest: number | null;
  /** `index` of the full split with the slowest moving pace, or null. */
  slowest: number | null;
}

/**
 * The fastest and slowest *full* splits by moving pace. The last, partial split is never marked
 * (its pace over a short stretch is not comparable). Nothing is marked with fewer than two full
 * splits with a pace, or when they all share one pace; on a tie the earlier split is marked.
 */
export function findSplitExtremes(splits: readonly Split[]): SplitExtremes {
  const full = splits.filter(
    (s) => s.pace_s !== null && Number.isFinite(s.pace_s) && s.distance_m >= UNIT_METRES[s.unit] - FULL_SPLIT_TOLERANCE_M,
  );
  if (full.length < 2) return { fastest: null, slowest: null };
  let fastest = full[0]!;
  let slowest = full[0]!;
  for (const split of full) {
    if (split.pace_s! < fastest.pace_s!) fastest = split;
    if (split.pace_s! > slowest.pace_s!) slowest = split;
  }
  if (fastest.pace_s === slowest.pace_s) return { fastest: null, slowest: null };
  return { fastest: fastest.index, slowest: slowest.index };
}
