import { describe, expect, it } from 'vitest';
import { EQUIVALENT_DISTANCES_M, HALF_MARATHON_M, MARATHON_M, MILE_M } from '../../../../shared/race/distances.ts';
import {
  equivalentTime,
  oxygenCost,
  performanceIndex,
  raceEquivalents,
  riegelTime,
  speedForOxygenCost,
  sustainableFraction,
} from '../../../../shared/race/equivalence.ts';

/** "h:mm:ss" or "m:ss" → seconds, for the rounded tables below. */
function clock(text: string): number {
  return text
    .split(':')
    .map(Number)
    .reduce((total, part) => total * 60 + part, 0);
}

describe('standard distances (REFERENCES.md §1)', () => {
  it.each<[string, number, number]>([
    ['marathon, IAAF Rule 240.1', MARATHON_M, 42195],
    ['half marathon = 42195 / 2', HALF_MARATHON_M, 21097.5],
    ['international mile = 1760 × 0.9144 m', MILE_M, 1609.344],
  ])('%s', (_name, value, expected) => {
    expect(value).toBe(expected);
  });

  it('lists the eight equivalent distances of api-contract.md, shortest first', () => {
    expect(EQUIVALENT_DISTANCES_M).toEqual([1500, 1609.344, 3000, 5000, 10000, 15000, 21097.5, 42195]);
  });
});

describe('riegelTime: T2 = T1 · (D2/D1)^b (Riegel 1981)', () => {
  it.each<[string, number, number, number, number, number]>([
    // name, t1 s, d1 m, d2 m, b, expected s — all rows of REFERENCES.md §3.1 "Worked values"
    ['half 1:25:00 → marathon, b 1.06', 5100, HALF_MARATHON_M, MARATHON_M, 1.06, 10633.151], // REFERENCES.md §3.1
    ['half 1:25:00 → marathon, b 1.07', 5100, HALF_MARATHON_M, MARATHON_M, 1.07, 10707.11], // REFERENCES.md §3.1
    ['half 1:25:00 → marathon, b 1.08', 5100, HALF_MARATHON_M, MARATHON_M, 1.08, 10781.584], // REFERENCES.md §3.1
    ['5K 20:00 → 10K', 1200, 5000, 10000, 1.06, 2501.918], // REFERENCES.md §3.1
    ['10K 40:00 → half', 2400, 10000, HALF_MARATHON_M, 1.06, 5295.367], // REFERENCES.md §3.1
    ['10K 40:00 → marathon', 2400, 10000, MARATHON_M, 1.06, 11040.478], // REFERENCES.md §3.1
    ['5K 25:00 → marathon', 1500, 5000, MARATHON_M, 1.06, 14386.651], // REFERENCES.md §3.1
    ['mile 6:00 → 5K', 360, MILE_M, 5000, 1.06, 1197.189], // REFERENCES.md §3.1
  ])('%s = %s s', (_name, t1, d1, d2, b, expected) => {
    expect(riegelTime(t1, d1, d2, b)).toBeCloseTo(expected, 3);
  });

  it('uses b = 1.06 when no exponent is given (REFERENCES.md §3.1, the usually quoted form)', () => {
    expect(riegelTime(5100, HALF_MARATHON_M, MARATHON_M)).toBeCloseTo(10633.151, 3);
    // factor 2^1.06 = 2.084932 (REFERENCES.md §3.1)
    expect(riegelTime(1, 1, 2)).toBeCloseTo(2.084932, 6);
  });

  it.each<[string, number, number, number]>([
    ['zero time', 0, 5000, 10000],
    ['negative time', -1, 5000, 10000],
    ['zero distance', 1200, 0, 10000],
    ['zero target distance', 1200, 5000, 0],
    ['NaN time', Number.NaN, 5000, 10000],
    ['infinite distance', 1200, Number.POSITIVE_INFINITY, 10000],
  ])('refuses %s with a RangeError', (_name, t1, d1, d2) => {
    expect(() => riegelTime(t1, d1, d2)).toThrow(RangeError);
  });
});

