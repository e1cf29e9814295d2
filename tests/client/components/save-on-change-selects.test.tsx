import { fireEvent, screen } from '@testing-library/react';
import { Suspense } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { AdminUser } from '../../../shared/users/schemas.ts';
import { UsersTable } from '../../../client/features/admin/components/users-table.tsx';
import { ActivityKindLine } from '../../../client/features/runs/components/activity-kind.tsx';
import { renderAt } from '../support/render.tsx';

// Selects that save on change (client/lib/use-held-choice.ts) show the new choice in the same render as the
// change, hold it while the save is in flight, and fall back to the saved value when the save is refused.
// Before, the admin's role select showed the old role for a tick (the mutation's pending state came later)
// and the activity kind showed the old kind until the server answered.

afterEach(() => vi.unstubAllGlobals());

const BUSY = { error: 'Pacewright is busy; try again in a minute.', code: 'busy' };

/** Plays the server: reads answer at once with `reads`; the PATCH waits until the test settles it. */
function serverWithHeldSave(reads: Record<string, unknown>) {
  let settle: (answer: Response) => void = () => {};
  const held = new Promise<Response>((resolve) => (settle = resolve));
  vi.stubGlobal('fetch', async (input: string, init: RequestInit = {}) => {
    if (init.method === 'PATCH') return held;
    return new Response(JSON.stringify(reads[String(input)] ?? {}), {
      status: 200,
      headers: { 'content-type': 'application/json' },
    });
  });
  return () => settle(new Response(JSON.stringify(BUSY), { status: 503, headers: { 'content-type': 'application/json' } }));
}

describe('the admin role select', () => {
  it('shows the new role in the same render as the choice, keeps it while saving, and falls back when refused', async () => {
    const users: AdminUser[] = [
      { id: 'u-admin', email: 'admin@example.test', name: 'Tamsin Admin', role: 'admin', created_at: '2026-11-01T08:00:00Z' },
      { id: 'u-runner', email: 'runner@example.test', name: 'Orrin Vale', role: 'runner', created_at: '2026-11-02T08:00:00Z' },
    ];
    const refuse = serverWithHeldSave({ '/api/admin/users': { users } });
    renderAt(
      '/admin',
      <Suspense fallback={<p>Loading…</p>}>
        <UsersTable currentUserId="u-admin" />
      </Suspense>,
    );
    const select = await screen.findByRole<HTMLSelectElement>('combobox', { name: 'Role of Orrin Vale' });
    expect(select.value).toBe('runner');

    fireEvent.change(select, { target: { value: 'coach' } });
    expect(select.value).toBe('coach'); // no tick later: the same render
    await vi.waitFor(() => expect(select.disabled).toBe(true));
    expect(select.value).toBe('coach');

    refuse();
    expect((await screen.findByText(/^The role of Orrin Vale was not changed:/)).textContent).toBe(
      `The role of Orrin Vale was not changed: ${BUSY.error}`,
    );
    expect(select.value).toBe('runner');
    expect(select.disabled).toBe(false);
  });
});

describe('the activity kind select', () => {
  it('shows the new kind at once, keeps it while saving, and falls back to the saved kind when refused', async () => {
    const refuse = serverWithHeldSave({});
    renderAt('/runs/r-1', <ActivityKindLine runId="r-1" kind="run" isOwner />);
    const select = screen.getByRole<HTMLSelectElement>('combobox', { name: 'This activity is a' });
    expect(select.value).toBe('run');

    fireEvent.change(select, { target: { value: 'ride' } });
    expect(select.value).toBe('ride');
    await vi.waitFor(() => expect(select.disabled).toBe(true));
    expect(select.value).toBe('ride');

    refuse();
    expect((await screen.findByRole('alert')).textContent).toBe(`Not changed: ${BUSY.error}`);
    expect(select.value).toBe('run');
  });
});
