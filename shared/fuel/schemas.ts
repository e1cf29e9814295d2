import { z } from 'zod';
import { FUEL_LIMITS } from './schedule.ts';

/**
 * Request schemas of the fuel API (fuel items, fuel plans, fuel taken, after-run check-in), shared by the server's
 * validation and the client's forms. Limits keep numbers physical: no negative grams, caffeine at most 400 mg per
 * serving, cold water 0–30 °C for at most 60 minutes.
 */

const L = FUEL_LIMITS;

function amount(what: string, unit: string, max: number, maxMessage: string) {
  return z
    .number({ error: `${what} is a number of ${unit}.` })
    .min(0, `${what} cannot be negative.`)
    .max(max, maxMessage);
}

const NameSchema = z
  .string({ error: 'Name the item.' })
  .trim()
  .min(1, 'Name the item.')
  .max(120, 'Keep the name under 120 characters.');

const ServingSchema = z
  .string({ error: 'A serving is text, e.g. "1 gel".' })
  .trim()
  .max(60, 'Keep the serving under 60 characters.');

export const FuelItemInputSchema = z
  .object({
    name: NameSchema,
    serving: ServingSchema.default(''),
    carbohydrate_g: amount('Carbohydrate', 'grams', 300, 'At most 300 g of carbohydrate per serving.'),
    sodium_mg: amount('Sodium', 'milligrams', 5000, 'At most 5000 mg of sodium per serving.'),
    caffeine_mg: amount('Caffeine', 'milligrams', 400, 'At most 400 mg of caffeine per serving.'),
    fluid_ml: amount('Fluid', 'millilitres', 2000, 'At most 2000 ml of fluid per serving.'),
  })
  .strict();
export type FuelItemInput = z.infer<typeof FuelItemInputSchema>;

export const FuelItemPatchSchema = z
  .object({
    name: NameSchema,
    serving: ServingSchema,
    carbohydrate_g: amount('Carbohydrate', 'grams', 300, 'At most 300 g of carbohydrate per serving.'),
    sodium_mg: amount('Sodium', 'milligrams', 5000, 'At most 5000 mg of sodium per serving.'),
    caffeine_mg: amount('Caffeine', 'milligrams', 400, 'At most 400 mg of caffeine per serving.'),
    fluid_ml: amount('Fluid', 'millilitres', 2000, 'At most 2000 ml of fluid per serving.'),
  })
  .partial()
  .strict()
  .refine((p) => Object.keys(p).length > 0, { message: 'Change at least one field.' });
export type FuelItemPatch = z.infer<typeof FuelItemPatchSchema>;

export const FuelItemSchema = z.object({
  id: z.string(),
  name: z.string(),
  serving: z.string(),
  carbohydrate_g: z.number(),
  sodium_mg: z.number(),
  caffeine_mg: z.number(),
  fluid_ml: z.number(),
});
export type FuelItem = z.infer<typeof FuelItemSchema>;
/** `GET /api/fuel-items`: the items the runner may pick from. */
export const FuelItemListAnswerSchema = z.object({ items: z.array(FuelItemSchema) });
export type FuelItemListAnswer = z.infer<typeof FuelItemListAnswerSchema>;
/** `POST /api/fuel-items` and `PATCH /api/fuel-items/:id`: the item. */
export const FuelItemAnswerSchema = z.object({ item: FuelItemSchema });
export type FuelItemAnswer = z.infer<typeof FuelItemAnswerSchema>;

const ItemIdSchema = z.uuid({ error: 'Not a fuel item id.' });

const ServingsSchema = z
  .number({ error: 'Servings is a number.' })
  .min(0.25, 'Take at least a quarter serving.')
  .max(L.maxServings, `At most ${L.maxServings} servings at a time.`);

const SecondsSchema = z
  .number({ error: 'A time is a number of seconds from the start.' })
  .min(0, 'A time cannot be before the start.')
  .max(48 * 3600, 'A time is at most 48 h from the start.');

const DistanceValueSchema = z
  .number({ error: 'A distance is a number.' })
  .min(0, 'A distance cannot be negative.')
  .max(250, 'A distance is at most 250.');

const UnitSchema = z.enum(['mi', 'km'], { error: 'A distance is in mi or km.' });

