import type { Evidence } from './targets.ts';

/**
 * Carbohydrate before and after a run, and carbohydrate loading, as grams for one runner's body mass.
 *
 * All three come from the 2016 joint position of the American College of Sports Medicine, the Academy of Nutrition
 * and Dietetics and Dietitians of Canada (Thomas, Erdman & Burke 2016, Med Sci Sports Exerc 48(3): 543–568;
 * the statement's existence is confirmed, volume and pages are from memory). Which figures the project's reference
 * sheet (REFERENCES.md §7) carries:
 * - carbohydrate loading 10–12 g/kg per 24 h for 36–48 h before events over 90 min: in REFERENCES.md (exact wording from memory);
 * - pre-run meal 1–4 g/kg 1–4 h before, and refuelling 1.0–1.2 g/kg/h for the first 4 h: NOT in REFERENCES.md —
 *   from memory, unconfirmed; check the original table before relying on them.
 */

const JOINT_2016 = 'Thomas, Erdman & Burke 2016, ACSM / Academy of Nutrition and Dietetics / Dietitians of Canada joint position';

export interface GramsRange {
  low_g: number;
  high_g: number;
}

export interface MealGuidance {
  /** Grams per kg (per hour or per day where the name says so). */
  g_per_kg: { low: number; high: number };
  source: string;
  evidence: Evidence;
  note: string;
}

export interface PreRunMeal extends MealGuidance {
  /** Hours before the start the meal is eaten. */
  hours_before: { low: number; high: number };
  grams: GramsRange;
}

export interface AfterRunRefuel extends MealGuidance {
  /** Grams per hour for this body mass. */
  grams_per_hour: GramsRange;
  hours: number;
  /** Over all `hours`. */
  grams_total: GramsRange;
}

export interface CarbohydrateLoading extends MealGuidance {
  applies: boolean;
  grams_per_day: GramsRange;
  days: { low: number; high: number };
  /** 36 h at the low figure to 48 h at the high one. */
  grams_total: GramsRange;
}

export interface MealPlan {
  pre_run: PreRunMeal;
  after_run: AfterRunRefuel;
  carbohydrate_loading: CarbohydrateLoading;
}

function assertBodyMass(bodyMassKg: number): void {
  if (!Number.isFinite(bodyMassKg) || bodyMassKg <= 0) throw new RangeError('Body mass must be more than 0 kg.');
}

function range(bodyMassKg: number, low: number, high: number, factor = 1): GramsRange {
  return { low_g: bodyMassKg * low * factor, high_g: bodyMassKg * high * factor };
}

/** Pre-run meal: 1–4 g/kg of carbohydrate 1–4 h before (joint position 2016; from memory). 70 kg → 70–280 g. */
export function preRunMeal(bodyMassKg: number): PreRunMeal {
  assertBodyMass(bodyMassKg);
  return {
    g_per_kg: { low: 1, high: 4 },
    hours_before: { low: 1, high: 4 },
    grams: range(bodyMassKg, 1, 4),
    source: `${JOINT_2016} (figures from memory, not in our reference sheet)`,
    evidence: 'from memory',
    note: 'The closer to the start, the smaller the meal. Try it before long runs, never first on race day.',
  };
}

/** After-run refuel: 1.0–1.2 g/kg per hour for the first 4 h when the next hard session is soon (joint position 2016; from memory). */
export function afterRunRefuel(bodyMassKg: number): AfterRunRefuel {
  assertBodyMass(bodyMassKg);
  const hours = 4;
  return {
    g_per_kg: { low: 1.0, high: 1.2 },
    grams_per_hour: range(bodyMassKg, 1.0, 1.2),
    hours,
    grams_total: range(bodyMassKg, 1.0, 1.2, hours),
    source: `${JOINT_2016} (figures from memory, not in our reference sheet)`,
    evidence: 'from memory',
    note: 'For fast refuelling when the next hard session is within a day; otherwise ordinary meals do the job.',
  };
}

/** Events longer than this call for carbohydrate loading (joint position 2016, via REFERENCES.md §7). */
export const LOADING_MIN_EVENT_S = 90 * 60;

/**
 * Carbohydrate loading: 10–12 g/kg per 24 h for 36–48 h before events over 90 min (joint position 2016; in
 * REFERENCES.md, table wording from memory). 70 kg → 700–840 g/day; 1050 g (36 h at 10) to 1680 g (48 h at 12).
 * `applies` is false for an expected duration of 90 min or less.
 */
export function carbohydrateLoading(bodyMassKg: number, eventDurationS: number): CarbohydrateLoading {
  assertBodyMass(bodyMassKg);
  if (!Number.isFinite(eventDurationS) || eventDurationS <= 0) throw new RangeError('Expected duration must be more than 0.');
  const applies = eventDurationS > LOADING_MIN_EVENT_S;
  return {
    applies,
    g_per_kg: { low: 10, high: 12 },
    grams_per_day: range(bodyMassKg, 10, 12),
    days: { low: 1.5, high: 2 },
    grams_total: { low_g: bodyMassKg * 10 * 1.5, high_g: bodyMassKg * 12 * 2 },
    source: `${JOINT_2016} (in our reference sheet; exact wording from memory)`,
    evidence: 'secondary',
    note: applies
      ? 'For the 36–48 h before a race longer than 90 min. Rehearse it before a long run first.'
      : 'Not needed: loading is for events longer than 90 min.',
  };
}

/** All three for a runner of `bodyMassKg` and a run or race expected to take `durationS`. */
export function mealPlan(bodyMassKg: number, durationS: number): MealPlan {
  return {
    pre_run: preRunMeal(bodyMassKg),
    after_run: afterRunRefuel(bodyMassKg),
    carbohydrate_loading: carbohydrateLoading(bodyMassKg, durationS),
  };
}
