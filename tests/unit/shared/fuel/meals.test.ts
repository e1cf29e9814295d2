import { describe, expect, it } from 'vitest';
import { afterRunRefuel, carbohydrateLoading, mealPlan, preRunMeal } from '../../../../shared/fuel/meals.ts';

describe('meals (Thomas, Erdman & Burke 2016 joint position)', () => {
  it('carbohydrate loading, 70 kg: 10–12 g/kg/d → 700–840 g/d; over 36–48 h → 1050–1680 g (REFERENCES.md §7)', () => {
    const l = carbohydrateLoading(70, 3.5 * 3600);
    expect(l.grams_per_day).toEqual({ low_g: 700, high_g: 840 });
    expect(l.grams_total).toEqual({ low_g: 1050, high_g: 1680 });
    expect(l.applies).toBe(true);
    expect(l.source).toContain('in our reference sheet');
  });

  it.each([
    [90 * 60, false], // only for events longer than 90 min
    [90 * 60 + 1, true],
  ])('loading applies for %d s: %s', (duration, applies) => {
    expect(carbohydrateLoading(60, duration).applies).toBe(applies);
  });

  it('pre-run meal 1–4 g/kg 1–4 h before, labelled from memory: 70 kg → 70–280 g', () => {
    const m = preRunMeal(70);
    expect(m.grams).toEqual({ low_g: 70, high_g: 280 });
    expect(m.hours_before).toEqual({ low: 1, high: 4 });
    expect(m.evidence).toBe('from memory');
    expect(m.source).toContain('from memory');
  });

  it('after-run refuel 1.0–1.2 g/kg/h for 4 h, labelled from memory: 55 kg → 55–66 g/h, 220–264 g', () => {
    const r = afterRunRefuel(55);
    expect(r.grams_per_hour.low_g).toBeCloseTo(55, 10);
    expect(r.grams_per_hour.high_g).toBeCloseTo(66, 10);
    expect(r.grams_total.low_g).toBeCloseTo(220, 10);
    expect(r.grams_total.high_g).toBeCloseTo(264, 10);
    expect(r.evidence).toBe('from memory');
  });

  it.each([0, -70, Number.NaN])('refuses a body mass of %s kg', (mass) => {
    expect(() => mealPlan(mass, 3600)).toThrow(/Body mass/);
  });

  it('refuses a zero duration for loading', () => {
    expect(() => carbohydrateLoading(70, 0)).toThrow(RangeError);
  });
});