const WhenSchema = z.discriminatedUnion(
  'type',
  [
    z
      .object({
        type: z.literal('every_distance'),
        every: z
          .number({ error: 'Give the distance between intakes.' })
          .min(L.minEveryDistance, 'Intakes are at least 0.1 apart.')
          .max(250, 'At most 250 apart.'),
        unit: UnitSchema,
        first: DistanceValueSchema.optional(),
      })
      .strict(),
    z
      .object({
        type: z.literal('every_time'),
        every_s: z
          .number({ error: 'Give the seconds between intakes.' })
          .min(L.minEveryS, 'Intakes are at least a minute apart.')
          .max(24 * 3600, 'At most 24 h apart.'),
        first_s: SecondsSchema.optional(),
      })
      .strict(),
    z
      .object({
        type: z.literal('at_distances'),
        at: z
          .array(DistanceValueSchema)
          .min(1, 'Give at least one distance.')
          .max(L.maxPointsPerRule, `At most ${L.maxPointsPerRule} points.`),
        unit: UnitSchema,
      })
      .strict(),
    z
      .object({
        type: z.literal('at_times'),
        at_s: z
          .array(SecondsSchema)
          .min(1, 'Give at least one time.')
          .max(L.maxPointsPerRule, `At most ${L.maxPointsPerRule} points.`),
      })
      .strict(),
  ],
  { error: 'Say when: every_distance, every_time, at_distances or at_times.' },
);

const BottleIdSchema = z
  .string({ error: 'Name the bottle.' })
  .trim()
  .min(1, 'Name the bottle.')
  .max(20, 'Keep a bottle name under 20 characters.');

export const IntakeRuleSchema = z
  .object({
    item_id: ItemIdSchema.optional(),
    servings: ServingsSchema.optional(),
    bottle: BottleIdSchema.optional(),
    ml: z
      .number({ error: 'Give the millilitres of each drink.' })
      .min(5, 'A drink is at least 5 ml.')
      .max(1000, 'A drink is at most 1000 ml.')
      .optional(),
    when: WhenSchema,
  })
  .strict()
  .refine((r) => (r.item_id === undefined) !== (r.bottle === undefined), {
    message: 'Each intake is either a fuel item (item_id) or a drink from a bottle (bottle).',
  })
  .refine((r) => r.bottle === undefined || r.ml !== undefined, { message: 'Give the millilitres of each drink.', path: ['ml'] });
export type IntakeRuleInput = z.infer<typeof IntakeRuleSchema>;

export const BottleSchema = z
  .object({
    id: BottleIdSchema,
    volume_ml: z
      .number({ error: 'A volume is a number of millilitres.' })
      .min(50, 'A bottle holds at least 50 ml.')
      .max(2000, 'A bottle holds at most 2000 ml.'),
    contents: z
      .array(z.object({ item_id: ItemIdSchema, servings: ServingsSchema }).strict())
      .max(L.maxBottleContents, `At most ${L.maxBottleContents} items in a bottle.`)
      .default([]),
  })
  .strict();

function targetRange(unit: string, max: number) {
  const n = z
    .number({ error: `A target is a number of ${unit}.` })
    .min(0, 'A target cannot be negative.')
    .max(max, `A target is at most ${max} ${unit}.`);
  return z
    .object({ low: n, high: n })
    .strict()
    .refine((t) => t.low <= t.high, { message: 'The low end cannot be above the high end.', path: ['high'] });
}

/** Targets the runner or coach sets instead of the proposed ones; each is optional. */
export const TargetOverridesSchema = z
  .object({
    carbohydrate: targetRange('g/h', 150).optional(),
    fluid: targetRange('ml/h', 2000).optional(),
    sodium: targetRange('mg/h', 3000).optional(),
  })
  .strict();
export type TargetOverrides = z.infer<typeof TargetOverridesSchema>;

