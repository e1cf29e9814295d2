import { describe, expect, it } from 'vitest';
import { cleanTrack } from '../../../../shared/tracks/clean.ts';
import type { TrackPoint } from '../../../../shared/tracks/types.ts';
import { T0 } from './helpers.ts';

const at = (s: number, extra: Partial<TrackPoint> = {}): TrackPoint => ({ t: T0 + s * 1000, lat: 45, lon: 7, ...extra });

describe('cleanTrack', () => {
  it.each<[string, TrackPoint[][], number, Partial<Record<string, number>>]>([
    ['keeps an ordered track as it is', [[at(0), at(1), at(2)]], 3, {}],
    ['drops a point that goes back in time and counts it', [[at(0), at(5), at(3), at(6)]], 3, { dropped_backwards: 1 }],
    ['merges a duplicate timestamp', [[at(0), at(1), at(1, { lat: 46 }), at(2)]], 3, { merged_duplicates: 1 }],
    ['drops untimed points', [[at(0), { t: Number.NaN, lat: 45, lon: 7 }, at(2)]], 2, { dropped_untimed: 1 }],
    [
      'drops points with NaN coordinates and no distance',
      [[at(0), at(1, { lat: Number.NaN }), at(2)]],
      2,
      { invalid_positions: 1, dropped_no_position: 1 },
    ],
    [
      'drops points with out-of-range coordinates',
      [[at(0), at(1, { lat: 95 }), at(2, { lon: -200 })]],
      1,
      { invalid_positions: 2, dropped_no_position: 2 },
    ],
    [
      'keeps a point without position that carries a device distance',
      [[at(0, { distance_m: 0 }), { t: T0 + 1000, distance_m: 3 }]],
      2,
      {},
    ],
    [
      'checks time across segments too',
      [
        [at(0), at(10)],
        [at(5), at(11)],
      ],
      3,
      { dropped_backwards: 1 },
    ],
    ['returns nothing for empty segments', [[], []], 0, {}],
  ])('%s', (_label, segments, kept, counts) => {
    const result = cleanTrack(segments);
    expect(result.points).toHaveLength(kept);
    for (const [key, value] of Object.entries(counts)) expect(result.report[key as keyof typeof result.report]).toBe(value);
    for (let i = 1; i < result.points.length; i++) {
      expect(result.points[i]!.t).toBeGreaterThan(result.points[i - 1]!.t);
    }
  });

  it('fills missing fields of a duplicate from the later point, but keeps the first point’s values', () => {
    const { points } = cleanTrack([[at(0, { hr: 120 }), at(0, { hr: 130, ele: 12 })]]);
    expect(points).toEqual([{ t: T0, lat: 45, lon: 7, hr: 120, ele: 12 }]);
  });

  it.each([
    ['heart rate 255 (no sensor)', { hr: 255 }, 'hr'],
    ['heart rate 0', { hr: 0 }, 'hr'],
    ['NaN elevation', { ele: Number.NaN }, 'ele'],
    ['elevation of 20 km', { ele: 20000 }, 'ele'],
    ['negative cadence', { cad: -3 }, 'cad'],
  ] as const)('removes an implausible value: %s', (_label, extra, key) => {
    const { points } = cleanTrack([[at(0, extra)]]);
    expect(points[0]?.[key]).toBeUndefined();
  });

  it('starts a new segment index only for non-empty segments', () => {
    const result = cleanTrack([[at(0), at(1)], [], [at(10), at(11)]]);
    expect(result.segment_starts).toEqual([0, 2]);
  });

  it('does not modify its input', () => {
    const input = [[at(0, { hr: 300 }), at(0)]];
    const copy = structuredClone(input);
    cleanTrack(input);
    expect(input).toEqual(copy);
  });
});
