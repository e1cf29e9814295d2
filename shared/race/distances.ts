import { HALF_MARATHON_M, MARATHON_M, METRES_PER_MILE } from '../units.ts';

/** International mile, exact since 1959: 1760 yd × 0.9144 m; marathon 42.195 km, half 21.0975 km (REFERENCES.md §1). */
export const MILE_M = METRES_PER_MILE;
export { HALF_MARATHON_M, MARATHON_M };

/** The distances, in metres, that race equivalents are given for (api-contract.md). */
export const EQUIVALENT_DISTANCES_M = [1500, MILE_M, 3000, 5000, 10_000, 15_000, HALF_MARATHON_M, MARATHON_M] as const;

/** A race distance people pick from a list, with the words the UI shows. */
export interface RaceDistanceChoice {
  id: string;
  label: string;
  distance_m: number;
}

/** The standard distances the tools offer in their pickers, shortest first. */
export const RACE_DISTANCE_CHOICES: readonly RaceDistanceChoice[] = [
  { id: '1500m', label: '1500 m', distance_m: 1500 },
  { id: 'mile', label: 'Mile', distance_m: MILE_M },
  { id: '3000m', label: '3000 m', distance_m: 3000 },
  { id: '5k', label: '5K', distance_m: 5000 },
  { id: '10k', label: '10K', distance_m: 10_000 },
  { id: '15k', label: '15K', distance_m: 15_000 },
  { id: 'half', label: 'Half marathon', distance_m: HALF_MARATHON_M },
  { id: 'marathon', label: 'Marathon', distance_m: MARATHON_M },
];

/** The picker's label for a distance in metres: "Marathon", "5K", or "12.5 km" when it is not a standard one. */
export function describeDistance(distanceM: number): string {
  const choice = RACE_DISTANCE_CHOICES.find((c) => c.distance_m === distanceM);
  if (choice) return choice.label;
  return `${Number((distanceM / 1000).toFixed(3))} km`;
}
