import { describe, expect, it } from 'vitest';
import {
  CreatePlanInputSchema,
  ParsePlanInputSchema,
  PlanItemsSchema,
  PlanSchema,
  UpdatePlanInputSchema,
} from '../../../../shared/plans/schemas.ts';
import type { Part, PlanItem } from '../../../../shared/plans/types.ts';

const REP: Part = {
  type: 'part',
  kind: 'rep',
  amount: { type: 'distance', distance_m: 800, unit: 'm' },
  target: { type: 'pace', fast_s_per_km: 218.75, slow_s_per_km: 225, per: 'rep' },
};
const JOG: Part = {
  type: 'part',
  kind: 'recovery jog',
  amount: { type: 'distance', distance_m: 400, unit: 'm' },
  target: { type: 'effort' },
};
const EASY: Part = { type: 'part', kind: 'easy', amount: { type: 'duration', duration_s: 2700 }, target: { type: 'effort' } };

function withPart(patch: Partial<Part>): PlanItem[] {
  return [{ ...REP, ...patch }];
}

function messages(result: { error?: { issues: { message: string }[] } }): string[] {
  return result.error?.issues.map((i) => i.message) ?? [];
}

describe('CreatePlanInputSchema', () => {
  it.each<[string, unknown]>([
    ['shorthand text', { date: '2026-10-03', text: '45 min easy' }],
    ['parts', { date: '2026-10-03', title: 'Long run', parts: [EASY] }],
    ['a repeat', { date: '2026-10-03', parts: [{ type: 'repeat', count: 6, parts: [REP, JOG] }] }],
    ['a runner id from a coach', { date: '2026-10-03', text: '45 min easy', runner_id: '3f2b8c1e-4a5d-4e6f-8a9b-0c1d2e3f4a5b' }],
    ['the first day of 1900', { date: '1900-01-01', text: '45 min easy' }],
    ['the last day of 2100', { date: '2100-12-31', text: '45 min easy' }],
  ])('accepts %s', (_name, input) => {
    expect(CreatePlanInputSchema.safeParse(input).error?.issues).toBeUndefined();
  });

  it.each<[string, unknown, string]>([
    [
      'a plan dated in year 10000',
      { date: '10000-01-01', text: '45 min easy' },
      'Pick a date between 1 January 1900 and 31 December 2100.',
    ],
    [
      'a plan dated in 2101',
      { date: '2101-01-01', text: '45 min easy' },
      'Pick a date between 1 January 1900 and 31 December 2100.',
    ],
    [
      'a plan dated in 1899',
      { date: '1899-12-31', text: '45 min easy' },
      'Pick a date between 1 January 1900 and 31 December 2100.',
    ],
    ['a day that does not exist', { date: '2026-02-30', text: '45 min easy' }, 'Use a date like 2026-10-03.'],
    ['no date', { text: '45 min easy' }, 'Use a date like 2026-10-03.'],
    ['neither text nor parts', { date: '2026-10-03' }, "Write the session, e.g. '45 min easy'."],
    ['both text and parts', { date: '2026-10-03', text: '45 min easy', parts: [EASY] }, 'not both'],
    ['shorthand with a mistake', { date: '2026-10-03', text: '6 x @ 3:00' }, "found '@'"],
    ['an empty parts list', { date: '2026-10-03', parts: [] }, 'at least one part'],
    ['a bad runner id', { date: '2026-10-03', text: '45 min easy', runner_id: '42' }, 'Not a runner id.'],
    ['a long title', { date: '2026-10-03', text: '45 min easy', title: 'x'.repeat(121) }, 'under 120 characters'],
    ['an unknown field', { date: '2026-10-03', text: '45 min easy', owner: 'me' }, ''],
  ])('refuses %s', (_name, input, message) => {
    const result = CreatePlanInputSchema.safeParse(input);
    expect(result.success).toBe(false);
    expect(messages(result).some((m) => m.includes(message))).toBe(true);
  });

  it('carries the position and expectation of a shorthand mistake in the issue params', () => {
    const issue = CreatePlanInputSchema.safeParse({ date: '2026-10-03', text: '8 mi @ 7:65/mi' }).error?.issues[0];
    expect(issue).toMatchObject({ path: ['text'], params: { position: 7, expected: "a time like '7:05' or '1:05:00'" } });
  });
});

