import { pacePerUnit } from '../runs/display.ts';
import { formatDuration, formatPace } from '../tracks/format.ts';
import type { Unit } from '../users/schemas.ts';
import type { RepBlock } from './rep-blocks.ts';
import type { DistanceUnit } from './types.ts';
import { metresPerUnit } from './units.ts';

/**
 * Words and numbers of the plan check as the run page shows them. The API gives paces in seconds per
 * km and distances in metres; these turn them into the reader's unit (mi or km).
 */

/** A planned distance in the unit it was written in, without trailing zeros: 800 → "800 m", 2000 km → "2 km", 2414.016 mi → "1.5 mi". */
export function formatPlannedDistance(distanceM: number, unit: DistanceUnit): string {
  if (unit === 'm') return `${Math.round(distanceM)} m`;
  return `${Number((distanceM / metresPerUnit(unit)).toFixed(3))} ${unit}`;
}

/** A run distance in the same unit as the plan, for comparison: metres whole, km and mi with 2 decimals ("806 m", "2.01 km"). */
export function formatActualDistance(distanceM: number, unit: DistanceUnit): string {
  if (!Number.isFinite(distanceM) || distanceM < 0) return '–';
  if (unit === 'm') return `${Math.round(distanceM)} m`;
  return `${(distanceM / metresPerUnit(unit)).toFixed(2)} ${unit}`;
}

/**
 * A pace target in the reader's unit: "3:39–3:45 /km", one pace when fast = slow ("7:05 /mi").
 * Missing ends give ''.
 */
export function formatPaceRange(fastSPerKm: number | undefined, slowSPerKm: number | undefined, unit: Unit): string {
  if (fastSPerKm === undefined || slowSPerKm === undefined) return '';
  const fast = formatPace(pacePerUnit(fastSPerKm, unit));
  const slow = formatPace(pacePerUnit(slowSPerKm, unit));
  return fast === slow ? `${fast} /${unit}` : `${fast}–${slow} /${unit}`;
}

/**
 * How far outside the target range a part was, in seconds per `unit`: "+12 s" slower, "−8 s" quicker
 * (a true minus sign), "0" inside the range, "–" without a pace target (null).
 */
export function formatDifference(differenceSPerKm: number | null, unit: Unit): string {
  if (differenceSPerKm === null || !Number.isFinite(differenceSPerKm)) return '–';
  const seconds = Math.round(Math.abs(pacePerUnit(differenceSPerKm, unit)!));
  // Under half a second either way reads as no difference, never "−0 s".
  if (seconds === 0) return '0';
  return `${differenceSPerKm > 0 ? '+' : '−'}${seconds} s`;
}

/** A pace tolerance as a share shown as ± per cent: 0.02 → "±2 %", 0.005 → "±0.5 %", 0.025 → "±2.5 %". */
export function formatTolerance(tolerance: number): string {
  return `±${Number((tolerance * 100).toFixed(1))} %`;
}

/**
 * The calendar dates `days` either side of `date` (`YYYY-MM-DD`), for finding plans near a run:
 * ("2026-10-03", 3) → { from: "2026-09-30", to: "2026-10-06" }. Pure calendar arithmetic in UTC,
 * so no time zone or daylight-saving change can shift a day.
 */
export function dateWindow(date: string, days: number): { from: string; to: string } {
  const base = Date.parse(`${date}T00:00:00Z`);
  const shift = (n: number) => new Date(base + n * 86_400_000).toISOString().slice(0, 10);
  return { from: shift(-days), to: shift(days) };
}

/**
 * Stops inside a part, shown apart from its pace: "2 stops, 2:00", "1 stop, 0:45", '' for none.
 * Seconds are clock time standing still (rounded to whole seconds).
 */
export function formatStops(stops: { count: number; seconds: number } | undefined): string {
  if (!stops || stops.count === 0) return '';
  const total = Math.round(stops.seconds);
  const time = `${Math.floor(total / 60)}:${String(total % 60).padStart(2, '0')}`;
  return `${stops.count} ${stops.count === 1 ? 'stop' : 'stops'}, ${time}`;
}

/** A signed change of pace in whole seconds per `unit`: "−4 s" quicker, "+3 s" slower, "0". */
function formatChange(differenceSPerKm: number, unit: Unit): string {
  // Halves round away from zero either way (−2.5 → −3, as +2.5 → +3).
  const seconds = Math.round(Math.abs(pacePerUnit(differenceSPerKm, unit)!));
  if (seconds === 0) return '0';
  return `${differenceSPerKm > 0 ? '+' : '−'}${seconds} s`;
}

/**
 * A repeat block on one line, paces per `unit` (moving time):
 * "6 × 800 m: 5 of 6 on pace · 2:58 2:57 2:59 3:04 2:56 – /km · average 2:58 · fastest 2:56, slowest 3:04 · first to last −2 s".
 * A rep not run shows "–"; the average, fastest and slowest are of the reps run.
 */
export function formatRepBlock(block: RepBlock, unit: Unit): string {
  const amount =
    'distance_m' in block.amount
      ? formatPlannedDistance(block.amount.distance_m, block.amount.unit)
      : formatDuration(block.amount.duration_s);
  const head = `${block.reps} × ${amount}: ${block.on_pace} of ${block.reps} on pace`;
  if (block.run === 0) return `${head} · none run`;
  const pace = (s: number | null) => formatPace(pacePerUnit(s, unit)) || '–';
  const pieces = [head, `${block.paces_s_per_km.map(pace).join(' ')} /${unit}`];
  if (block.average_s_per_km !== null) pieces.push(`average ${pace(block.average_s_per_km)}`);
  if (block.run >= 2) {
    pieces.push(`fastest ${pace(block.fastest_s_per_km)}, slowest ${pace(block.slowest_s_per_km)}`);
    pieces.push(`first to last ${formatChange(block.first_to_last_s_per_km!, unit)}`);
  }
  return pieces.join(' · ');
}