describe('Daniels & Gilbert (1979) building blocks (REFERENCES.md §3.2, verified: yes)', () => {
  it.each<[number, number]>([
    [200, 36.0116], // REFERENCES.md §3.2
    [250, 47.4645], // REFERENCES.md §3.2
    [300, 59.4374], // REFERENCES.md §3.2
    [350, 71.9303], // REFERENCES.md §3.2
  ])('oxygen cost at %s m/min = %s ml/kg/min', (v, expected) => {
    expect(oxygenCost(v)).toBeCloseTo(expected, 4);
  });

  it.each<[number, number]>([
    [10, 1.009995], // REFERENCES.md §3.2
    [30, 0.930025], // REFERENCES.md §3.2
    [60, 0.888007], // REFERENCES.md §3.2
    [120, 0.840883], // REFERENCES.md §3.2
    [180, 0.818992], // REFERENCES.md §3.2
    [240, 0.808823], // REFERENCES.md §3.2
    [3.5, 1.133154], // race_equivalence.py output
    [20, 0.952983], // race_equivalence.py output
    [90, 0.859982], // race_equivalence.py output
  ])('sustainable fraction for %s min = %s', (t, expected) => {
    expect(sustainableFraction(t)).toBeCloseTo(expected, 6);
  });

  it('F(t) crosses 1 at t = 11.03 min (REFERENCES.md §3.2: "F exceeds 1 for t < 11.03 min")', () => {
    expect(sustainableFraction(11.02)).toBeGreaterThan(1);
    expect(sustainableFraction(11.04)).toBeLessThan(1);
  });

  it('is written with exp, not the pow transcription (REFERENCES.md §3.2, pitfall)', () => {
    const powVersion = 0.8 + 0.1894393 ** (-0.012778 * 10) + 0.2989558 ** (-0.1932605 * 10);
    expect(Math.abs(sustainableFraction(10) - powVersion)).toBeGreaterThan(0.1);
  });

  it.each<[number]>([[36.0116], [47.4645], [59.4374], [71.9303]])(
    'speedForOxygenCost inverts the oxygen cost (%s ml/kg/min → 200…350 m/min)',
    (vo2) => {
      expect(oxygenCost(speedForOxygenCost(vo2))).toBeCloseTo(vo2, 9);
    },
  );

  it('speedForOxygenCost(36.0116) = 200 m/min (REFERENCES.md §3.2, VO₂(200))', () => {
    expect(speedForOxygenCost(36.0116)).toBeCloseTo(200, 6);
  });

  it.each<[number]>([[-4.6], [-10], [Number.NaN]])('speedForOxygenCost refuses %s', (vo2) => {
    expect(() => speedForOxygenCost(vo2)).toThrow(RangeError);
  });
});

describe('equivalentTime: unrounded cells (REFERENCES.md §3.2, "Unrounded cells for tests")', () => {
  it.each<[number, string, number, number]>([
    [50, '5K', 5000, 1196.02], // REFERENCES.md §3.2
    [50, '10K', 10000, 2479.6], // REFERENCES.md §3.2
    [50, 'half', HALF_MARATHON_M, 5491.2], // REFERENCES.md §3.2
    [50, 'marathon', MARATHON_M, 11439.74], // REFERENCES.md §3.2
    [40, '5K', 5000, 1446.22], // REFERENCES.md §3.2
    [40, '10K', 10000, 3000.77], // REFERENCES.md §3.2
    [40, 'half', HALF_MARATHON_M, 6653.91], // REFERENCES.md §3.2
    [40, 'marathon', MARATHON_M, 13777.42], // REFERENCES.md §3.2
    [60, '5K', 5000, 1022.79], // REFERENCES.md §3.2
    [60, '10K', 10000, 2121.85], // REFERENCES.md §3.2
    [60, 'half', HALF_MARATHON_M, 4688.59], // REFERENCES.md §3.2
    [60, 'marathon', MARATHON_M, 9802.48], // REFERENCES.md §3.2
  ])('index %s, %s: %s s', (index, _name, d, expected) => {
    expect(Math.abs(equivalentTime(index, d) - expected)).toBeLessThanOrEqual(0.01);
  });

  it.each<[number]>([[0], [-3], [Number.NaN]])('refuses an index of %s', (index) => {
    expect(() => equivalentTime(index, 5000)).toThrow(RangeError);
  });

  it('widens its bracket beyond 2000 min for a very slow ultra (250 km at index 10)', () => {
    const t = equivalentTime(10, 250_000);
    expect(t / 60).toBeGreaterThan(2000);
    expect(performanceIndex(250_000, t)).toBeCloseTo(10, 9);
  });
});

