/**
 * Heart-rate zones and time in each zone.
 *
 * Zone bounds are fractions of the heart-rate reserve (Karvonen et al. 1957: HRrest + k·(HRmax − HRrest))
 * when the resting heart rate is known, else fractions of the maximum heart rate. The five 10-point bands
 * from 50 % to 100 % are common practice, not a published standard; a qualified coach or physician sets
 * zones for an individual, ideally from a measured maximum.
 */

export const ZONE_LOWER_FRACTIONS = [0.5, 0.6, 0.7, 0.8, 0.9] as const;

export type ZoneMethod = 'heart-rate reserve' | 'percent of maximum';

export interface HeartRateZone {
  /** 1–5; 0 is "below zone 1". */
  zone: number;
  /** Lower bound in bpm (inclusive); zone 0 starts at 0. */
  from_bpm: number;
  /** Upper bound in bpm (exclusive); the top zone has none. */
  to_bpm: number | null;
}

/** Karvonen target heart rate for a fraction of the reserve. */
export function karvonenHeartRate(restingHr: number, maxHr: number, fraction: number): number {
  return restingHr + fraction * (maxHr - restingHr);
}

/** Zone bounds in bpm; null when the maximum heart rate is unknown or not above the resting rate. */
export function heartRateZones(
  maxHr: number | null,
  restingHr: number | null,
): { method: ZoneMethod; zones: HeartRateZone[] } | null {
  if (maxHr === null || !(maxHr > 0) || (restingHr !== null && restingHr >= maxHr)) return null;
  const method: ZoneMethod = restingHr === null ? 'percent of maximum' : 'heart-rate reserve';
  const bound = (f: number) => (restingHr === null ? f * maxHr : karvonenHeartRate(restingHr, maxHr, f));
  const lowers = ZONE_LOWER_FRACTIONS.map(bound);
  const zones: HeartRateZone[] = [{ zone: 0, from_bpm: 0, to_bpm: lowers[0]! }];
  lowers.forEach((from, i) => zones.push({ zone: i + 1, from_bpm: from, to_bpm: lowers[i + 1] ?? null }));
  return { method, zones };
}

/**
 * Seconds spent in each zone (index = zone number 0–5), counting only moving intervals with a
 * known heart rate at both ends; each interval is credited to the zone of its mean heart rate.
 */
export function timeInZones(t: Float64Array, hr: Float64Array, moving: Uint8Array, zones: readonly HeartRateZone[]): number[] {
  const seconds = zones.map(() => 0);
  for (let i = 1; i < t.length; i++) {
    if (!moving[i]) continue;
    const a = hr[i - 1]!;
    const b = hr[i]!;
    if (!Number.isFinite(a) || !Number.isFinite(b)) continue;
    const mean = (a + b) / 2;
    let zone = 0;
    for (const z of zones) if (mean >= z.from_bpm) zone = z.zone;
    seconds[zone]! += (t[i]! - t[i - 1]!) / 1000;
  }
  return seconds;
}
