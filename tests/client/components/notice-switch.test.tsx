import { fireEvent, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { NoticeSwitches } from '../../../shared/notices/schemas.ts';
import { NoticeSwitchesCard } from '../../../client/features/profile/components/notice-switches-card.tsx';
import { renderAt } from '../support/render.tsx';

// A switch that saves on change (client/lib/use-held-choice.ts) shows the new choice in the same render as
// the click, holds it while the save is in flight, and falls back to the saved value when the save is refused.

afterEach(() => vi.unstubAllGlobals());

const SAVED: NoticeSwitches = {
  import: true,
  note: true,
  pain_alert: true,
  squad_leave: true,
  digest: true,
  plan_change: false,
};

/** Plays the server: reads answer at once; the PATCH waits until the test settles it. */
function serverWithHeldSave() {
  let settle: (answer: Response) => void = () => {};
  const held = new Promise<Response>((resolve) => (settle = resolve));
  vi.stubGlobal('fetch', async (input: string, init: RequestInit = {}) => {
    if (init.method === 'PATCH') return held;
    const body = String(input) === '/api/me/notices' ? { switches: SAVED } : {};
    return new Response(JSON.stringify(body), { status: 200, headers: { 'content-type': 'application/json' } });
  });
  return settle;
}

describe('a notice switch', () => {
  it('is ticked in the same render as the click, stays ticked while saving, and clears again when the save is refused', async () => {
    const settle = serverWithHeldSave();
    renderAt('/profile', <NoticeSwitchesCard role="runner" />);
    const box = await screen.findByRole<HTMLInputElement>('checkbox', { name: 'My coach changes my plan' });
    expect(box.checked).toBe(false);

    fireEvent.click(box);
    expect(box.checked).toBe(true); // no tick later: the same render
    await vi.waitFor(() => expect(box.checked).toBe(true));

    settle(
      new Response(JSON.stringify({ error: 'Pacewright is busy; try again in a minute.', code: 'busy' }), {
        status: 503,
        headers: { 'content-type': 'application/json' },
      }),
    );
    expect((await screen.findByRole('alert')).textContent).toBe('Not saved: Pacewright is busy; try again in a minute.');
    expect(box.checked).toBe(false);
  });
});
