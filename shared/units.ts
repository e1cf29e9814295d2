/**
 * Unit definitions used everywhere (no imports, so any bundle can use them).
 * International mile: 1609.344 m exactly (1959 international yard and pound agreement).
 * Marathon 42 195 m and half marathon 21 097.5 m (World Athletics road race distances).
 */
export const METRES_PER_MILE = 1609.344;
export const METRES_PER_KM = 1000;
/** Metres in one display unit: the one table every feature converts miles and kilometres with. */
export const UNIT_METRES: Readonly<Record<'mi' | 'km', number>> = { mi: METRES_PER_MILE, km: METRES_PER_KM };
/** International foot: 0.3048 m exactly (the same 1959 agreement). Climb is shown in feet when distances are in miles. */
export const METRES_PER_FOOT = 0.3048;
/** The climb unit that goes with a distance unit: feet with miles, metres with kilometres. */
export const CLIMB_UNIT: Readonly<Record<'mi' | 'km', 'ft' | 'm'>> = { mi: 'ft', km: 'm' };
/** Metres of climb or descent in the climb unit of `unit`, rounded to a whole foot or metre. */
export function climbIn(metres: number, unit: 'mi' | 'km'): number {
  return Math.round(unit === 'mi' ? metres / METRES_PER_FOOT : metres);
}
export const MARATHON_M = 42_195;
export const HALF_MARATHON_M = 21_097.5;

/**
 * A size limit in words a runner reads: "2 GB", "1.5 GB", "50 MB", "800 KB" (binary units, as
 * file managers show them), never "0 GB".
 */
export function formatFileSize(bytes: number): string {
  const steps: [number, string][] = [
    [1024 ** 3, 'GB'],
    [1024 ** 2, 'MB'],
    [1024, 'KB'],
  ];
  for (const [size, unit] of steps) {
    if (bytes >= size) return `${Number((bytes / size).toFixed(1))} ${unit}`;
  }
  return `${Math.max(0, Math.round(bytes))} bytes`;
}
