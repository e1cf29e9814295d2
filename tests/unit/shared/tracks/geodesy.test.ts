import { describe, expect, it } from 'vitest';
import { geodesicDirect, geodesicDistance, geodesicInverse, isValidPosition } from '../../../../shared/tracks/geodesy.ts';
import { METRES_PER_KM, METRES_PER_MILE } from '../../../../shared/units.ts';

function dms(deg: number, min: number, sec: number): number {
  const sign = deg < 0 ? -1 : 1;
  return sign * (Math.abs(deg) + min / 60 + sec / 3600);
}

describe('unit definitions', () => {
  it('uses the international mile of 1609.344 m (1959 yard and pound agreement: 1760 × 0.9144 m)', () => {
    expect(METRES_PER_MILE).toBe(1760 * 0.9144);
    expect(METRES_PER_MILE).toBe(1609.344);
    expect(METRES_PER_KM).toBe(1000);
  });

  it('has the marathon at 26.2187574565 mi (IAAF Rule 240: 42.195 km; REFERENCES.md §1)', () => {
    expect(42195 / METRES_PER_MILE).toBeCloseTo(26.2187574565, 9);
  });
});

describe('geodesicDistance', () => {
  it('reproduces the Vincenty (1975) worked example, Flinders Peak to Buninyong: 54 972.271 m (Geoscience Australia; WGS-84 agrees with GRS80 within 0.1 µm)', () => {
    const lat1 = dms(-37, 57, 3.7203);
    const lon1 = dms(144, 25, 29.5244);
    const lat2 = dms(-37, 39, 10.1561);
    const lon2 = dms(143, 55, 35.3839);
    expect(geodesicDistance(lat1, lon1, lat2, lon2)).toBeCloseTo(54972.271, 3);
    const inverse = geodesicInverse(lat1, lon1, lat2, lon2);
    // Published forward azimuth 306°52′05.37″ and reverse azimuth 127°10′25.07″ (= azi2 + 180°).
    expect(inverse.azi1 + 360).toBeCloseTo(dms(306, 52, 5.37), 5);
    expect(inverse.azi2 + 180).toBeCloseTo(dms(127, 10, 25.07), 5);
  });

  it("passes GeographicLib's own GeodSolve0 check: 5 853 226 ± 0.5 m, azi1 53.47022°, azi2 111.59367° (Karney 2013; geographiclib test_geodesic.py)", () => {
    const r = geodesicInverse(40.6, -73.8, 49.01666667, 2.55);
    expect(Math.abs(r.s12 - 5853226)).toBeLessThan(0.5);
    expect(r.azi1).toBeCloseTo(53.47022, 5);
    expect(r.azi2).toBeCloseTo(111.59367, 5);
  });

  // REFERENCES.md §2.4 (a) and (b): GeographicLib 2.0 values on WGS-84. Haversine would be off by
  // 0.06–0.56 %, so a 0.1 mm tolerance catches a spherical shortcut.
  it.each([
    [0, 0, 0.000639486, 0.000635205, 100.0],
    [0, 0, 0.010291526, 0.010222631, 1609.344],
    [45, 0, 45.010238977, 0.014435339, 1609.344],
    [45, 0, 45.063592157, 0.089780428, 10000.0],
    [70, 0, 70.010197907, 0.029815071, 1609.344],
    [0, 0, 0, 0.001, 111.3195],
    [0, 0, 0.00001, 0, 1.1057],
    [45, 0, 45.001, 0, 111.1318],
    [45, 0, 45, 0.01, 788.4684],
    [45, 0, 45.01, 0.01, 1362.5724],
    [70, 0, 70, 0.1, 3818.6537],
  ])('(%f, %f) → (%f, %f) is %f m on WGS-84 (REFERENCES.md §2.4, GeographicLib 2.0)', (lat1, lon1, lat2, lon2, expected) => {
    expect(geodesicDistance(lat1, lon1, lat2, lon2)).toBeCloseTo(expected, 3);
  });

  it('gives a degree of longitude at the equator as 111 319.491 m (REFERENCES.md §2.4 d)', () => {
    expect(geodesicDistance(0, 0, 0, 1)).toBeCloseTo(111319.491, 2);
  });

  it.each([
    ['identical points', 10, 20, 10, 20, 0],
    ['NaN latitude', Number.NaN, 0, 0, 0, Number.NaN],
    ['latitude above 90', 91, 0, 0, 0, Number.NaN],
    ['longitude below −180', 0, -181, 0, 0, Number.NaN],
  ])('%s', (_label, lat1, lon1, lat2, lon2, expected) => {
    expect(geodesicDistance(lat1, lon1, lat2, lon2)).toEqual(expected);
  });
});

describe('geodesicDirect', () => {
  it('goes 1609.344 m due north of (45°, 0°) to latitude 45.014481384068° (REFERENCES.md §2.4)', () => {
    expect(geodesicDirect(45, 0, 0, 1609.344).lat).toBeCloseTo(45.014481384068, 10);
  });

  it('returns to the Vincenty example end point within 1 mm (REFERENCES.md §2.2 direct check)', () => {
    const end = geodesicDirect(dms(-37, 57, 3.7203), dms(144, 25, 29.5244), dms(306, 52, 5.37), 54972.271);
    expect(geodesicDistance(end.lat, end.lon, dms(-37, 39, 10.1561), dms(143, 55, 35.3839))).toBeLessThan(0.001);
  });
});

describe('isValidPosition', () => {
  it.each([
    [0, 0, true],
    [90, 180, true],
    [-90, -180, true],
    [90.0001, 0, false],
    [0, 180.0001, false],
    [Number.NaN, 0, false],
    [0, Number.POSITIVE_INFINITY, false],
    [undefined, 0, false],
  ])('(%s, %s) → %s', (lat, lon, expected) => {
    expect(isValidPosition(lat, lon)).toBe(expected);
  });
});
