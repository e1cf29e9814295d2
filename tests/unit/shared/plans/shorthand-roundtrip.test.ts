import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countExpandedParts } from '../../../../shared/plans/expand.ts';
import { PlanItemsSchema } from '../../../../shared/plans/schemas.ts';
import { formatShorthand, normaliseItems, parseShorthand } from '../../../../shared/plans/shorthand.ts';
import { PART_KINDS, RELATIVE_PACE_REFS } from '../../../../shared/plans/types.ts';
import type { Part, PartAmount, PartTarget, PlanItem } from '../../../../shared/plans/types.ts';
import { paceFromWritten } from '../../../../shared/plans/units.ts';

// Arbitrary *valid* plans. Distances and paces are unrounded doubles (as a form builder might send), kept a little
// inside the limits so rounding to what the shorthand can say never pushes one outside:
// distances 1 m–249 km, paces 1:40–18:20 per km, rep paces only on parts of at least 100 m
// (rounding a rep time to whole seconds then moves the pace by at most 5 s/km).

const double = (min: number, max: number): fc.Arbitrary<number> => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

const amountArb: fc.Arbitrary<PartAmount> = fc.oneof(
  fc.record({
    type: fc.constant('distance' as const),
    distance_m: double(1, 249_000),
    unit: fc.constantFrom('mi' as const, 'km' as const, 'm' as const),
  }),
  // Written values, as a person types them.
  fc
    .record({ unit: fc.constantFrom('mi' as const, 'km' as const), value: fc.integer({ min: 1, max: 100_000 }) })
    .map(({ unit, value }) => ({
      type: 'distance' as const,
      distance_m: (value / 1000) * (unit === 'mi' ? 1609.344 : 1000),
      unit,
    })),
  fc.record({ type: fc.constant('duration' as const), duration_s: fc.integer({ min: 1, max: 86_400 }) }),
);

function targetArb(amount: PartAmount): fc.Arbitrary<PartTarget> {
  const pers = amount.type === 'distance' && amount.distance_m >= 100 ? (['mi', 'km', 'rep'] as const) : (['mi', 'km'] as const);
  const distance = amount.type === 'distance' ? amount.distance_m : null;
  return fc.oneof(
    fc
      .record({ a: double(100, 1100), b: double(100, 1100), per: fc.constantFrom(...pers) })
      .map(({ a, b, per }) => ({ type: 'pace' as const, fast_s_per_km: Math.min(a, b), slow_s_per_km: Math.max(a, b), per })),
    // Whole seconds in the written unit (fast = slow is a single pace).
    fc.record({ per: fc.constantFrom(...pers), w: fc.integer({ min: 0, max: 30 }) }).map(({ per, w }) => {
      const base = per === 'rep' ? Math.round((300 * (distance ?? 0)) / 1000) : per === 'mi' ? 420 : 260;
      return {
        type: 'pace' as const,
        fast_s_per_km: paceFromWritten(base, per, distance),
        slow_s_per_km: paceFromWritten(base + w, per, distance),
        per,
      };
    }),
    fc.record({ type: fc.constant('relative' as const), ref: fc.constantFrom(...RELATIVE_PACE_REFS) }),
    fc.record({
      type: fc.constant('relative' as const),
      ref: fc.constantFrom(...RELATIVE_PACE_REFS),
      offset: fc.record({
        s_per_km: double(-110, 110).filter((s) => s !== 0),
        per: fc.constantFrom('mi' as const, 'km' as const),
      }),
    }),
    fc
      .record({ a: fc.integer({ min: 30, max: 240 }), b: fc.integer({ min: 30, max: 240 }) })
      .map(({ a, b }) => ({ type: 'heart_rate' as const, low_bpm: Math.min(a, b), high_bpm: Math.max(a, b) })),
    fc.constant({ type: 'effort' as const }),
  );
}

const partArb: fc.Arbitrary<Part> = amountArb.chain((amount) =>
  fc.record({
    type: fc.constant('part' as const),
    kind: fc.constantFrom(...PART_KINDS),
    amount: fc.constant(amount),
    target: targetArb(amount),
  }),
);

const itemArb: fc.Arbitrary<PlanItem> = fc.oneof(
  { weight: 3, arbitrary: partArb },
  {
    weight: 2,
    arbitrary: fc.record({
      type: fc.constant('repeat' as const),
      count: fc.integer({ min: 1, max: 50 }),
      parts: fc.array(partArb, { minLength: 1, maxLength: 4 }),
    }),
  },
);

const itemsArb = fc.array(itemArb, { minLength: 1, maxLength: 12 }).filter((items) => countExpandedParts(items) <= 200);

describe('shorthand round trip (property-based)', () => {
  it('generates valid plans, and normalising keeps them valid', () => {
    fc.assert(
      fc.property(itemsArb, (items) => {
        expect(PlanItemsSchema.safeParse(items).error?.issues).toBeUndefined();
        expect(PlanItemsSchema.safeParse(normaliseItems(items)).error?.issues).toBeUndefined();
      }),
    );
  });

  it('parseShorthand(formatShorthand(items)) deep-equals normaliseItems(items)', () => {
    fc.assert(
      fc.property(itemsArb, (items) => {
        const text = formatShorthand(items);
        const result = parseShorthand(text);
        expect(result).toStrictEqual({ ok: true, items: normaliseItems(items) });
      }),
      { numRuns: 500 },
    );
  });

  it('normalised items survive the round trip unchanged, and normalising is idempotent', () => {
    fc.assert(
      fc.property(itemsArb, (items) => {
        const canonical = normaliseItems(items);
        expect(normaliseItems(canonical)).toStrictEqual(canonical);
        expect(parseShorthand(formatShorthand(canonical))).toStrictEqual({ ok: true, items: canonical });
      }),
    );
  });

  it('formatting is stable: format(parse(format(items))) = format(items)', () => {
    fc.assert(
      fc.property(itemsArb, (items) => {
        const text = formatShorthand(items);
        const again = parseShorthand(text);
        expect(again.ok && formatShorthand(again.items)).toBe(text);
      }),
    );
  });

  it('never throws on arbitrary text; a failure points inside the text', () => {
    const pieces = fc.constantFrom(
      '2',
      '6',
      '800',
      '0',
      '7:05',
      '2:55',
      '7:65',
      ' ',
      ' ',
      ',',
      'x',
      '×',
      '(',
      ')',
      '@',
      '-',
      '+',
      '/',
      'mi',
      'km',
      'm',
      'min',
      's',
      'h',
      'easy',
      'jog',
      'w/',
      'MP',
      'goal',
      '10K',
      'bpm',
      'warm',
      'up',
      'tempo',
      '.5',
      ':',
    );
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string(),
          fc.array(pieces, { maxLength: 30 }).map((p) => p.join('')),
        ),
        (text) => {
          const result = parseShorthand(text);
          if (result.ok) {
            expect(PlanItemsSchema.safeParse(result.items).success).toBe(true);
          } else {
            expect(result.error.position).toBeGreaterThanOrEqual(0);
            expect(result.error.position).toBeLessThanOrEqual(text.length);
            expect(result.error.message.length).toBeGreaterThan(0);
          }
        },
      ),
      { numRuns: 2000 },
    );
  });
});
