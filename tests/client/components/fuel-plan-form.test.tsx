import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { FuelItem } from '../../../shared/fuel/schemas.ts';
import { FuelPlanForm } from '../../../client/features/fuel/components/fuel-plan-form.tsx';
import { descriptionOf, fakeServer, renderAt, type SentRequest } from '../support/render.tsx';

// The fuel plan inputs (client/features/fuel/components/fuel-plan-form.tsx): each field is checked once left, in the
// words of its label and the runner's unit; what is sent is the API's input in its own units; a refused save keeps
// everything and puts the server's answer at the control it names.

afterEach(() => vi.unstubAllGlobals());

const USER_ID = '6a2b8c4d-9e0f-4a1b-8c3d-7e5f6a9b0c1d';
const DRAFT_KEY = `pacewright:draft:fuel-plan:${USER_ID}:goal`;
const PLAN_PATH = '/api/me/goal-race/fuel-plan';
const GEL: FuelItem = {
  id: '3f1c2a4e-5b6d-4e7f-8a9b-0c1d2e3f4a5b',
  name: 'Lemon gel',
  serving: '1 sachet',
  carbohydrate_g: 22,
  sodium_mg: 40,
  caffeine_mg: 0,
  fluid_ml: 0,
};
const MIX: FuelItem = {
  id: '9b8a7c6d-5e4f-4a3b-9c2d-1e0f9a8b7c6d',
  name: 'Drink mix',
  serving: '1 scoop',
  carbohydrate_g: 20,
  sodium_mg: 250,
  caffeine_mg: 0,
  fluid_ml: 0,
};

function showForm() {
  return renderAt(
    '/plan/fuel',
    <FuelPlanForm
      owner={{ kind: 'goal' }}
      userId={USER_ID}
      plan={null}
      items={[GEL, MIX]}
      unit="mi"
      defaultBodyMass={null}
      durationFrom="your goal time"
    />,
  );
}

const field = (label: string) => screen.getByLabelText(label) as HTMLInputElement;
const puts = (sent: SentRequest[]) => sent.filter((r) => r.method === 'PUT' && r.path === PLAN_PATH);

/** A whole plan, in miles: 62 kg, 2:30:00, easy 9:30 per mi, bottle A (500 ml, 2 scoops), a gel every 3 mi from mile 2. */
async function fillPlan(u: ReturnType<typeof userEvent.setup>) {
  await u.type(field('Body mass (kg)'), '62');
  await u.type(field('Expected duration (optional, h:mm:ss)'), '2:30:00');
  await u.type(field('Easy pace (m:ss per mi, where needed)'), '9:30');
  await u.click(screen.getByRole('button', { name: 'Add a bottle' }));
  await u.click(screen.getByRole('button', { name: 'Mix in an item' }));
  await u.selectOptions(field('Mixed in, bottle 1 item 1'), MIX.id);
  await u.clear(field('Servings, bottle 1 item 1'));
  await u.type(field('Servings, bottle 1 item 1'), '2');
  await u.click(screen.getByRole('button', { name: 'Add an intake' }));
  await u.selectOptions(field('What, intake 1'), `item:${GEL.id}`);
  await u.type(field('Every (mi), intake 1'), '3');
  await u.type(field('First at (mi, optional), intake 1'), '2');
}

