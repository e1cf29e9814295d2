import { describe, expect, it } from 'vitest';
import { localDateTime } from '../../../../shared/runs/local-time.ts';

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
