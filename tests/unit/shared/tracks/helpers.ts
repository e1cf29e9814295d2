import { cleanTrack } from '../../../../shared/tracks/clean.ts';
import { buildSeries } from '../../../../shared/tracks/series.ts';
import type { TrackPoint, TrackSeries } from '../../../../shared/tracks/types.ts';

export const T0 = Date.UTC(2024, 0, 1, 8, 0, 0);

/** Series straight from device distances: `rows` are [seconds, metres, hr?]. */
export function deviceSeries(rows: readonly (readonly number[])[]): TrackSeries {
  const points: TrackPoint[] = rows.map(([s, m, hr]) => {
    const p: TrackPoint = { t: T0 + (s as number) * 1000, distance_m: m as number };
    if (hr !== undefined) p.hr = hr;
    return p;
  });
  return buildSeries(cleanTrack([points]));
}

/** The REFERENCES.md §2.5 track: 61 points at 45.000…45.060° N on 0° E, one every 30 s. */
export function meridianPoints(): TrackPoint[] {
  return Array.from({ length: 61 }, (_, i) => ({ t: T0 + i * 30_000, lat: 45 + i * 0.001, lon: 0 }));
}
