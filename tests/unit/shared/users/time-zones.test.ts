import { describe, expect, it } from 'vitest';
import { TIME_ZONES, TIME_ZONE_ALIASES, canonicalTimeZone } from '../../../../shared/users/time-zones.ts';

/** The wall clock of a zone at an instant, from the runtime's own tz data (ICU), not from our table. */
function wallClock(timeZone: string, epochMs: number): string {
  return new Intl.DateTimeFormat('en-CA', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).format(epochMs);
}

describe('the time zone list: current IANA names, old ones as aliases', () => {
  it('lists the current names and none of the outdated ones Intl still answers', () => {
    // IANA tz database, file `backward`: Asia/Calcutta → Asia/Kolkata (renamed 2008), Europe/Kiev →
    // Europe/Kyiv (2022b), Asia/Saigon → Asia/Ho_Chi_Minh, America/Godthab → America/Nuuk (2020a).
    for (const current of ['Asia/Kolkata', 'Europe/Kyiv', 'Asia/Ho_Chi_Minh', 'America/Nuuk', 'UTC', 'Europe/Berlin']) {
      expect(TIME_ZONES).toContain(current);
    }
    for (const outdated of ['Asia/Calcutta', 'Europe/Kiev', 'Asia/Saigon', 'America/Godthab', 'US/Pacific', 'Etc/UTC']) {
      expect(TIME_ZONES).not.toContain(outdated);
    }
    expect(new Set(TIME_ZONES).size).toBe(TIME_ZONES.length);
  });

  it('answers an outdated name with its current one, a current name as it is, and null for no zone', () => {
    expect(canonicalTimeZone('Asia/Calcutta')).toBe('Asia/Kolkata');
    expect(canonicalTimeZone('Europe/Kiev')).toBe('Europe/Kyiv');
    expect(canonicalTimeZone('US/Pacific')).toBe('America/Los_Angeles');
    expect(canonicalTimeZone('Etc/UTC')).toBe('UTC');
    expect(canonicalTimeZone('Europe/Berlin')).toBe('Europe/Berlin');
    expect(canonicalTimeZone('Etc/GMT+5')).toBe('Etc/GMT+5');
    expect(canonicalTimeZone('Etc/GMT+15')).toBeNull();
    expect(canonicalTimeZone('Not/AZone')).toBeNull();
    expect(canonicalTimeZone('toString')).toBeNull();
    expect(canonicalTimeZone('')).toBeNull();
  });

  it('points every alias at a listed name that is not itself an alias', () => {
    for (const [alias, current] of Object.entries(TIME_ZONE_ALIASES)) {
      expect(TIME_ZONES, alias).toContain(current);
      expect(TIME_ZONES, alias).not.toContain(alias);
    }
  });

  it('every alias shows the same clock as its current name (checked against the runtime ICU tz data)', () => {
    // Winter, summer and a late evening near the date line; a rename never moves the clock.
    const instants = [Date.UTC(2026, 0, 15, 12), Date.UTC(2026, 6, 15, 12), Date.UTC(2026, 11, 4, 23, 30)];
    for (const [alias, current] of Object.entries(TIME_ZONE_ALIASES)) {
      for (const at of instants) expect(wallClock(alias, at), `${alias} → ${current}`).toBe(wallClock(current, at));
    }
  });

  it('every listed name is one the runtime can date with', () => {
    for (const zone of TIME_ZONES) expect(() => wallClock(zone, 0), zone).not.toThrow();
  });
});
