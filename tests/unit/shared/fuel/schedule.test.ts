import { describe, expect, it } from 'vitest';
import {
  buildSchedule,
  compareWithTarget,
  courseFromPlanItems,
  courseFromRace,
  distanceAtTime,
  expectedDurationFromPlan,
  formatClock,
  FuelPlanError,
  scaleCourse,
  timeAtDistance,
  type FuelItemFacts,
  type ScheduleInput,
} from '../../../../shared/fuel/schedule.ts';
import { proposeTargets } from '../../../../shared/fuel/targets.ts';
import { expandParts } from '../../../../shared/plans/expand.ts';
import { parseShorthand } from '../../../../shared/plans/shorthand.ts';
import { plannedVolume } from '../../../../shared/plans/weeks.ts';
import type { PlanItem } from '../../../../shared/plans/types.ts';

const MILE = 1609.344;
/** 8:00 per mile in seconds per km. */
const EIGHT_PER_MILE = 480 / 1.609344;

function items(text: string): PlanItem[] {
  const r = parseShorthand(text);
  if (!r.ok) throw new Error(r.error.message);
  return r.items;
}

const GEL: FuelItemFacts = {
  id: 'gel',
  name: 'energy gel',
  serving: '1 gel',
  carbohydrate_g: 25,
  sodium_mg: 50,
  caffeine_mg: 0,
  fluid_ml: 0,
};
const CAF_GEL: FuelItemFacts = { ...GEL, id: 'caf', name: 'energy gel with caffeine', caffeine_mg: 40 };
const MIX: FuelItemFacts = {
  id: 'mix',
  name: 'drink mix',
  serving: '150 ml',
  carbohydrate_g: 9,
  sodium_mg: 70,
  caffeine_mg: 0,
  fluid_ml: 150,
};
const POWDER: FuelItemFacts = {
  id: 'powder',
  name: 'drink powder',
  serving: '1 scoop',
  carbohydrate_g: 30,
  sodium_mg: 300,
  caffeine_mg: 0,
  fluid_ml: 0,
};

const LONG_RUN = courseFromPlanItems(items('18 mi easy'), {}, EIGHT_PER_MILE);

function schedule(over: Partial<ScheduleInput>) {
  return buildSchedule({
    course: LONG_RUN,
    items: [GEL, CAF_GEL, MIX, POWDER],
    intakes: [],
    targets: proposeTargets({ duration_s: LONG_RUN.duration_s }),
    ...over,
  });
}

describe('expectedDurationFromPlan', () => {
  it('18 mi easy at 8:00/mi takes 2:24:00 over 28 968 m', () => {
    expect(LONG_RUN.duration_s).toBeCloseTo(8640, 6);
    expect(LONG_RUN.distance_m).toBeCloseTo(18 * MILE, 6);
    expect(LONG_RUN.segments[0]!.pace_from).toBe('easy pace');
  });

  it('uses the middle of a pace range, the race pace for @ MP, and timed parts for distance', () => {
    // 2 mi easy at 8:00/mi = 960 s; 10 min easy = 1.25 mi; 4 mi @ 7:00-7:10/mi = 4 × 425 s; 2 mi @ MP (300 s/km).
    const c = courseFromPlanItems(items('2 mi easy, 10 min easy, 4 mi @ 7:00-7:10/mi, 2 mi @ MP'), { MP: 300 }, EIGHT_PER_MILE);
    expect(c.segments.map((s) => s.pace_from)).toEqual(['easy pace', 'easy pace', 'target', 'race pace']);
    expect(c.segments[1]!.distance_m).toBeCloseTo(1.25 * MILE, 6);
    expect(c.duration_s).toBeCloseTo(960 + 600 + 4 * 425 + 2 * MILE * 0.3, 6);
    expect(c.distance_m).toBeCloseTo(9.25 * MILE, 6);
  });

  it('unrolls repeats', () => {
    const c = expectedDurationFromPlan(expandParts(items('3 x 1 km @ 4:00/km w/ 2 min jog')), {}, 360);
    expect(c.segments).toHaveLength(6);
    expect(c.duration_s).toBeCloseTo(3 * 240 + 3 * 120, 6);
  });

  it('leaves out the recovery after the last rep unless it is written, as the plan check and weekly volume do', () => {
    // 2 mi warm-up at 8:00/mi (960 s), six 3 min reps at 4:00/km, five 90 s jogs at 8:00/mi between them.
    const c = courseFromPlanItems(items('2 mi easy, 6 x 3 min @ 4:00/km w/ 90 s jog'), {}, EIGHT_PER_MILE);
    expect(c.segments.map((s) => s.kind).filter((k) => k === 'recovery jog')).toHaveLength(5);
    expect(c.segments).toHaveLength(1 + 6 + 5);
    expect(c.duration_s).toBeCloseTo(960 + 6 * 180 + 5 * 90, 6);
    expect(c.distance_m).toBeCloseTo(2 * MILE + 6 * 750 + (5 * 90 * 1000) / EIGHT_PER_MILE, 6);
    // Written after the repeat, the last recovery is run: 6 jogs.
    const written = courseFromPlanItems(items('6 x 3 min @ 4:00/km w/ 90 s jog, 90 s jog'), {}, EIGHT_PER_MILE);
    expect(written.duration_s).toBeCloseTo(6 * 180 + 6 * 90, 6);
    // The same count as the weekly planned volume.
    expect(plannedVolume(items('2 mi easy, 6 x 3 min @ 4:00/km w/ 90 s jog')).duration_s).toBe(6 * 180 + 5 * 90);
  });

  it('asks for the easy pace when a part has no pace target', () => {
    expect(() => courseFromPlanItems(items('18 mi easy'), {})).toThrow(FuelPlanError);
    try {
      courseFromPlanItems(items('18 mi easy'), {});
    } catch (err) {
      expect((err as FuelPlanError).field).toBe('easy_pace_s_per_km');
    }
  });

  it('says what to set when a race pace is missing', () => {
    expect(() => courseFromPlanItems(items('10 mi @ MP'), {}, EIGHT_PER_MILE)).toThrow(/marathon effort/);
  });

  it.each([0, -300, Number.NaN])('refuses an easy pace of %s', (pace) => {
    expect(() => courseFromPlanItems(items('5 mi easy'), {}, pace)).toThrow(FuelPlanError);
  });

  it('refuses an empty plan', () => {
    expect(() => expectedDurationFromPlan([], {}, 300)).toThrow(FuelPlanError);
  });
});

