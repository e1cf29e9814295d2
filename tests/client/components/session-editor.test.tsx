import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { CONTROL_CHARACTER_MESSAGE } from '../../../shared/api/text.ts';
import type { Plan } from '../../../shared/plans/schemas.ts';
import { SessionEditor } from '../../../client/features/plans/components/session-editor.tsx';
import { descriptionOf, fakeServer, renderAt, type SentRequest } from '../support/render.tsx';

// The session editor (client/features/plans/components/session-editor.tsx and session-builder.tsx): the shorthand
// line and the builder follow each other, an unreadable field blocks the save with its message beside it, the
// shorthand is what is sent, and a refused save keeps everything with the answer at its field.

afterEach(() => vi.unstubAllGlobals());

const USER_ID = '6a2b8c4d-9e0f-4a1b-8c3d-7e5f6a9b0c1d';
const RUNNER_ID = '1c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f';
const SESSION = '2 mi warm-up, 4 x 400 m @ 1:30-1:35 w/ 200 m jog, 1 mi cool-down';

function showEditor(onDone = vi.fn()) {
  const view = renderAt(
    '/plan',
    <SessionEditor
      plan={null}
      date="2026-12-07"
      userId={USER_ID}
      runnerId={RUNNER_ID}
      ownerZone="UTC"
      onClose={() => {}}
      onDone={onDone}
    />,
  );
  return { ...view, onDone };
}

const control = (name: string) => screen.getByLabelText(name) as HTMLInputElement;
const shorthand = () => control('Session in shorthand');
/** Pastes into the shorthand line, as a coach pasting a session does (typing 68 characters one by one is slow here). */
async function pasteShorthand(u: ReturnType<typeof userEvent.setup>, text: string) {
  await u.clear(shorthand());
  await u.paste(text);
}
const posts = (sent: SentRequest[]) => sent.filter((r) => r.method === 'POST' && r.path === '/api/plans');

