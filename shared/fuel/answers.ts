import { z } from 'zod';
import { CAUTION_TOPICS, type Caution } from './cautions.ts';
import { FuelItemSchema } from './schemas.ts';
import type { MealPlan } from './meals.ts';
import type { Bottle, Course, FuelItemFacts, FuelSchedule, IntakeRule } from './schedule.ts';
import type { PlannedVsTaken, TakenEntry } from './taken.ts';
import type { FuelTargets } from './targets.ts';

/**
 * Answer schemas of the fuel API (fuel plans, fuel taken, after-run check-in): /api/openapi.json documents them,
 * the API tests parse every answer with them, and the client takes its types from them. The computations keep
 * their own interfaces (schedule.ts, targets.ts, meals.ts, taken.ts); the checks at the end prove both describe
 * the same JSON, so neither can drift.
 */

export const CautionSchema = z.object({
  topic: z.enum(CAUTION_TOPICS),
  title: z.string(),
  text: z.string(),
  source: z.string(),
  last_word: z.string(),
});

const EvidenceSchema = z.enum(['confirmed', 'secondary', 'from memory', 'common practice', 'computed', 'set']);

const FuelTargetSchema = z.object({
  low: z.number(),
  /** Null when the source gives no upper figure ("small amounts"): nothing counts as over. */
  high: z.number().nullable(),
  unit: z.enum(['g/h', 'ml/h', 'mg/h']),
  source: z.string(),
  note: z.string(),
  evidence: EvidenceSchema,
});

const FuelTargetsSchema = z.object({ carbohydrate: FuelTargetSchema, fluid: FuelTargetSchema, sodium: FuelTargetSchema });

const UnitSchema = z.enum(['mi', 'km']);
const IntakeWhenSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('every_distance'), every: z.number(), unit: UnitSchema, first: z.number().optional() }),
  z.object({ type: z.literal('every_time'), every_s: z.number(), first_s: z.number().optional() }),
  z.object({ type: z.literal('at_distances'), at: z.array(z.number()), unit: UnitSchema }),
  z.object({ type: z.literal('at_times'), at_s: z.array(z.number()) }),
]);

const IntakeRuleAnswerSchema = z.object({
  item_id: z.string().optional(),
  servings: z.number().optional(),
  bottle: z.string().optional(),
  ml: z.number().optional(),
  when: IntakeWhenSchema,
});

const BottleAnswerSchema = z.object({
  id: z.string(),
  volume_ml: z.number(),
  contents: z.array(z.object({ item_id: z.string(), servings: z.number() })),
});

/** A fuel item's facts as the schedule reads them: the fuel item answer itself (shared/fuel/schemas.ts). */
const FuelItemFactsSchema = FuelItemSchema;

const CourseSchema = z.object({
  distance_m: z.number(),
  duration_s: z.number(),
  segments: z.array(
    z.object({
      kind: z.string(),
      distance_m: z.number(),
      duration_s: z.number(),
      pace_s_per_km: z.number(),
      pace_from: z.enum(['target', 'race pace', 'easy pace', 'even']),
    }),
  ),
});

/** Carbohydrate, fluid, sodium and caffeine of an intake or a total. */
export const AmountsSchema = z.object({
  carbohydrate_g: z.number(),
  fluid_ml: z.number(),
  sodium_mg: z.number(),
  caffeine_mg: z.number(),
});

const TargetStatusSchema = z.enum(['within', 'under', 'over']);
const RangeSchema = z.object({ low: z.number(), high: z.number().nullable() });
const PerTargetRange = z.object({ carbohydrate: RangeSchema, fluid: RangeSchema, sodium: RangeSchema });
const PerTargetStatus = z.object({ carbohydrate: TargetStatusSchema, fluid: TargetStatusSchema, sodium: TargetStatusSchema });

const FuelScheduleSchema = z.object({
  distance_m: z.number(),
  duration_s: z.number(),
  intakes: z.array(
    AmountsSchema.extend({
      rule_index: z.number(),
      item_id: z.string().nullable(),
      bottle: z.string().nullable(),
      label: z.string(),
      servings: z.number().nullable(),
      ml: z.number().nullable(),
      distance_m: z.number(),
      distance_mi: z.number(),
      distance_km: z.number(),
      time_s: z.number(),
      clock: z.string(),
      time_of_day: z.string().nullable(),
      refill: z.boolean(),
    }),
  ),
  hours: z.array(
    AmountsSchema.extend({
      hour: z.number(),
      from_s: z.number(),
      to_s: z.number(),
      hours: z.number(),
      targets: PerTargetRange,
      status: PerTargetStatus,
    }),
  ),
  totals: AmountsSchema.extend({ caffeine_mg_per_kg: z.number().nullable() }),
  target_totals: PerTargetRange,
  status: PerTargetStatus,
  bottles: z.array(
    z.object({
      id: z.string(),
      volume_ml: z.number(),
      volume_fl_oz: z.number(),
      contents: z.array(z.object({ item_id: z.string(), name: z.string(), servings: z.number() })),
      carbohydrate_g: z.number(),
      sodium_mg: z.number(),
      caffeine_mg: z.number(),
      carbohydrate_pct: z.number(),
      sodium_mg_per_l: z.number(),
      caffeine_mg_per_l: z.number(),
      refills: z.number(),
    }),
  ),
  warnings: z.array(z.string()),
});

