import { describe, expect, it } from 'vitest';
import {
  checkPlanDraft,
  controlOf,
  problemsFromServer,
  type IntakeDraft,
  type PlanDraft,
} from '../../../client/features/fuel/utils/fuel-plan-draft.ts';

const GEL = '7d1f1c3e-5b8a-4c8e-9a43-2f0d6c1b9e01';

function intake(patch: Partial<IntakeDraft>): IntakeDraft {
  return {
    key: 1,
    what: `item:${GEL}`,
    servings: '1',
    ml: '150',
    when: 'every_distance',
    every: '5',
    unit: 'mi',
    first: '',
    at: '',
    ...patch,
  };
}

function draft(patch: Partial<PlanDraft> = {}): PlanDraft {
  const none = { own: false, low: '', high: '' };
  return {
    bodyMass: '58',
    duration: '',
    easyPace: '9:30',
    startClock: '',
    sweat: '',
    targets: { carbohydrate: none, fluid: none, sodium: none },
    bottles: [],
    intakes: [intake({})],
    ...patch,
  };
}

describe('fuel plan form: problems at the control, in the words of its label', () => {
  it('reads a good draft into the API input, the mi pace as seconds per km', () => {
    const check = checkPlanDraft(draft(), 'mi');
    expect(check.fields).toEqual({});
    // 9:30 per mi = 570 s / 1.609344 km = 354.2 s per km (international mile, 1609.344 m).
    expect(check.input?.easy_pace_s_per_km).toBeCloseTo(354.18, 1);
  });

  it('asks for what the label shows, never internal names or units', () => {
    const check = checkPlanDraft(
      draft({
        bodyMass: 'sixty',
        easyPace: '9.30',
        duration: '2h',
        intakes: [
          intake({ what: '', every: '' }),
          intake({ key: 2, when: 'every_time', every: '' }),
          intake({ key: 3, when: 'at_times', at: '0:40, 9:99' }),
        ],
      }),
      'mi',
    );
    expect(check.input).toBeNull();
    expect(check.fields).toEqual({
      body_mass_kg: 'Write the body mass in kg, e.g. 62.',
      easy_pace_s_per_km: 'Write the easy pace as m:ss per mi, e.g. 9:30.',
      expected_duration_s: 'Write the expected duration as h:mm:ss, e.g. 2:30:00, or leave it empty.',
      'intakes.0.what': 'Choose an item or a bottle for this intake.',
      'intakes.0.when.every': 'Write the distance between intakes in mi, e.g. 3.',
      'intakes.1.when.every': 'Write the minutes between intakes, e.g. 20.',
      'intakes.2.when.at': 'Write the times as h:mm from the start, separated by commas, e.g. 0:40, 1:20.',
    });
    for (const message of Object.values(check.fields)) expect(message).not.toMatch(/seconds|per km|_|body mass kg/);
  });

  it('words a range in the unit of the field: 1:30–20:00 per km is 2:25–32:11 per mi', () => {
    // 90 s/km × 1.609344 = 144.8 s = 2:25; 1200 s/km × 1.609344 = 1931.2 s = 32:11 (international mile).
    const check = checkPlanDraft(draft({ easyPace: '1:10' }), 'mi');
    expect(check.fields.easy_pace_s_per_km).toBe('Write an easy pace between 2:25 and 32:11 per mi.');
    expect(checkPlanDraft(draft({ easyPace: '1:10' }), 'km').fields.easy_pace_s_per_km).toBe(
      'A pace must be between 1:30 and 20:00 per km.',
    );
  });

  it('a target with the low end above the high end is named at the high field', () => {
    const none = { own: false, low: '', high: '' };
    const check = checkPlanDraft(
      draft({
        targets: {
          carbohydrate: { own: true, low: '90', high: '60' },
          fluid: { own: true, low: 'x', high: '500' },
          sodium: none,
        },
      }),
      'km',
    );
    expect(check.fields['targets.carbohydrate.high']).toBe('The low end cannot be above the high end.');
    expect(check.fields['targets.fluid.low']).toBe('Write the fluid low figure in ml/h, e.g. 500.');
  });

  it('puts the server answers back on the controls, and the form-wide ones in a list', () => {
    const d = draft({
      bottles: [
        { key: 5, name: 'A', volume: '500', volumeUnit: 'ml', contents: [] },
        { key: 6, name: 'A', volume: '500', volumeUnit: 'ml', contents: [] },
      ],
    });
    const problems = problemsFromServer(
      [
        { field: 'intakes.0.item_id', message: 'There is no fuel item with this id.' },
        { field: 'intakes.0.when.first_s', message: 'A time is a number of seconds from the start.' },
        { field: 'bottles', message: 'Give each bottle its own name.' },
      ],
      d,
      'mi',
    );
    expect(problems.fields).toEqual({
      'intakes.0.what': 'There is no fuel item with this id.',
      'intakes.0.when.first': 'Write the first distance in mi, e.g. 2, or leave it empty.',
    });
    expect(problems.general).toEqual(['Bottles: Give each bottle its own name.']);
  });

  it('maps API paths to controls', () => {
    expect(controlOf('intakes.3')).toBe('intakes.3.what');
    expect(controlOf('intakes.3.bottle')).toBe('intakes.3.what');
    expect(controlOf('intakes.3.when.at_s.2')).toBe('intakes.3.when.at');
    expect(controlOf('intakes.3.when.every_s')).toBe('intakes.3.when.every');
    expect(controlOf('bottles.1.contents.0.item_id')).toBe('bottles.1.contents.0.item_id');
    expect(controlOf('bottles')).toBeNull();
    expect(controlOf('intakes')).toBeNull();
  });
});
