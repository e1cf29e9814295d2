import { describe, expect, it } from 'vitest';
import type { DailyLoad } from '../../../../shared/weeks/load.ts';
import {
  isLongRunPlan,
  longRunPlanId,
  summariseWeek,
  type WeekPlan,
  type WeekReviewInput,
  type WeekRun,
} from '../../../../shared/weeks/week-review.ts';
import { addDays, weekDates } from '../../../../shared/weeks/weeks.ts';

const START = '2026-10-12'; // Monday
const END = '2026-10-18';
const AFTER = '2026-10-19';

function plan(id: string, date: string, over: Partial<WeekPlan> = {}): WeekPlan {
  return {
    id,
    date,
    title: id,
    planned_distance_m: null,
    planned_duration_s: null,
    is_long_run: false,
    easy_only: false,
    ...over,
  };
}

function run(id: string, date: string, over: Partial<WeekRun> = {}): WeekRun {
  return { id, date, distance_m: 0, moving_s: 0, trimp: null, session_verdict: null, pace_s_per_km: null, ...over };
}

/** Whole weeks of load ending on `end`, spread evenly over each week's days (fractional daily loads). */
function weeklyLoads(weekly: number[], end = END): DailyLoad[] {
  const days = weekly.flatMap((w) => Array.from({ length: 7 }, () => w / 7));
  return days.map((load, i) => ({ date: addDays(end, i - days.length + 1), load }));
}

const PLANS: WeekPlan[] = [
  plan('p-mon', '2026-10-12', { title: 'Easy 8 km', planned_distance_m: 8000, easy_only: true }),
  plan('p-wed', '2026-10-14', { title: '6 × 800 m', planned_distance_m: 11_000 }),
  plan('p-thu', '2026-10-15', { title: '45 min easy', planned_duration_s: 2700, easy_only: true }),
  plan('p-sat', '2026-10-17', { title: 'Easy 6 km', planned_distance_m: 6000, easy_only: true }),
  plan('p-sun', '2026-10-18', { title: 'Long run 28 km', planned_distance_m: 28_000, is_long_run: true }),
  plan('p-next', '2026-10-19', { title: 'Next week', planned_distance_m: 10_000 }),
];

const RUNS: WeekRun[] = [
  run('r-mon', '2026-10-12', {
    distance_m: 8100,
    moving_s: 2580,
    trimp: 60,
    session_verdict: 'as planned',
    pace_s_per_km: 318.5,
  }),
  run('r-wed', '2026-10-14', {
    distance_m: 11_200,
    moving_s: 3300,
    trimp: 95.5,
    session_verdict: 'partly',
    pace_s_per_km: 294.6,
  }),
  run('r-thu', '2026-10-15', { distance_m: 9000, moving_s: 2700, session_verdict: 'as planned', pace_s_per_km: 300 }),
  run('r-fri', '2026-10-16', { distance_m: 5000, moving_s: 1600, trimp: 30, session_verdict: 'unplanned', pace_s_per_km: 290 }),
  run('r-prev', '2026-10-11', { distance_m: 99_000 }),
];

function input(over: Partial<WeekReviewInput> = {}): WeekReviewInput {
  return {
    start: START,
    dates: weekDates(START),
    plans: PLANS,
    runs: RUNS,
    previous_week_run_distance_m: 32_000,
    daily_loads_last_28_days: weeklyLoads([40, 40, 40, 40]),
    easy_pace_fastest_s_per_km: 310,
    today: AFTER,
    ...over,
  };
}

/** A week whose only runs add up to `metres` (split over two days). */
function weekOf(metres: number, previous: number | null): WeekReviewInput {
  return input({
    plans: [],
    runs: [run('a', '2026-10-13', { distance_m: metres / 2 }), run('b', '2026-10-16', { distance_m: metres / 2 })],
    previous_week_run_distance_m: previous,
  });
}

const codes = (i: WeekReviewInput) => summariseWeek(i).flags.map((f) => f.code);

