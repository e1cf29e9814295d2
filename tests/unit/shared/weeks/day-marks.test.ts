import { describe, expect, it } from 'vitest';
import { crossTrainingSeconds, missedLabel, missedReasonOf, type WeekDayMark } from '../../../../shared/weeks/day-marks.ts';
import { summariseWeek, type WeekPlan, type WeekRun } from '../../../../shared/weeks/week-review.ts';
import { weekDates } from '../../../../shared/weeks/weeks.ts';

// Week totals with days that are not runs (issue 15). Figures are hand-computed: 45 min of
// cross-training is 2 700 s; a run of 10 km in 3 000 s moving.

const START = '2026-12-07'; // Monday
const AFTER = '2026-12-14';

const mark = (date: string, kind: WeekDayMark['kind'], minutes: number | null = null): WeekDayMark => ({
  date,
  kind,
  minutes,
  note: '',
});
const plan = (id: string, date: string, over: Partial<WeekPlan> = {}): WeekPlan => ({
  id,
  date,
  title: id,
  planned_distance_m: 8000,
  planned_duration_s: null,
  is_long_run: false,
  easy_only: true,
  ...over,
});
const run = (id: string, date: string, distance_m: number, moving_s: number): WeekRun => ({
  id,
  date,
  distance_m,
  moving_s,
  trimp: null,
  session_verdict: 'as planned',
  pace_s_per_km: moving_s / (distance_m / 1000),
});

function week(plans: WeekPlan[], runs: WeekRun[], marks: WeekDayMark[]) {
  return summariseWeek({
    start: START,
    dates: weekDates(START),
    plans,
    runs,
    previous_week_run_distance_m: null,
    daily_loads_last_28_days: [],
    easy_pace_fastest_s_per_km: null,
    today: AFTER,
    day_marks: marks,
  });
}

describe('crossTrainingSeconds', () => {
  it.each([
    [[], 0],
    [[mark('2026-12-08', 'cross-training', 45)], 2700],
    [[mark('2026-12-08', 'cross-training', 45), mark('2026-12-09', 'cross-training', 30)], 4500],
    [[mark('2026-12-08', 'rest'), mark('2026-12-09', 'ill')], 0],
    [[mark('2026-12-08', 'cross-training', -5), mark('2026-12-09', 'cross-training', Number.NaN)], 0],
  ])('%j → %i s', (marks, seconds) => {
    expect(crossTrainingSeconds(marks)).toBe(seconds);
  });
});

describe('missedReasonOf and missedLabel', () => {
  it('names the mark of the day, or null for an unmarked day', () => {
    const marks = [mark('2026-12-08', 'ill'), mark('2026-12-09', 'rest')];
    expect(missedReasonOf('2026-12-08', marks)).toBe('ill');
    expect(missedReasonOf('2026-12-10', marks)).toBeNull();
    expect(missedLabel('ill')).toBe('missed — ill');
    expect(missedLabel('injured')).toBe('missed — injured');
    expect(missedLabel('rest')).toBe('missed — rest day');
    expect(missedLabel(null)).toBe('missed');
  });
});

describe('summariseWeek with day marks', () => {
  it('a session planned on a day marked ill is "missed — ill", not a plain miss', () => {
    const review = week([plan('p-tue', '2026-12-08'), plan('p-thu', '2026-12-10')], [], [mark('2026-12-08', 'ill')]);
    expect(review.totals.sessions.missed).toBe(1); // Thursday: nothing marked
    expect(review.totals.sessions.missed_with_reason).toBe(1); // Tuesday: ill
    expect(review.missed_plans).toEqual([
      { plan_id: 'p-tue', date: '2026-12-08', reason: 'ill' },
      { plan_id: 'p-thu', date: '2026-12-10', reason: null },
    ]);
    expect(review.days[1]!.day_marks).toEqual([mark('2026-12-08', 'ill')]);
  });

  it('cross-training adds its minutes to the week’s time but nothing to its running distance', () => {
    const review = week([], [run('r', '2026-12-07', 10_000, 3000)], [mark('2026-12-09', 'cross-training', 45)]);
    expect(review.totals.run_distance_m).toBe(10_000);
    expect(review.totals.moving_s).toBe(3000);
    expect(review.totals.cross_training_s).toBe(2700);
    expect(review.totals.time_s).toBe(5700);
  });

  it('rest and injured days add no time; a missed long run on an injured day says so in its flag', () => {
    const review = week(
      [plan('long', '2026-12-13', { planned_distance_m: 30_000, is_long_run: true })],
      [],
      [mark('2026-12-13', 'injured'), mark('2026-12-12', 'rest')],
    );
    expect(review.totals.time_s).toBe(0);
    expect(review.totals.sessions).toMatchObject({ missed: 0, missed_with_reason: 1 });
    const flag = review.flags.find((f) => f.code === 'long-run-missed');
    expect(flag?.message).toContain('The day is marked injured.');
  });

  it('marks outside the week are ignored; no marks leaves the totals as before', () => {
    const outside = week([plan('p', '2026-12-08')], [], [mark('2026-12-20', 'ill'), mark('2026-12-01', 'cross-training', 60)]);
    expect(outside.totals.sessions).toMatchObject({ missed: 1, missed_with_reason: 0 });
    expect(outside.totals.cross_training_s).toBe(0);
  });
});