describe('courses', () => {
  it('a goal race runs at even pace: 3:30:00 marathon', () => {
    const c = courseFromRace(42195, 3.5 * 3600);
    expect(c.segments[0]!.pace_s_per_km).toBeCloseTo(12600 / 42.195, 9);
    expect(timeAtDistance(c, 21097.5)).toBeCloseTo(6300, 9);
    expect(distanceAtTime(c, 6300)).toBeCloseTo(21097.5, 9);
  });

  it('maps distance and time across stretches of different pace, and clamps past the finish', () => {
    const c = courseFromPlanItems(items('1 km @ 5:00/km, 1 km @ 4:00/km'), {});
    expect(timeAtDistance(c, 1500)).toBeCloseTo(420, 9);
    expect(distanceAtTime(c, 420)).toBeCloseTo(1500, 9);
    expect(timeAtDistance(c, 5000)).toBe(540);
    expect(distanceAtTime(c, 9999)).toBe(2000);
  });

  it('scales to the runner’s own expected duration', () => {
    const c = scaleCourse(LONG_RUN, 9000);
    expect(c.duration_s).toBeCloseTo(9000, 6);
    expect(c.distance_m).toBeCloseTo(LONG_RUN.distance_m, 6);
    expect(() => scaleCourse(LONG_RUN, 0)).toThrow(FuelPlanError);
  });

  it.each([
    [0, 3600],
    [42195, 0],
  ])('refuses a race of %d m in %d s', (d, t) => {
    expect(() => courseFromRace(d, t)).toThrow(FuelPlanError);
  });
});