describe('summariseWeek: the finished week', () => {
  const review = summariseWeek(input());

  it('puts each day’s plans and runs side by side and ignores other weeks', () => {
    expect(review.days.map((d) => d.date)).toEqual(weekDates(START));
    expect(review.days.map((d) => [d.plans.map((p) => p.id), d.runs.map((r) => r.id)])).toEqual([
      [['p-mon'], ['r-mon']],
      [[], []],
      [['p-wed'], ['r-wed']],
      [['p-thu'], ['r-thu']],
      [[], ['r-fri']],
      [['p-sat'], []],
      [['p-sun'], []],
    ]);
  });

  it('totals plan and run; the time-based plan is left out of the planned distance', () => {
    expect(review.totals).toEqual({
      planned_distance_m: 53_000, // 8 + 11 + 6 + 28 km; "45 min easy" has no distance
      plans_without_distance: 1,
      planned_duration_s: 2700,
      run_distance_m: 33_300,
      moving_s: 10_180,
      cross_training_s: 0,
      time_s: 10_180,
      sessions: { as_planned: 2, partly: 1, missed: 2, missed_with_reason: 0, unplanned: 1 }, // Sat and Sun missed
      sessions_due: 5, // the week is over: every plan of the week was due
      moving_s_on_timed_plans: 2700, // Thursday's run on "45 min easy" against its 2700 s
      goal_pace_s: 0,
      trimp: 185.5,
      runs_without_trimp: 1,
    });
  });

  it('counts as due only the sessions dated up to today, and adds up time at goal pace', () => {
    const midweek = summariseWeek(
      input({ today: '2026-10-15', runs: RUNS.map((r) => (r.id === 'r-wed' ? { ...r, goal_pace_s: 1500 } : r)) }),
    );
    expect(midweek.totals.sessions_due).toBe(3); // Mon, Wed, Thu; Sat and Sun are still ahead
    expect(midweek.totals.goal_pace_s).toBe(1500);
  });

  it('words the flags for the coach with the runner’s name', () => {
    const coach = summariseWeek(
      input({ previous_week_run_distance_m: 20_000, reader: { role: 'coach', runner_name: 'Ivy Calder' } }),
    );
    const messages = coach.flags.map((f) => f.message);
    expect(messages[0]).toMatch(/^Ivy Calder ran 33\.3 km this week, 67 % more/);
    expect(messages.join(' ')).not.toMatch(/\b(You|Your|your)\b/);
    expect(messages.join(' ')).toContain('As the coach, you have the last word');
  });

  it('names the longest run and its share of the week', () => {
    expect(review.long_run).toEqual({ run_id: 'r-wed', distance_m: 11_200, share_of_week: 11_200 / 33_300 });
  });

  it('computes the acute:chronic ratio on the week’s last day', () => {
    expect(review.acute_chronic_ratio).toMatchObject({ end_date: END, window: 'coupled', reason: null });
    expect(review.acute_chronic_ratio?.ratio).toBeCloseTo(1, 12);
  });

  it('flags the easy run run too fast and the missed long run, in that order', () => {
    expect(review.flags.map((f) => [f.code, f.plan_id, f.run_id])).toEqual([
      ['easy-too-fast', 'p-thu', 'r-thu'],
      ['long-run-missed', 'p-sun', undefined],
    ]);
    expect(review.flags[0]?.message).toContain('Thu 15 Oct ("45 min easy") averaged 5:00 /km');
    expect(review.flags[0]?.message).toContain('(5:10 /km)');
    expect(review.flags[1]?.message).toContain('The long run of 28.0 km planned for Sun 18 Oct ("Long run 28 km")');
  });
});

describe('summariseWeek: today inside the week', () => {
  it('counts only plans before today as missed, and flags no long run yet', () => {
    const review = summariseWeek(input({ today: '2026-10-17' }));
    expect(review.totals.sessions.missed).toBe(0); // Saturday is today, Sunday is to come
    expect(review.flags.map((f) => f.code)).toEqual(['easy-too-fast']);
    expect(review.acute_chronic_ratio?.end_date).toBe('2026-10-17');
  });

  it('counts a plan missed the day after', () => {
    const review = summariseWeek(input({ today: END }));
    expect(review.totals.sessions.missed).toBe(1);
    expect(codes(input({ today: END }))).not.toContain('long-run-missed');
  });

  it('has no ratio for a week that has not started', () => {
    expect(summariseWeek(input({ today: '2026-10-11' })).acute_chronic_ratio).toBeNull();
  });

  it('counts a run whose plan check says missed', () => {
    const runs = [run('x', '2026-10-12', { distance_m: 1000, session_verdict: 'missed' })];
    expect(summariseWeek(input({ runs, plans: [], today: '2026-10-13' })).totals.sessions.missed).toBe(1);
  });
});

describe('summariseWeek: volume-jump ("10 % rule", common practice; REFERENCES.md §8)', () => {
  it.each<[string, number, number | null, boolean]>([
    ['exactly 10 % (30 → 33 km) is not a jump', 33_000, 30_000, false],
    ['one metre over 10 % is', 33_001, 30_000, true],
    ['REFERENCES.md §8 compounding: 36.3 → 39.93 km is exactly 10 %', 39_930, 36_300, false],
    ['a smaller week', 20_000, 30_000, false],
    ['no previous week', 40_000, null, false],
    ['previous week of 0', 40_000, 0, false],
    ['Nielsen 2014’s > 30 % range is flagged too', 40_000, 30_000, true],
  ])('%s', (_label, metres, previous, flagged) => {
    expect(codes(weekOf(metres, previous)).includes('volume-jump')).toBe(flagged);
  });

  it('explains itself in km or miles', () => {
    const [km] = summariseWeek(weekOf(40_000, 30_000)).flags;
    expect(km?.message).toContain('You ran 40.0 km this week, 33 % more than the 30.0 km of the week before.');
    const [mi] = summariseWeek({ ...weekOf(40_000, 30_000), unit: 'mi' }).flags;
    expect(mi?.message).toContain('You ran 24.9 mi this week, 33 % more than the 18.6 mi');
  });
});

