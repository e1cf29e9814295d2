// geographiclib-geodesic is minified CommonJS: a named import type-checks but fails under
// Node ESM and tsx (stack.md), so take the default export and destructure it.
import geodesic from 'geographiclib-geodesic';

const { Geodesic } = geodesic;
const WGS84 = Geodesic.WGS84;

/** True when `lat` ∈ [−90, 90] and `lon` ∈ [−180, 180] and both are finite numbers. */
export function isValidPosition(lat: number | undefined, lon: number | undefined): boolean {
  return (
    typeof lat === 'number' &&
    typeof lon === 'number' &&
    Number.isFinite(lat) &&
    Number.isFinite(lon) &&
    lat >= -90 &&
    lat <= 90 &&
    lon >= -180 &&
    lon <= 180
  );
}

/**
 * Ellipsoidal (WGS-84) distance in metres between two points given in degrees, by Karney's
 * algorithm (GeographicLib; accurate to about 15 nm). Identical points give 0.
 * Invalid coordinates give NaN.
 */
export function geodesicDistance(lat1: number, lon1: number, lat2: number, lon2: number): number {
  if (!isValidPosition(lat1, lon1) || !isValidPosition(lat2, lon2)) return Number.NaN;
  if (lat1 === lat2 && lon1 === lon2) return 0;
  return WGS84.Inverse(lat1, lon1, lat2, lon2, Geodesic.DISTANCE).s12 ?? Number.NaN;
}

/** Result of the inverse problem: distance (m) and azimuths at both ends (degrees from north). */
export interface InverseResult {
  s12: number;
  azi1: number;
  azi2: number;
}

/** Distance and forward azimuths between two points on WGS-84 (degrees in, metres out). */
export function geodesicInverse(lat1: number, lon1: number, lat2: number, lon2: number): InverseResult {
  const r = WGS84.Inverse(lat1, lon1, lat2, lon2);
  return { s12: r.s12 ?? Number.NaN, azi1: r.azi1 ?? Number.NaN, azi2: r.azi2 ?? Number.NaN };
}

/** Result of the direct problem: the end point and the azimuth there (degrees). */
export interface DirectResult {
  lat: number;
  lon: number;
  azi: number;
}

/**
 * Walk `s12` metres from (lat1, lon1) along azimuth `azi1` (degrees clockwise from north) on
 * WGS-84. Negative `s12` walks backwards.
 */
export function geodesicDirect(lat1: number, lon1: number, azi1: number, s12: number): DirectResult {
  const r = WGS84.Direct(lat1, lon1, azi1, s12);
  return { lat: r.lat2 ?? Number.NaN, lon: r.lon2 ?? Number.NaN, azi: r.azi2 ?? Number.NaN };
}
