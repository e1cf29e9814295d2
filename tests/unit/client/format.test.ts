/**
 * Dates and times read in a named zone (client/lib/format.ts): a coach's device in one zone reads a runner's
 * moments on the runner's clock, and the words "runner's clock" appear only when the two clocks read differently.
 */
import { describe, expect, it } from 'vitest';
import {
  daysAgoReadsDifferently,
  formatDate,
  formatDateTime,
  formatDaysAgo,
  formatInZone,
  readsDifferently,
  whoseClock,
} from '../../../client/lib/format.ts';

const RUNNER = 'America/Chicago';
const FAR_COACH = 'Asia/Tokyo';

describe('formatDate / formatDateTime in a named zone', () => {
  it('reads one instant on two clocks', () => {
    const start = '2026-11-28T13:05:00.000Z';
    // Central Standard Time is UTC−6 in November, Japan Standard Time UTC+9 all year (no DST since 1951).
    expect(formatDateTime(start, RUNNER)).toBe('28 Nov 2026, 07:05');
    expect(formatDateTime(start, FAR_COACH)).toBe('28 Nov 2026, 22:05');
    expect(formatInZone(start, RUNNER, 'time')).toBe('07:05');
  });

  it('puts an evening run on the runner’s day even when the coach’s clock has passed midnight', () => {
    const evening = '2026-11-29T03:30:00.000Z';
    expect(formatDate(evening, RUNNER)).toBe('28 Nov 2026');
    expect(formatDateTime(evening, RUNNER)).toBe('28 Nov 2026, 21:30');
    expect(formatDate(evening, FAR_COACH)).toBe('29 Nov 2026');
    expect(readsDifferently(evening, RUNNER, FAR_COACH, 'date')).toBe(true);
  });

  it('says whose clock only when what is shown would read otherwise', () => {
    const morning = '2026-11-28T12:00:00.000Z'; // 06:00 in the runner's zone, 21:00 in the coach's: same day
    expect(readsDifferently(morning, RUNNER, FAR_COACH, 'date')).toBe(false);
    expect(readsDifferently(morning, RUNNER, FAR_COACH, 'time')).toBe(true);
    expect(readsDifferently(morning, RUNNER, RUNNER, 'date-time')).toBe(false);
    // Another name for the same offset at that moment needs no words: Etc/GMT+6 is UTC−6 (POSIX sign), as Chicago in winter…
    expect(readsDifferently(morning, RUNNER, 'Etc/GMT+6', 'date-time')).toBe(false);
    // …but not in summer, when Chicago keeps daylight time (UTC−5).
    expect(readsDifferently('2026-07-04T12:00:00.000Z', RUNNER, 'Etc/GMT+6', 'time')).toBe(true);
  });

  it('words the clock for the runner and for a coach', () => {
    expect(whoseClock(RUNNER, false)).toBe("runner's clock, America/Chicago");
    expect(whoseClock(RUNNER, true)).toBe('America/Chicago clock');
  });
});

describe('"last upload … days ago" on the runner’s calendar (the squad overview and the week review)', () => {
  // 5 Dec 2026 02:00 UTC: 4 Dec, 20:00 in Chicago (CST, UTC−6); 5 Dec, 11:00 in Tokyo (JST, UTC+9).
  const now = Date.UTC(2026, 11, 5, 2, 0);
  const evening = '2026-12-04T03:30:00.000Z'; // 3 Dec, 21:30 in Chicago; 4 Dec, 12:30 in Tokyo

  it('counts the runner’s days, which a far-away coach’s calendar counts otherwise', () => {
    expect(formatDaysAgo(evening, RUNNER, now)).toBe('yesterday');
    expect(formatDaysAgo(evening, FAR_COACH, now)).toBe('yesterday');
    const lunch = '2026-12-04T18:00:00.000Z'; // 4 Dec, 12:00 in Chicago (today there); 5 Dec, 03:00 in Tokyo (today)
    expect(formatDaysAgo(lunch, RUNNER, now)).toBe('today');
    const lateNight = '2026-12-04T14:30:00.000Z'; // 4 Dec, 08:30 in Chicago (today); 4 Dec, 23:30 in Tokyo (yesterday)
    expect(formatDaysAgo(lateNight, RUNNER, now)).toBe('today');
    expect(formatDaysAgo(lateNight, FAR_COACH, now)).toBe('yesterday');
    expect(daysAgoReadsDifferently(lateNight, RUNNER, FAR_COACH, now)).toBe(true);
    expect(daysAgoReadsDifferently(evening, RUNNER, FAR_COACH, now)).toBe(false);
    expect(daysAgoReadsDifferently(null, RUNNER, FAR_COACH, now)).toBe(false);
    expect(formatDaysAgo('2026-11-30T15:00:00.000Z', RUNNER, now)).toBe('4 days ago'); // 30 Nov, 09:00 in Chicago
  });
});

/**
 * Daylight-saving edges checked against the IANA tz database's rules (files `northamerica` and `europe`; these
 * lines unchanged since 2007 and 1996):
 *   Rule US 2007 max - Mar Sun>=8  2:00  1:00 D   → 8 Mar 2026 (the second Sunday), 02:00 local skips to 03:00
 *   Rule US 2007 max - Nov Sun>=1  2:00  0    S   → 1 Nov 2026 (the first Sunday), 02:00 local falls back to 01:00
 *   Rule EU 1981 max - Mar lastSun 1:00u 1:00 S
 *   Rule EU 1996 max - Oct lastSun 1:00u 0    -   → 25 Oct 2026 (the last Sunday), at 01:00 UTC
 */
describe('daylight-saving edges (IANA tz database rules)', () => {
  it('skips the hour in spring in Chicago', () => {
    expect(formatDateTime('2026-03-08T07:59:00.000Z', RUNNER)).toBe('8 Mar 2026, 01:59'); // CST, UTC−6
    expect(formatDateTime('2026-03-08T08:00:00.000Z', RUNNER)).toBe('8 Mar 2026, 03:00'); // CDT, UTC−5
  });

  it('repeats the hour in autumn in Chicago: two instants an hour apart read alike', () => {
    const first = '2026-11-01T06:30:00.000Z'; // 01:30 CDT
    const second = '2026-11-01T07:30:00.000Z'; // 01:30 CST
    expect(formatDateTime(first, RUNNER)).toBe('1 Nov 2026, 01:30');
    expect(formatDateTime(second, RUNNER)).toBe('1 Nov 2026, 01:30');
    // The coach's clock, without daylight time, tells them apart.
    expect(formatInZone(first, FAR_COACH, 'time')).toBe('15:30');
    expect(formatInZone(second, FAR_COACH, 'time')).toBe('16:30');
  });

  it('ends summer time in Europe at 01:00 UTC on the last Sunday of October', () => {
    expect(formatDateTime('2026-10-25T00:59:00.000Z', 'Europe/Paris')).toBe('25 Oct 2026, 02:59'); // CEST, UTC+2
    expect(formatDateTime('2026-10-25T01:00:00.000Z', 'Europe/Paris')).toBe('25 Oct 2026, 02:00'); // CET, UTC+1
    // A week earlier Paris and Chicago were 7 h apart; between the two changes (25 Oct – 1 Nov) only 6 h.
    expect(formatInZone('2026-10-18T12:00:00.000Z', 'Europe/Paris', 'time')).toBe('14:00');
    expect(formatInZone('2026-10-28T12:00:00.000Z', 'Europe/Paris', 'time')).toBe('13:00');
    expect(formatInZone('2026-10-28T12:00:00.000Z', RUNNER, 'time')).toBe('07:00');
  });
});
