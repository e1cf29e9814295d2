import { describe, expect, it } from 'vitest';
import { acsmRunningVo2, estimateRunEnergy } from '../../../../shared/tracks/energy.ts';
import { heartRateZones, karvonenHeartRate, timeInZones } from '../../../../shared/tracks/heart-rate.ts';

describe('karvonenHeartRate', () => {
  // REFERENCES.md §6, worked values (heart_rate.py): rest 60, max 190.
  it.each([
    [0.5, 125],
    [0.6, 138],
    [0.7, 151],
    [0.8, 164],
    [0.85, 170.5],
    [0.9, 177],
  ])('%s of the reserve (rest 60, max 190) is %s bpm', (fraction, bpm) => {
    expect(karvonenHeartRate(60, 190, fraction)).toBeCloseTo(bpm, 6);
  });
  it('70 % with rest 50 and max 180 is 141 bpm (REFERENCES.md §6)', () => {
    expect(karvonenHeartRate(50, 180, 0.7)).toBeCloseTo(141, 6);
  });
});

describe('heartRateZones', () => {
  it('uses the reserve when the resting heart rate is known', () => {
    const result = heartRateZones(190, 60)!;
    expect(result.method).toBe('heart-rate reserve');
    expect(result.zones.map((z) => z.from_bpm)).toEqual([0, 125, 138, 151, 164, 177]);
    expect(result.zones.at(-1)!.to_bpm).toBeNull();
  });
  it('falls back to percent of maximum', () => {
    const result = heartRateZones(200, null)!;
    expect(result.method).toBe('percent of maximum');
    expect(result.zones.map((z) => z.from_bpm)).toEqual([0, 100, 120, 140, 160, 180]);
  });
  it.each([
    [null, 60],
    [0, null],
    [150, 150],
    [150, 170],
  ])('no zones for max %s and rest %s', (max, rest) => {
    expect(heartRateZones(max, rest)).toBeNull();
  });
});

describe('timeInZones', () => {
  it('credits moving intervals to the zone of their mean heart rate and skips stops and unknown values', () => {
    const { zones } = heartRateZones(200, null)!;
    const t = Float64Array.from([0, 10_000, 20_000, 30_000, 40_000, 50_000]);
    const hr = Float64Array.from([110, 110, 150, Number.NaN, 185, 185]);
    const moving = Uint8Array.from([0, 1, 1, 1, 0, 1]);
    // 0→1: mean 110 (zone 1, 10 s); 1→2: mean 130 (zone 2, 10 s); 2→3 unknown; 3→4 stopped; 4→5: 185 (zone 5, 10 s)
    expect(timeInZones(t, hr, moving, zones)).toEqual([0, 10, 10, 0, 0, 10]);
  });
});

describe('ACSM running equation', () => {
  // REFERENCES.md §4 worked example (energy.py): 70 kg, 33.8 km in 160 min, level.
  it('gives 45.75 ml/kg/min at 211.25 m/min', () => {
    expect(acsmRunningVo2(211.25)).toBeCloseTo(45.75, 10);
  });
  it('gives 55.2563 ml/kg/min at the same speed on a +5 % grade', () => {
    expect(acsmRunningVo2(211.25, 0.05)).toBeCloseTo(55.2563, 3);
  });
  it('gives 2562.0 kcal gross and 2366.0 kcal net for the worked example', () => {
    const e = estimateRunEnergy(33_800, 160 * 60, 70)!;
    expect(e.gross_kcal).toBeCloseTo(2562.0, 1);
    // Equals Margaria et al. (1963)'s ~1 kcal/kg/km net: 70 × 33.8 = 2366.
    expect(e.net_kcal).toBeCloseTo(2366.0, 1);
  });
  it.each([
    [5000, 1800, null],
    [5000, 0, 70],
    [0, 1800, 70],
    [1000, 1800, 70], // 33 m/min: walking pace, out of the equation's range
  ])('no estimate for %s m in %s s at %s kg', (d, s, kg) => {
    expect(estimateRunEnergy(d, s, kg)).toBeNull();
  });
});
