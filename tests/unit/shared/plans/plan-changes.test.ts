import { describe, expect, it } from 'vitest';
import {
  describePlanAddedOrDeleted,
  describePlanChange,
  formatChangedWhen,
  formatPlanDay,
  planByline,
} from '../../../../shared/plans/plan-changes.ts';

const base = { date: '2026-12-12', title: 'Long run', notes: '', text: '10 mi easy' };

describe('describePlanChange', () => {
  it.each([
    [{ ...base }, null],
    [
      { ...base, date: '2026-12-13' },
      { kind: 'moved', summary: 'Moved from Sat 12 Dec to Sun 13 Dec.' },
    ],
    [
      { ...base, text: '11 mi easy' },
      { kind: 'changed', summary: 'Changed session "10 mi easy" → "11 mi easy".' },
    ],
    [
      { ...base, date: '2026-12-13', title: 'Long', notes: 'flat' },
      { kind: 'changed', summary: 'Moved from Sat 12 Dec to Sun 13 Dec; changed title "Long run" → "Long"; notes.' },
    ],
  ])('%j → %j', (after, expected) => {
    expect(describePlanChange(base, after)).toEqual(expected);
  });

  it('says what was added and deleted', () => {
    expect(describePlanAddedOrDeleted('added', base)).toBe('Added for Sat 12 Dec: 10 mi easy.');
    expect(describePlanAddedOrDeleted('deleted', base)).toBe('Deleted from Sat 12 Dec: 10 mi easy.');
  });
});

describe('formatPlanDay', () => {
  it.each([
    ['2026-12-12', 'Sat 12 Dec'],
    ['2024-02-29', 'Thu 29 Feb'],
    ['2027-01-01', 'Fri 1 Jan'],
  ])('%s → %s', (date, text) => expect(formatPlanDay(date)).toBe(text));
});

describe('formatChangedWhen', () => {
  const now = new Date('2026-12-10T15:00:00Z'); // Thursday 09:00 in America/Chicago
  it.each([
    ['2026-12-10T14:00:00Z', 'today'],
    ['2026-12-09T20:00:00Z', 'yesterday'],
    ['2026-12-08T12:00:00Z', 'Tue'],
    ['2026-12-01T12:00:00Z', '1 Dec'],
    // 03:00 UTC on the 10th is still the evening of the 9th in Chicago (UTC−6).
    ['2026-12-10T03:00:00Z', 'yesterday'],
  ])('%s → %s', (at, text) => expect(formatChangedWhen(new Date(at), now, 'America/Chicago')).toBe(text));
});

describe('planByline', () => {
  const now = new Date('2026-12-10T15:00:00Z');
  const written = { author_name: 'Dana Whitlock', updated_by_name: 'Dana Whitlock', created_at: '2026-12-08T12:00:00Z' };
  it('names the author; "changed" only after an edit; the editor only when not the author', () => {
    expect(planByline({ ...written, updated_at: '2026-12-08T12:00:00Z' }, now, 'UTC')).toBe('written by Dana Whitlock');
    expect(planByline({ ...written, updated_at: '2026-12-08T12:00:00.400Z' }, now, 'UTC')).toMatch(/ · changed /);
    expect(planByline({ ...written, updated_at: '2026-12-08T13:00:00Z' }, now, 'UTC')).toBe(
      'written by Dana Whitlock · changed Tue',
    );
    expect(planByline({ ...written, updated_by_name: 'Ivy Calder', updated_at: '2026-12-10T09:00:00Z' }, now, 'UTC')).toBe(
      'written by Dana Whitlock · changed today by Ivy Calder',
    );
    expect(planByline({ ...written, author_name: null, updated_at: '2026-12-08T12:00:00Z' }, now, 'UTC')).toBe(
      'written by a former account',
    );
  });
});