describe('buildSchedule', () => {
  it('a gel every 5 miles over 18 miles at 8:00/mi: miles 5, 10, 15 at 0:40, 1:20, 2:00', () => {
    const s = schedule({ intakes: [{ item_id: 'gel', when: { type: 'every_distance', every: 5, unit: 'mi' } }] });
    expect(s.intakes.map((i) => i.distance_mi)).toEqual([5, 10, 15]);
    expect(s.intakes.map((i) => i.clock)).toEqual(['0:40:00', '1:20:00', '2:00:00']);
    expect(s.intakes.map((i) => i.time_s)).toEqual([2400, 4800, 7200]);
    expect(s.intakes.map((i) => i.distance_km)).toEqual([8.0467, 16.0934, 24.1402]);
    expect(s.intakes[0]).toMatchObject({ label: 'energy gel ×1', carbohydrate_g: 25, sodium_mg: 50, fluid_ml: 0, refill: false });
  });

  it('drink mix every 15 minutes over 2:24: nine drinks, 0:15 to 2:15, and hourly totals vs targets', () => {
    const s = schedule({
      intakes: [
        { item_id: 'gel', when: { type: 'every_distance', every: 5, unit: 'mi' } },
        { item_id: 'mix', when: { type: 'every_time', every_s: 900 } },
      ],
    });
    const drinks = s.intakes.filter((i) => i.item_id === 'mix');
    expect(drinks.map((d) => d.clock)).toEqual([
      '0:15:00',
      '0:30:00',
      '0:45:00',
      '1:00:00',
      '1:15:00',
      '1:30:00',
      '1:45:00',
      '2:00:00',
      '2:15:00',
    ]);
    expect(drinks[0]!.distance_mi).toBe(1.875);
    // Hour 1 [0, 1 h): gel at 0:40 + drinks at 0:15, 0:30, 0:45 → 25 + 27 g, 450 ml, 50 + 210 mg.
    // Hour 2 [1 h, 2 h): gel at 1:20 + drinks at 1:00…1:45 → 25 + 36 g, 600 ml.
    // Hour 3 [2 h, 2:24), 0.4 h: gel at 2:00 + drinks at 2:00, 2:15 → 25 + 18 g, 300 ml; targets prorated.
    expect(s.hours.map((h) => [h.hour, h.hours, h.carbohydrate_g, h.fluid_ml, h.sodium_mg])).toEqual([
      [1, 1, 52, 450, 260],
      [2, 1, 61, 600, 330],
      [3, 0.4, 43, 300, 190],
    ]);
    expect(s.hours[0]!.status).toEqual({ carbohydrate: 'within', fluid: 'within', sodium: 'within' });
    expect(s.hours[1]!.status.carbohydrate).toBe('over'); // 61 g against 30–60 g/h
    expect(s.hours[2]!.targets.carbohydrate).toEqual({ low: 12, high: 24 });
    expect(s.totals).toMatchObject({ carbohydrate_g: 156, fluid_ml: 1350, sodium_mg: 780, caffeine_mg: 0 });
    expect(s.target_totals.carbohydrate).toEqual({ low: 72, high: 144 });
    expect(s.status.carbohydrate).toBe('over');
    // Same time, the earlier rule first.
    expect(s.intakes.filter((i) => i.time_s === 7200).map((i) => i.item_id)).toEqual(['gel', 'mix']);
  });

  it('places at given distances and times, drops points after the finish with a warning, keeps a gel at the start', () => {
    const s = schedule({
      intakes: [
        { item_id: 'gel', servings: 2, when: { type: 'at_distances', at: [6.2, 13.1, 30], unit: 'mi' } },
        { item_id: 'caf', when: { type: 'at_times', at_s: [0, 5400] } },
      ],
      body_mass_kg: 80,
    });
    expect(s.intakes.map((i) => i.clock)).toEqual(['0:00:00', '0:49:36', '1:30:00', '1:44:48']);
    expect(s.intakes[1]).toMatchObject({ servings: 2, carbohydrate_g: 50, distance_mi: 6.2 });
    expect(s.warnings).toEqual(['1 of the points of intake 1 fall after the finish and are left out.']);
    expect(s.totals.caffeine_mg).toBe(80);
    expect(s.totals.caffeine_mg_per_kg).toBe(1);
  });

  it('every km from a given first point; intakes never at the finish', () => {
    const c = courseFromRace(10000, 3000);
    const s = schedule({
      course: c,
      intakes: [{ item_id: 'mix', when: { type: 'every_distance', every: 2.5, unit: 'km', first: 1 } }],
    });
    expect(s.intakes.map((i) => i.distance_km)).toEqual([1, 3.5, 6, 8.5]);
    const end = schedule({ course: c, intakes: [{ item_id: 'mix', when: { type: 'every_distance', every: 5, unit: 'km' } }] });
    expect(end.intakes.map((i) => i.distance_km)).toEqual([5]);
  });

  it('prints the time of day from a start time', () => {
    const s = schedule({
      start_clock: '23:30',
      intakes: [{ item_id: 'gel', when: { type: 'every_distance', every: 5, unit: 'mi' } }],
    });
    expect(s.intakes.map((i) => i.time_of_day)).toEqual(['00:10', '00:50', '01:30']);
  });

  it('bottles: concentration from contents, sips draw it down, a refill starts a fresh one', () => {
    const s = schedule({
      bottles: [{ id: 'A', volume_ml: 500, contents: [{ item_id: 'powder', servings: 1 }] }],
      intakes: [{ bottle: 'A', ml: 150, when: { type: 'every_time', every_s: 1200 } }],
    });
    expect(s.bottles[0]).toMatchObject({ id: 'A', carbohydrate_g: 30, carbohydrate_pct: 6, sodium_mg_per_l: 600, refills: 2 });
    expect(s.bottles[0]!.volume_fl_oz).toBeCloseTo(16.907, 3);
    // 150 ml of a 6 % drink carries 9 g; drinks at 0:20 … 2:20 (7); 500 ml covers three.
    expect(s.intakes).toHaveLength(7);
    expect(s.intakes[0]).toMatchObject({ label: 'bottle A, 150 ml', carbohydrate_g: 9, sodium_mg: 90, fluid_ml: 150 });
    expect(s.intakes.map((i) => i.refill)).toEqual([false, false, false, true, false, false, true]);
  });

  it('a 6 % drink: 500 mL carries 30 g (REFERENCES.md §7)', () => {
    const s = schedule({
      bottles: [{ id: 'B', volume_ml: 500, contents: [{ item_id: 'powder', servings: 1 }] }],
      intakes: [{ bottle: 'B', ml: 500, when: { type: 'at_times', at_s: [3000] } }],
    });
    expect(s.intakes[0]!.carbohydrate_g).toBe(30);
  });

  it.each([
    [{ intakes: [{ item_id: 'nope', when: { type: 'at_times' as const, at_s: [60] } }] }, 'intakes.0.item_id'],
    [{ intakes: [{ bottle: 'Z', ml: 100, when: { type: 'at_times' as const, at_s: [60] } }] }, 'intakes.0.bottle'],
    [{ intakes: [{ item_id: 'gel', servings: -1, when: { type: 'at_times' as const, at_s: [60] } }] }, 'intakes.0.servings'],
    [{ intakes: [{ item_id: 'gel', when: { type: 'every_time' as const, every_s: 0 } }] }, 'intakes.0.when.every_s'],
    [
      { intakes: [{ item_id: 'gel', when: { type: 'every_distance' as const, every: 0.01, unit: 'mi' as const } }] },
      'intakes.0.when.every',
    ],
    [{ intakes: [{ item_id: 'gel', when: { type: 'at_times' as const, at_s: [-5] } }] }, 'intakes.0.when.at_s.0'],
    [{ intakes: [{ when: { type: 'at_times' as const, at_s: [60] } }] }, 'intakes.0'],
    [
      {
        bottles: [{ id: 'A', volume_ml: 500, contents: [] }],
        intakes: [{ bottle: 'A', ml: 600, when: { type: 'at_times' as const, at_s: [60] } }],
      },
      'intakes.0.ml',
    ],
    [
      { bottles: [{ id: 'A', volume_ml: 500, contents: [{ item_id: 'nope', servings: 1 }] }], intakes: [] },
      'bottles.0.contents.0.item_id',
    ],
  ])('refuses bad input %#, naming the field', (over, field) => {
    try {
      schedule(over as Partial<ScheduleInput>);
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(FuelPlanError);
      expect((err as FuelPlanError).field).toBe(field);
    }
  });

  it('refuses 500 gels: more than 200 scheduled intakes', () => {
    const long = courseFromRace(42195, 10 * 3600);
    expect(() => schedule({ course: long, intakes: [{ item_id: 'gel', when: { type: 'every_time', every_s: 60 } }] })).toThrow(
      /more than 200 intakes/,
    );
  });

  it('does not mutate its input', () => {
    const input: ScheduleInput = {
      course: LONG_RUN,
      items: [GEL],
      intakes: [{ item_id: 'gel', when: { type: 'every_distance', every: 5, unit: 'mi' } }],
      targets: proposeTargets({ duration_s: LONG_RUN.duration_s }),
    };
    const copy = structuredClone(input);
    buildSchedule(input);
    expect(input).toEqual(copy);
  });
});

describe('compareWithTarget and formatClock', () => {
  it.each([
    [29.9, { low: 30, high: 60 }, 'under'],
    [30, { low: 30, high: 60 }, 'within'],
    [60.04, { low: 30, high: 60 }, 'within'], // arithmetic noise below 0.1 is not a status change
    [60.1, { low: 30, high: 60 }, 'over'],
    [500, { low: 0, high: null }, 'within'], // no upper figure published
    [25, { low: 0, high: 0 }, 'over'],
  ])('%d against %j is %s', (value, target, status) => {
    expect(compareWithTarget(value, target)).toBe(status);
  });

  it.each([
    [0, '0:00:00'],
    [2400, '0:40:00'],
    [8639.6, '2:24:00'],
    [36000, '10:00:00'],
  ])('%d s → %s', (s, text) => {
    expect(formatClock(s)).toBe(text);
  });
});
