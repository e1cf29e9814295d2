import { describe, expect, it } from 'vitest';
import { describeSession, joinNumbers, type DescribedPart } from '../../../../shared/plans/describe-session.ts';
import type { PartVerdict } from '../../../../shared/plans/plan-check.ts';

/** 2 km warm-up, 6 × (800 m rep, 400 m jog), 2 km cool-down, with the reps' verdicts given. */
function workout(reps: PartVerdict[], others: Partial<Record<number, PartVerdict>> = {}): DescribedPart[] {
  const parts: DescribedPart[] = [{ kind: 'warm-up', verdict: 'on pace' }];
  for (const verdict of reps) parts.push({ kind: 'rep', verdict }, { kind: 'recovery jog', verdict: 'on pace' });
  parts.push({ kind: 'cool-down', verdict: 'on pace' });
  return parts.map((p, i) => ({ ...p, verdict: others[i] ?? p.verdict }));
}

const ON: PartVerdict = 'on pace';

describe('describeSession', () => {
  it.each<[string, DescribedPart[], Parameters<typeof describeSession>[1], string]>([
    ['every rep on pace', workout([ON, ON, ON, ON, ON, ON]), 'as planned', 'As planned: all 6 reps on pace.'],
    [
      'one rep missed',
      workout([ON, ON, ON, 'missed', ON, ON]),
      'partly',
      'Partly as planned: 5 of 6 reps on pace, rep 4 missed.',
    ],
    [
      'rep 4 missed and rep 6 quick (the example of screens.md)',
      workout([ON, ON, ON, 'missed', ON, 'quick']),
      'partly',
      'Partly as planned: 4 of 6 reps on pace, rep 4 missed, rep 6 quick.',
    ],
    [
      'reps of the same verdict are grouped, runs of three shortened',
      workout(['slow', 'slow', 'slow', ON, 'slow', ON]),
      'partly',
      'Partly as planned: 2 of 6 reps on pace, reps 1–3 and 5 slow.',
    ],
    [
      'an off-plan part that is not a rep is named after the reps, without a number when it is the only one of its kind',
      workout([ON, ON, ON, ON, ON, ON], { 13: 'extended' }),
      'partly',
      'Partly as planned: all 6 reps on pace, cool-down extended.',
    ],
    [
      'recovery jogs are numbered among recovery jogs',
      workout([ON, ON, ON, ON, ON, ON], { 4: 'cut short' }),
      'partly',
      'Partly as planned: all 6 reps on pace, recovery jog 2 cut short.',
    ],
    [
      'nothing on pace',
      workout(['missed', 'missed', 'missed', 'missed', 'missed', 'missed'], { 0: 'cut short' }),
      'missed',
      'Missed: 0 of 6 reps on pace, reps 1–6 missed, warm-up cut short.',
    ],
    ['a single easy run on pace', [{ kind: 'easy', verdict: ON }], 'as planned', 'As planned: the easy part on pace.'],
    ['a single easy run cut short', [{ kind: 'easy', verdict: 'cut short' }], 'missed', 'Missed: easy part cut short.'],
    [
      'a long run with a goal-pace block counts the block',
      [
        { kind: 'easy', verdict: ON },
        { kind: 'goal pace', verdict: 'quick' },
        { kind: 'cool-down', verdict: ON },
      ],
      'partly',
      'Partly as planned: goal-pace part quick.',
    ],
    [
      'several easy and cool-down parts without a quality kind count all parts',
      [
        { kind: 'easy', verdict: ON },
        { kind: 'cool-down', verdict: 'slow' },
      ],
      'partly',
      'Partly as planned: 1 of 2 parts on pace, cool-down slow.',
    ],
    [
      'two easy parts around a goal-pace block: the off-plan one is named by its row in the table',
      [
        { kind: 'easy', verdict: 'by feel' },
        { kind: 'goal pace', verdict: ON },
        { kind: 'easy', verdict: 'cut short' },
      ],
      'partly',
      'Partly as planned: the goal-pace part on pace, part 3 (easy) cut short.',
    ],
    [
      'parts run by feel are not off plan',
      [
        { kind: 'easy', verdict: 'by feel' },
        { kind: 'goal pace', verdict: ON },
        { kind: 'easy', verdict: 'by feel' },
      ],
      'as planned',
      'As planned: the goal-pace part on pace.',
    ],
    ['no parts', [], 'unplanned', 'No session plan on this day.'],
    ['unplanned wins over parts', [{ kind: 'easy', verdict: ON }], 'unplanned', 'No session plan on this day.'],
  ])('%s', (_name, parts, verdict, sentence) => {
    expect(describeSession(parts, verdict)).toBe(sentence);
  });

  it('names at most four groups, then counts the rest', () => {
    const parts: DescribedPart[] = [
      { kind: 'rep', verdict: 'quick' },
      { kind: 'rep', verdict: 'slow' },
      { kind: 'rep', verdict: 'missed' },
      { kind: 'rep', verdict: 'cut short' },
      { kind: 'rep', verdict: 'extended' },
      { kind: 'warm-up', verdict: 'slow' },
    ];
    expect(describeSession(parts, 'partly')).toBe(
      'Partly as planned: 0 of 5 reps on pace, rep 1 quick, rep 2 slow, rep 3 missed, rep 4 cut short, and 2 more parts off plan.',
    );
  });

  it('does not change its input', () => {
    const parts = Object.freeze(workout([ON, 'missed', ON, ON, ON, ON]).map((p) => Object.freeze(p)));
    expect(() => describeSession(parts, 'partly')).not.toThrow();
  });
});

describe('joinNumbers', () => {
  it.each<[number[], string]>([
    [[], ''],
    [[4], '4'],
    [[4, 6], '4 and 6'],
    [[1, 2], '1 and 2'],
    [[1, 2, 3], '1–3'],
    [[1, 2, 3, 5], '1–3 and 5'],
    [[1, 3, 4, 5, 6, 9], '1, 3–6 and 9'],
  ])('%j → "%s"', (numbers, text) => {
    expect(joinNumbers(numbers)).toBe(text);
  });
});
