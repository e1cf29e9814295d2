import { describe, expect, it } from 'vitest';
import { parseIsoTime, parseNumber } from '../../../../server/features/runs/parse/parse-time.ts';
import { createPrng } from '../../../../shared/tracks/synthetic.ts';

const pad = (value: number, width: number): string => String(value).padStart(width, '0');

/** A random instant between the years 1000 and 9999, to the millisecond. */
function randomInstant(random: () => number): number {
  const from = Date.UTC(1000, 0, 1);
  const to = Date.UTC(9999, 11, 31, 23, 59, 59, 999);
  return from + Math.floor(random() * (to - from));
}

/** `t` written as a device would, in local time at `offsetMin` with `digits` fraction digits (0–3). */
function writeIso(t: number, offsetMin: number | 'Z', digits: number): string {
  const local = new Date(t + (offsetMin === 'Z' ? 0 : offsetMin) * 60_000);
  const date = `${pad(local.getUTCFullYear(), 4)}-${pad(local.getUTCMonth() + 1, 2)}-${pad(local.getUTCDate(), 2)}`;
  const time = `${pad(local.getUTCHours(), 2)}:${pad(local.getUTCMinutes(), 2)}:${pad(local.getUTCSeconds(), 2)}`;
  const fraction = digits === 0 ? '' : `.${pad(local.getUTCMilliseconds(), 3).slice(0, digits)}`;
  const zone =
    offsetMin === 'Z'
      ? 'Z'
      : `${offsetMin < 0 ? '-' : '+'}${pad(Math.floor(Math.abs(offsetMin) / 60), 2)}:${pad(Math.abs(offsetMin) % 60, 2)}`;
  return `${date}T${time}${fraction}${zone}`;
}

describe('parseIsoTime', () => {
  it('agrees with Date.parse on 20 000 random times in the forms devices write', () => {
    const random = createPrng(14);
    const offsets = ['Z', 0, 60, -300, 330, 345, -570, 840, -720] as const;
    for (let i = 0; i < 20_000; i++) {
      const text = writeIso(randomInstant(random), offsets[i % offsets.length]!, i % 4);
      expect(parseIsoTime(text), text).toBe(Date.parse(text));
    }
  });

  it.each([
    '2024-02-29T23:59:59.999Z',
    '2023-12-31T23:59:60Z',
    '2024-09-14T24:00:00Z',
    '1900-02-28T12:00:00Z',
    '2000-02-29T00:00:00+14:00',
    '9999-12-31T23:59:59.999-12:00',
    '1000-01-01T00:00:00Z',
    '2024-09-14T06:30:00.1Z',
    '2024-09-14T06:30:00.12Z',
  ])('reads %s as Date.UTC would', (text) => {
    const m = /^(\d{4})-(\d\d)-(\d\d)T(\d\d):(\d\d):(\d\d)(?:\.(\d+))?(Z|([+-])(\d\d):(\d\d))$/.exec(text)!;
    const [, y, mo, d, h, mi, s, frac, , sign, oh, om] = m;
    const offset = sign === undefined ? 0 : (sign === '-' ? -1 : 1) * (Number(oh) * 60 + Number(om));
    const ms = frac === undefined ? 0 : Number(frac.padEnd(3, '0'));
    const expected = Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi), Number(s), ms) - offset * 60_000;
    expect(parseIsoTime(text)).toBe(expected);
  });

  it.each<[string, number]>([
    // Less common forms, read by the general path.
    ['2024-09-14t06:30:00z', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['2024-09-14 06:30:00Z', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['  2024-09-14T06:30:00Z\n', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['2024-09-14T06:30Z', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['2024-09-14T06:30:00.123456Z', Date.UTC(2024, 8, 14, 6, 30, 0, 123)],
    ['2024-09-14T06:30:00.9996Z', Date.UTC(2024, 8, 14, 6, 30, 1, 0)],
    ['2024-09-14T06:30:00,5Z', Date.UTC(2024, 8, 14, 6, 30, 0, 500)],
    ['2024-09-14T08:30:00+0200', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['2024-09-14T08:30:00+02', Date.UTC(2024, 8, 14, 6, 30, 0)],
    ['2024-02-31T00:00:00Z', Date.UTC(2024, 2, 2)],
    // Date.UTC reads years 0–99 as 1900–1999; kept as it was.
    ['0050-01-01T00:00:00Z', Date.UTC(1950, 0, 1)],
  ])('%s', (text, expected) => {
    expect(parseIsoTime(text)).toBe(expected);
  });

  it.each([
    '2024-13-01T00:00:00Z',
    '2024-00-10T00:00:00Z',
    '2024-09-00T00:00:00Z',
    '2024-09-32T00:00:00Z',
    '2024-09-14T25:00:00Z',
    '2024-09-14T06:60:00Z',
    '2024-09-14T06:30:61Z',
    '2024-09-14T06:30:00.Z',
    '2024-09-14T06:30:00ZZ',
    '2024-09-14T06:30:00+2:00',
    '2024-09-14T06:3a:00Z',
    '0000-00-00T99:99:99Z',
    '+275760-09-13T00:00:01Z',
  ])('gives NaN for %s', (text) => {
    expect(parseIsoTime(text)).toBeNaN();
  });
});

describe('parseNumber', () => {
  it('agrees with Number() on 20 000 random decimals as files write them', () => {
    const random = createPrng(15);
    for (let i = 0; i < 20_000; i++) {
      const whole = String(Math.floor(random() * 10 ** Math.floor(random() * 10)));
      const fraction = String(Math.floor(random() * 10 ** 12)).slice(0, Math.floor(random() * 13));
      const sign = ['', '-', '+'][i % 3]!;
      const text = fraction === '' && i % 2 === 0 ? `${sign}${whole}` : `${sign}${whole}.${fraction}`;
      expect(parseNumber(text), text).toBe(Number(text));
    }
  });

  it.each([
    '46.2000124',
    '-31.399969',
    '0.1',
    '-0',
    '-0.0',
    '007.50',
    '5.',
    '.5',
    '+3',
    '123456789012345',
    '1234567890123456',
    '12345678901234567890',
    '0.000000000000000000000001',
    '1e3',
    '-2.5E-3',
    ' 12 ',
    '9007199254740993',
  ])('reads "%s" exactly as Number() does', (text) => {
    expect(Object.is(parseNumber(text), Number(text))).toBe(true);
  });

  it.each(['', ' ', '.', '+', '-', '-.', '1e', 'abc', '0x10', 'Infinity', 'NaN', '1,5', '1.2.3', '12a', '--1'])(
    'gives NaN for "%s"',
    (text) => {
      expect(parseNumber(text)).toBeNaN();
    },
  );

  it('gives NaN for a missing value', () => {
    expect(parseNumber(undefined)).toBeNaN();
  });
});
