import { describe, expect, it } from 'vitest';
import { calendarDaysAgo, calendarDaysBetween, localDateTime, todayIn } from '../../../../shared/runs/local-time.ts';

describe('localDateTime', () => {
  it('gives the date and time in each zone asked for, zones taking turns', () => {
    const instant = Date.parse('2026-03-29T00:30:00Z');
    // Formatters are kept per zone: asking for one zone must never answer in the one asked before.
    for (let round = 0; round < 3; round++) {
      expect(localDateTime(instant, 'UTC')).toEqual({ date: '2026-03-29', time: '00:30' });
      expect(localDateTime(instant, 'Etc/GMT+4')).toEqual({ date: '2026-03-28', time: '20:30' }); // UTC−4
      expect(localDateTime(instant, 'Etc/GMT-9')).toEqual({ date: '2026-03-29', time: '09:30' }); // UTC+9
    }
  });

  it('follows a zone across its clock change', () => {
    expect(localDateTime(Date.parse('2026-03-29T00:30:00Z'), 'Europe/Berlin')).toEqual({ date: '2026-03-29', time: '01:30' });
    expect(localDateTime(Date.parse('2026-03-29T01:30:00Z'), 'Europe/Berlin')).toEqual({ date: '2026-03-29', time: '03:30' });
  });

  it('refuses an unknown zone every time it is asked', () => {
    expect(() => localDateTime(0, 'Not/AZone')).toThrow(RangeError);
    expect(() => localDateTime(0, 'Not/AZone')).toThrow(RangeError);
  });
});

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

describe('calendar days between and ago', () => {
  it('counts calendar days, across a month end and a clock change', () => {
    expect(calendarDaysBetween('2026-11-30', '2026-12-01')).toBe(1);
    expect(calendarDaysBetween('2026-12-01', '2026-11-30')).toBe(-1);
    // Europe/Berlin moves its clocks on 2026-03-29 (EU summer time, last Sunday of March): still one day each.
    expect(calendarDaysBetween('2026-03-28', '2026-03-30')).toBe(2);
  });

  it('reads both the instant and today in the zone asked for', () => {
    const now = Date.UTC(2026, 11, 5, 9, 0); // 5 Dec 09:00 UTC
    const lastNight = Date.UTC(2026, 11, 4, 23, 30); // 4 Dec 23:30 UTC
    // In UTC the upload was yesterday; in Asia/Kolkata (UTC+5:30) it was at 05:00 on 5 Dec, so today.
    expect(calendarDaysAgo(lastNight, 'UTC', now)).toBe(1);
    expect(calendarDaysAgo(lastNight, 'Asia/Kolkata', now)).toBe(0);
    // Pacific/Pago_Pago (UTC−11): 4 Dec 12:30 and now 4 Dec 22:00, the same day.
    expect(calendarDaysAgo(lastNight, 'Pacific/Pago_Pago', now)).toBe(0);
  });
});
