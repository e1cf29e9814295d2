import { describe, expect, it } from 'vitest';
import { analyseTrack } from '../../../../shared/tracks/analyse.ts';
import { cleanTrack } from '../../../../shared/tracks/clean.ts';
import { buildSeries } from '../../../../shared/tracks/series.ts';
import { computeSplits, timeAtDistance } from '../../../../shared/tracks/splits.ts';
import { deviceSeries, meridianPoints, T0 } from './helpers.ts';

describe('splits of the REFERENCES.md §2.5 meridian track (splits.py, GeographicLib; verified by computation)', () => {
  const analysis = analyseTrack(cleanTrack([meridianPoints()]));

  it('totals 6667.941821 m of WGS-84 geodesic distance', () => {
    expect(analysis.summary.distance_m).toBeCloseTo(6667.941821, 4);
    expect(analysis.summary.distance_source).toBe('geodesic');
  });

  it.each([
    [1, 269.9496],
    [2, 269.9491],
    [3, 269.9487],
    [4, 269.9483],
    [5, 269.9479],
    [6, 269.9474],
  ])('km split %i takes %f s', (index, seconds) => {
    const split = analysis.splits.km[index - 1]!;
    expect(split.elapsed_s).toBeCloseTo(seconds, 3);
    expect(split.moving_s).toBeCloseTo(seconds, 3);
    expect(split.distance_m).toBe(1000);
  });

  it('ends with a partial km of 667.9418 m in 180.3089 s', () => {
    const last = analysis.splits.km[6]!;
    expect(analysis.splits.km).toHaveLength(7);
    expect(last.distance_m).toBeCloseTo(667.9418, 4);
    expect(last.elapsed_s).toBeCloseTo(180.3089, 3);
  });

  it.each([
    [1, 434.4415],
    [2, 434.4404],
    [3, 434.4393],
    [4, 434.4382],
  ])('mile split %i takes %f s', (index, seconds) => {
    expect(analysis.splits.mi[index - 1]!.elapsed_s).toBeCloseTo(seconds, 3);
    expect(analysis.splits.mi[index - 1]!.distance_m).toBe(1609.344);
  });

  it('ends with a partial mile of 230.5658 m in 62.2405 s', () => {
    const last = analysis.splits.mi[4]!;
    expect(last.distance_m).toBeCloseTo(230.5658, 4);
    expect(last.elapsed_s).toBeCloseTo(62.2405, 3);
  });

  it('averages 269.9484 s/km and 434.4398 s/mi', () => {
    expect(analysis.summary.pace_s_per_km).toBeCloseTo(269.9484, 3);
    expect(analysis.summary.pace_s_per_mi).toBeCloseTo(434.4398, 3);
  });
});

