import { describe, expect, it } from 'vitest';
import { RegisterInputSchema } from '../../../../shared/auth/schemas.ts';
import { UpdateProfileInputSchema, isKnownTimeZone } from '../../../../shared/users/schemas.ts';

describe('RegisterInputSchema', () => {
  const valid = { email: ' Runner@Example.TEST ', password: 'ten chars!', name: '  Ivy ', role: 'runner' };
  it('normalises e-mail to lower case and trims the name', () => {
    expect(RegisterInputSchema.parse(valid)).toEqual({ ...valid, email: 'runner@example.test', name: 'Ivy' });
  });
  it.each([
    ['password of 9 characters', { password: 'nine char' }, 'password'],
    ['password over 72 bytes (bcrypt limit)', { password: 'é'.repeat(37) }, 'password'],
    ['admin role', { role: 'admin' }, 'role'],
    ['blank name', { name: '   ' }, 'name'],
    ['e-mail without domain', { email: 'runner@' }, 'email'],
  ])('rejects a %s', (_label, change, field) => {
    const result = RegisterInputSchema.safeParse({ ...valid, ...change });
    expect(result.success).toBe(false);
    expect(result.error!.issues[0]!.path).toEqual([field]);
  });
});

describe('UpdateProfileInputSchema', () => {
  it.each([
    [{ resting_hr: 24 }, false],
    [{ resting_hr: 25 }, true],
    [{ max_hr: 241 }, false],
    [{ resting_hr: 60, max_hr: 60 }, false],
    [{ resting_hr: 59, max_hr: 60 }, false], // max below 100 bpm is refused
    [{ resting_hr: 59, max_hr: 180 }, true],
    [{ weight_kg: 24.9 }, false],
    [{ weight_kg: 61.5 }, true],
    [{ birth_year: 1899 }, false],
    [{ birth_year: null, weight_kg: null }, true],
    [{ unit: 'km' }, true],
    [{ unit: 'yd' }, false],
    [{ time_zone: 'America/Chicago' }, true],
    [{ time_zone: 'Chicago' }, false],
    [{ role: 'admin' }, false],
  ])('%j valid: %s', (input, ok) => {
    expect(UpdateProfileInputSchema.safeParse(input).success).toBe(ok);
  });

  it('knows IANA time zones, current and outdated', () => {
    expect(isKnownTimeZone('Europe/Berlin')).toBe(true);
    expect(isKnownTimeZone('Asia/Calcutta')).toBe(true);
    expect(isKnownTimeZone('Not/AZone')).toBe(false);
  });

  it('stores an outdated time zone name as the current one', () => {
    // IANA tz database, file `backward`: "Link Asia/Kolkata Asia/Calcutta", "Link Europe/Kyiv Europe/Kiev".
    expect(UpdateProfileInputSchema.parse({ time_zone: 'Asia/Calcutta' })).toEqual({ time_zone: 'Asia/Kolkata' });
    expect(UpdateProfileInputSchema.parse({ time_zone: 'Europe/Kiev' })).toEqual({ time_zone: 'Europe/Kyiv' });
    expect(UpdateProfileInputSchema.parse({ time_zone: 'Europe/Berlin' })).toEqual({ time_zone: 'Europe/Berlin' });
  });
});
