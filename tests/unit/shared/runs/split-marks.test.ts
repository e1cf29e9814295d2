import { describe, expect, it } from 'vitest';
import { findSplitExtremes } from '../../../../shared/runs/split-marks.ts';
import type { Split } from '../../../../shared/tracks/types.ts';

function split(index: number, pace: number | null, distance = 1609.344, unit: 'mi' | 'km' = 'mi'): Split {
  return {
    index,
    unit,
    distance_m: distance,
    start_t: 0,
    end_t: 0,
    elapsed_s: pace ?? 0,
    moving_s: pace ?? 0,
    pace_s: pace,
    flat_pace_s: pace,
    avg_hr: null,
    max_hr: null,
    avg_cad: null,
    elev_gain_m: null,
    elev_loss_m: null,
  };
}

describe('findSplitExtremes', () => {
  it('marks the quickest and the slowest full split', () => {
    expect(findSplitExtremes([split(1, 480), split(2, 470), split(3, 495), split(4, 300, 400)])).toEqual({
      fastest: 2,
      slowest: 3,
    });
  });

  it('never marks the last partial split, however quick or slow', () => {
    expect(findSplitExtremes([split(1, 300, 1000, 'km'), split(2, 310, 1000, 'km'), split(3, 200, 512, 'km')])).toEqual({
      fastest: 1,
      slowest: 2,
    });
  });

  it('counts a split within half a metre of the unit as full', () => {
    expect(findSplitExtremes([split(1, 300, 999.6, 'km'), split(2, 310, 1000, 'km')])).toEqual({ fastest: 1, slowest: 2 });
  });

  it.each<[string, Split[]]>([
    ['no splits', []],
    ['one full split', [split(1, 480), split(2, 300, 500)]],
    ['all full splits at one pace', [split(1, 480), split(2, 480)]],
    ['full splits without a pace', [split(1, null), split(2, null)]],
  ])('marks nothing with %s', (_label, splits) => {
    expect(findSplitExtremes(splits)).toEqual({ fastest: null, slowest: null });
  });

  it('marks the earlier split on a tie', () => {
    expect(findSplitExtremes([split(1, 470), split(2, 470), split(3, 500), split(4, 500)])).toEqual({ fastest: 1, slowest: 3 });
  });
});