describe('summariseWeek: load-spike (Gabbett 2016, coupled ratio above 1.5)', () => {
  it.each<[string, number[], boolean]>([
    ['REFERENCES.md §8: 40, 40, 40, 40, 60 → 1.3333 coupled (1.50 uncoupled) is not a spike', [40, 40, 40, 40, 60], false],
    ['REFERENCES.md §8: 40, 40, 40, 40, 80 → 1.6 is', [40, 40, 40, 40, 80], true],
    ['exactly 1.5 (50, 50, 50, 90), from fractional daily loads, is not', [50, 50, 50, 90], false],
    ['just above 1.5 (50, 50, 50, 91) is', [50, 50, 50, 91], true],
    ['not enough history (3 weeks) gives no flag', [10, 10, 80], false],
  ])('%s', (_label, weekly, flagged) => {
    expect(codes(input({ daily_loads_last_28_days: weeklyLoads(weekly) })).includes('load-spike')).toBe(flagged);
  });

  it('says "not enough history" when there is less than 28 days', () => {
    const review = summariseWeek(input({ daily_loads_last_28_days: weeklyLoads([10, 10, 80]) }));
    expect(review.acute_chronic_ratio).toMatchObject({ ratio: null, reason: 'not enough history' });
  });

  it('explains itself as a description, not a prediction', () => {
    const flag = summariseWeek(input({ daily_loads_last_28_days: weeklyLoads([40, 40, 40, 80]) })).flags[0];
    expect(flag?.message).toContain('1.60 times the average week over the last 4 weeks');
    expect(flag?.message).toContain('not as a prediction');
  });
});

describe('summariseWeek: easy-too-fast', () => {
  const easy = plan('e', '2026-10-13', { easy_only: true, title: 'Easy 10 km' });
  const hard = plan('h', '2026-10-13', { title: 'Tempo' });
  it.each<[string, WeekPlan[], WeekRun, number | null, boolean]>([
    ['quicker than the fast end', [easy], run('r', '2026-10-13', { pace_s_per_km: 309 }), 310, true],
    ['at the fast end exactly', [easy], run('r', '2026-10-13', { pace_s_per_km: 310 }), 310, false],
    ['slower than the fast end', [easy], run('r', '2026-10-13', { pace_s_per_km: 340 }), 310, false],
    ['plan not easy-only', [hard], run('r', '2026-10-13', { pace_s_per_km: 250 }), 310, false],
    ['no plan that day', [], run('r', '2026-10-13', { pace_s_per_km: 250 }), 310, false],
    ['two plans that day, one not easy', [easy, hard], run('r', '2026-10-13', { pace_s_per_km: 250 }), 310, false],
    [
      'two plans, run linked to the easy one',
      [easy, hard],
      run('r', '2026-10-13', { pace_s_per_km: 250, plan_id: 'e' }),
      310,
      true,
    ],
    [
      'two plans, run linked to the hard one',
      [easy, hard],
      run('r', '2026-10-13', { pace_s_per_km: 250, plan_id: 'h' }),
      310,
      false,
    ],
    ['easy range unknown', [easy], run('r', '2026-10-13', { pace_s_per_km: 250 }), null, false],
    ['run pace unknown', [easy], run('r', '2026-10-13'), 310, false],
  ])('%s', (_label, plans, r, fastest, flagged) => {
    const i = input({ plans, runs: [r], easy_pace_fastest_s_per_km: fastest, previous_week_run_distance_m: null });
    expect(codes(i).includes('easy-too-fast')).toBe(flagged);
  });

  it('shows paces per mile when asked', () => {
    const i = input({ plans: [easy], runs: [run('r', '2026-10-13', { pace_s_per_km: 300 })], unit: 'mi' });
    expect(summariseWeek(i).flags[0]?.message).toContain(
      'averaged 8:03 /mi, quicker than the fast end of your easy range (8:19 /mi)',
    );
  });
});