export const FuelPlanInputSchema = z
  .object({
    body_mass_kg: z
      .number({ error: 'Body mass is a number of kilograms.' })
      .min(25, 'Body mass must be between 25 and 250 kg.')
      .max(250, 'Body mass must be between 25 and 250 kg.'),
    easy_pace_s_per_km: z
      .number({ error: 'A pace is a number of seconds per km.' })
      .min(90, 'A pace must be between 1:30 and 20:00 per km.')
      .max(1200, 'A pace must be between 1:30 and 20:00 per km.')
      .optional(),
    expected_duration_s: z
      .number({ error: 'A duration is a number of seconds.' })
      .min(60, 'A run lasts at least a minute.')
      .max(48 * 3600, 'A run lasts at most 48 h.')
      .optional(),
    start_clock: z
      .string()
      .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Write the start time like 07:30.')
      .nullable()
      .optional(),
    sweat_l_per_h: z
      .number({ error: 'A sweat rate is a number of litres per hour.' })
      .min(0, 'A sweat rate cannot be negative.')
      .max(5, 'A sweat rate is at most 5 L/h.')
      .optional(),
    targets: TargetOverridesSchema.optional(),
    bottles: z.array(BottleSchema).max(L.maxBottles, `At most ${L.maxBottles} bottles.`).default([]),
    intakes: z.array(IntakeRuleSchema).max(L.maxRules, `At most ${L.maxRules} intakes.`),
  })
  .strict();
export type FuelPlanInput = z.infer<typeof FuelPlanInputSchema>;

const ScaleSchema = (what: string) =>
  z
    .number({ error: `${what} is a whole number from 1 to 5.` })
    .int(`${what} is a whole number from 1 to 5.`)
    .min(1, `${what} is a whole number from 1 to 5.`)
    .max(5, `${what} is a whole number from 1 to 5.`);

const NotesSchema = z.string({ error: 'Notes are text.' }).trim().max(2000, 'Keep the notes under 2000 characters.');

export const TakenEntrySchema = z.discriminatedUnion(
  'kind',
  [
    z
      .object({
        kind: z.literal('item'),
        item_id: ItemIdSchema,
        servings: ServingsSchema,
        time_s: SecondsSchema.nullable().default(null),
      })
      .strict(),
    z
      .object({
        kind: z.literal('water'),
        fluid_ml: z.number({ error: 'Give the millilitres.' }).min(1, 'At least 1 ml.').max(2000, 'At most 2000 ml at a time.'),
        time_s: SecondsSchema.nullable().default(null),
      })
      .strict(),
    // A drink from one of the bottles of the run's fuel plan: it carries the bottle's mix in proportion.
    z
      .object({
        kind: z.literal('drink'),
        bottle: BottleIdSchema,
        fluid_ml: z.number({ error: 'Give the millilitres.' }).min(1, 'At least 1 ml.').max(2000, 'At most 2000 ml at a time.'),
        time_s: SecondsSchema.nullable().default(null),
      })
      .strict(),
  ],
  { error: 'An entry is a fuel item (kind "item"), plain water (kind "water") or a drink from a planned bottle (kind "drink").' },
);
export type TakenEntryInput = z.infer<typeof TakenEntrySchema>;

export const FuelTakenInputSchema = z
  .object({
    entries: z.array(TakenEntrySchema).max(100, 'At most 100 entries.'),
    stomach: ScaleSchema('Stomach').nullable().default(null),
    energy: ScaleSchema('Energy').nullable().default(null),
    notes: NotesSchema.default(''),
  })
  .strict();
export type FuelTakenInput = z.infer<typeof FuelTakenInputSchema>;

const MinutesSchema = z
  .number({ error: 'Minutes is a number.' })
  .min(0, 'Minutes cannot be negative.')
  .max(600, 'At most 600 minutes.');

export const ColdWaterSchema = z
  .object({
    water_temp_c: z
      .number({ error: 'Water temperature is a number of °C.' })
      .min(0, 'Water temperature must be between 0 and 30 °C.')
      .max(30, 'Water temperature must be between 0 and 30 °C.'),
    minutes: z
      .number({ error: 'Minutes is a number.' })
      .min(0.5, 'At least half a minute.')
      .max(60, 'At most 60 minutes in cold water.'),
  })
  .strict();

export const CheckinInputSchema = z
  .object({
    sleep_hours: z
      .number({ error: 'Sleep is a number of hours.' })
      .min(0, 'Sleep cannot be negative.')
      .max(24, 'At most 24 hours of sleep.')
      .nullable()
      .default(null),
    soreness: ScaleSchema('Soreness').nullable().default(null),
    mood: ScaleSchema('Mood').nullable().default(null),
    walking_minutes: MinutesSchema.nullable().default(null),
    mobility_minutes: MinutesSchema.nullable().default(null),
    cold_water: ColdWaterSchema.nullable().default(null),
    notes: NotesSchema.default(''),
  })
  .strict();
export type CheckinInput = z.infer<typeof CheckinInputSchema>;
