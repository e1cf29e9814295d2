import { describe, expect, it } from 'vitest';
import { formatDaysAgo } from '../../../client/lib/format.ts';

describe('formatDaysAgo: "last upload" counted in the profile time zone, not the device one', () => {
  // 5 Dec 2026 09:00 UTC. IANA tzdata: Asia/Kolkata is UTC+5:30, America/Chicago UTC−6 in winter (CST).
  const now = Date.UTC(2026, 11, 5, 9, 0);

  it('reads the upload and today in the same zone', () => {
    const lateEvening = '2026-12-04T23:30:00Z'; // 4 Dec 23:30 UTC = 5 Dec 05:00 in Kolkata = 4 Dec 17:30 in Chicago
    expect(formatDaysAgo(lateEvening, 'UTC', now)).toBe('yesterday');
    expect(formatDaysAgo(lateEvening, 'Asia/Kolkata', now)).toBe('today');
    expect(formatDaysAgo(lateEvening, 'America/Chicago', now)).toBe('yesterday');
    expect(formatDaysAgo('2026-12-01T12:00:00Z', 'America/Chicago', now)).toBe('4 days ago');
    expect(formatDaysAgo(null, 'UTC', now)).toBe('never');
  });
});
