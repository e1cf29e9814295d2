/**
 * Every field the server sends for a day and a run of the week review is shown: the test walks the shared
 * schema (shared/weeks/week-answer.ts), so a field added there without a rendering (or a stated reason not
 * to show it) fails here. The week is rendered with React's server renderer, no browser needed.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { RunnerWeekSchema, WeekDayRunSchema, WeekPlanSchema } from '../../../shared/weeks/week-answer.ts';
import { WeekDays } from '../../../client/features/squad/components/week-days.tsx';

const RUN_ID = '11111111-1111-4111-8111-111111111111';
const COACH_ID = '22222222-2222-4222-8222-222222222222';
const RUNNER_ID = '33333333-3333-4333-8333-333333333333';

const run = {
  id: RUN_ID,
  name: 'Harbour loop long run',
  started_at: '2026-11-28T13:05:00.000Z',
  local_date: '2026-11-28',
  local_time: '07:05',
  time_zone: 'America/Chicago',
  distance_m: 29_000,
  elapsed_s: 9300,
  moving_s: 9120,
  pace_s_per_km: 9120 / 29,
  ascent_m: 120,
  avg_hr: 148,
  kind: 'run',
  date: '2026-11-28',
  trimp: 187.4,
  session_verdict: 'partly',
  plan_id: '44444444-4444-4444-8444-444444444444',
  goal_pace_s: 2400,
  verdict_reason: 'goal-pace part +65 s/mi slow',
  reps_line: '6 reps: 3:12 3:10 /km · avg 3:11 · first→last −2 s',
  fuel_taken: {
    entries: 3,
    carbohydrate_g: 75,
    fluid_ml: 650,
    sodium_mg: 410,
    caffeine_mg: 40,
    planned: { carbohydrate_g: 90, fluid_ml: 700, sodium_mg: 500, caffeine_mg: 0 },
    stomach: 2,
    energy: 3,
    notes: 'Second gel sat heavy.',
  },
  checkin: {
    run_id: RUN_ID,
    sleep_hours: 6.5,
    soreness: 4,
    mood: 2,
    walking_minutes: 25,
    mobility_minutes: 15,
    cold_water_temp_c: 12,
    cold_water_minutes: 8,
    notes: 'Left calf tight on the stairs.',
    updated_at: '2026-11-28T18:00:00.000Z',
  },
  notes: [
    {
      id: '55555555-5555-4555-8555-555555555555',
      text: 'Calf felt tight from mile 14.',
      created_at: '2026-11-28T17:00:00.000Z',
      author: { id: RUNNER_ID, name: 'Ivy Calder', role: 'runner' },
      concern: 'pain',
      unread: true,
    },
  ],
};

const plan = {
  id: '44444444-4444-4444-8444-444444444444',
  date: '2026-11-28',
  title: 'Long run with goal-pace block',
  planned_distance_m: 29_000,
  planned_duration_s: 1800,
  is_long_run: true,
  easy_only: true,
};

const week = RunnerWeekSchema.parse({
  runner_id: RUNNER_ID,
  runner: { id: RUNNER_ID, name: 'Ivy Calder' },
  start: '2026-11-23',
  end: '2026-11-29',
  today: '2026-11-30',
  time_zone: 'America/Chicago',
  week_starts_on: 1,
  days: ['2026-11-23', '2026-11-24', '2026-11-25', '2026-11-26', '2026-11-27', '2026-11-28', '2026-11-29'].map((date) => ({
    date,
    plans: date === plan.date ? [plan] : [],
    runs: date === run.date ? [run] : [],
    unread_notes: date === run.date ? 1 : 0,
    day_marks: date === '2026-11-26' ? [{ date, kind: 'cross-training', minutes: 45, note: 'Pool running' }] : [],
  })),
  missed_plans: [],
  totals: {
    planned_distance_m: 29_000,
    plans_without_distance: 0,
    planned_duration_s: 1800,
    run_distance_m: 29_000,
    moving_s: 9120,
    cross_training_s: 2700,
    time_s: 11_820,
    sessions: { as_planned: 0, partly: 1, missed: 0, missed_with_reason: 0, unplanned: 0 },
    sessions_due: 1,
    moving_s_on_timed_plans: 0,
    goal_pace_s: 2400,
    trimp: 187.4,
    runs_without_trimp: 0,
  },
  long_run: { run_id: RUN_ID, distance_m: 29_000, share_of_week: 1 },
  acute_chronic_ratio: null,
  flags: [],
  trend: [],
  last_upload: null,
  reviewed_by: [],
  notes: [],
  unread_notes: 1,
});

/**
 * What each field looks like on the page (in km, as the reader's unit here), or why it is not shown.
 * A string is searched for in the rendered HTML; `{ hidden }` states the reason the field is not shown.
 */
