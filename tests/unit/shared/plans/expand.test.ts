import { describe, expect, it } from 'vitest';
import { countExpandedParts, expandParts, resolveTargets } from '../../../../shared/plans/expand.ts';
import { parseShorthand } from '../../../../shared/plans/shorthand.ts';
import type { PlanItem, RacePaces } from '../../../../shared/plans/types.ts';

const MILE = 1609.344;

function parsed(text: string): PlanItem[] {
  const result = parseShorthand(text);
  if (!result.ok) throw new Error(result.error.message);
  return result.items;
}

describe('expandParts', () => {
  const items = parsed('2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down');

  it('unrolls a repeat of 6 with recoveries into 12 entries, rep and jog in turn', () => {
    const flat = expandParts(items);
    expect(flat).toHaveLength(14);
    expect(countExpandedParts(items)).toBe(14);
    expect(flat.map((p) => p.kind)).toStrictEqual([
      'warm-up',
      ...Array.from({ length: 6 }, () => ['rep', 'recovery jog']).flat(),
      'cool-down',
    ]);
    expect(flat.map((p) => p.index)).toStrictEqual(Array.from({ length: 14 }, (_, i) => i));
  });

  it('says where each entry came from', () => {
    const flat = expandParts(items);
    expect(flat[0]).toMatchObject({ index: 0, item_index: 0, repeat: null });
    expect(flat[1]).toMatchObject({ index: 1, item_index: 1, repeat: { round: 1, rounds: 6, step: 0 } });
    expect(flat[2]).toMatchObject({ index: 2, item_index: 1, repeat: { round: 1, rounds: 6, step: 1 } });
    expect(flat[12]).toMatchObject({ index: 12, item_index: 1, kind: 'recovery jog', repeat: { round: 6, rounds: 6, step: 1 } });
    expect(flat[13]).toMatchObject({ index: 13, item_index: 2, kind: 'cool-down', repeat: null });
  });

  it('copies each part: the entries carry amount and target, and changing one leaves the plan alone', () => {
    const flat = expandParts(items);
    expect(flat[1]).toMatchObject({
      type: 'part',
      amount: { type: 'distance', distance_m: 800, unit: 'm' },
      target: { type: 'pace', fast_s_per_km: 218.75, slow_s_per_km: 225, per: 'rep' },
    });
    const before = structuredClone(items);
    if (flat[1]?.amount.type === 'distance') flat[1].amount.distance_m = 1;
    expect(items).toStrictEqual(before);
    expect(flat[3]?.amount).toMatchObject({ distance_m: 800 });
  });

  it.each<[string, number]>([
    ['45 min easy', 1],
    ['6 x 20 s strides', 6],
    ['4 x (1 km @ 3:40/km, 200 m jog, 200 m @ 0:36)', 12],
    ['1 x 2 mi @ 6:30/mi', 1],
    ['50 x 400 m w/ 200 m jog', 100],
  ])('"%s" expands to %i parts', (text, n) => {
    expect(expandParts(parsed(text))).toHaveLength(n);
    expect(countExpandedParts(parsed(text))).toBe(n);
  });

  it('gives an empty list for no items', () => {
    expect(expandParts([])).toStrictEqual([]);
  });
});

describe('resolveTargets', () => {
  const flat = expandParts(
    parsed(
      '2 mi easy, 8 mi @ goal, 3 mi @ MP+10s/mi, 2 x 1 mi @ HMP-5s/km, 1 mi @ 10K, 1 mi @ 5K, 40 min @ 140-150 bpm, 1 mi @ 7:05/mi',
    ),
  );

  it('resolves race paces against the runner’s goal and results, with offsets', () => {
    // Goal 3:00:00 for 42195 m = 10800 / 42.195 = 255.954… s/km.
    const goal = 10800 / 42.195;
    const paces: RacePaces = { goal, MP: goal, HMP: 245, '10K': 235, '5K': 225 };
    const resolved = resolveTargets(flat, paces).map((p) => p.resolved);
    expect(resolved).toStrictEqual([
      { type: 'effort' },
      { type: 'pace', fast_s_per_km: goal, slow_s_per_km: goal, from: 'goal' },
      // +10 s/mi = 10 × 1000 / 1609.344 = 6.2137 s/km
      { type: 'pace', fast_s_per_km: goal + 10000 / MILE, slow_s_per_km: goal + 10000 / MILE, from: 'MP' },
      { type: 'pace', fast_s_per_km: 240, slow_s_per_km: 240, from: 'HMP' },
      { type: 'pace', fast_s_per_km: 240, slow_s_per_km: 240, from: 'HMP' },
      { type: 'pace', fast_s_per_km: 235, slow_s_per_km: 235, from: '10K' },
      { type: 'pace', fast_s_per_km: 225, slow_s_per_km: 225, from: '5K' },
      { type: 'heart_rate', low_bpm: 140, high_bpm: 150 },
      { type: 'pace', fast_s_per_km: 425000 / MILE, slow_s_per_km: 425000 / MILE, from: 'written' },
    ]);
  });

  it('without a goal race, race paces stay unresolved and say why; written targets still resolve', () => {
    const resolved = resolveTargets(flat, {}).map((p) => p.resolved);
    expect(resolved[1]).toStrictEqual({
      type: 'unresolved',
      ref: 'goal',
      reason: 'No goal race pace yet: set a goal race on your profile.',
    });
    expect(resolved[2]).toMatchObject({ type: 'unresolved', ref: 'MP', reason: expect.stringContaining('marathon effort') });
    expect(resolved[5]).toMatchObject({ type: 'unresolved', ref: '10K' });
    expect(resolved[7]).toStrictEqual({ type: 'heart_rate', low_bpm: 140, high_bpm: 150 });
    expect(resolved[8]).toMatchObject({ type: 'pace', from: 'written' });
  });

  it.each<[string, RacePaces]>([
    ['a zero pace', { goal: 0 }],
    ['a negative pace', { goal: -5 }],
    ['NaN', { goal: Number.NaN }],
    ['infinity', { goal: Number.POSITIVE_INFINITY }],
  ])('treats %s as missing', (_name, paces) => {
    expect(resolveTargets(flat, paces)[1]?.resolved).toMatchObject({ type: 'unresolved', ref: 'goal' });
  });

  it('leaves a target unresolved when the offset pushes it outside 1:30–20:00 per km', () => {
    const parts = expandParts(parsed('1 km @ 5K-2s/km'));
    expect(resolveTargets(parts, { '5K': 91 })[0]?.resolved).toMatchObject({ type: 'unresolved', ref: '5K' });
    expect(resolveTargets(parts, { '5K': 92 })[0]?.resolved).toStrictEqual({
      type: 'pace',
      fast_s_per_km: 90,
      slow_s_per_km: 90,
      from: '5K',
    });
  });

  it('keeps the expanded fields and does not mutate its input', () => {
    const before = structuredClone(flat);
    const [first] = resolveTargets(flat, {});
    expect(first).toMatchObject({ index: 0, item_index: 0, kind: 'easy', repeat: null });
    expect(flat).toStrictEqual(before);
  });
});
