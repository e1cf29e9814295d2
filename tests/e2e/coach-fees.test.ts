import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE, DEMO_SQUAD_NAME } from '../../db/seeds/01_demo_people.ts';
import { TEST_CARDS } from '../../shared/fees/schemas.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

/**
 * Issue 20: the demo coach sets a monthly fee; an invited runner sees it on the invitation, joins, pays on the local
 * fake's hosted checkout page with the test card and sees the receipt; the coach sees "paid through …"; a second
 * runner's declined card leaves them "due"; cancelling shows "cancelled at period end". Runner at 375 px, coach at
 * 1280 px, each screen also photographed at the other width.
 */

const COACH = DEMO_PEOPLE.find((p) => p.role === 'coach')!;
const IVY = DEMO_PEOPLE.find((p) => p.email.startsWith('ivy@'))!;
const PHONE = { width: 375, height: 812 };
const DESKTOP = { width: 1280, height: 900 };

const { server, browser } = useBrowserSession();

async function freshPage(size: { width: number; height: number }): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize(size);
  return page;
}

async function signedInPage(email: string, password: string, size: { width: number; height: number }): Promise<Page> {
  const page = await freshPage(size);
  await page.goto(`${server.url}/sign-in`);
  await signIn(page, email, password);
  await page.waitForURL(/\/log$/);
  return page;
}

async function inviteLinkFor(page: Page, address: string): Promise<string> {
  let link = '';
  await expect
    .poll(async () => {
      const { messages } = (await (await page.request.get(`${server.url}/api/dev/outbox`)).json()) as {
        messages: Array<{ to: string; text: string }>;
      };
      link = /\/invite\/inv_[A-Za-z0-9_-]+/.exec(messages.find((m) => m.to === address)?.text ?? '')?.[0] ?? '';
      return link;
    })
    .not.toBe('');
  return link;
}

const fees = (page: Page) => page.getByRole('list', { name: `Fees of the runners in ${DEMO_SQUAD_NAME}` });
const feeRow = (page: Page, name: string) => fees(page).getByRole('listitem').filter({ hasText: name });

