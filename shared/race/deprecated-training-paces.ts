import type { Pace } from './paces.ts';
import { oxygenCost, performanceIndex } from './equivalence.ts';
import { trainingRanges, type TrainingRangeKind } from './training-ranges.ts';

/**
 * DEPRECATED, for one release only (0.1.x; remove in the next): the earlier `training_paces` field of
 * `GET /api/tools/paces`, answered only when a client asks for it with `?include=training_paces`, so scripts written
 * against it can still read its kind values while they move to `training_ranges`. Each earlier kind value is mapped
 * onto one of today's ranges and every number is today's; nothing of the earlier scheme's bands is computed.
 */
export const DEPRECATED_TRAINING_PACE_KINDS = ['easy', 'marathon', 'threshold', 'interval', 'repetition'] as const;
export type DeprecatedTrainingPaceKind = (typeof DEPRECATED_TRAINING_PACE_KINDS)[number];

/** Which of today's ranges each earlier kind value now reads. */
export const DEPRECATED_KIND_MAPPING: Readonly<Record<DeprecatedTrainingPaceKind, TrainingRangeKind>> = {
  easy: 'easy',
  marathon: 'marathon-effort',
  threshold: 'half-marathon-effort',
  interval: '5k-effort',
  repetition: 'mile-effort',
};

export const DEPRECATED_INDEX_SOURCE = 'Daniels & Gilbert (1979), oxygen cost and sustainable fraction equations';
export const DEPRECATION_NOTICE = 'Deprecated: read training_ranges instead; training_paces goes in the next release.';

export interface DeprecatedTrainingPaces {
  notice: typeof DEPRECATION_NOTICE;
  /** Daniels & Gilbert index of the result, ml·kg⁻¹·min⁻¹. */
  index: number;
  index_source: typeof DEPRECATED_INDEX_SOURCE;
  ranges: Array<{
    kind: DeprecatedTrainingPaceKind;
    label: string;
    purpose: string;
    /** The oxygen cost of each end of today's range as a share of the index (computed, not a band). */
    vo2max_fraction_low: number;
    vo2max_fraction_high: number;
    fast: Pace;
    slow: Pace;
    source: string;
  }>;
}

/** The deprecated field for a result of `distanceM` metres in `timeS` seconds, read from `trainingRanges`. */
export function deprecatedTrainingPaces(distanceM: number, timeS: number): DeprecatedTrainingPaces {
  const index = performanceIndex(distanceM, timeS);
  const { ranges } = trainingRanges(distanceM, timeS);
  const shareOfIndex = (pace: Pace): number => oxygenCost(60_000 / pace.s_per_km) / index;
  return {
    notice: DEPRECATION_NOTICE,
    index,
    index_source: DEPRECATED_INDEX_SOURCE,
    ranges: DEPRECATED_TRAINING_PACE_KINDS.map((kind) => {
      const range = ranges.find((r) => r.kind === DEPRECATED_KIND_MAPPING[kind])!;
      return {
        kind,
        label: range.label,
        purpose: range.purpose,
        vo2max_fraction_low: shareOfIndex(range.slow),
        vo2max_fraction_high: shareOfIndex(range.fast),
        fast: range.fast,
        slow: range.slow,
        source: range.source,
      };
    }),
  };
}
