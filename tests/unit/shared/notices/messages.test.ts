import { describe, expect, it } from 'vitest';
import { NOTICE_KIND_INFO, NOTICE_KINDS, noticeKindsFor } from '../../../../shared/notices/kinds.ts';
import {
  notesNotice,
  painAlert,
  squadLeaveNotice,
  UPLOAD_NOTICE_LISTED_MAX,
  uploadNotice,
} from '../../../../shared/notices/messages.ts';

const run = (i: number) => ({ name: `Run ${i}`, local_date: '2026-12-05', distance_m: 16_093.44, href: `/runs/${i}` });

describe('uploadNotice', () => {
  it('names one run, in the reader’s unit (10 mi = 16 093.44 m, the international mile)', () => {
    const message = uploadNotice('Rhea', [run(1)], 'mi', '/week');
    expect(message.subject).toBe('Rhea uploaded a run');
    expect(message.items).toEqual([{ text: '5 Dec 2026 · Run 1 · 10.00 mi', href: '/runs/1' }]);
    expect(uploadNotice('Rhea', [run(1)], 'km', '/week').items[0]!.text).toBe('5 Dec 2026 · Run 1 · 16.09 km');
  });

  it('lists at most 20 runs and counts the rest', () => {
    const message = uploadNotice(
      'Rhea',
      Array.from({ length: 25 }, (_, i) => run(i)),
      'km',
      '/week',
    );
    expect(message.subject).toBe('Rhea uploaded 25 runs');
    expect(message.items).toHaveLength(UPLOAD_NOTICE_LISTED_MAX);
    expect(message.paragraphs).toEqual(['The first 20 are listed; 5 more runs came in the same upload.']);
  });
});

describe('notesNotice', () => {
  const note = (author: string) => ({
    author_name: author,
    about: 'week of 30 Nov 2026',
    runner_name: 'Rhea',
    excerpt: 'Hi',
    href: '/w',
  });
  it('says who wrote, and whose run or week it is for a coach', () => {
    expect(notesNotice([note('Rhea')], false)).toMatchObject({
      subject: 'A new note from Rhea',
      items: [{ text: 'Rhea on Rhea’s week of 30 Nov 2026: “Hi”' }],
    });
    expect(notesNotice([note('Dana'), note('Dana')], true).subject).toBe('2 new notes from Dana');
    expect(notesNotice([note('Dana'), note('Lee')], true).items[0]!.text).toBe('Dana on your week of 30 Nov 2026: “Hi”');
    expect(notesNotice([note('Dana'), note('Lee')], true).subject).toBe('2 new notes from 2 people');
  });
});

describe('painAlert', () => {
  const words = (m: ReturnType<typeof painAlert>) => [m.subject, m.title, ...m.paragraphs].join(' ');
  it('repeats what the runner reported, diagnoses nothing and defers to a physician or physiotherapist', () => {
    const m = painAlert('Rhea', { source: 'checkin', soreness: 4, run_name: 'Long run', local_date: '2026-12-05' }, '/runs/1');
    expect(m.subject).toBe('Rhea reported soreness 4 of 5');
    expect(m.paragraphs[0]).toBe('Rhea reported soreness 4 of 5 in the check-in after “Long run” on 5 Dec 2026.');
    expect(words(m)).toMatch(/not an assessment/);
    expect(words(m)).toMatch(/physician or physiotherapist/);
    // No condition is named: the alert never guesses at a cause.
    expect(words(m)).not.toMatch(/injur|strain|sprain|fracture|tendin|overtrain/i);
  });

  it('an illness note defers to a physician', () => {
    const m = painAlert('Rhea', { source: 'note', concern: 'illness', about: 'week of 30 Nov 2026', excerpt: 'Fever' }, '/w');
    expect(m.subject).toBe('Rhea wrote a note about illness');
    expect(words(m)).toMatch(/a physician is the one to say/);
  });
});

describe('squadLeaveNotice', () => {
  it('says who left which squad and when', () => {
    expect(squadLeaveNotice('Rhea', 'Dawn Group', '2026-12-05', '/squad').paragraphs[0]).toBe(
      'Rhea left the squad “Dawn Group” on 5 Dec 2026.',
    );
  });
});

describe('notice kinds', () => {
  it('each kind has its own users column; a runner is offered notes and plan changes, a coach the squad notices', () => {
    expect(new Set(NOTICE_KINDS.map((k) => NOTICE_KIND_INFO[k].column)).size).toBe(NOTICE_KINDS.length);
    expect(noticeKindsFor('runner')).toEqual(['note', 'plan_change']);
    expect(noticeKindsFor('coach')).toEqual(['import', 'note', 'pain_alert', 'squad_leave', 'digest']);
  });
});
