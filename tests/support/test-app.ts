import request from 'supertest';
import type { Express } from 'express';
import { createApp } from '../../server/app.ts';
import type { Mailer, OutgoingMail } from '../../server/lib/mailer.ts';
import { loadConfig, type AppConfig } from '../../server/config.ts';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth/schemas.ts';

/**
 * Test configuration: cheap bcrypt, a fixed secret, and rate limits and per-user upload caps high
 * enough not to interfere (tests of those limits set the real numbers back, see loadConfig).
 */
export function testConfig(overrides: Partial<AppConfig> = {}): AppConfig {
  return {
    ...loadConfig({
      NODE_ENV: 'test',
      JWT_SECRET: 'test-secret-that-is-long-enough-0123456789',
      DATABASE_URL: process.env.DATABASE_URL,
    }),
    bcryptCost: 4,
    authRateLimit: { windowMs: 60_000, max: 1000 },
    uploadsAtOncePerUser: 1000,
    uploadRateLimit: { windowMs: 60_000, max: 100_000 },
    recomputeRateLimit: { windowMs: 60_000, max: 100_000 },
    ...overrides,
  };
}

/**
 * Mail sent by apps built with `testApp`, which never reach an SMTP server (so tests never write
 * into a developer's running mail catcher). Tests about e-mail use tests/support/mail.ts instead.
 */
export const recordedMail: OutgoingMail[] = [];
export const recordingMailer: Mailer = {
  async send(mail) {
    recordedMail.push(mail);
  },
};

export function testApp(overrides: Partial<AppConfig> = {}): Express {
  return createApp({ config: testConfig(overrides), mailer: recordingMailer });
}

/** A browser-like client: keeps cookies and sends the CSRF header on writes, as the real client does. */
export interface BrowserAgent {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
}

export async function browserAgent(app: Express): Promise<BrowserAgent> {
  const agent = request.agent(app);
  const res = await agent.get('/api/health');
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith(`${CSRF_COOKIE}=`));
  if (!cookie) throw new Error('no CSRF cookie was set');
  return { agent, csrf: cookie.split(';')[0]!.split('=')[1]! };
}

export async function signedInAgent(app: Express, email: string, password: string): Promise<BrowserAgent> {
  const browser = await browserAgent(app);
  const res = await browser.agent.post('/api/auth/login').set(CSRF_HEADER, browser.csrf).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return browser;
}
