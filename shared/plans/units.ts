import { METRES_PER_KM, METRES_PER_MILE } from '../units.ts';
import type { DistanceUnit, PacePer } from './types.ts';

/** Metres in one written distance unit. */
export function metresPerUnit(unit: DistanceUnit): number {
  if (unit === 'mi') return METRES_PER_MILE;
  if (unit === 'km') return METRES_PER_KM;
  return 1;
}

/** The metres a pace is written over: a mile, a km, or the rep's own distance. */
function paceBaseMetres(per: PacePer, partDistanceM: number | null): number {
  if (per === 'rep') {
    if (partDistanceM === null || !(partDistanceM > 0)) return Number.NaN;
    return partDistanceM;
  }
  return metresPerUnit(per);
}

/**
 * Seconds per km from a pace as written: `writtenS` seconds per mile, per km, or for the
 * rep's own distance (`partDistanceM`, needed only when `per` is 'rep').
 * Examples: 425 s per mi (7:05/mi) → 425 × 1000 / 1609.344 = 264.08… s/km;
 * 175 s per 800 m (2:55) → 175 × 1000 / 800 = 218.75 s/km. A rep pace without a distance gives NaN.
 */
export function paceFromWritten(writtenS: number, per: PacePer, partDistanceM: number | null): number {
  return (writtenS * METRES_PER_KM) / paceBaseMetres(per, partDistanceM);
}

/** The inverse of `paceFromWritten`, unrounded: seconds per mile, per km or per rep. */
export function paceToWritten(sPerKm: number, per: PacePer, partDistanceM: number | null): number {
  return (sPerKm * paceBaseMetres(per, partDistanceM)) / METRES_PER_KM;
}

/** Distances are written with at most three decimals of their unit. */
export function roundWrittenDistance(value: number): number {
  return Math.round(value * 1000) / 1000;
}

/** Metres from a written distance, rounded to three decimals of its unit first. */
export function distanceFromWritten(value: number, unit: DistanceUnit): number {
  return roundWrittenDistance(value) * metresPerUnit(unit);
}

/** The written value of a distance in its unit, rounded to three decimals (3218.688 m in mi → 2). */
export function distanceToWritten(distanceM: number, unit: DistanceUnit): number {
  return roundWrittenDistance(distanceM / metresPerUnit(unit));
}
