import { describe, expect, it } from 'vitest';
import {
  draftToItems,
  itemsToDraft,
  moveEntry,
  newDraftPart,
  type DraftItem,
  type DraftRepeat,
} from '../../../../shared/plans/builder.ts';
import { formatShorthand, normaliseItems, parseShorthand } from '../../../../shared/plans/shorthand.ts';
import type { PlanItem } from '../../../../shared/plans/types.ts';

function counter(): () => string {
  let n = 0;
  return () => `r${++n}`;
}

function items(text: string): PlanItem[] {
  const result = parseShorthand(text);
  if (!result.ok) throw new Error(result.error.message);
  return result.items;
}

const EXAMPLES = [
  '2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down',
  '10 mi easy, 8 mi @ 7:05/mi, 2 mi @ 6:55/mi, 1 mi cool-down',
  '45 min easy',
  '15 min warm-up, 6 x 3 min @ 4:05-4:13/km w/ 2 min jog, 10 min cool-down',
  '2 h easy, 30 min @ MP',
  '5 km tempo @ HMP+10s/mi, 4 x (200 m @ 0:40, 200 m jog, 100 m strides), 40 min @ 140-150 bpm, 65 min @ 10K-5s/km',
];

describe('itemsToDraft then draftToItems', () => {
  it.each(EXAMPLES)('gives back the same plan and shorthand: %s', (text) => {
    const parsed = items(text);
    const back = draftToItems(itemsToDraft(parsed, counter()));
    expect(back.ok).toBe(true);
    if (!back.ok) return;
    expect(normaliseItems(back.items)).toEqual(normaliseItems(parsed));
    expect(formatShorthand(back.items)).toBe(text);
  });

  it('shows the repeat with its count and its two parts, as written', () => {
    const draft = itemsToDraft(items('6 x 800 m @ 2:55-3:00 w/ 400 m jog'), counter());
    const repeat = draft[0] as DraftRepeat;
    expect(repeat).toMatchObject({ type: 'repeat', count: '6' });
    expect(repeat.parts.map((p) => [p.kind, p.amount, p.unit, p.target, p.paceFast, p.paceSlow, p.pacePer])).toEqual([
      ['rep', '800', 'm', 'pace', '2:55', '3:00', 'rep'],
      ['recovery jog', '400', 'm', 'effort', '', '', 'mi'],
    ]);
    expect(new Set([repeat.id, ...repeat.parts.map((p) => p.id)]).size).toBe(3);
  });

  it('changing the repeat count changes the shorthand', () => {
    const draft = itemsToDraft(items('2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog'), counter());
    const edited = draft.map((item) => (item.type === 'repeat' ? { ...item, count: '5' } : item));
    const back = draftToItems(edited);
    expect(back.ok && formatShorthand(back.items)).toBe('2 mi warm-up, 5 x 800 m @ 2:55-3:00 w/ 400 m jog');
  });
});

describe('draftToItems field problems', () => {
  const part = (overrides: Parameters<typeof newDraftPart>[1]) => newDraftPart('p', overrides);
  it.each<[string, DraftItem[], string]>([
    ['a blank distance', [part({ amount: '' })], 'p.amount'],
    ['a distance of 0', [part({ amount: '0' })], 'p.amount'],
    ['a time that is not m:ss', [part({ unit: 'time', amount: '45' })], 'p.amount'],
    ['a half-typed pace', [part({ target: 'pace', paceFast: '7:0' })], 'p.paceFast'],
    ['a bad slow pace', [part({ target: 'pace', paceFast: '7:05', paceSlow: 'x' })], 'p.paceSlow'],
    [
      'a per-rep pace on a timed part',
      [part({ target: 'pace', unit: 'time', amount: '5:00', paceFast: '1:00', pacePer: 'rep' })],
      'p.paceFast',
    ],
    ['a fractional offset', [part({ target: 'relative', offset: '2.5' })], 'p.offset'],
    ['a heart rate in words', [part({ target: 'heart_rate', hrLow: 'high' })], 'p.hrLow'],
    ['a repeat count of 0', [{ type: 'repeat', id: 'r', count: '0', parts: [newDraftPart('q')] }], 'r.count'],
    ['an empty repeat', [{ type: 'repeat', id: 'r', count: '3', parts: [] }], 'r.count'],
  ])('%s is reported on its field', (_name, draft, field) => {
    const result = draftToItems(draft);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(Object.keys(result.errors)).toContain(field);
  });

  it('a blank slow pace means a single pace; a blank high heart rate a single heart rate', () => {
    const result = draftToItems([
      part({ target: 'pace', paceFast: '7:05', paceSlow: '' }),
      newDraftPart('h', { target: 'heart_rate', hrLow: '150', hrHigh: '' }),
    ]);
    expect(result.ok && formatShorthand(result.items)).toBe('1 mi easy @ 7:05/mi, 1 mi easy @ 150 bpm');
  });

  it('an empty form is no items', () => {
    expect(draftToItems([])).toEqual({ ok: true, items: [] });
  });
});

describe('moveEntry', () => {
  it.each<[number, -1 | 1, string[]]>([
    [1, -1, ['b', 'a', 'c']],
    [1, 1, ['a', 'c', 'b']],
    [0, -1, ['a', 'b', 'c']],
    [2, 1, ['a', 'b', 'c']],
    [5, 1, ['a', 'b', 'c']],
  ])('moves entry %s by %s', (index, by, expected) => {
    const list = ['a', 'b', 'c'];
    expect(moveEntry(list, index, by)).toEqual(expected);
    expect(list).toEqual(['a', 'b', 'c']);
  });
});
