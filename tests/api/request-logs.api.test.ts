import { describe, expect, it } from 'vitest';
import { captureLogLines } from '../../server/lib/logger.ts';
import { CSRF_HEADER } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { signedInAgent, testApp } from '../support/test-app.ts';

// Issue 13 #15: request logs carried the X-CSRF-Token header, the secret that pairs with the pw_csrf cookie.
describe('request logs', () => {
  it('never carry the X-CSRF-Token value: the header is logged as [Redacted], like the cookie', async () => {
    const app = testApp();
    const { user, password } = await createUser();
    const lines: string[] = [];
    const stop = captureLogLines((line) => lines.push(line), 'info');
    try {
      const { agent, csrf } = await signedInAgent(app, user.email, password);
      const res = await agent.patch('/api/me').set(CSRF_HEADER, csrf).send({ name: 'Renamed Runner' });
      expect(res.status).toBe(200);

      const requestLines = lines.filter((l) => l.includes('"url":"/api/me"') && l.includes('PATCH'));
      expect(requestLines.length).toBeGreaterThan(0);
      expect(lines.filter((l) => l.includes(csrf))).toEqual([]);
      for (const line of requestLines) expect(JSON.parse(line).req.headers['x-csrf-token']).toBe('[Redacted]');
    } finally {
      stop();
    }
  });
});
