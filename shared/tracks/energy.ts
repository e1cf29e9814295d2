/**
 * Energy estimate from the ACSM running equation (ACSM's Guidelines for Exercise Testing and
 * Prescription, 10th ed., 2018, Table 6.3): gross VO₂ = 0.2·S + 0.9·S·G + 3.5 ml·kg⁻¹·min⁻¹,
 * S in m/min, G the grade. The grade term is for steady treadmill grades, not rolling courses,
 * so a run is estimated as level. 5 kcal per litre of O₂ is the ACSM convention.
 */

export const KCAL_PER_LITRE_O2 = 5;
/** Below ~80 m/min the runner is walking and the running equation does not apply (ACSM validity range). */
export const MIN_RUNNING_SPEED_M_PER_MIN = 80;

/** Gross VO₂ in ml·kg⁻¹·min⁻¹ at speed `metresPerMinute` on grade `grade` (decimal). */
export function acsmRunningVo2(metresPerMinute: number, grade = 0): number {
  return 0.2 * metresPerMinute + 0.9 * metresPerMinute * grade + 3.5;
}

/**
 * Gross and net (resting 3.5 ml·kg⁻¹·min⁻¹ removed) kilocalories for a level run of `distanceM`
 * in `movingS` by a runner of `weightKg`; null when weight or time is missing or the average speed
 * is below running speed.
 */
export function estimateRunEnergy(
  distanceM: number,
  movingS: number,
  weightKg: number | null,
): { gross_kcal: number; net_kcal: number } | null {
  if (weightKg === null || !(weightKg > 0) || !(movingS > 0) || !(distanceM > 0)) return null;
  const minutes = movingS / 60;
  const speed = distanceM / minutes;
  if (speed < MIN_RUNNING_SPEED_M_PER_MIN) return null;
  const gross = acsmRunningVo2(speed);
  const litres = (vo2: number) => (vo2 * weightKg * minutes) / 1000;
  return { gross_kcal: litres(gross) * KCAL_PER_LITRE_O2, net_kcal: litres(gross - 3.5) * KCAL_PER_LITRE_O2 };
}
