import { describe, expect, it } from 'vitest';
import { todayIn } from '../../../client/lib/format.ts';

describe('todayIn: today in the profile time zone, not the device one', () => {
  // 2026-12-04T22:30:00Z. IANA tzdata: Pacific/Kiritimati is UTC+14 all year, Pacific/Pago_Pago UTC−11,
  // Europe/Berlin UTC+1 in winter (CET), Asia/Kolkata UTC+5:30.
  const instant = Date.UTC(2026, 11, 4, 22, 30);

  it('names the calendar date the runner lives on at that instant', () => {
    expect(todayIn('Pacific/Kiritimati', instant)).toBe('2026-12-05');
    expect(todayIn('Pacific/Pago_Pago', instant)).toBe('2026-12-04');
    expect(todayIn('Europe/Berlin', instant)).toBe('2026-12-04');
    expect(todayIn('Asia/Kolkata', instant)).toBe('2026-12-05');
  });
});
