import { describe, expect, it } from 'vitest';
import { expandParts, resolveTargets } from '../../../../shared/plans/expand.ts';
import { firstPlanOfEachDay, planCheckInputsText, planOfRun } from '../../../../shared/plans/run-plan-choice.ts';
import { parseShorthand } from '../../../../shared/plans/shorthand.ts';

const plan = (id: string, runner_id: string, date: string) => ({ id, runner_id, date });
// In the order "first" means: by date, then by creation.
const plans = [
  plan('a1', 'ann', '2026-11-24'),
  plan('a2', 'ann', '2026-11-24'),
  plan('b1', 'bo', '2026-11-24'),
  plan('a3', 'ann', '2026-11-25'),
];
const byId = new Map(plans.map((p) => [p.id, p]));
const firstOfDay = firstPlanOfEachDay(plans);
const annsRun = { user_id: 'ann', local_date: '2026-11-24' };

describe('planOfRun', () => {
  it('takes the first plan of the runner’s own day when none was chosen', () => {
    expect(planOfRun(annsRun, undefined, byId, firstOfDay)).toEqual({ plan: plans[0], linked: 'same day' });
    expect(planOfRun({ user_id: 'bo', local_date: '2026-11-24' }, undefined, byId, firstOfDay).plan?.id).toBe('b1');
    expect(planOfRun({ user_id: 'bo', local_date: '2026-11-25' }, undefined, byId, firstOfDay)).toEqual({
      plan: null,
      linked: null,
    });
  });

  it('takes the chosen plan, whatever its day; "no plan" chosen on purpose stays unplanned', () => {
    expect(planOfRun(annsRun, { plan_id: 'a3' }, byId, firstOfDay)).toEqual({ plan: plans[3], linked: 'chosen' });
    expect(planOfRun(annsRun, { plan_id: null }, byId, firstOfDay)).toEqual({ plan: null, linked: null });
    expect(planOfRun(annsRun, { plan_id: 'gone' }, byId, firstOfDay)).toEqual({ plan: null, linked: null });
  });
});

describe('planCheckInputsText', () => {
  const parts = (text: string, paces = {}) => {
    const parsed = parseShorthand(text);
    if (!parsed.ok) throw new Error(parsed.error.message);
    return resolveTargets(expandParts(parsed.items), paces);
  };
  const base = planCheckInputsText('run-1', parts('5 km @ goal', { goal: 333 }), 0.02, 'code-1');

  it('is the same for the same inputs', () => {
    expect(planCheckInputsText('run-1', parts('5 km @ goal', { goal: 333 }), 0.02, 'code-1')).toBe(base);
  });

  it.each([
    ['another run', planCheckInputsText('run-2', parts('5 km @ goal', { goal: 333 }), 0.02, 'code-1')],
    ['another plan', planCheckInputsText('run-1', parts('6 km @ goal', { goal: 333 }), 0.02, 'code-1')],
    ['a race-named pace that moved', planCheckInputsText('run-1', parts('5 km @ goal', { goal: 300 }), 0.02, 'code-1')],
    ['a race-named pace gone', planCheckInputsText('run-1', parts('5 km @ goal'), 0.02, 'code-1')],
    ['another tolerance', planCheckInputsText('run-1', parts('5 km @ goal', { goal: 333 }), 0.05, 'code-1')],
    ['changed plan-check code', planCheckInputsText('run-1', parts('5 km @ goal', { goal: 333 }), 0.02, 'code-2')],
  ])('changes with %s', (_what, text) => {
    expect(text).not.toBe(base);
  });
});
