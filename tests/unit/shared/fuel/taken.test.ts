import { describe, expect, it } from 'vitest';
import { buildSchedule, courseFromRace, type FuelItemFacts } from '../../../../shared/fuel/schedule.ts';
import { comparePlannedWithTaken, resolveTakenEntries } from '../../../../shared/fuel/taken.ts';
import { proposeTargets } from '../../../../shared/fuel/targets.ts';

const GEL: FuelItemFacts = {
  id: 'gel',
  name: 'energy gel',
  serving: '1 gel',
  carbohydrate_g: 25,
  sodium_mg: 50,
  caffeine_mg: 0,
  fluid_ml: 0,
};
const amounts = (c: number, f = 0) => ({ carbohydrate_g: c, fluid_ml: f, sodium_mg: 0, caffeine_mg: 0 });

describe('resolveTakenEntries', () => {
  it('item entries carry the item × servings; water only its millilitres', () => {
    const r = resolveTakenEntries(
      [
        { kind: 'item', item_id: 'gel', servings: 1.5, time_s: 2400 },
        { kind: 'water', fluid_ml: 200, time_s: null },
      ],
      [GEL],
    );
    expect(r).toEqual({
      ok: true,
      entries: [
        {
          kind: 'item',
          item_id: 'gel',
          name: 'energy gel',
          servings: 1.5,
          time_s: 2400,
          carbohydrate_g: 37.5,
          fluid_ml: 0,
          sodium_mg: 75,
          caffeine_mg: 0,
        },
        {
          kind: 'water',
          item_id: null,
          name: 'water',
          servings: null,
          time_s: null,
          carbohydrate_g: 0,
          fluid_ml: 200,
          sodium_mg: 0,
          caffeine_mg: 0,
        },
      ],
    });
  });

  it('reports the first unknown item', () => {
    expect(
      resolveTakenEntries(
        [
          { kind: 'water', fluid_ml: 100, time_s: 0 },
          { kind: 'item', item_id: 'x', servings: 1, time_s: 0 },
        ],
        [GEL],
      ),
    ).toEqual({
      ok: false,
      index: 1,
      field: 'item_id',
      message: 'This item is no longer among your fuel items: remove the entry, or add the item again.',
    });
  });

  // 500 ml with 60 g carbohydrate, 400 mg sodium and 100 mg caffeine mixed in.
  const BOTTLE = { id: 'A', volume_ml: 500, carbohydrate_pct: 12, sodium_mg_per_l: 800, caffeine_mg_per_l: 200 };

  it('a drink from a planned bottle carries its share of the mix: half the bottle, half of each', () => {
    const half = resolveTakenEntries([{ kind: 'drink', bottle: 'A', fluid_ml: 250, time_s: 1800 }], [], [BOTTLE]);
    expect(half).toEqual({
      ok: true,
      entries: [
        {
          kind: 'drink',
          item_id: null,
          bottle: 'A',
          name: 'bottle A',
          servings: null,
          time_s: 1800,
          carbohydrate_g: 30,
          fluid_ml: 250,
          sodium_mg: 200,
          caffeine_mg: 50,
        },
      ],
    });
    const whole = resolveTakenEntries([{ kind: 'drink', bottle: 'A', fluid_ml: 500, time_s: null }], [], [BOTTLE]);
    expect(whole.ok && whole.entries[0]).toMatchObject({ carbohydrate_g: 60, fluid_ml: 500, sodium_mg: 400, caffeine_mg: 100 });
  });

  it('a ticked drink carries what the same drink carries in the plan', () => {
    const powder: FuelItemFacts = { ...GEL, id: 'powder', name: 'drink powder', carbohydrate_g: 30, sodium_mg: 300 };
    const schedule = buildSchedule({
      course: courseFromRace(10_000, 3600),
      items: [powder],
      bottles: [{ id: 'A', volume_ml: 500, contents: [{ item_id: 'powder', servings: 1 }] }],
      intakes: [{ bottle: 'A', ml: 150, when: { type: 'at_times', at_s: [1200] } }],
      targets: proposeTargets({ duration_s: 3600, body_mass_kg: 60 }),
    });
    const planned = schedule.intakes[0]!;
    const taken = resolveTakenEntries([{ kind: 'drink', bottle: 'A', fluid_ml: 150, time_s: 1200 }], [], schedule.bottles);
    expect(taken.ok && taken.entries[0]).toMatchObject({
      carbohydrate_g: planned.carbohydrate_g,
      fluid_ml: planned.fluid_ml,
      sodium_mg: planned.sodium_mg,
      caffeine_mg: planned.caffeine_mg,
    });
    expect(planned).toMatchObject({ carbohydrate_g: 9, sodium_mg: 90 });
  });

  it.each([
    [
      { kind: 'drink' as const, bottle: 'Z', fluid_ml: 100, time_s: 0 },
      'bottle',
      "There is no bottle with this name in the run's fuel plan.",
    ],
    [
      { kind: 'drink' as const, bottle: 'A', fluid_ml: 501, time_s: 0 },
      'fluid_ml',
      'A drink cannot be more than the bottle holds.',
    ],
  ])('refuses drink %j', (entry, field, message) => {
    expect(resolveTakenEntries([entry], [], [BOTTLE])).toEqual({ ok: false, index: 0, field, message });
  });
});

describe('comparePlannedWithTaken', () => {
  it('buckets by clock hour, runs to the later of plan and run, and keeps untimed entries apart', () => {
    const planned = [2400, 4800, 7200].map((t) => ({ ...amounts(25), time_s: t }));
    const taken = [
      { ...amounts(25), time_s: 2500 },
      { ...amounts(25), time_s: 9000 },
      { ...amounts(0, 300), time_s: null },
    ];
    const r = comparePlannedWithTaken(planned, taken, 8640);
    expect(r.hours.map((h) => [h.hour, h.planned.carbohydrate_g, h.taken.carbohydrate_g])).toEqual([
      [1, 25, 25],
      [2, 25, 0],
      [3, 25, 25],
    ]);
    expect(r.hours[2]!.to_s).toBe(9000);
    expect(r.untimed.fluid_ml).toBe(300);
    expect(r.totals).toEqual({ planned: amounts(75), taken: amounts(50, 300) });
  });

  it('gives one hour for an empty record', () => {
    expect(comparePlannedWithTaken([], [], 1200).hours).toHaveLength(1);
  });
});