describe('Session editor', () => {
  it('keeps the shorthand and the builder in step both ways', async () => {
    fakeServer(() => ({ status: 200, body: {} }));
    showEditor();
    const u = userEvent.setup();
    expect(screen.getByText('No parts yet. Add a part or a repeat, or write the shorthand above.')).toBeTruthy();

    await pasteShorthand(u, SESSION);
    const parts = within(screen.getByRole('list', { name: 'Parts of the session' }));
    expect((parts.getByLabelText('Kind, part 1') as HTMLSelectElement).value).toBe('warm-up');
    expect(control('Amount, part 1').value).toBe('2');
    expect(control('Repeat count, repeat 2').value).toBe('4');
    expect(control('Amount, repeat 2 part 1').value).toBe('400');
    expect(control('Fast, repeat 2 part 1, pace').value).toBe('1:30');
    expect((parts.getByLabelText('Kind, repeat 2 part 2') as HTMLSelectElement).value).toBe('recovery jog');
    expect(control('Amount, part 3').value).toBe('1');

    // A change in the builder rewrites the shorthand.
    await u.clear(control('Repeat count, repeat 2'));
    await u.type(control('Repeat count, repeat 2'), '6');
    expect(shorthand().value).toBe('2 mi warm-up, 6 x 400 m @ 1:30-1:35 w/ 200 m jog, 1 mi cool-down');
    // Moving a part reorders the shorthand too.
    await u.click(screen.getByRole('button', { name: 'Move part 3 up' }));
    expect(shorthand().value).toBe('2 mi warm-up, 1 mi cool-down, 6 x 400 m @ 1:30-1:35 w/ 200 m jog');
  });

  it('an unreadable shorthand or builder field blocks the save, with its message beside it', async () => {
    const sent = fakeServer(() => ({ status: 500 }));
    showEditor();
    const u = userEvent.setup();

    await u.type(shorthand(), '2 mi warm-up, 4 x');
    expect(shorthand().getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(shorthand())).toMatch(/^Expected a distance like '2 mi' or a time like '45 min', found the end\./);
    await u.click(screen.getByRole('button', { name: 'Save session' }));
    expect(screen.getByRole('alert').textContent).toMatch(/^The session cannot be read yet: Expected a distance/);

    await pasteShorthand(u, SESSION);
    await u.clear(control('Amount, part 1'));
    await u.type(control('Amount, part 1'), 'two');
    expect(control('Amount, part 1').getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(control('Amount, part 1'))).toBe('Write a distance in mi as a number more than 0, e.g. 2 or 0.5.');
    // The shorthand keeps the last readable session; it is not rewritten from a field it cannot read.
    expect(shorthand().value).toBe(SESSION);
    await u.click(screen.getByRole('button', { name: 'Save session' }));
    expect(screen.getByRole('alert').textContent).toBe('Some builder fields cannot be read: see the messages beside them.');
    expect(posts(sent)).toEqual([]);
  });

  it('sends the shorthand for the runner; a refused save keeps everything with the answer at its field', async () => {
    const refusal = 'Plans are written at most a year ahead.';
    let refuse = true;
    const sent = fakeServer((r) => {
      if (r.method !== 'POST') return { status: 200, body: {} };
      if (refuse)
        return {
          status: 400,
          body: {
            error: 'Some fields need attention.',
            code: 'validation-failed',
            details: [{ field: 'date', message: refusal }],
          },
        };
      const body = r.body as { date: string; title: string; text: string; runner_id: string };
      const plan: Partial<Plan> = { id: 'a1b2c3d4-0000-4000-8000-000000000001', ...body, notes: '' };
      return { status: 201, body: { plan } };
    });
    const { onDone } = showEditor();
    const u = userEvent.setup();
    await u.type(control('Title (optional)'), '  Track 400s ');
    await pasteShorthand(u, SESSION);
    await u.click(screen.getByRole('button', { name: 'Save session' }));

    const date = control('Date');
    await vi.waitFor(() => expect(date.getAttribute('aria-invalid')).toBe('true'));
    expect(descriptionOf(date)).toBe(refusal);
    expect(screen.getByRole('alert').textContent).toBe(
      'Not saved: see the messages beside the fields. Everything you entered is still here.',
    );
    expect(posts(sent)[0]!.body).toEqual({ date: '2026-12-07', title: 'Track 400s', text: SESSION, runner_id: RUNNER_ID });
    expect(onDone).not.toHaveBeenCalled();
    expect(shorthand().value).toBe(SESSION);
    expect(control('Title (optional)').value).toBe('  Track 400s ');
    expect(control('Repeat count, repeat 2').value).toBe('4');

    // Changing the field answers the message; the next save goes through and hands the stored plan on.
    refuse = false;
    await u.clear(date);
    await u.type(date, '2026-12-08');
    expect(date.getAttribute('aria-invalid')).toBeNull();
    await u.click(screen.getByRole('button', { name: 'Save session' }));
    await vi.waitFor(() => expect(onDone).toHaveBeenCalledTimes(1));
    expect(onDone.mock.calls[0]![0]).toMatchObject({ date: '2026-12-08', text: SESSION });
    expect(onDone.mock.calls[0]![1]).toBe('Session added.');
    expect(posts(sent)).toHaveLength(2);
  });

  it('a title with an invisible control character is refused at the field, as the server would, and nothing is sent', async () => {
    const sent = fakeServer(() => ({ status: 201, body: {} }));
    showEditor();
    const u = userEvent.setup();
    await pasteShorthand(u, SESSION);
    const title = control('Title (optional)');
    await u.click(title);
    // U+0007 (BEL) pasted from another program: shared/api/text.ts refuses C0 controls other than tab and line breaks.
    await u.paste('Track\u0007 400s');
    await u.tab();
    expect(title.getAttribute('aria-invalid')).toBe('true');
    expect(descriptionOf(title)).toBe(CONTROL_CHARACTER_MESSAGE);
    await u.click(screen.getByRole('button', { name: 'Save session' }));
    expect(posts(sent)).toEqual([]);
    expect(title.value).toBe('Track\u0007 400s');

    // Typing the title again answers the message, and the save goes out.
    await u.clear(title);
    await u.type(title, 'Track 400s');
    expect(title.getAttribute('aria-invalid')).toBeNull();
    await u.click(screen.getByRole('button', { name: 'Save session' }));
    await vi.waitFor(() => expect(posts(sent)).toHaveLength(1));
    expect(posts(sent)[0]!.body).toMatchObject({ title: 'Track 400s', text: SESSION });
  });
});
