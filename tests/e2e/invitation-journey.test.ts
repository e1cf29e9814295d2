import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { SIGN_UP_SENT_MESSAGE } from '../../shared/auth/schemas.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const RUN_FILE = path.resolve('fixtures/gps-samples/run-hr-4s.gpx');
const COACH = DEMO_PEOPLE.find((p) => p.role === 'coach')!;
const SQUAD_NAME = 'Harbor Line Runners';

type CaughtMessage = { to: string; subject: string; text: string };

const { server, browser } = useBrowserSession();

/** An address nobody has used in this database yet. */
const freshAddress = (who: string) => `${who}-${Date.now().toString(36)}@example.org`;

/** A page with no session: cookies of the previous person are gone. */
async function freshPage(): Promise<Page> {
  await browser.context.clearCookies();
  return browser.context.newPage();
}

async function signedInPage(email: string, password: string): Promise<Page> {
  const page = await freshPage();
  await page.goto(`${server.url}/sign-in`);
  await signIn(page, email, password);
  await page.waitForURL(/\/log$/);
  return page;
}

/** The newest message to `to` whose subject matches, read from the development outbox API. */
async function newestMessageTo(page: Page, to: string, subject: RegExp): Promise<CaughtMessage> {
  let found: CaughtMessage | undefined;
  await expect
    .poll(async () => {
      const response = await page.request.get(`${server.url}/api/dev/outbox`);
      const { messages } = (await response.json()) as { messages: CaughtMessage[] };
      found = messages.find((m) => m.to === to && subject.test(m.subject));
      return Boolean(found);
    })
    .toBe(true);
  return found!;
}

/** The path of the sign-up link in the newest sign-up e-mail to `to`. */
async function signUpLinkTo(page: Page, to: string): Promise<string> {
  const mail = await newestMessageTo(page, to, /Finish creating your Pacewright account/);
  return new URL(/https?:\/\/\S+\/sign-up\/confirm\/\S+/.exec(mail.text)![0]).pathname;
}

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** GET a JSON resource as the page's signed-in user. */
function getJson<T>(page: Page, url: string): Promise<T> {
  return page.evaluate(async (u) => (await fetch(u, { credentials: 'same-origin' })).json() as Promise<T>, url);
}

describe('joining a squad by invitation', () => {
  it('the coach invites a new address; they sign up through the e-mailed link, import a run, and coach and runner talk in its notes', async () => {
    const address = freshAddress('wren');
    const password = 'lakeside loop at dawn';

    // The coach invites the new address from the Squad page.
    const coachPage = await signedInPage(COACH.email, COACH.password);
    const coachErrors = watchErrors(coachPage);
    await coachPage.goto(`${server.url}/squad`);
    await coachPage.getByRole('button', { name: 'Invite runners', exact: true }).click();
    await coachPage.getByLabel('Runner’s e-mail').fill(address);
    await coachPage.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => coachPage.getByRole('status').allTextContents()).toContain(`Invitation sent to ${address}.`);

    // The e-mail is caught on loopback; the outbox page shows it and its link.
    await newestMessageTo(coachPage, address, /invites you/);
    await coachPage.goto(`${server.url}/dev/outbox`);
    await coachPage
      .getByRole('list', { name: 'Caught messages' })
      .getByRole('button', { name: new RegExp(escapeRegExp(address)) })
      .first()
      .click();
    const message = coachPage.getByRole('article', { name: /^Message: .*invites you to Harbor Line Runners/ });
    const inviteLink = message.getByRole('link', { name: /\/invite\/inv_/ });
    await inviteLink.waitFor();
    expect(await message.textContent()).toContain('Accept the invitation');
    await screenshot(coachPage, 'outbox');
    const invitePath = (await inviteLink.getAttribute('href'))!;
    expect(invitePath).toMatch(/^\/invite\/inv_[A-Za-z0-9_-]+$/);
    expect(coachErrors).toEqual([]);
    await coachPage.close();

    // The invited person opens the link with no session and signs up through it.
    const page = await freshPage();
    // 401 on /api/auth/me is how the app learns it is signed out; not an error.
    const errors = watchErrors(page, [/401/]);
    await page.goto(`${server.url}${invitePath}`);
    await expect
      .poll(() => page.getByRole('heading', { level: 1 }).textContent())
      .toBe(`${COACH.name} invites you to join ${SQUAD_NAME}`);
    expect(await page.getByText('What joining means').count()).toBe(1);
    await screenshot(page, 'invite');

    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.waitForURL(/\/sign-up\?/);
    await expect.poll(() => page.getByLabel('E-mail').inputValue()).toBe(address);
    await expect.poll(() => page.getByRole('radio', { name: /Runner/ }).isChecked()).toBe(true);
    await page.getByLabel('Name').fill('Wren Halloway');
    await page.getByLabel('Password').fill(password);
    await page.getByRole('button', { name: 'Create account' }).click();

    // The invitation e-mail already proved the invited address: no second e-mail, the account is
    // made at once (an open sign-up waits for its e-mailed link, see "choosing a new password").
    // Back on the invitation, now signed in: one explicit click joins the squad.
    await page.waitForURL((url) => url.pathname === invitePath);
    await page.getByRole('button', { name: 'Accept invitation' }).click();
    await page.waitForURL(/\/log$/);

    // The new runner imports a run through the Log page.
    await page.getByLabel('Choose files').setInputFiles(RUN_FILE);
    const uploads = page.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 20_000 }).toMatch(/imported →/);
    await uploads.getByRole('link').first().click();
    await page.waitForURL(/\/runs\/[^/]+$/);
    const runPath = new URL(page.url()).pathname;
    const runId = runPath.split('/').pop()!;
    const { user } = await getJson<{ user: { id: string } }>(page, '/api/auth/me');
    const run = await getJson<{ name: string; summary: { local_date: string } }>(page, `/api/runs/${runId}`);
    // From the API, not the page's heading: read too early under load, the heading can still be empty.
    const runName = run.name;
    expect(runName).not.toBe('');

    // The profile now names the coach who can read this runner's data.
    await page.goto(`${server.url}/profile`);
    const coaches = page.getByRole('list', { name: 'Coaches who can read my data' });
    await expect.poll(() => coaches.textContent()).toContain(`${COACH.name}`);
    expect(await coaches.textContent()).toContain(`coach of ${SQUAD_NAME}`);
    expect(errors).toEqual([]);
    await page.close();

    // The coach opens the runner's week review, follows the run and writes a note on it.
    const reviewPage = await signedInPage(COACH.email, COACH.password);
    await reviewPage.goto(`${server.url}/squad/${user.id}/week/${run.summary.local_date}`);
    await expect.poll(() => reviewPage.getByRole('heading', { level: 1 }).textContent()).toBe('Wren Halloway');
    await reviewPage
      .getByRole('link', { name: new RegExp(escapeRegExp(runName)) })
      .first()
      .click();
    await reviewPage.waitForURL((url) => url.pathname === runPath);
    await expect.poll(() => reviewPage.getByRole('heading', { level: 1 }).textContent()).toBe(runName);
    const note = 'Even splits all the way round the lake. Keep the first mile this easy on Saturday too.';
    await reviewPage.getByRole('textbox', { name: 'Write a note' }).fill(note);
    await reviewPage.getByRole('button', { name: 'Add note' }).click();
    const coachThread = reviewPage.getByRole('list', { name: 'Notes on this run' });
    await expect.poll(() => coachThread.textContent()).toContain(note);
    await reviewPage.close();

    // The runner signs in and reads the coach's note on the run page.
    const runnerPage = await signedInPage(address, password);
    await runnerPage.goto(`${server.url}${runPath}`);
    const thread = runnerPage.getByRole('list', { name: 'Notes on this run' });
    await expect.poll(() => thread.textContent()).toContain(note);
    expect(await thread.getByRole('listitem').first().textContent()).toMatch(new RegExp(`^${COACH.name} · coach`));

    // Leaving the squad ends the coach's access (and leaves the demo squad as the other journeys expect it).
    await runnerPage.goto(`${server.url}/profile`);
    await runnerPage.getByRole('button', { name: `Leave squad ${SQUAD_NAME}` }).click();
    await runnerPage.getByRole('button', { name: `Leave ${SQUAD_NAME}` }).click();
    await expect.poll(() => runnerPage.getByText(/^Only you\./).count()).toBe(1);
    await runnerPage.close();
  });
});