const LowHigh = z.object({ low: z.number(), high: z.number() });
const GramsRangeSchema = z.object({ low_g: z.number(), high_g: z.number() });
const MealGuidanceSchema = z.object({ g_per_kg: LowHigh, source: z.string(), evidence: EvidenceSchema, note: z.string() });
const MealPlanSchema = z.object({
  pre_run: MealGuidanceSchema.extend({ hours_before: LowHigh, grams: GramsRangeSchema }),
  after_run: MealGuidanceSchema.extend({ grams_per_hour: GramsRangeSchema, hours: z.number(), grams_total: GramsRangeSchema }),
  carbohydrate_loading: MealGuidanceSchema.extend({
    applies: z.boolean(),
    grams_per_day: GramsRangeSchema,
    days: LowHigh,
    grams_total: GramsRangeSchema,
  }),
});

/** A fuel plan as GET/PUT /api/plans/:id/fuel-plan and /api/me/goal-race/fuel-plan answer it. */
export const FuelPlanSchema = z.object({
  id: z.string(),
  runner_id: z.string(),
  author_id: z.string().nullable(),
  plan_id: z.string().nullable(),
  goal_race: z.boolean(),
  body_mass_kg: z.number(),
  easy_pace_s_per_km: z.number().nullable(),
  expected_duration_s: z.number(),
  expected_duration_given: z.boolean(),
  expected_distance_m: z.number(),
  start_clock: z.string().nullable(),
  sweat_l_per_h: z.number().nullable(),
  targets: FuelTargetsSchema,
  proposed_targets: FuelTargetsSchema,
  intakes: z.array(IntakeRuleAnswerSchema),
  bottles: z.array(BottleAnswerSchema),
  items: z.array(FuelItemFactsSchema),
  course: CourseSchema,
  schedule: FuelScheduleSchema,
  meals: MealPlanSchema,
  cautions: z.array(CautionSchema),
  /** The session plan or goal race changed after this fuel plan was computed: save it again to refresh. */
  source_changed: z.boolean(),
  updated_at: z.string(),
});
export type FuelPlan = z.infer<typeof FuelPlanSchema>;

/** `{ fuel_plan }` of the fuel-plan routes; null where none is set yet (GET). */
export const FuelPlanAnswerSchema = z.object({ fuel_plan: FuelPlanSchema.nullable() });
export const SavedFuelPlanAnswerSchema = z.object({ fuel_plan: FuelPlanSchema });
export type FuelPlanAnswer = z.infer<typeof FuelPlanAnswerSchema>;
export type SavedFuelPlanAnswer = z.infer<typeof SavedFuelPlanAnswerSchema>;

const TakenEntrySchema = AmountsSchema.extend({
  kind: z.enum(['item', 'water', 'drink']),
  item_id: z.string().nullable(),
  /** The plan's bottle a drink came from (drink entries only). */
  bottle: z.string().optional(),
  name: z.string(),
  servings: z.number().nullable(),
  /** Seconds from the start; null when the runner did not say. */
  time_s: z.number().nullable(),
});

const PlannedVsTakenSchema = z.object({
  hours: z.array(
    z.object({ hour: z.number(), from_s: z.number(), to_s: z.number(), planned: AmountsSchema, taken: AmountsSchema }),
  ),
  /** Entries taken without a time. */
  untimed: AmountsSchema,
  totals: z.object({ planned: AmountsSchema, taken: AmountsSchema }),
});

/** GET/PUT /api/runs/:id/fuel-taken. */
export const FuelTakenViewSchema = z.object({
  fuel_taken: z
    .object({
      run_id: z.string(),
      entries: z.array(TakenEntrySchema),
      stomach: z.number().nullable(),
      energy: z.number().nullable(),
      notes: z.string(),
      updated_at: z.string(),
    })
    .nullable(),
  planned_vs_taken: PlannedVsTakenSchema.extend({ fuel_plan_id: z.string() }).nullable(),
  cautions: z.array(CautionSchema),
});
export type FuelTakenView = z.infer<typeof FuelTakenViewSchema>;

/** GET/PUT /api/runs/:id/checkin. */
export const CheckinViewSchema = z.object({
  checkin: z
    .object({
      run_id: z.string(),
      sleep_hours: z.number().nullable(),
      soreness: z.number().nullable(),
      mood: z.number().nullable(),
      walking_minutes: z.number().nullable(),
      mobility_minutes: z.number().nullable(),
      cold_water: z.object({ water_temp_c: z.number(), minutes: z.number(), notes: z.array(z.string()) }).nullable(),
      notes: z.string(),
      updated_at: z.string(),
    })
    .nullable(),
  cautions: z.array(CautionSchema),
});
export type CheckinView = z.infer<typeof CheckinViewSchema>;

// The computations' interfaces and these schemas must describe the same JSON.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const MATCHES: [
  Same<z.infer<typeof CautionSchema>, Caution>,
  Same<z.infer<typeof FuelTargetsSchema>, FuelTargets>,
  Same<z.infer<typeof IntakeRuleAnswerSchema>, IntakeRule>,
  Same<z.infer<typeof BottleAnswerSchema>, Bottle>,
  Same<z.infer<typeof FuelItemFactsSchema>, FuelItemFacts>,
  Same<z.infer<typeof CourseSchema>, Course>,
  Same<z.infer<typeof FuelScheduleSchema>, FuelSchedule>,
  Same<z.infer<typeof MealPlanSchema>, MealPlan>,
  Same<z.infer<typeof TakenEntrySchema>, TakenEntry>,
  Same<z.infer<typeof PlannedVsTakenSchema>, PlannedVsTaken>,
] = [true, true, true, true, true, true, true, true, true, true];
void MATCHES;
