import { screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { UnsubscribePanel } from '../../../client/features/notices/components/unsubscribe-panel.tsx';
import { fakeServer, renderAt } from '../support/render.tsx';

// The unsubscribe page reads its link first: an outdated link (the switch was turned back on after the
// e-mail) or a deleted account is said in plain words at once, with no button that could only be refused.

afterEach(() => vi.unstubAllGlobals());

const TOKEN = 'uns_made-up-for-the-page';
const OUTDATED =
  'You switched “A runner leaves one of my squads” back on after this e-mail was sent, so this old link changed nothing. Switch it off on your profile if you want it off.';
const GONE = 'The account this link was for has been deleted, so it gets no e-mail at all.';

describe('the unsubscribe page', () => {
  it.each([
    [409, 'unsubscribe-link-outdated', OUTDATED, 'This link is out of date'],
    [410, 'unsubscribe-account-gone', GONE, 'This account no longer exists'],
  ])(
    'a %i from the link read shows its heading and sentence, and no button to turn anything off',
    async (status, code, error, heading) => {
      const sent = fakeServer(() => ({ status, body: { error, code } }));
      renderAt(`/notices/off/${TOKEN}`, <UnsubscribePanel token={TOKEN} />);
      expect((await screen.findByRole('heading', { level: 1 })).textContent).toBe(heading);
      expect(screen.getByRole('alert').textContent).toBe(error);
      expect(screen.getByText('Nothing was changed.')).toBeTruthy();
      expect(screen.queryByRole('button', { name: 'Turn these e-mails off' })).toBeNull();
      // Only the read was sent: nothing was asked to change.
      expect(sent.map((r) => r.method)).toEqual(['GET']);
    },
  );
});