type Shown = string | { hidden: string };
const RUN_FIELDS: Record<string, Shown> = {
  id: { hidden: 'used in the link to the run' },
  name: 'Harbour loop long run',
  started_at: { hidden: 'the local time is shown instead' },
  local_date: { hidden: 'the day row is the date' },
  local_time: '07:05',
  time_zone: { hidden: 'named only when the reader’s clock reads the start otherwise (client/README.md)' },
  distance_m: '29.00 km',
  elapsed_s: { hidden: 'moving time is the week’s measure; the run page shows clock time' },
  moving_s: '2:32:00 moving',
  pace_s_per_km: '5:14 /km',
  ascent_m: { hidden: 'on the run page' },
  avg_hr: '♥ 148',
  kind: { hidden: 'always a run here: rides and hikes are kept out of the week review (issue #14)' },
  date: { hidden: 'the day row is the date' },
  trimp: 'TRIMP 187',
  session_verdict: 'partly',
  plan_id: { hidden: 'which plan is shown by the day row' },
  goal_pace_s: '40:00 at goal pace',
  verdict_reason: 'goal-pace part +65 s/mi slow',
  reps_line: '6 reps: 3:12 3:10 /km · avg 3:11 · first→last −2 s',
  'fuel_taken.entries': '3 entries',
  'fuel_taken.carbohydrate_g': '75 g carbs',
  'fuel_taken.fluid_ml': '650 ml',
  'fuel_taken.sodium_mg': '410 mg sodium',
  'fuel_taken.caffeine_mg': '40 mg caffeine',
  'fuel_taken.planned.carbohydrate_g': 'planned 90 g',
  'fuel_taken.planned.fluid_ml': '700 ml',
  'fuel_taken.planned.sodium_mg': '500 mg)',
  'fuel_taken.planned.caffeine_mg': { hidden: 'planned caffeine is on the run’s fuel card' },
  'fuel_taken.stomach': 'stomach 2/5',
  'fuel_taken.energy': 'energy 3/5',
  'fuel_taken.notes': 'Second gel sat heavy.',
  'checkin.run_id': { hidden: 'the run it belongs to' },
  'checkin.sleep_hours': 'sleep 6.5 h',
  'checkin.soreness': 'soreness 4/5',
  'checkin.mood': 'mood 2/5',
  'checkin.walking_minutes': 'walking 25 min',
  'checkin.mobility_minutes': 'mobility 15 min',
  'checkin.cold_water_temp_c': 'cold water 12 °C',
  'checkin.cold_water_minutes': 'for 8 min',
  'checkin.notes': 'Left calf tight on the stairs.',
  // On the runner's clock (their profile zone, America/Chicago): 18:00 UTC is 12:00 there.
  'checkin.updated_at': '>28 Nov 2026, 12:00</time>',
  'notes.id': { hidden: 'marks the note read' },
  'notes.text': 'Calf felt tight from mile 14.',
  'notes.created_at': '>28 Nov 2026, 11:00</time>',
  'notes.author.id': { hidden: 'tells "You" from the other side' },
  'notes.author.name': 'Ivy Calder',
  'notes.author.role': { hidden: 'the name says who wrote it' },
  'notes.concern': 'about pain',
  'notes.unread': 'data-unread="true"',
};
const PLAN_FIELDS: Record<string, Shown> = {
  id: { hidden: 'a key only' },
  date: { hidden: 'the day row is the date' },
  title: 'Long run with goal-pace block',
  planned_distance_m: '29.0 km',
  planned_duration_s: '30 min',
  is_long_run: 'long run',
  easy_only: ' · easy',
};

/** Every leaf of an object schema as a dotted path (arrays and nullable objects are walked into). */
function leafPaths(schema: z.ZodType, prefix = ''): string[] {
  let inner: z.ZodType = schema;
  while (inner instanceof z.ZodNullable || inner instanceof z.ZodOptional) inner = inner.unwrap() as z.ZodType;
  if (inner instanceof z.ZodArray) return leafPaths(inner.element as z.ZodType, prefix);
  if (inner instanceof z.ZodObject) {
    return Object.entries(inner.shape as Record<string, z.ZodType>).flatMap(([key, child]) =>
      leafPaths(child, prefix ? `${prefix}.${key}` : key),
    );
  }
  return [prefix];
}

const html = renderToStaticMarkup(
  createElement(
    QueryClientProvider,
    { client: new QueryClient() },
    createElement(
      MemoryRouter,
      null,
      createElement(WeekDays, {
        week,
        unit: 'km',
        meId: COACH_ID,
        // The days card names the runner's clock once (week-review.tsx); its lines then show bare times.
        clock: { timeZone: week.time_zone, viewerIsRunner: false, named: true },
      }),
    ),
  ),
);

describe('the week review shows every field the server sends', () => {
  it.each(leafPaths(WeekDayRunSchema))('run field %s', (path) => {
    const shown = RUN_FIELDS[path];
    expect(shown, `${path} is sent by the server but neither rendered nor explained in RUN_FIELDS`).toBeDefined();
    if (typeof shown === 'string') expect(html).toContain(shown);
  });

  it.each(leafPaths(WeekPlanSchema))('plan field %s', (path) => {
    const shown = PLAN_FIELDS[path];
    expect(shown, `${path} is sent by the server but neither rendered nor explained in PLAN_FIELDS`).toBeDefined();
    if (typeof shown === 'string') expect(html).toContain(shown);
  });

  it('shows a marked day: its kind, minutes and note', () => {
    expect(html).toContain('Cross-training');
    expect(html).toContain('45 min');
    expect(html).toContain('Pool running');
  });

  it('marks the day that has an unread note', () => {
    expect(html).toContain('1 new');
  });
});
