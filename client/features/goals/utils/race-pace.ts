import { formatPaceIn } from '../../../../shared/runs/display.ts';
import type { Unit } from '../../../../shared/users/schemas.ts';

/** "7:04 /mi": the even pace of a race of `distanceM` metres in `timeS` seconds, in the reader's unit. */
export function formatRacePace(distanceM: number, timeS: number, unit: Unit): string {
  return formatPaceIn(timeS / (distanceM / 1000), unit);
}