describe('choosing a new password', () => {
  it('forgot password → the reset link from the outbox → the new password signs in; the used link is refused', async () => {
    const address = freshAddress('moss');
    const page = await freshPage();
    await page.goto(`${server.url}/sign-up`);
    await page.getByLabel('Name').fill('Moss Arden');
    await page.getByLabel('E-mail').fill(address);
    await page.getByLabel('Password').fill('first password here');
    await page.getByRole('button', { name: 'Create account' }).click();
    // The same answer for every address (issue 13 #7): the account is made from the e-mailed link.
    await expect.poll(() => page.getByRole('status').allTextContents()).toContain(SIGN_UP_SENT_MESSAGE);
    await screenshot(page, 'sign-up-check-email');
    expect((await browser.context.cookies()).map((c) => c.name)).not.toContain('pw_session');
    await page.goto(`${server.url}${await signUpLinkTo(page, address)}`);
    await page.getByRole('button', { name: 'Create my account' }).click();
    await page.waitForURL(/\/log$/);
    await browser.context.clearCookies();

    await page.goto(`${server.url}/sign-in`);
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.waitForURL(/\/forgot-password$/);
    await page.getByLabel('E-mail').fill(address);
    await page.getByRole('button', { name: 'Send me a link' }).click();
    await expect
      .poll(() => page.getByRole('status').allTextContents())
      .toContain('If that address has an account, a link to choose a new password is on its way.');

    const mail = await newestMessageTo(page, address, /new Pacewright password/);
    const resetPath = new URL(/https?:\/\/\S+\/reset-password\/\S+/.exec(mail.text)![0]).pathname;
    await page.goto(`${server.url}${resetPath}`);
    await page.getByLabel('New password', { exact: true }).fill('second password now');
    await page.getByLabel('New password again').fill('second passwort now');
    await page.getByRole('button', { name: 'Save new password' }).click();
    await expect.poll(() => page.getByText('The two passwords differ.').count()).toBe(1);
    await page.getByLabel('New password again').fill('second password now');
    await page.getByRole('button', { name: 'Save new password' }).click();

    await page.waitForURL(/\/sign-in$/);
    await expect
      .poll(() => page.getByRole('status').allTextContents())
      .toContain('Your password has been changed. Sign in with the new one.');
    await signIn(page, address, 'second password now');
    await page.waitForURL(/\/log$/);

    // The link worked once; opened again it is refused with a sentence.
    await browser.context.clearCookies();
    await page.goto(`${server.url}${resetPath}`);
    await page.getByLabel('New password', { exact: true }).fill('third password later');
    await page.getByLabel('New password again').fill('third password later');
    await page.getByRole('button', { name: 'Save new password' }).click();
    await expect
      .poll(() => page.getByRole('alert').allTextContents())
      .toContain('This reset link has already been used. Ask for a new one if you need it.');
    await page.close();
  });
});
