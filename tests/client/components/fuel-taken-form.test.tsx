import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { FuelTakenView } from '../../../shared/fuel/answers.ts';
import type { FuelItem } from '../../../shared/fuel/schemas.ts';
import { FuelTakenCard } from '../../../client/features/fuel/components/fuel-taken-card.tsx';
import { descriptionOf, fakeServer, renderAt, type SentRequest } from '../support/render.tsx';

// The run page's fuel record (client/features/fuel/components/fuel-taken-card.tsx): entries are checked where they
// are typed, a refused save keeps every entry on screen and in the device's draft, and the server's problem
// stands at the entry it names.

afterEach(() => vi.unstubAllGlobals());

const RUN_ID = '0d7c9a52-1b3e-4f6a-8c2d-5e9f0a1b2c3d';
const USER_ID = '6a2b8c4d-9e0f-4a1b-8c3d-7e5f6a9b0c1d';
const DRAFT_KEY = `pacewright:draft:fuel-taken:${USER_ID}:${RUN_ID}`;
const GEL: FuelItem = {
  id: '3f1c2a4e-5b6d-4e7f-8a9b-0c1d2e3f4a5b',
  name: 'Lemon gel',
  serving: '1 sachet',
  carbohydrate_g: 22,
  sodium_mg: 40,
  caffeine_mg: 0,
  fluid_ml: 0,
};
const NOTHING_YET: FuelTakenView = { fuel_taken: null, planned_vs_taken: null, cautions: [] };
const GONE = 'This item is no longer among your fuel items: remove the entry, or add the item again.';

/** The run page's reads, and `onPut` for the save. */
function server(onPut: (request: SentRequest) => { status: number; body?: unknown }) {
  return fakeServer((r) => {
    if (r.method === 'PUT' && r.path === `/api/runs/${RUN_ID}/fuel-taken`) return onPut(r);
    if (r.path === `/api/runs/${RUN_ID}/fuel-taken`) return { status: 200, body: NOTHING_YET };
    if (r.path === '/api/fuel-items') return { status: 200, body: { items: [GEL] } };
    if (r.path.startsWith('/api/plans?')) return { status: 200, body: { plans: [] } };
    return { status: 200, body: {} }; // /api/health, asked for the CSRF cookie before a write
  });
}

const showCard = () =>
  renderAt(`/runs/${RUN_ID}`, <FuelTakenCard runId={RUN_ID} userId={USER_ID} localDate="2026-11-28" isOwner unit="km" />);

async function addExtra(u: ReturnType<typeof userEvent.setup>, what: string, amount: string, time: string) {
  await u.selectOptions(screen.getByLabelText('What you took'), what);
  const amountField = screen.getByLabelText(what === 'water' ? 'Millilitres (ml)' : 'Servings');
  await u.clear(amountField);
  await u.type(amountField, amount);
  await u.clear(screen.getByLabelText('Time (h:mm from the start)'));
  await u.type(screen.getByLabelText('Time (h:mm from the start)'), time);
  await u.click(screen.getByRole('button', { name: 'Add to the record' }));
}

const valueOf = (label: string) => (screen.getByLabelText(label) as HTMLInputElement).value;
const puts = (sent: SentRequest[]) => sent.filter((r) => r.method === 'PUT');

