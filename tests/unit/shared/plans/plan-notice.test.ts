import { describe, expect, it } from 'vitest';
import { planChangeNotice, type NoticedChange } from '../../../../shared/plans/plan-notice.ts';

const change = (over: Partial<NoticedChange>): NoticedChange => ({
  plan_id: 'p1',
  actor_name: 'Dana Coach',
  kind: 'added',
  summary: 'Added for Sat 12 Dec: 10 mi easy.',
  plan_date: '2026-12-12',
  ...over,
});

describe('planChangeNotice', () => {
  it('counts sessions, not changes, and names the week by its first day', () => {
    const notice = planChangeNotice(
      [
        change({}),
        change({ kind: 'changed', summary: 'Changed notes.' }),
        change({ plan_id: 'p2', summary: 'Added for Sun 13 Dec: 5 mi easy.', plan_date: '2026-12-13' }),
      ],
      1,
    );
    // 12 and 13 Dec 2026 are a Saturday and a Sunday; their Monday is 7 Dec.
    expect(notice.subject).toBe('Dana Coach changed 2 sessions in your week of 7 Dec');
    expect(notice.intro).toBe('Dana Coach changed 2 sessions in your week of 7 Dec.');
    expect(notice.first_week).toBe('2026-12-07');
    expect(notice.lines).toEqual([
      'Week of 7 Dec:',
      '- Added for Sat 12 Dec: 10 mi easy.',
      '- Sat 12 Dec: Changed notes.',
      '- Added for Sun 13 Dec: 5 mi easy.',
    ]);
  });

  it('follows the runner’s first day of the week', () => {
    // Weeks starting on Sunday: Sat 12 Dec is in the week of Sun 6 Dec, Sun 13 Dec starts the next.
    const notice = planChangeNotice([change({}), change({ plan_id: 'p2', plan_date: '2026-12-13', summary: 'x.' })], 0);
    expect(notice.subject).toBe('Dana Coach changed 2 sessions in your weeks of 6 Dec and 13 Dec');
    expect(notice.lines[0]).toBe('Week of 6 Dec:');
    expect(notice.lines[2]).toBe('Week of 13 Dec:');
  });

  it('one session, many weeks, several editors', () => {
    expect(planChangeNotice([change({ kind: 'moved', summary: 'Moved from Sat 12 Dec to Sun 13 Dec.' })], 1).subject).toBe(
      'Dana Coach changed 1 session in your week of 7 Dec',
    );
    const notice = planChangeNotice(
      [
        change({ plan_date: '2026-12-01' }),
        change({ plan_id: 'p2', plan_date: '2026-12-12', actor_name: 'Sam Helper' }),
        change({ plan_id: 'p3', plan_date: '2026-12-28' }),
      ],
      1,
    );
    expect(notice.subject).toBe('Dana Coach and Sam Helper changed 3 sessions in 3 weeks of your plan, from 30 Nov');
    expect(notice.lines).toContain('- Added for Sat 12 Dec: 10 mi easy. (Sam Helper)');
  });

  it('a moved-and-changed session is not given its day twice', () => {
    const notice = planChangeNotice(
      [change({ kind: 'changed', summary: 'Moved from Sat 12 Dec to Sun 13 Dec; changed notes.', plan_date: '2026-12-13' })],
      1,
    );
    expect(notice.lines[1]).toBe('- Moved from Sat 12 Dec to Sun 13 Dec; changed notes.');
  });

  it('refuses an empty burst', () => {
    expect(() => planChangeNotice([], 1)).toThrow(RangeError);
  });
});
