import { describe, expect, it } from 'vitest';
import {
  loadCoachCount,
  loadDates,
  loadRunnerName,
  loadRunnerProfile,
  loadSessionFor,
  loadSessionsOf,
  loadWeekFeedback,
  parseLoadSettings,
  planLoadSquads,
} from '../../../db/load/load-plan.ts';
import { parseShorthand } from '../../../shared/plans/shorthand.ts';
import { trueDistance } from '../../../shared/tracks/synthetic.ts';
import { dayOfWeek } from '../../../shared/weeks/weeks.ts';

describe('parseLoadSettings', () => {
  it('uses 50 runners × 3 years, batches of 100 and 2 at a time by default', () => {
    expect(parseLoadSettings({})).toStrictEqual({ ok: true, settings: { runners: 50, years: 3, batch: 100, concurrency: 2 } });
  });

  it('accepts a fraction of a year', () => {
    expect(parseLoadSettings({ LOAD_RUNNERS: '2', LOAD_YEARS: '0.1' })).toMatchObject({
      ok: true,
      settings: { runners: 2, years: 0.1 },
    });
  });

  it.each([
    ['LOAD_RUNNERS', '0'],
    ['LOAD_RUNNERS', '2.5'],
    ['LOAD_RUNNERS', '1000'],
    ['LOAD_YEARS', '0'],
    ['LOAD_YEARS', 'many'],
    ['LOAD_YEARS', '21'],
    ['LOAD_BATCH', '-1'],
  ])('when %s is %s, answers an error naming it', (name, value) => {
    const result = parseLoadSettings({ [name]: value });
    expect(result.ok).toBe(false);
    expect(!result.ok && result.error).toContain(name);
  });
});

describe('loadRunnerName', () => {
  it.each([
    [1, 'Load Runner 001'],
    [17, 'Load Runner 017'],
    [999, 'Load Runner 999'],
  ])('runner %i is %s', (n, name) => expect(loadRunnerName(n)).toBe(name));
});

describe('planLoadSquads', () => {
  it('cuts 50 runners into two full squads, each with its own coach', () => {
    const squads = planLoadSquads(50);
    expect(squads.map((s) => s.runners.length)).toStrictEqual([25, 25]);
    expect(squads.map((s) => s.coach)).toStrictEqual([1, 2]);
    expect(loadCoachCount(squads)).toBe(2);
  });

  it('puts every runner in exactly one squad of at most the given size', () => {
    const squads = planLoadSquads(103, 20);
    expect(squads.flatMap((s) => s.runners)).toStrictEqual(Array.from({ length: 103 }, (_, i) => i + 1));
    expect(squads.map((s) => s.runners.length)).toStrictEqual([20, 20, 20, 20, 20, 3]);
    expect(loadCoachCount(squads)).toBe(6);
  });

  it('gives no squads for no runners', () => expect(planLoadSquads(0)).toStrictEqual([]));

  it.each([0, 51, 2.5])('refuses a squad size of %s', (size) => expect(() => planLoadSquads(10, size)).toThrow(RangeError));
});

describe('loadDates', () => {
  it('ends on the given day and covers 365 days a year', () => {
    const dates = loadDates('2026-11-30', 1);
    expect(dates).toHaveLength(365);
    expect(dates[0]).toBe('2025-12-01');
    expect(dates.at(-1)).toBe('2026-11-30');
  });

  it('keeps at least one day for a tiny fraction of a year', () =>
    expect(loadDates('2026-11-30', 0.0001)).toStrictEqual(['2026-11-30']));
});

describe('loadSessionFor', () => {
  const profile = loadRunnerProfile(17);
  const dates = loadDates('2026-11-29', 1);
  const sessions = loadSessionsOf(profile, dates);

  it('rests one day a week, on the runner’s own rest day', () => {
    expect(sessions).toHaveLength(dates.length - dates.filter((d) => dayOfWeek(d) === profile.rest_weekday).length);
    expect(sessions.every((s) => dayOfWeek(s.date) !== profile.rest_weekday)).toBe(true);
  });

  it('writes every plan in shorthand that parses', () => {
    expect(sessions.length).toBeGreaterThan(0);
    for (const s of sessions) expect(parseShorthand(s.plan), s.plan).toMatchObject({ ok: true });
  });

  it('samples every 10–15 s and starts on the session’s own UTC date', () => {
    for (const s of sessions) {
      expect(s.sample_s).toBeGreaterThanOrEqual(10);
      expect(s.sample_s).toBeLessThanOrEqual(15);
      expect(new Date(s.start_t).toISOString().slice(0, 10)).toBe(s.date);
    }
  });

  it('varies the distance by day and by runner', () => {
    const easyDistances = new Set(sessions.filter((s) => s.kind === 'easy').map((s) => Math.round(trueDistance(s.phases))));
    expect(easyDistances.size).toBeGreaterThan(10);
    const other = loadSessionsOf(loadRunnerProfile(18), dates);
    expect(other.map((s) => s.phases)).not.toStrictEqual(sessions.map((s) => s.phases));
  });

  it('is the same session when asked again (a resumed load makes identical files)', () => {
    expect(loadSessionFor(profile, '2026-06-10')).toStrictEqual(loadSessionFor(profile, '2026-06-10'));
  });
});

describe('loadWeekFeedback', () => {
  it('reviews four weeks in five and notes every third week, one entry per Monday', () => {
    const feedback = loadWeekFeedback(loadRunnerProfile(3), loadDates('2026-11-29', 1));
    expect(feedback).toHaveLength(52);
    expect(feedback.every((f) => dayOfWeek(f.week_start) === 1)).toBe(true);
    expect(feedback.filter((f) => !f.reviewed).length).toBeGreaterThanOrEqual(10);
    expect(feedback.filter((f) => f.note !== null).length).toBeGreaterThanOrEqual(17);
  });
});
