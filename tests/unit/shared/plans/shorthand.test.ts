import { describe, expect, it } from 'vitest';
import { formatShorthand, normaliseItems, parseShorthand } from '../../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../../shared/plans/types.ts';
import { PlanItemsSchema } from '../../../../shared/plans/schemas.ts';

const MILE = 1609.344; // metres, exact by definition (international yard and pound agreement, 1959)

function parsed(text: string): PlanItem[] {
  const result = parseShorthand(text);
  if (!result.ok) throw new Error(`expected '${text}' to parse: ${result.error.message} at ${result.error.position}`);
  return result.items;
}

describe('parseShorthand: the issue examples', () => {
  it('2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down', () => {
    // 2:55 for 800 m = 175 s / 0.8 km = 218.75 s/km; 3:00 for 800 m = 180 s / 0.8 km = 225 s/km.
    expect(parsed('2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down')).toStrictEqual([
      {
        type: 'part',
        kind: 'warm-up',
        amount: { type: 'distance', distance_m: 2 * MILE, unit: 'mi' },
        target: { type: 'effort' },
      },
      {
        type: 'repeat',
        count: 6,
        parts: [
          {
            type: 'part',
            kind: 'rep',
            amount: { type: 'distance', distance_m: 800, unit: 'm' },
            target: { type: 'pace', fast_s_per_km: 218.75, slow_s_per_km: 225, per: 'rep' },
          },
          {
            type: 'part',
            kind: 'recovery jog',
            amount: { type: 'distance', distance_m: 400, unit: 'm' },
            target: { type: 'effort' },
          },
        ],
      },
      {
        type: 'part',
        kind: 'cool-down',
        amount: { type: 'distance', distance_m: 2 * MILE, unit: 'mi' },
        target: { type: 'effort' },
      },
    ]);
  });

  it('10 mi easy, 8 mi @ 7:05/mi, 2 mi @ 6:55/mi, 1 mi cool-down', () => {
    const items = parsed('10 mi easy, 8 mi @ 7:05/mi, 2 mi @ 6:55/mi, 1 mi cool-down');
    // 7:05/mi = 425 s per 1609.344 m = 425 × 1000 / 1609.344 = 264.0827… s/km (4:24.1/km);
    // 6:55/mi = 415 s per mile = 415 × 1000 / 1609.344 = 257.8690… s/km (4:17.9/km).
    expect(items).toStrictEqual([
      { type: 'part', kind: 'easy', amount: { type: 'distance', distance_m: 10 * MILE, unit: 'mi' }, target: { type: 'effort' } },
      {
        type: 'part',
        kind: 'steady',
        amount: { type: 'distance', distance_m: 8 * MILE, unit: 'mi' },
        target: { type: 'pace', fast_s_per_km: (425 * 1000) / MILE, slow_s_per_km: (425 * 1000) / MILE, per: 'mi' },
      },
      {
        type: 'part',
        kind: 'steady',
        amount: { type: 'distance', distance_m: 2 * MILE, unit: 'mi' },
        target: { type: 'pace', fast_s_per_km: (415 * 1000) / MILE, slow_s_per_km: (415 * 1000) / MILE, per: 'mi' },
      },
      { type: 'part', kind: 'cool-down', amount: { type: 'distance', distance_m: MILE, unit: 'mi' }, target: { type: 'effort' } },
    ]);
    const second = items[1];
    expect(second?.type === 'part' && second.target.type === 'pace' && second.target.fast_s_per_km).toBeCloseTo(264.0828, 4);
  });

  it('45 min easy', () => {
    expect(parsed('45 min easy')).toStrictEqual([
      { type: 'part', kind: 'easy', amount: { type: 'duration', duration_s: 2700 }, target: { type: 'effort' } },
    ]);
  });

  it.each([
    '2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down',
    '10 mi easy, 8 mi @ 7:05/mi, 2 mi @ 6:55/mi, 1 mi cool-down',
    '45 min easy',
  ])('formats "%s" back exactly as written, and formatting is idempotent', (text) => {
    const once = formatShorthand(parsed(text));
    expect(once).toBe(text);
    expect(formatShorthand(parsed(once))).toBe(once);
  });

  it('gives items that pass the API schema', () => {
    expect(PlanItemsSchema.safeParse(parsed('2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down')).success).toBe(
      true,
    );
  });
});

