import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays, dayOfWeek, daysBetween, isIsoDate } from '../../../../shared/weeks/weeks.ts';

// The date helpers count days by arithmetic; `Date` and its ISO strings are the reference they must agree with.
const DAY_MS = 86_400_000;
const referenceIsIsoDate = (text: string) => {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(text)) return false;
  const ms = Date.parse(`${text}T00:00:00Z`);
  return !Number.isNaN(ms) && new Date(ms).toISOString().slice(0, 10) === text;
};
const referenceMs = (date: string) => Date.parse(`${date}T00:00:00Z`);

const pad = (n: number, width: number) => String(n).padStart(width, '0');
/** Strings shaped like dates, impossible ones included (month 00–19, day 00–39). */
const dateShaped = fc
  .tuple(fc.integer({ min: 0, max: 9999 }), fc.integer({ min: 0, max: 19 }), fc.integer({ min: 0, max: 39 }))
  .map(([y, m, d]) => `${pad(y, 4)}-${pad(m, 2)}-${pad(d, 2)}`);
/** Real calendar dates from 0002 to 9997 (400 days either way stay within four-digit years). */
const realDate = fc
  .integer({ min: referenceMs('0002-01-01') / DAY_MS, max: referenceMs('9997-12-31') / DAY_MS })
  .map((day) => new Date(day * DAY_MS).toISOString().slice(0, 10));

describe('calendar dates by arithmetic', () => {
  it('isIsoDate agrees with a round trip through Date, leap years and impossible days included', () => {
    fc.assert(
      fc.property(dateShaped, (text) => isIsoDate(text) === referenceIsIsoDate(text)),
      { numRuns: 20_000 },
    );
    for (const text of ['0000-02-29', '1900-02-29', '2000-02-29', '2100-02-29', '2400-02-29', '2026-04-31', '2026-12-31']) {
      expect(isIsoDate(text)).toBe(referenceIsIsoDate(text));
    }
  });

  it('addDays, daysBetween and dayOfWeek agree with Date across four millennia', () => {
    fc.assert(
      fc.property(realDate, fc.integer({ min: -400, max: 400 }), (date, days) => {
        const later = new Date(referenceMs(date) + days * DAY_MS).toISOString().slice(0, 10);
        expect(addDays(date, days)).toBe(later);
        expect(daysBetween(date, later)).toBe(days);
        expect(dayOfWeek(date)).toBe(new Date(referenceMs(date)).getUTCDay());
      }),
      { numRuns: 20_000 },
    );
  });

  it('steps over the first and last years a four-digit date can hold', () => {
    expect(addDays('0000-12-31', 1)).toBe('0001-01-01');
    expect(addDays('0001-01-01', -1)).toBe('0000-12-31');
    expect(addDays('0000-03-01', -1)).toBe('0000-02-29');
    expect(addDays('9999-12-30', 1)).toBe('9999-12-31');
    expect(() => addDays('2027-02-29', 1)).toThrow(RangeError);
  });
});
