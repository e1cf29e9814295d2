import type { Express } from 'express';
import request from 'supertest';
import { afterAnswerSettled } from '../../server/lib/after-answer.ts';
import { CSRF_HEADER, type RegisterInput } from '../../shared/auth/schemas.ts';
import { browserAgent, recordedMail, type BrowserAgent } from './test-app.ts';

/** The token of the newest sign-up link recorded for `to` (apps built with `testApp`). */
export function signUpTokenMailedTo(to: string): string | undefined {
  const mail = recordedMail.filter((m) => m.to === to).at(-1);
  return mail?.text.match(/\/sign-up\/confirm\/(sgn_[A-Za-z0-9_-]{43})/)?.[1];
}

/**
 * Signs up as a person would: the form (201, confirmation "sent", no cookie — the same for every
 * address), then the e-mailed link, which makes the account with the answered id and signs this
 * browser in. Returns the browser, the form's answer and the link's answer.
 */
export async function signUpThroughMail(
  app: Express,
  input: RegisterInput,
): Promise<{ browser: BrowserAgent; asked: request.Response; answer: request.Response }> {
  const asked = await request(app).post('/api/auth/register').send(input);
  if (asked.status !== 201 || asked.body.confirmation !== 'sent')
    throw new Error(`sign-up failed: ${asked.status} ${JSON.stringify(asked.body)}`);
  await afterAnswerSettled();
  const token = signUpTokenMailedTo(input.email.trim().toLowerCase());
  if (!token) throw new Error(`no sign-up link was mailed to ${input.email}`);
  const browser = await browserAgent(app);
  const answer = await browser.agent.post(`/api/auth/register/${token}`).set(CSRF_HEADER, browser.csrf);
  return { browser, asked, answer };
}