describe('PlanItemsSchema guard rails', () => {
  const NINETY_NINE = Array.from({ length: 99 }, () => JOG);

  it.each<[string, unknown, string]>([
    ['99 repeats of 99 parts', [{ type: 'repeat', count: 99, parts: NINETY_NINE }], 'A repeat is done 1 to 50 times.'],
    [
      '3 repeats of 99 parts',
      [{ type: 'repeat', count: 3, parts: NINETY_NINE }],
      'With its repeats unrolled this plan has 297 parts; a session plan has at most 200.',
    ],
    ['51 items', Array.from({ length: 51 }, () => EASY), 'at most 50 parts and repeats'],
    ['a repeat of 0', [{ type: 'repeat', count: 0, parts: [REP] }], 'A repeat is done 1 to 50 times.'],
    ['an empty repeat', [{ type: 'repeat', count: 3, parts: [] }], 'A repeat needs at least one part.'],
    ['a nested repeat', [{ type: 'repeat', count: 2, parts: [{ type: 'repeat', count: 2, parts: [REP] }] }], ''],
    [
      'a pace of 0:00',
      withPart({ target: { type: 'pace', fast_s_per_km: 0, slow_s_per_km: 0, per: 'km' } }),
      'A pace must be more than 0:00.',
    ],
    [
      'a pace of 1:00/km',
      withPart({ target: { type: 'pace', fast_s_per_km: 60, slow_s_per_km: 60, per: 'km' } }),
      'between 1:30 and 20:00 per km',
    ],
    [
      'a pace of 25:00/km',
      withPart({ target: { type: 'pace', fast_s_per_km: 300, slow_s_per_km: 1500, per: 'km' } }),
      'between 1:30 and 20:00 per km',
    ],
    [
      'a range written slow-fast',
      withPart({ target: { type: 'pace', fast_s_per_km: 300, slow_s_per_km: 290, per: 'km' } }),
      'fast-slow',
    ],
    ['a rep pace on a timed part', withPart({ amount: { type: 'duration', duration_s: 60 } }), 'needs a distance'],
    ['a distance of 0', withPart({ amount: { type: 'distance', distance_m: 0, unit: 'm' } }), 'at least 1 m'],
    ['a distance over 250 km', withPart({ amount: { type: 'distance', distance_m: 250_001, unit: 'km' } }), 'at most 250 km'],
    ['a duration over 24 h', [{ ...EASY, amount: { type: 'duration', duration_s: 86_401 } }], 'at most 24 h'],
    ['a fractional duration', [{ ...EASY, amount: { type: 'duration', duration_s: 60.5 } }], 'whole seconds'],
    ['a heart rate of 20', [{ ...EASY, target: { type: 'heart_rate', low_bpm: 20, high_bpm: 150 } }], 'from 30 to 240 bpm'],
    ['a heart-rate range high-low', [{ ...EASY, target: { type: 'heart_rate', low_bpm: 160, high_bpm: 150 } }], 'low-high'],
    [
      'an offset of 0',
      [{ ...EASY, target: { type: 'relative', ref: 'MP', offset: { s_per_km: 0, per: 'mi' } } }],
      'Leave out an offset of 0.',
    ],
    ['an unknown race pace', [{ ...EASY, target: { type: 'relative', ref: 'marathon' } }], 'goal, MP, HMP, 10K or 5K'],
    ['an unknown kind', [{ ...EASY, kind: 'fartlek' }], 'A part kind is one of'],
    ['an unknown unit', withPart({ amount: { type: 'distance', distance_m: 800, unit: 'yd' as 'm' } }), 'mi, km or m'],
  ])('refuses %s', (_name, items, message) => {
    const result = PlanItemsSchema.safeParse(items);
    expect(result.success).toBe(false);
    expect(messages(result).some((m) => m.includes(message))).toBe(true);
  });

  it('accepts 50 rounds of 4 parts (200 unrolled) and a race pace with an offset', () => {
    expect(PlanItemsSchema.safeParse([{ type: 'repeat', count: 50, parts: [REP, JOG, REP, JOG] }]).success).toBe(true);
    const mp: PlanItem = { ...EASY, target: { type: 'relative', ref: 'MP', offset: { s_per_km: 6.2137, per: 'mi' } } };
    expect(PlanItemsSchema.safeParse([mp]).success).toBe(true);
  });
});

describe('UpdatePlanInputSchema', () => {
  it.each<[string, unknown, boolean]>([
    ['a move to another day', { date: '2026-10-04' }, true],
    ['a new title', { title: 'Long run' }, true],
    ['new shorthand', { text: '10 mi easy' }, true],
    ['new parts', { parts: [EASY] }, true],
    ['nothing', {}, false],
    ['text and parts', { text: '10 mi easy', parts: [EASY] }, false],
    ['a date in year 10000', { date: '10000-01-01' }, false],
    ['a new runner', { runner_id: '3f2b8c1e-4a5d-4e6f-8a9b-0c1d2e3f4a5b' }, false],
  ])('%s → %s', (_name, input, ok) => {
    expect(UpdatePlanInputSchema.safeParse(input).success).toBe(ok);
  });
});

describe('ParsePlanInputSchema and PlanSchema', () => {
  it('takes {text} for the parse endpoint', () => {
    expect(ParsePlanInputSchema.safeParse({ text: '45 min easy' }).success).toBe(true);
    expect(ParsePlanInputSchema.safeParse({}).success).toBe(false);
  });

  it('describes a stored plan', () => {
    const plan = {
      id: 'p1',
      date: '2026-10-03',
      title: '',
      notes: '',
      text: '6 x 800 m @ 2:55-3:00 w/ 400 m jog',
      parts: [{ type: 'repeat', count: 6, parts: [REP, JOG] }],
      runner_id: 'r1',
      author_id: null,
      author_name: null,
      updated_at: '2026-10-01T08:00:00.000Z',
      updated_by_name: 'Dana Whitlock',
      created_at: '2026-10-01T07:00:00.000Z',
    };
    expect(PlanSchema.parse(plan)).toStrictEqual(plan);
    // Every plan answer says who wrote it and who changed it last (api-contract.md, "Coach prescribes").
    const { updated_by_name: _, ...withoutEditor } = plan;
    expect(PlanSchema.safeParse(withoutEditor).success).toBe(false);
  });
});
