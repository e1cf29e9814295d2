import { describe, expect, it } from 'vitest';
import { buildChartRows, niceTicks, robustRange } from '../../../../shared/runs/chart-series.ts';

describe('buildChartRows', () => {
  // 100 m every 30 s: 5:00 per km.
  const t = [0, 30_000, 60_000, 90_000, 120_000];
  const d = [0, 100, 200, 300, 400];

  it('measures pace over the trailing 200 m, in the display unit', () => {
    const rows = buildChartRows({ t, d, ele: null, hr: null }, 'km');
    expect(rows.map((r) => r.pace_s)).toEqual([null, null, 300, 300, 300]);
    expect(rows[4]!.distance).toBe(0.4);
    const miles = buildChartRows({ t, d, ele: null, hr: null }, 'mi');
    expect(miles[4]!.pace_s).toBeCloseTo(482.8032, 3);
    expect(miles[4]!.distance).toBe(0.249);
  });

  it('leaves pace blank while stopped (slower than 20:00 per km)', () => {
    const rows = buildChartRows({ t: [0, 60_000, 400_000], d: [0, 200, 400], ele: null, hr: null }, 'km');
    expect(rows[2]!.pace_s).toBeNull();
  });

  it('skips points without time or distance and keeps heart rate and elevation', () => {
    const rows = buildChartRows({ t: [0, null, 60_000], d: [0, 100, 200], ele: [10, 11, null], hr: [120, 130, 140] }, 'km');
    expect(rows).toEqual([
      { distance: 0, pace_s: null, hr: 120, ele: 10 },
      { distance: 0.2, pace_s: 300, hr: 140, ele: null },
    ]);
  });
});

describe('robustRange', () => {
  it('drops the extreme 2 % at each end', () => {
    const values = [...Array.from({ length: 98 }, (_, i) => 300 + i), 1, 5000];
    expect(robustRange(values)).toEqual([301, 396]); // nearest ranks 2 and 97 of 0–99: both spikes left out
  });

  it('ignores unknown values and returns null without any', () => {
    expect(robustRange([null, 5, null], 0, 1)).toEqual([5, 5]);
    expect(robustRange([null, Number.NaN])).toBeNull();
  });
});

describe('niceTicks', () => {
  it.each<[number, number, number[], number, [number, number], number[]]>([
    [452, 538, [10, 15, 30, 60], 5, [450, 540], [450, 480, 510, 540]],
    [131, 187, [5, 10, 20, 50], 5, [120, 200], [120, 140, 160, 180, 200]],
    [176, 176, [1, 2, 5], 5, [175, 177], [175, 176, 177]],
    [0, 10_000, [1000, 2000, 5000], 5, [0, 10_000], [0, 5000, 10_000]],
    [0, 12, [1, 2], 5, [0, 12], [0, 2, 4, 6, 8, 10, 12]], // no step fits: the largest one
  ])('%s–%s with steps %j, at most %i ticks → domain %j', (min, max, steps, maxTicks, domain, ticks) => {
    expect(niceTicks(min, max, steps, maxTicks)).toEqual({ domain, ticks });
  });
});
