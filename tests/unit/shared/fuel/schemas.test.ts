import { describe, expect, it } from 'vitest';
import {
  CheckinInputSchema,
  FuelItemInputSchema,
  FuelPlanInputSchema,
  FuelTakenInputSchema,
} from '../../../../shared/fuel/schemas.ts';

const GEL = {
  name: 'energy gel, 25 g carbohydrate',
  serving: '1 gel',
  carbohydrate_g: 25,
  sodium_mg: 50,
  caffeine_mg: 0,
  fluid_ml: 0,
};
const UUID = '0b6c6f0e-6b8a-4d36-9a53-0a3d0e0f5b1c';

function messages(result: { success: boolean; error?: { issues: Array<{ path: PropertyKey[]; message: string }> } }) {
  return result.error?.issues.map((i) => `${i.path.join('.')}: ${i.message}`) ?? [];
}

describe('fuel schemas', () => {
  it('accepts a generic item', () => {
    expect(FuelItemInputSchema.parse(GEL)).toEqual(GEL);
  });

  it.each([
    [{ ...GEL, carbohydrate_g: -1 }, 'carbohydrate_g: Carbohydrate cannot be negative.'],
    [{ ...GEL, caffeine_mg: 401 }, 'caffeine_mg: At most 400 mg of caffeine per serving.'],
    [{ ...GEL, name: ' ' }, 'name: Name the item.'],
    [{ ...GEL, brand: 'x' }, ': Unrecognized key: "brand"'],
  ])('refuses %j', (item, message) => {
    expect(messages(FuelItemInputSchema.safeParse(item))[0]).toBe(message);
  });

  it.each([
    [{ body_mass_kg: 0, intakes: [] }, 'body_mass_kg: Body mass must be between 25 and 250 kg.'],
    [
      { body_mass_kg: 70, intakes: [{ item_id: UUID, servings: 500, when: { type: 'at_times', at_s: [60] } }] },
      'intakes.0.servings: At most 10 servings at a time.',
    ],
    [
      { body_mass_kg: 70, intakes: [{ item_id: UUID, bottle: 'A', ml: 100, when: { type: 'at_times', at_s: [60] } }] },
      'intakes.0: Each intake is either a fuel item (item_id) or a drink from a bottle (bottle).',
    ],
    [
      { body_mass_kg: 70, intakes: [], targets: { carbohydrate: { low: 60, high: 30 } } },
      'targets.carbohydrate.high: The low end cannot be above the high end.',
    ],
    [{ body_mass_kg: 70, intakes: [], start_clock: '7:30' }, 'start_clock: Write the start time like 07:30.'],
  ])('refuses a fuel plan %#', (plan, message) => {
    expect(messages(FuelPlanInputSchema.safeParse(plan))).toContain(message);
  });

  it('refuses stomach 6 and negative servings taken', () => {
    const r = FuelTakenInputSchema.safeParse({ entries: [{ kind: 'item', item_id: UUID, servings: -1 }], stomach: 6 });
    expect(messages(r)).toEqual([
      'entries.0.servings: Take at least a quarter serving.',
      'stomach: Stomach is a whole number from 1 to 5.',
    ]);
  });

  it.each([
    [
      { cold_water: { water_temp_c: 50, minutes: 10 } },
      'cold_water.water_temp_c: Water temperature must be between 0 and 30 °C.',
    ],
    [{ cold_water: { water_temp_c: 12, minutes: 61 } }, 'cold_water.minutes: At most 60 minutes in cold water.'],
    [{ soreness: 0 }, 'soreness: Soreness is a whole number from 1 to 5.'],
    [{ sleep_hours: 25 }, 'sleep_hours: At most 24 hours of sleep.'],
  ])('refuses a check-in %j', (checkin, message) => {
    expect(messages(CheckinInputSchema.safeParse(checkin))).toEqual([message]);
  });

  it('fills check-in defaults', () => {
    expect(CheckinInputSchema.parse({ mood: 4 })).toEqual({
      sleep_hours: null,
      soreness: null,
      mood: 4,
      walking_minutes: null,
      mobility_minutes: null,
      cold_water: null,
      notes: '',
    });
  });
});
