import type { Caution } from '../../../../shared/fuel/cautions.ts';
import type { MealPlan } from '../../../../shared/fuel/meals.ts';
import type { Bottle, Course, FuelItemFacts, FuelSchedule, IntakeRule } from '../../../../shared/fuel/schedule.ts';
import type { PlannedVsTaken, TakenEntry } from '../../../../shared/fuel/taken.ts';
import type { FuelTargets } from '../../../../shared/fuel/targets.ts';

/** A fuel plan as GET/PUT /api/plans/:id/fuel-plan and /api/me/goal-race/fuel-plan return it. */
export interface FuelPlan {
  id: string;
  runner_id: string;
  author_id: string | null;
  plan_id: string | null;
  goal_race: boolean;
  body_mass_kg: number;
  easy_pace_s_per_km: number | null;
  expected_duration_s: number;
  expected_duration_given: boolean;
  expected_distance_m: number;
  start_clock: string | null;
  sweat_l_per_h: number | null;
  targets: FuelTargets;
  proposed_targets: FuelTargets;
  intakes: IntakeRule[];
  bottles: Bottle[];
  items: FuelItemFacts[];
  course: Course;
  schedule: FuelSchedule;
  meals: MealPlan;
  cautions: Caution[];
  /** The session plan or goal race changed after the last save: save again to refresh the schedule. */
  source_changed: boolean;
  updated_at: string;
}

/** GET/PUT /api/runs/:id/fuel-taken. */
export interface FuelTakenView {
  fuel_taken: {
    run_id: string;
    entries: TakenEntry[];
    stomach: number | null;
    energy: number | null;
    notes: string;
    updated_at: string;
  } | null;
  planned_vs_taken: (PlannedVsTaken & { fuel_plan_id: string }) | null;
  cautions: Caution[];
}

/** GET/PUT /api/runs/:id/checkin. */
export interface CheckinView {
  checkin: {
    run_id: string;
    sleep_hours: number | null;
    soreness: number | null;
    mood: number | null;
    walking_minutes: number | null;
    mobility_minutes: number | null;
    cold_water: { water_temp_c: number; minutes: number; notes: string[] } | null;
    notes: string;
    updated_at: string;
  } | null;
  cautions: Caution[];
}