describe('performanceIndex and equivalents from a performance (REFERENCES.md §3.2, "From a performance")', () => {
  it.each<[string, number, number, number]>([
    ['half 1:25:00', HALF_MARATHON_M, 5100, 54.4535], // REFERENCES.md §3.2
    ['5K 20:00', 5000, 1200, 49.8062], // REFERENCES.md §3.2
    ['10K 40:00', 10000, 2400, 51.9441], // REFERENCES.md §3.2
    ['marathon 3:00:00', MARATHON_M, 10800, 53.5283], // REFERENCES.md §3.2
    ['half 1:31:04', HALF_MARATHON_M, 5464, 50.2877], // REFERENCES.md §3.2 (paragraph under the comparison table)
  ])('%s → index %s', (_name, d, t, expected) => {
    expect(performanceIndex(d, t)).toBeCloseTo(expected, 4);
  });

  it('half 1:25:00 → marathon 10 644.4 s = 2:57:24 (REFERENCES.md §3.2)', () => {
    expect(equivalentTime(performanceIndex(HALF_MARATHON_M, 5100), MARATHON_M)).toBeCloseTo(10644.4, 1);
  });

  it('half 1:31:04 → marathon 3:09:45 (REFERENCES.md §3.2)', () => {
    expect(Math.round(equivalentTime(performanceIndex(HALF_MARATHON_M, 5464), MARATHON_M))).toBe(clock('3:09:45'));
  });

  it.each<[number, number]>([
    [0, 1200],
    [5000, 0],
    [-5000, 1200],
  ])('refuses %s m in %s s', (d, t) => {
    expect(() => performanceIndex(d, t)).toThrow(RangeError);
  });
});

describe('equation-exact equivalents, rounded table (REFERENCES.md §3.2 rows 30/40/50/60/70/85; race_equivalence.py for 35…80)', () => {
  // Columns: 1500 m, mile, 3000 m, 5K, 10K, 15K, half, marathon.
  const TABLE: Array<[number, string[]]> = [
    [30, ['8:30', '9:10', '17:56', '30:41', '1:03:49', '1:38:21', '2:21:17', '4:49:49']], // REFERENCES.md §3.2
    [35, ['7:25', '8:01', '15:44', '26:59', '56:02', '1:26:21', '2:04:13', '4:16:06']], // race_equivalence.py
    [40, ['6:35', '7:07', '14:02', '24:06', '50:01', '1:17:02', '1:50:54', '3:49:37']], // REFERENCES.md §3.2
    [45, ['5:56', '6:24', '12:40', '21:49', '45:13', '1:09:37', '1:40:14', '3:28:16']], // race_equivalence.py
    [50, ['5:24', '5:50', '11:33', '19:56', '41:20', '1:03:34', '1:31:31', '3:10:40']], // REFERENCES.md §3.2
    [55, ['4:57', '5:21', '10:37', '18:22', '38:06', '58:32', '1:24:16', '2:55:55']], // race_equivalence.py
    [60, ['4:35', '4:57', '9:50', '17:03', '35:22', '54:18', '1:18:09', '2:43:22']], // REFERENCES.md §3.2
    [65, ['4:16', '4:37', '9:09', '15:55', '33:02', '50:41', '1:12:54', '2:32:35']], // race_equivalence.py
    [70, ['4:00', '4:19', '8:35', '14:56', '31:01', '47:34', '1:08:23', '2:23:13']], // REFERENCES.md §3.2
    [75, ['3:46', '4:04', '8:04', '14:04', '29:15', '44:50', '1:04:26', '2:14:59']], // race_equivalence.py
    [80, ['3:34', '3:51', '7:37', '13:18', '27:42', '42:26', '1:00:57', '2:07:43']], // race_equivalence.py
    [85, ['3:23', '3:39', '7:14', '12:37', '26:19', '40:18', '57:51', '2:01:15']], // REFERENCES.md §3.2
  ];
  const cells = TABLE.flatMap(([index, times]) =>
    times.map((text, i): [number, number, string] => [index, EQUIVALENT_DISTANCES_M[i]!, text]),
  );

  it.each(cells)('index %s at %s m ≈ %s (within 1 s)', (index, d, text) => {
    expect(Math.abs(equivalentTime(index, d) - clock(text))).toBeLessThanOrEqual(1);
  });
});