describe('Fuel taken on the run page', () => {
  it('checks an added intake where it is typed: nothing joins the record and nothing is sent', async () => {
    const sent = server(() => ({ status: 500 }));
    showCard();
    const u = userEvent.setup();
    await screen.findByLabelText('What you took');

    await u.click(screen.getByRole('button', { name: 'Add to the record' }));
    expect(descriptionOf(screen.getByLabelText('What you took'))).toBe('Choose what you took: one of your fuel items or water.');

    await addExtra(u, 'water', '150', '1:75');
    expect(descriptionOf(screen.getByLabelText('Time (h:mm from the start)'))).toBe(
      'Write the time as h:mm from the start, e.g. 1:15.',
    );
    // A missing or unreadable amount is asked for in the field's own words (not "a number" in the schema's).
    await addExtra(u, `item:${GEL.id}`, 'one', '0:40');
    expect(descriptionOf(screen.getByLabelText('Servings'))).toBe('Write the servings as a number, e.g. 1 or 0.5.');
    await addExtra(u, 'water', '2500', '1:20');
    expect(descriptionOf(screen.getByLabelText('Millilitres (ml)'))).toBe('At most 2000 ml at a time.');
    expect(screen.getByText('Nothing yet: tick planned intakes or add what you took.')).toBeTruthy();

    // An entry already on the record is checked as it is edited, and the save is held back.
    await addExtra(u, 'water', '150', '1:20');
    const time = screen.getByLabelText('Time, entry 1');
    await u.clear(time);
    await u.type(time, '80 min');
    await u.click(screen.getByRole('button', { name: 'Save fuel taken' }));
    expect(time.getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(time)).toBe('Time: Write the time as h:mm from the start, e.g. 1:15.');
    expect(screen.getByRole('alert').textContent).toBe('One entry needs a fix before saving: see the messages beside them.');
    expect(puts(sent)).toEqual([]);
  });

  it('a refused save keeps every entry, here and after a reload, and puts the answer at the entry it names', async () => {
    const sent = server(() => ({
      status: 400,
      body: { error: GONE, code: 'validation-failed', details: [{ field: 'entries.0.item_id', message: GONE }] },
    }));
    const first = showCard();
    const u = userEvent.setup();
    await screen.findByLabelText('What you took');
    await addExtra(u, `item:${GEL.id}`, '1', '0:40');
    await addExtra(u, 'water', '150', '1:20');
    await u.selectOptions(screen.getByLabelText('Stomach (1–5)'), '4');
    await u.type(screen.getByLabelText('Fuel notes'), 'Gel went down easily.');
    await u.click(screen.getByRole('button', { name: 'Save fuel taken' }));

    expect(await screen.findByText(/^Not saved:/)).toHaveProperty(
      'textContent',
      `Not saved: ${GONE} Everything you entered is still here.`,
    );
    expect(puts(sent)).toHaveLength(1);
    expect(puts(sent)[0]!.body).toEqual({
      entries: [
        { kind: 'item', item_id: GEL.id, servings: 1, time_s: 40 * 60 },
        { kind: 'water', fluid_ml: 150, time_s: 80 * 60 },
      ],
      stomach: 4,
      energy: null,
      notes: 'Gel went down easily.',
    });
    // The problem stands at the entry the server named, not at the other one.
    const recorded = within(screen.getByRole('region', { name: 'Recorded intakes' }));
    expect(descriptionOf(recorded.getByText('Lemon gel'))).toBe(`Lemon gel: ${GONE}`);
    expect(screen.getByLabelText('Millilitres (ml), entry 2').getAttribute('aria-invalid')).toBeNull();
    const kept = () => {
      expect(valueOf('Servings, entry 1')).toBe('1');
      expect(valueOf('Time, entry 1')).toBe('0:40');
      expect(valueOf('Millilitres (ml), entry 2')).toBe('150');
      expect(valueOf('Time, entry 2')).toBe('1:20');
      expect(valueOf('Stomach (1–5)')).toBe('4');
      expect(valueOf('Fuel notes')).toBe('Gel went down easily.');
    };
    kept();

    // A reload opens the same entries from the device's draft, and says they are not saved.
    first.unmount();
    expect(JSON.parse(localStorage.getItem(DRAFT_KEY)!).value.entries).toHaveLength(2);
    showCard();
    expect(await screen.findByText('Restored what you entered earlier on this device; it is not saved yet.')).toBeTruthy();
    kept();
  });

  it('an accepted save says so and drops the draft', async () => {
    const sent = server((r) => ({
      status: 200,
      body: {
        fuel_taken: {
          run_id: RUN_ID,
          entries: [
            {
              kind: 'water',
              item_id: null,
              name: 'water',
              servings: null,
              time_s: null,
              carbohydrate_g: 0,
              fluid_ml: 300,
              sodium_mg: 0,
              caffeine_mg: 0,
            },
          ],
          stomach: null,
          energy: null,
          notes: (r.body as { notes: string }).notes,
          updated_at: '2026-11-28T11:00:00.000Z',
        },
        planned_vs_taken: null,
        cautions: [],
      } satisfies FuelTakenView,
    }));
    showCard();
    const u = userEvent.setup();
    await screen.findByLabelText('What you took');
    await u.selectOptions(screen.getByLabelText('What you took'), 'water');
    await u.type(screen.getByLabelText('Millilitres (ml)'), '300');
    await u.click(screen.getByRole('button', { name: 'Add to the record' }));
    expect(localStorage.getItem(DRAFT_KEY)).not.toBeNull();
    await u.click(screen.getByRole('button', { name: 'Save fuel taken' }));

    expect(await screen.findByText('Fuel taken saved.')).toBeTruthy();
    // No time given is sent as null ("not said"), not as zero.
    expect(puts(sent)[0]!.body).toMatchObject({ entries: [{ kind: 'water', fluid_ml: 300, time_s: null }] });
    expect(localStorage.getItem(DRAFT_KEY)).toBeNull();
  });
});