describe('computeSplits with device distance', () => {
  it('interpolates each boundary linearly in time at exactly k × 1000 m', () => {
    // 0 m at 0 s, 900 m at 300 s, 1100 m at 400 s: 1000 m is crossed at 350 s.
    const series = deviceSeries([
      [0, 0],
      [300, 900],
      [400, 1100],
      [700, 2000],
    ]);
    const splits = computeSplits(series, 'km');
    expect(splits.map((s) => s.elapsed_s)).toEqual([350, 350]);
    expect(splits.map((s) => s.distance_m)).toEqual([1000, 1000]);
    expect(timeAtDistance(series, 1000)).toBe(T0 + 350_000);
  });

  // Found by the upload fuzz test (tests/api/faults.api.test.ts): one damaged reading once asked for ~10^17 splits.
  it('ignores a damaged device distance (huge, or a jump faster than anything on foot or wheels)', () => {
    for (const glitch of [1e20, 1e308, 5_000_000]) {
      const series = deviceSeries([
        [0, 0],
        [300, 1000],
        [310, glitch],
        [600, 2000],
      ]);
      expect(series.d[series.d.length - 1]).toBe(2000);
      expect(computeSplits(series, 'km').map((s) => s.distance_m)).toEqual([1000, 1000]);
    }
  });

  it('keeps a fast but possible device distance (a descent on a bike at 25 m/s)', () => {
    const series = deviceSeries([
      [0, 0],
      [40, 1000],
      [80, 2000],
    ]);
    expect(series.d[series.d.length - 1]).toBe(2000);
  });

  it('reports a boundary that falls exactly on a point at that point’s time', () => {
    const splits = computeSplits(
      deviceSeries([
        [0, 0],
        [250, 1000],
        [500, 2000],
      ]),
      'km',
    );
    expect(splits.map((s) => s.elapsed_s)).toEqual([250, 250]);
  });

  it('takes a 3-minute stop out of moving time but not out of elapsed time', () => {
    // Runs 1000 m in 300 s, stands 180 s (device distance flat), runs 1000 m in 300 s.
    const rows: number[][] = [];
    for (let s = 0; s <= 300; s++) rows.push([s, (s * 1000) / 300]);
    for (let s = 301; s <= 480; s++) rows.push([s, 1000]);
    for (let s = 481; s <= 780; s++) rows.push([s, 1000 + ((s - 480) * 1000) / 300]);
    const [first, second] = computeSplits(deviceSeries(rows), 'km');
    expect(first!.elapsed_s).toBeCloseTo(300, 6);
    expect(second!.elapsed_s).toBeCloseTo(480, 6);
    expect(second!.moving_s).toBeCloseTo(300, 6);
    expect(second!.pace_s).toBeCloseTo(300, 6);
  });

  it('averages heart rate over time, not over points', () => {
    // 100 bpm for 100 s then 160 bpm for 1 s: a point average would say 130.
    const [split] = computeSplits(
      deviceSeries([
        [0, 0, 100],
        [100, 500, 100],
        [101, 600, 160],
      ]),
      'km',
    );
    expect(split!.avg_hr).toBeCloseTo((100 * 100 + 1 * 130) / 101, 6);
    expect(split!.max_hr).toBe(160);
  });

  it.each([
    [
      'a remainder under 1 m is not a split',
      [
        [0, 0],
        [100, 1000.5],
      ],
      1,
    ],
    [
      'a remainder of 1 m is a partial split',
      [
        [0, 0],
        [100, 1001],
      ],
      2,
    ],
    [
      'a run shorter than one unit is one partial split',
      [
        [0, 0],
        [100, 400],
      ],
      1,
    ],
    [
      'a run without distance has no splits',
      [
        [0, 0],
        [100, 0],
      ],
      0,
    ],
  ])('%s', (_label, rows, count) => {
    expect(computeSplits(deviceSeries(rows), 'km')).toHaveLength(count);
  });

  it('leaves heart rate and elevation empty when the file has none', () => {
    const [split] = computeSplits(
      deviceSeries([
        [0, 0],
        [300, 1000],
      ]),
      'km',
    );
    expect(split).toMatchObject({ avg_hr: null, max_hr: null, elev_gain_m: null, elev_loss_m: null, flat_pace_s: null });
  });

  it('has no splits for a single point', () => {
    expect(computeSplits(buildSeries(cleanTrack([[{ t: T0, distance_m: 0 }]])), 'mi')).toEqual([]);
  });
});

describe('geodesic distance and stops', () => {
  it('does not count GPS jitter while standing still', () => {
    // 200 s standing with ±1.5 m jitter at 1 Hz, then 600 m due north in 200 s.
    const points = [];
    for (let s = 0; s < 200; s++) {
      const jitter = (((s * 7919) % 13) - 6) / 6; // deterministic, −1…1
      points.push({ t: T0 + s * 1000, lat: 45 + (jitter * 1.5) / 111_132, lon: 7 + (((s * 104729) % 11) - 5) / 5 / 78_847 });
    }
    for (let s = 200; s <= 400; s++) points.push({ t: T0 + s * 1000, lat: 45 + ((s - 200) * 3) / 111_132, lon: 7 });
    const { summary } = analyseTrack(cleanTrack([points]));
    expect(summary.distance_m).toBeGreaterThan(595);
    expect(summary.distance_m).toBeLessThan(610);
    expect(summary.moving_s).toBeGreaterThan(198);
    expect(summary.moving_s).toBeLessThan(206);
  });

  it('does not join segments: the pause between them adds neither distance nor moving time', () => {
    const a = [0, 1, 2].map((s) => ({ t: T0 + s * 1000, lat: 45 + (s * 3) / 111_132, lon: 7 }));
    const b = [600, 601, 602].map((s) => ({ t: T0 + s * 1000, lat: 46 + ((s - 600) * 3) / 111_132, lon: 7 }));
    const { summary } = analyseTrack(cleanTrack([a, b]));
    expect(summary.distance_m).toBeCloseTo(12, 0);
    expect(summary.elapsed_s).toBe(602);
    expect(summary.moving_s).toBe(4);
    expect(summary.segments).toBe(2);
  });
});

describe('a tiny last split', () => {
  it('under 100 m shows its distance and time but no pace or flat-equivalent pace', () => {
    // 1000 m in 300 s, then 10 m in 3 s (device distances).
    const splits = computeSplits(
      deviceSeries([
        [0, 0],
        [300, 1000],
        [303, 1010],
      ]),
      'km',
    );
    expect(splits).toHaveLength(2);
    expect(splits[1]).toMatchObject({ distance_m: 10, elapsed_s: 3, pace_s: null, flat_pace_s: null });
    expect(splits[0]!.pace_s).toBeCloseTo(300, 6);
  });

  it('of 100 m or more keeps its pace', () => {
    const splits = computeSplits(
      deviceSeries([
        [0, 0],
        [300, 1000],
        [330, 1100],
      ]),
      'km',
    );
    expect(splits[1]!.pace_s).toBeCloseTo(300, 6);
  });
});