describe('raceEquivalents (api-contract.md shape)', () => {
  it('half 1:25:00: Riegel marathon 10 633.151 s, Daniels & Gilbert 10 644.4 s (REFERENCES.md §3.1, §3.2)', () => {
    const rows = raceEquivalents(HALF_MARATHON_M, 5100);
    expect(rows.map((r) => r.distance_m)).toEqual([...EQUIVALENT_DISTANCES_M]);
    const marathon = rows.find((r) => r.distance_m === MARATHON_M)!;
    expect(marathon.riegel_s).toBeCloseTo(10633.151, 3);
    expect(marathon.daniels_gilbert_s).toBeCloseTo(10644.4, 1);
    expect(Object.keys(marathon).sort()).toEqual(['daniels_gilbert_s', 'distance_m', 'riegel_s']);
  });

  it('gives the result back at its own distance, by both methods', () => {
    const half = raceEquivalents(HALF_MARATHON_M, 5100).find((r) => r.distance_m === HALF_MARATHON_M)!;
    expect(half).toEqual({ distance_m: HALF_MARATHON_M, riegel_s: 5100, daniels_gilbert_s: 5100 });
  });

  it.each<[string, number, number, number, number]>([
    // result, distance, time, distance asked for, expected D&G seconds (rounded)
    ['5K 20:00 → marathon 3:11:17', 5000, 1200, MARATHON_M, clock('3:11:17')], // race_equivalence.py
    ['10K 40:00 → 5K 19:18', 10000, 2400, 5000, clock('19:18')], // race_equivalence.py
    ['marathon 3:00:00 → 10K 38:59', MARATHON_M, 10800, 10000, clock('38:59')], // race_equivalence.py
  ])('%s', (_name, d, t, target, expected) => {
    const row = raceEquivalents(d, t).find((r) => r.distance_m === target)!;
    expect(Math.round(row.daniels_gilbert_s)).toBe(expected);
  });

  it('mile 6:00 → 5K by Riegel: 1197.189 s (REFERENCES.md §3.1)', () => {
    const row = raceEquivalents(MILE_M, 360).find((r) => r.distance_m === 5000)!;
    expect(row.riegel_s).toBeCloseTo(1197.189, 3);
  });

  it('rounds to the millisecond', () => {
    const rows = raceEquivalents(5000, 1234.5678);
    expect(rows.length).toBeGreaterThan(5);
    for (const row of rows) {
      expect(Math.round(row.riegel_s * 1000) / 1000).toBe(row.riegel_s);
      expect(Math.round(row.daniels_gilbert_s * 1000) / 1000).toBe(row.daniels_gilbert_s);
    }
  });

  it.each<[number, number]>([
    [0, 1200],
    [5000, -1],
    [Number.NaN, 1200],
  ])('refuses %s m in %s s', (d, t) => {
    expect(() => raceEquivalents(d, t)).toThrow(RangeError);
  });
});
