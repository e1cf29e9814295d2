import { describe, expect, it } from 'vitest';
import { computeFastestSections, fastestSection, FASTEST_SECTION_DISTANCES_M } from '../../../../shared/tracks/fastest.ts';
import { deviceSeries, T0 } from './helpers.ts';

describe('fastestSection', () => {
  it('lists 400 m, 1 km, 1 mile (1609.344 m), 5 km, 10 km, half (21 097.5 m) and marathon (42 195 m, IAAF Rule 240)', () => {
    expect(FASTEST_SECTION_DISTANCES_M).toEqual([400, 1000, 1609.344, 5000, 10000, 21097.5, 42195]);
  });

  it('finds a fast kilometre in the middle of a run', () => {
    // 2 km at 5:00/km, 1 km at 4:00/km, 2 km at 5:00/km.
    const series = deviceSeries([
      [0, 0],
      [600, 2000],
      [840, 3000],
      [1440, 5000],
    ]);
    const best = fastestSection(series, 1000)!;
    expect(best.time_s).toBeCloseTo(240, 9);
    expect(best.start_t).toBe(T0 + 600_000);
    expect(best.start_distance_m).toBe(2000);
  });

  it('finds a section whose ends both fall between points', () => {
    // Uniform 4:00/km with sparse points: 400 m anywhere takes 96 s.
    const best = fastestSection(
      deviceSeries([
        [0, 0],
        [300, 1250],
        [600, 2500],
      ]),
      400,
    )!;
    expect(best.time_s).toBeCloseTo(96, 9);
    expect(best.pace_s_per_km).toBeCloseTo(240, 9);
  });

  it('starts a section when the runner leaves a stop, not when they arrived', () => {
    const best = fastestSection(
      deviceSeries([
        [0, 0],
        [100, 400],
        [400, 400],
        [500, 800],
      ]),
      400,
    )!;
    expect(best.time_s).toBeCloseTo(100, 9);
  });

  it.each([
    [
      'a run shorter than the distance',
      [
        [0, 0],
        [100, 399],
      ],
      400,
    ],
    [
      'a zero distance',
      [
        [0, 0],
        [100, 500],
      ],
      0,
    ],
    ['a single point', [[0, 0]], 400],
  ])('gives null for %s', (_label, rows, distance) => {
    expect(fastestSection(deviceSeries(rows), distance)).toBeNull();
  });

  it('agrees with a brute-force search on an uneven run', () => {
    const rows: number[][] = [[0, 0]];
    let d = 0;
    for (let s = 1; s <= 1200; s++) {
      d += 2.5 + 1.5 * Math.sin(s / 37) + (s % 97 < 10 ? -2.4 : 0);
      rows.push([s, d]);
    }
    const series = deviceSeries(rows);
    const best = fastestSection(series, 1000)!;
    let brute = Number.POSITIVE_INFINITY;
    for (let startM = 0; startM + 1000 <= d; startM += 0.5) {
      const a = interpolate(rows, startM, 'last');
      const b = interpolate(rows, startM + 1000, 'first');
      brute = Math.min(brute, b - a);
    }
    expect(best.time_s).toBeLessThanOrEqual(brute + 1e-9);
    expect(best.time_s).toBeGreaterThan(brute - 0.5);
  });

  it('only reports distances the run covers', () => {
    const sections = computeFastestSections(
      deviceSeries([
        [0, 0],
        [1500, 5200],
      ]),
    );
    expect(sections.map((s) => s.distance_m)).toEqual([400, 1000, 1609.344, 5000]);
  });
});

function interpolate(rows: number[][], metres: number, which: 'first' | 'last'): number {
  for (let i = 1; i < rows.length; i++) {
    const [t0, d0] = rows[i - 1] as [number, number];
    const [t1, d1] = rows[i] as [number, number];
    const hit = which === 'first' ? d1 >= metres && d0 < metres : d0 <= metres && d1 > metres;
    if (hit) return t0 + ((metres - d0) / (d1 - d0)) * (t1 - t0);
  }
  return Number.NaN;
}