describe('coach fees', () => {
  it('fee set → shown on the invitation → paid on the fake checkout → the coach sees paid through; declined stays due; cancel', async () => {
    const address = `wren-${Date.now().toString(36)}@example.org`;

    // The coach sets a monthly fee on the Squad page and invites a runner.
    const coach = await signedInPage(COACH.email, COACH.password, DESKTOP);
    const coachErrors = watchErrors(coach);
    await coach.goto(`${server.url}/squad`);
    await coach.getByRole('button', { name: `Change the fee of ${DEMO_SQUAD_NAME}` }).click();
    await coach.getByLabel('Fee', { exact: true }).selectOption('monthly');
    await coach.getByLabel('Currency').selectOption('USD');
    await coach.getByLabel('Amount a month').fill('45.00');
    await coach.getByRole('button', { name: 'Save fee' }).click();
    await expect.poll(() => coach.getByTestId('squad-fee').textContent()).toBe('$45.00 a month');
    await coach.getByRole('button', { name: 'Invite runners', exact: true }).click();
    await coach.getByLabel('Runner’s e-mail').fill(address);
    await coach.getByRole('button', { name: 'Send invitation' }).click();
    await expect.poll(() => coach.getByRole('status').allTextContents()).toContain(`Invitation sent to ${address}.`);
    const invitePath = await inviteLinkFor(coach, address);
    expect(coachErrors).toEqual([]);
    await coach.close();

    // The runner, on a phone, reads the fee before accepting, signs up, joins and pays.
    const runner = await freshPage(PHONE);
    const runnerErrors = watchErrors(runner, [/401/]);
    await runner.goto(`${server.url}${invitePath}`);
    await expect
      .poll(() => runner.getByTestId('invitation-fee').textContent())
      .toMatch(/This squad has a fee: \$45\.00 a month\./);
    await screenshot(runner, 'fees-invitation-375');
    await runner.getByRole('link', { name: 'Create an account' }).click();
    await runner.waitForURL(/\/sign-up\?/);
    await runner.getByLabel('Name').fill('Wren Halloway');
    await runner.getByLabel('Password').fill('lakeside loop at dawn');
    await runner.getByRole('button', { name: 'Create account' }).click();
    await runner.waitForURL((url) => url.pathname === invitePath);
    await runner.getByRole('button', { name: 'Accept invitation' }).click();
    await runner.waitForURL(/\/log$/);

    await runner.goto(`${server.url}/fees`);
    await expect.poll(() => runner.getByTestId('my-fee-status').textContent()).toBe('due');
    await runner.getByRole('button', { name: 'Pay' }).click();
    // The card is typed on the payment service's page (here the local fake), never on ours.
    await runner.waitForURL((url) => url.pathname.startsWith('/checkout/cs_test_'));
    expect(new URL(runner.url()).origin).not.toBe(new URL(server.url).origin);
    await screenshot(runner, 'fees-checkout-375');
    await runner.getByLabel('Card number').fill(TEST_CARDS.pays);
    await runner.getByRole('button', { name: 'Pay' }).click();
    await runner.waitForURL((url) => url.pathname === '/fees' && url.origin === new URL(server.url).origin);
    await expect.poll(() => runner.getByTestId('my-fee-status').textContent()).toMatch(/^paid through /);
    expect(await runner.getByRole('list', { name: `Receipts for ${DEMO_SQUAD_NAME}` }).textContent()).toMatch(/^\$45\.00 paid /);
    await screenshot(runner, 'fees-runner-paid-375');
    await runner.setViewportSize(DESKTOP);
    await screenshot(runner, 'fees-runner-paid-1280');
    expect(runnerErrors).toEqual([]);
    await runner.close();

    // A second runner's card is declined: they stay due.
    const ivy = await signedInPage(IVY.email, IVY.password, PHONE);
    await ivy.goto(`${server.url}/fees`);
    await ivy.getByRole('button', { name: 'Pay' }).click();
    await ivy.waitForURL((url) => url.pathname.startsWith('/checkout/cs_test_'));
    await ivy.getByLabel('Card number').fill(TEST_CARDS.declined);
    await ivy.getByRole('button', { name: 'Pay' }).click();
    await expect.poll(() => ivy.getByRole('alert').textContent()).toBe('Your card was declined.');
    await ivy.getByRole('link', { name: 'Back without paying' }).click();
    await ivy.waitForURL((url) => url.pathname === '/fees');
    await expect.poll(() => ivy.getByTestId('my-fee-status').textContent()).toBe('due');
    await ivy.close();

    // The coach sees who paid through when, and who is due.
    const coachAgain = await signedInPage(COACH.email, COACH.password, DESKTOP);
    await coachAgain.goto(`${server.url}/squad`);
    await expect
      .poll(() => feeRow(coachAgain, 'Wren Halloway').getByTestId('fee-status').textContent())
      .toMatch(/^paid through /);
    expect(await feeRow(coachAgain, IVY.name).getByTestId('fee-status').textContent()).toBe('due');
    await screenshot(coachAgain, 'fees-coach-1280');
    await coachAgain.setViewportSize(PHONE);
    await screenshot(coachAgain, 'fees-coach-375');
    await coachAgain.close();

    // The runner cancels at the end of the period; both sides read it.
    const wren = await signedInPage(address, 'lakeside loop at dawn', PHONE);
    await wren.goto(`${server.url}/fees`);
    await wren.getByRole('button', { name: 'Cancel at period end' }).click();
    await expect.poll(() => wren.getByTestId('my-fee-status').textContent()).toMatch(/^cancelled at period end \(paid through /);
    // Leaving the squad keeps the demo squad as the other journeys expect it.
    await wren.goto(`${server.url}/profile`);
    await wren.getByRole('button', { name: `Leave squad ${DEMO_SQUAD_NAME}` }).click();
    await wren.getByRole('button', { name: `Leave ${DEMO_SQUAD_NAME}` }).click();
    await wren.close();

    const coachLast = await signedInPage(COACH.email, COACH.password, DESKTOP);
    await coachLast.goto(`${server.url}/squad`);
    await expect.poll(() => feeRow(coachLast, IVY.name).getByTestId('fee-status').textContent()).toBe('due');
    // Back to no fee, as the demo squad started.
    await coachLast.getByRole('button', { name: `Change the fee of ${DEMO_SQUAD_NAME}` }).click();
    await coachLast.getByLabel('Fee', { exact: true }).selectOption('none');
    await coachLast.getByRole('button', { name: 'Save fee' }).click();
    await expect.poll(() => coachLast.getByTestId('squad-fee').textContent()).toBe('No fee');
    await coachLast.close();
  }, 180_000);
});