describe('parseShorthand: variants, shown by their canonical form', () => {
  it.each<[string, string]>([
    ['2 mi wu, 6 x 800m @ 2:55-3:00 w/ 400m jog, 2 mi cd', '2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down'],
    ['2 MI Warm Up, 2 mi cool down', '2 mi warm-up, 2 mi cool-down'],
    ['6 × 800 m @ 2:55–3:00 with 400 m recovery jog', '6 x 800 m @ 2:55-3:00 w/ 400 m jog'],
    ['6x(800m@2:55-3:00,400m jog)', '6 x 800 m @ 2:55-3:00 w/ 400 m jog'],
    ['4 x (1 km @ 3:40/km, 200 m jog, 200 m @ 0:36)', '4 x (1 km @ 3:40/km, 200 m jog, 200 m @ 0:36)'],
    ['3 x (1 mi @ 5:50/mi) w/ 90 sec jog', '3 x 1 mi @ 5:50/mi w/ 90 s jog'],
    ['6 x 20 s strides', '6 x 20 s strides'],
    ['6 x 20s strides w/ 40s jog', '6 x 20 s strides w/ 40 s jog'],
    ['10 miles easy', '10 mi easy'],
    ['10 mi', '10 mi easy'],
    ['10k easy', '10 km easy'],
    ['1.5 h easy', '90 min easy'],
    ['1 hr 30 min steady', '90 min steady'],
    ['1 h 5 min 30 s easy', '65 min 30 s easy'],
    ['2 h easy', '2 h easy'],
    ['90 s easy', '90 s easy'],
    ['20 min tempo @ 6:10/mi', '20 min tempo @ 6:10/mi'],
    ['5 km tempo at 3:50-3:55/km', '5 km tempo @ 3:50-3:55/km'],
    ['8 mi @ 7:05/mile', '8 mi @ 7:05/mi'],
    ['8 mi @ 7:05-7:05/mi', '8 mi @ 7:05/mi'],
    ['8 mi @ MP', '8 mi @ MP'],
    ['8 mi @ mp', '8 mi @ MP'],
    ['8 mi goal pace @ goal', '8 mi @ goal'],
    ['3 mi @ goal pace', '3 mi @ goal'],
    ['8 mi tempo @ MP', '8 mi tempo @ MP'],
    ['6 mi @ HMP', '6 mi @ HMP'],
    ['3 mi @ 10K pace', '3 mi @ 10K'],
    ['5 x 1 km @ 5k w/ 400 m jog', '5 x 1 km @ 5K w/ 400 m jog'],
    ['8 mi @ MP+10s/mi', '8 mi @ MP+10s/mi'],
    ['8 mi @ MP + 10 sec/mi', '8 mi @ MP+10s/mi'],
    ['4 mi @ HMP-5s/km', '4 mi @ HMP-5s/km'],
    ['40 min @ 150-160 bpm', '40 min @ 150-160 bpm'],
    ['40 min easy @ 145 bpm', '40 min easy @ 145 bpm'],
    ['10 km @ 45:00', '10 km @ 45:00'],
    ['10 mi @ 65:00', '10 mi @ 1:05:00'],
    ['400 m rep @ 1:20', '400 m rep @ 1:20'],
    ['0.5 mi jog', '0.5 mi jog'],
    ['1 x 2 mi @ 6:30/mi', '1 x 2 mi @ 6:30/mi'],
    ['  45 min easy  ', '45 min easy'],
  ])('"%s" → "%s"', (text, canonical) => {
    expect(formatShorthand(parsed(text))).toBe(canonical);
  });

  it.each<[string, string]>([
    ['8 mi @ 7:05/mi', 'steady'],
    ['8 mi @ MP', 'goal pace'],
    ['8 mi @ goal', 'goal pace'],
    ['6 mi @ HMP', 'steady'],
    ['40 min @ 150-160 bpm', 'steady'],
    ['10 mi', 'easy'],
    ['8 mi tempo @ 7:05/mi', 'tempo'],
  ])('a top-level part "%s" gets kind %s', (text, kind) => {
    const [item] = parsed(text);
    expect(item?.type === 'part' && item.kind).toBe(kind);
  });

  it('inside a repeat an unnamed part is a rep and the "w/" part a recovery jog', () => {
    const [item] = parsed('3 x 2 mi @ MP w/ 800 m');
    expect(item?.type === 'repeat' && item.parts.map((p) => p.kind)).toStrictEqual(['rep', 'recovery jog']);
  });

  it('stores a race-pace offset in s/km: +10 s/mi = 10 × 1000 / 1609.344 = 6.2137 s/km', () => {
    const [item] = parsed('8 mi @ MP+10s/mi');
    expect(item?.type === 'part' && item.target).toStrictEqual({
      type: 'relative',
      ref: 'MP',
      offset: { s_per_km: (10 * 1000) / MILE, per: 'mi' },
    });
  });

  it('stores a heart-rate range and a single heart rate as low = high', () => {
    const items = parsed('40 min @ 150-160 bpm, 20 min @ 145 bpm');
    expect(items.map((i) => i.type === 'part' && i.target)).toStrictEqual([
      { type: 'heart_rate', low_bpm: 150, high_bpm: 160 },
      { type: 'heart_rate', low_bpm: 145, high_bpm: 145 },
    ]);
  });
});

