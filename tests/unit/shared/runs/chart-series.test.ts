import { describe, expect, it } from 'vitest';
import { buildChartRows } from '../../../../shared/runs/chart-series.ts';

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
