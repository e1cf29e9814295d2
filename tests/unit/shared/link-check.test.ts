import { describe, expect, it } from 'vitest';
import { looksLikeLink } from '../../../shared/squads/link-check.ts';

describe('looksLikeLink', () => {
  it.each([
    'Account locked - verify at http://evil.example now',
    'HTTPS://EXAMPLE.ORG',
    'visit www.example.org',
    'harbor.run',
    'short x.co/abc',
    'write to help@example.org',
    'mailto:someone',
    'javascript:alert(1)',
  ])('refuses %s', (text) => expect(looksLikeLink(text)).toBe(true));

  it.each(['Harbor Line Runners', 'St. Kilda Harriers', 'Track Tuesdays 6.30 pm', 'Ridge Road 10 km group', 'A.M. Milers'])(
    'accepts %s',
    (text) => expect(looksLikeLink(text)).toBe(false),
  );
});