describe('parseShorthand: mistakes say where and what was expected', () => {
  const NINETY_NINE_PARTS = Array.from({ length: 99 }, () => '400 m').join(', ');
  const FIFTY_ONE_ITEMS = Array.from({ length: 51 }, () => '1 mi').join(', ');

  it.each<[string, string, number, string]>([
    ['empty text', '', 0, 'Write the session'],
    ['only spaces', '   ', 3, 'Write the session'],
    ['no amount after the count', '6 x @ 3:00', 4, "Expected a distance like '2 mi' or a time like '45 min', found '@'"],
    ['an empty part', '2 mi warm-up,, 1 mi', 13, "A part is missing before ','"],
    ['a trailing comma', '2 mi warm-up,', 13, 'A part is missing before the end'],
    ['seconds past 59', '8 mi @ 7:65/mi', 7, "'7:65' is not a time"],
    ['seconds with one digit', '8 mi @ 7:5/mi', 7, "'7:5' is not a time"],
    ['a pace of 0:00', '8 mi @ 0:00/mi', 7, 'A pace must be more than 0:00'],
    ['a pace too fast to be true', '8 mi @ 1:00/km', 7, 'outside the 1:30–20:00 per km'],
    ['a repeat without a count', 'x 800 m', 0, 'A repeat starts with its count'],
    ['99 repeats', `99 x (${NINETY_NINE_PARTS})`, 0, "A repeat is done 1 to 50 times; '99 x' is not possible here"],
    ['a repeat of 0', '0 x 400 m', 0, 'A repeat is done 1 to 50 times'],
    ['a fractional count', '2.5 x 400 m', 0, 'A repeat is done 1 to 50 times'],
    [
      'too many parts unrolled',
      `3 x (${NINETY_NINE_PARTS})`,
      0,
      '3 rounds of 99 parts is 297 parts; a session plan has at most 200',
    ],
    [
      'too many parts over several repeats',
      '40 x 400 m w/ 200 m jog, 40 x 400 m w/ 200 m jog, 40 x 400 m w/ 200 m jog',
      50,
      'more than 200 parts',
    ],
    ['too many items', FIFTY_ONE_ITEMS, 300, 'at most 50 parts and repeats'],
    ['an unknown unit', '10 parsecs easy', 3, "'parsecs' is not a unit"],
    ['a missing unit', '10 easy', 3, "'10' needs a unit"],
    ['a range written slow-fast', '5 mi @ 7:05-6:55/mi', 7, "A pace range is written fast-slow, e.g. '6:55-7:05/mi'"],
    ['a bracket with no count', '(800 m @ 3:00', 0, 'A group in brackets needs a count'],
    ['an unclosed bracket', '6 x (800 m @ 3:00', 17, "Expected ',' or ')' to close the bracket opened at 4"],
    ['a stray closing bracket', '6 x 800 m)', 9, 'closes no bracket'],
    ['nested repeats', '2 x (3 x 400 m)', 5, 'A repeat cannot hold another repeat'],
    ['nested brackets', '2 x ((400 m))', 5, 'Brackets cannot be nested'],
    ['an unknown kind', '10 mi jogging', 6, "'jogging' is not a part kind"],
    ['the kind after the target', '8 mi @ 7:05/mi tempo', 15, 'Write the kind before the target'],
    ['the kind before the amount', 'easy 10 mi', 0, 'Write the amount first'],
    ['the count after the amount', '800 m x 6', 6, 'Write the count first'],
    ['a missing comma', '2 mi warm-up 6 x 800 m', 13, "Expected a comma between parts, found '6'"],
    ['a clock as an amount', '20:00 tempo', 0, "Write '20:00' as a time with its unit"],
    ['nothing after @', '8 mi @', 6, "Expected a target after '@', found the end"],
    ['a word that is no target', '8 mi @ fast', 7, "Expected a target after '@', found 'fast'"],
    ['a rep time too fast for the distance', '8 mi @ 7:05', 7, 'Did you mean 7:05/mi or 7:05/km?'],
    ['a rep time on a timed part', '20 min @ 6:00', 9, "write '6:00/mi' or '6:00/km'"],
    ['a bad unit after /', '8 mi @ 7:05/hr', 12, "Expected 'mi' or 'km' after '/'"],
    ['a range with no slow end', '8 mi @ 7:05-/mi', 12, 'A pace range is written fast-slow'],
    ['a heart rate without bpm', '40 min @ 150-160', 9, 'A heart rate ends in bpm'],
    ['a heart-rate range high-low', '40 min @ 160-150 bpm', 9, "written low-high, e.g. '150-160 bpm'"],
    ['a heart rate out of range', '40 min @ 20 bpm', 9, 'from 30 to 240 bpm'],
    ['an offset with no unit', '8 mi @ MP+10s', 13, 'per mile or per km'],
    ['an offset of 0', '8 mi @ MP+0s/mi', 10, "write just 'MP'"],
    ['an offset too large', '8 mi @ MP+150s/km', 10, 'at most 2:00 per km'],
    ['a race pace we do not know', '8 mi @ 15K', 7, "'15K' is not a race pace here"],
    ['a distance of 0', '0 mi easy', 0, 'A distance must be more than 0'],
    ['a distance too long', '300 km easy', 0, 'at most 250 km'],
    ['a time too long', '25 h easy', 0, 'at most 24 h'],
    ['a stray character', '8 mi; 2 mi', 4, "';' has no meaning"],
    ['w/ outside a repeat', '8 mi w/ 1 mi jog', 5, "'w/' adds a recovery to a repeat"],
  ])('%s: "%s" → at %i, "%s"', (_name, text, position, message) => {
    const result = parseShorthand(text);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.position).toBe(position);
    expect(result.error.message).toContain(message);
    expect(result.error.expected.length).toBeGreaterThan(0);
  });

  it('refuses text over 2000 characters', () => {
    const result = parseShorthand(`${'1 mi easy, '.repeat(200)}1 mi easy`);
    expect(result.ok || result.error.position).toBe(2000);
  });

  it('normaliseItems is what the shorthand can say: paces to whole seconds in their unit, distances to 3 decimals', () => {
    const items: PlanItem[] = [
      {
        type: 'part',
        kind: 'tempo',
        amount: { type: 'distance', distance_m: 8046.9, unit: 'mi' },
        target: { type: 'pace', fast_s_per_km: 264.3, slow_s_per_km: 270.2, per: 'mi' },
      },
    ];
    // 8046.9 m = 5.00005 mi → 5 mi; 264.3 s/km × 1.609344 = 425.35 s/mi → 7:05; 270.2 × 1.609344 = 434.84 → 7:15.
    expect(normaliseItems(items)).toStrictEqual([
      {
        type: 'part',
        kind: 'tempo',
        amount: { type: 'distance', distance_m: 5 * MILE, unit: 'mi' },
        target: { type: 'pace', fast_s_per_km: (425 * 1000) / MILE, slow_s_per_km: (435 * 1000) / MILE, per: 'mi' },
      },
    ]);
    expect(formatShorthand(items)).toBe('5 mi tempo @ 7:05-7:15/mi');
  });
});