describe('Fuel plan form', () => {
  it('checks a field once it is left, in the words of its label and unit, and saves nothing while one needs a fix', async () => {
    const sent = fakeServer(() => ({ status: 500 }));
    showForm();
    const u = userEvent.setup();

    await u.type(field('Body mass (kg)'), 'sixty');
    // Not while typing: the message comes once the field is left.
    expect(field('Body mass (kg)').getAttribute('aria-invalid')).toBeNull();
    await u.tab();
    expect(field('Body mass (kg)').getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(field('Body mass (kg)'))).toBe(
      'For the meal figures and caffeine per kg. Write the body mass in kg, e.g. 62.',
    );

    // The pace is asked for per mile, as the label says, never in seconds per km.
    await u.type(field('Easy pace (m:ss per mi, where needed)'), '1:00');
    await u.tab();
    expect(descriptionOf(field('Easy pace (m:ss per mi, where needed)'))).toMatch(
      /Write an easy pace between \d+:\d\d and \d+:\d\d per mi\.$/,
    );

    // An intake whose item was never chosen is not sent as an empty choice.
    await u.click(screen.getByRole('button', { name: 'Add an intake' }));
    await u.click(screen.getByRole('button', { name: 'Save and compute the schedule' }));
    expect(descriptionOf(field('What, intake 1'))).toBe('Choose an item or a bottle for this intake.');
    expect(screen.getByRole('alert').textContent).toMatch(
      /^Not saved yet: \d+ fields need a fix, see the messages beside them\./,
    );
    // Focus goes to the first field, in page order, that needs attention.
    expect(document.activeElement).toBe(field('Body mass (kg)'));
    expect(puts(sent)).toEqual([]);
  });

  it('sends the plan in the API units and keeps everything, with the answer at its control, when the save is refused', async () => {
    const gone = 'There is no fuel item with this id.';
    const sent = fakeServer((r) =>
      r.method === 'PUT'
        ? {
            status: 400,
            body: { error: gone, code: 'validation-failed', details: [{ field: 'intakes.0.item_id', message: gone }] },
          }
        : { status: 200, body: {} },
    );
    const first = showForm();
    const u = userEvent.setup();
    await fillPlan(u);
    // Before any save the bottle's concentration is worked out on the page: 2 × 20 g in 500 ml is 8 %.
    expect(within(screen.getByRole('group', { name: 'Bottle 1' })).getByText(/40 g carbohydrate \(8 %\)/)).toBeTruthy();
    await u.click(screen.getByRole('button', { name: 'Save and compute the schedule' }));

    expect(await screen.findByText(/^Not saved:/)).toHaveProperty(
      'textContent',
      'Not saved: see the messages beside the fields. Everything you entered is still here.',
    );
    expect(puts(sent)).toHaveLength(1);
    const body = puts(sent)[0]!.body as Record<string, unknown>;
    expect(body).toMatchObject({
      body_mass_kg: 62,
      expected_duration_s: 2.5 * 3600,
      start_clock: null,
      bottles: [{ id: 'A', volume_ml: 500, contents: [{ item_id: MIX.id, servings: 2 }] }],
      intakes: [{ item_id: GEL.id, servings: 1, when: { type: 'every_distance', every: 3, unit: 'mi', first: 2 } }],
    });
    // 9:30 per mi is sent per km: 570 s ÷ 1.609344 km (the international mile, exactly 1 609.344 m).
    expect(body.easy_pace_s_per_km).toBeCloseTo(570 / 1.609344, 1);

    const what = field('What, intake 1');
    expect(what.getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(what)).toBe(gone);
    expect(document.activeElement).toBe(what);
    const kept = () => {
      expect(field('Body mass (kg)').value).toBe('62');
      expect(field('Expected duration (optional, h:mm:ss)').value).toBe('2:30:00');
      expect(field('Easy pace (m:ss per mi, where needed)').value).toBe('9:30');
      expect(field('Servings, bottle 1 item 1').value).toBe('2');
      expect(field('What, intake 1').value).toBe(`item:${GEL.id}`);
      expect(field('Every (mi), intake 1').value).toBe('3');
      expect(field('First at (mi, optional), intake 1').value).toBe('2');
    };
    kept();

    // Choosing again answers the server's message at once.
    await u.selectOptions(what, `item:${MIX.id}`);
    expect(what.getAttribute('aria-invalid')).toBeNull();

    // A reload opens the same inputs from the device's draft.
    first.unmount();
    expect(localStorage.getItem(DRAFT_KEY)).not.toBeNull();
    showForm();
    expect(screen.getByText('Restored what you entered earlier on this device; it is not saved yet.')).toBeTruthy();
    expect(field('Body mass (kg)').value).toBe('62');
    expect(field('What, intake 1').value).toBe(`item:${MIX.id}`);
    await u.click(screen.getByRole('button', { name: 'Start again from empty' }));
    expect(field('Body mass (kg)').value).toBe('');
    expect(screen.queryByLabelText('What, intake 1')).toBeNull();
    expect(localStorage.getItem(DRAFT_KEY)).toBeNull();
  });
});