describe('summariseWeek: long-run-missed', () => {
  const long = plan('l', '2026-10-18', { is_long_run: true, planned_duration_s: 6000, title: '100 min long' });
  it.each<[string, WeekRun[], string, boolean]>([
    ['no run that day, day passed', [], AFTER, true],
    ['run that day', [run('r', '2026-10-18', { distance_m: 20_000 })], AFTER, false],
    ['run the day before (moved)', [run('r', '2026-10-17', { distance_m: 20_000 })], AFTER, true],
    ['the day is today', [], END, false],
  ])('%s', (_label, runs, today, flagged) => {
    expect(codes(input({ plans: [long], runs, today })).includes('long-run-missed')).toBe(flagged);
  });

  it('leaves out the distance for a time-based long run', () => {
    const flag = summariseWeek(input({ plans: [long], runs: [] })).flags.at(-1);
    expect(flag?.message).toContain('The long run planned for Sun 18 Oct ("100 min long")');
  });
});

describe('summariseWeek: every flag explains itself and defers to the coach', () => {
  const review = summariseWeek(
    input({ previous_week_run_distance_m: 20_000, daily_loads_last_28_days: weeklyLoads([40, 40, 40, 80]) }),
  );
  it('raises all four here', () => {
    expect(review.flags.map((f) => f.code)).toEqual(['volume-jump', 'load-spike', 'easy-too-fast', 'long-run-missed']);
  });
  it.each([
    ['volume-jump', /'10 % rule'.*no published source/],
    ['load-spike', /Gabbett.*2016.*Br J Sports Med 50:273–280/],
    ['easy-too-fast', /12–30 % more time per km than marathon effort.*Daniels & Gilbert.*our own choice/],
    ['long-run-missed', /plan/],
  ])('%s names its source and ends with the coach', (code, source) => {
    const flag = review.flags.find((f) => f.code === code);
    expect(flag?.source).toMatch(source);
    expect(flag?.message).toMatch(/[Yy]our coach[^.]*\.$/);
  });
});

describe('summariseWeek: edge cases and invalid input', () => {
  it('an empty week has zero totals, no long run and no flags', () => {
    const review = summariseWeek(input({ plans: [], runs: [], previous_week_run_distance_m: 0 }));
    expect(review.totals).toMatchObject({ planned_distance_m: 0, run_distance_m: 0, trimp: null, runs_without_trimp: 0 });
    expect(review.long_run).toBeNull();
    expect(review.flags).toEqual([]);
  });

  it.each<[string, Partial<WeekReviewInput>]>([
    ['dates from another start', { dates: weekDates('2026-10-13') }],
    ['six dates', { dates: weekDates(START).slice(0, 6) }],
    ['invalid start', { start: '2026-10-32' }],
    ['invalid today', { today: '18/10/2026' }],
  ])('%s throws RangeError', (_label, over) => {
    expect(() => summariseWeek(input(over))).toThrow(RangeError);
  });
});

describe('longRunPlanId and isLongRunPlan (90 min or 25 % of the week, common practice)', () => {
  const d = (id: string, date: string, km: number) => plan(id, date, { planned_distance_m: km * 1000 });
  const m = (id: string, date: string, min: number) => plan(id, date, { planned_duration_s: min * 60 });
  it.each<[string, WeekPlan[], string | null]>([
    ['the fixture week: 28 of 53 km', PLANS.slice(0, 5), 'p-sun'],
    [
      'exactly 25 % of the week',
      [
        d('a', '2026-10-12', 25),
        d('b', '2026-10-13', 20),
        d('c', '2026-10-14', 20),
        d('e', '2026-10-15', 20),
        d('f', '2026-10-16', 15),
      ],
      'a',
    ],
    [
      'just under 25 %',
      [
        d('a', '2026-10-12', 24.999),
        d('b', '2026-10-13', 20),
        d('c', '2026-10-14', 20),
        d('e', '2026-10-15', 20),
        d('f', '2026-10-16', 15.001),
      ],
      null,
    ],
    ['exactly 90 min', [m('a', '2026-10-12', 45), m('b', '2026-10-18', 90)], 'b'],
    ['89 min, no distances', [m('a', '2026-10-12', 45), m('b', '2026-10-18', 89)], null],
    ['90 min outranks a longer share by distance', [m('a', '2026-10-14', 95), d('b', '2026-10-18', 30)], 'a'],
    ['89 min falls back to distance', [m('a', '2026-10-14', 89), d('b', '2026-10-18', 30)], 'b'],
    ['a tie goes to the earlier date', [d('late', '2026-10-18', 10), d('early', '2026-10-12', 10)], 'early'],
    ['one plan in the week is 100 % of it', [d('a', '2026-10-15', 5)], 'a'],
    ['no plans', [], null],
    ['plans with no amounts', [plan('a', '2026-10-12'), plan('b', '2026-10-13', { planned_distance_m: 0 })], null],
  ])('%s → %s', (_label, plans, expected) => {
    expect(longRunPlanId(plans)).toBe(expected);
  });

  it('isLongRunPlan answers for one plan of the week', () => {
    const week = PLANS.slice(0, 5);
    expect(week.map((p) => isLongRunPlan(p, week))).toEqual([false, false, false, false, true]);
  });
});
