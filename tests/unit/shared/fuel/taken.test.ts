import { describe, expect, it } from 'vitest';
import type { FuelItemFacts } from '../../../../shared/fuel/schedule.ts';
import { comparePlannedWithTaken, resolveTakenEntries } from '../../../../shared/fuel/taken.ts';

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
      unknown: 1,
    });
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
