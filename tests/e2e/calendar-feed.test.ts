import path from 'node:path';
import ical from 'node-ical';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { db } from '../../server/lib/db.ts';
import type { RunningServer } from '../../server/index.ts';
import {
  launchBrowser,
  screenshot,
  SCREENSHOT_DIR,
  signIn,
  startAppServerWithPublicUrl,
  watchErrors,
} from '../support/browser.ts';

// Issue 15: the calendar feed from the profile card, at 375 and 1280 px. The coach writes a session on
// a runner's plan; the runner and the coach each turn their feed on, copy the address shown, and the
// test fetches that very address and reads it with an independent iCalendar parser (node-ical). Then
// the address is replaced (the old one answers 404) and the feed turned off (the new one 404s too).
// The runner also turns the plan-change e-mail off on the profile.

const coach = DEMO_PEOPLE.find((p) => p.role === 'coach')!;
const ivy = DEMO_PEOPLE.filter((p) => p.role === 'runner')[0]!;
const WAIT = { timeout: 15_000 };
const TITLE = `Feed tempo ${Date.now().toString(36)}`;
const SHORTHAND = '2 mi easy, 4 mi @ 6:45/mi, 1 mi easy';

let server: RunningServer;
let browser: Awaited<ReturnType<typeof launchBrowser>>;

beforeAll(async () => {
  server = await startAppServerWithPublicUrl();
  browser = await launchBrowser();
  await browser.context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: server.url });
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

async function signedInPage(email: string, password: string, next: string, width: number): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize({ width, height: 900 });
  await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(next)}`);
  await signIn(page, email, password);
  await page.waitForURL((url) => url.pathname === next.split('?')[0]);
  return page;
}

const noSideways = (page: Page) =>
  page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

/** Wednesday of next week and its Monday, on the browser's clock (the page's). */
async function nextWednesday(page: Page): Promise<{ monday: string; wednesday: string }> {
  return page.evaluate(() => {
    const d = new Date();
    const iso = (t: Date) =>
      `${t.getFullYear()}-${String(t.getMonth() + 1).padStart(2, '0')}-${String(t.getDate()).padStart(2, '0')}`;
    const monday = new Date(d.getFullYear(), d.getMonth(), d.getDate() - ((d.getDay() + 6) % 7) + 7);
    return { monday: iso(monday), wednesday: iso(new Date(monday.getFullYear(), monday.getMonth(), monday.getDate() + 2)) };
  });
}

/** The events of the feed at `url`, read by node-ical; fails unless the address answers 200 text/calendar. */
async function readFeed(url: string) {
  const res = await fetch(url);
  expect(res.status).toBe(200);
  expect(res.headers.get('content-type')).toMatch(/^text\/calendar/);
  const parsed = ical.sync.parseICS(await res.text());
  return Object.values(parsed).filter((c): c is ical.VEvent => c?.type === 'VEVENT');
}

const ymd = (d: Date) =>
  `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;

/**
 * On the profile: turn the feed on, copy the address, check the feed holds the coach's session
 * (`summary`, on `date`), replace the address (the old one 404s), turn it off (the new one 404s).
 */
async function feedCycle(page: Page, summary: string, date: string, shot: string): Promise<void> {
  const card = page.getByRole('heading', { name: 'Calendar', exact: true }).locator('xpath=ancestor::section[1]');
  await expect.poll(() => card.getByText('The calendar feed is off.').count(), WAIT).toBe(1);
  await card.getByRole('button', { name: 'Turn on the calendar feed' }).click();
  const address = card.getByLabel('Calendar feed address');
  await expect.poll(() => address.count(), WAIT).toBe(1);
  const first = await address.inputValue();
  expect(first).toMatch(new RegExp(`^${server.url}/api/calendar/cal_[A-Za-z0-9_-]{43}\\.ics$`));
  await card.getByRole('button', { name: 'Copy address' }).click();
  await expect.poll(() => card.getByRole('button', { name: 'Copied', exact: true }).count(), WAIT).toBe(1);
  expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(first);
  await expect.poll(() => card.getByText(/^The calendar feed is on/).count(), WAIT).toBe(1);
  expect(await noSideways(page)).toBeLessThanOrEqual(0);
  await screenshot(page, shot);
  await card.screenshot({ path: path.join(SCREENSHOT_DIR, `${shot}-card.png`) });

  // The address on the page, fetched and parsed: the coach's session is there on its day, in shorthand.
  const events = await readFeed(first);
  const session = events.find((e) => String(e.summary) === summary);
  expect(session, `an event "${summary}" in the feed`).toBeDefined();
  expect(session!.datetype).toBe('date');
  expect(ymd(session!.start)).toBe(date);
  expect(String(session!.description)).toContain(SHORTHAND);
  expect(String(session!.uid)).toMatch(/@pacewright\.invalid$/);

  // Shown once: "I have copied it" hides it, and a reload never shows it again.
  await card.getByRole('button', { name: 'I have copied it' }).click();
  await expect.poll(() => address.count(), WAIT).toBe(0);
  await page.reload();
  await expect.poll(() => card.getByText(/^The calendar feed is on/).count(), WAIT).toBe(1);
  expect(await card.getByLabel('Calendar feed address').count()).toBe(0);

  await card.getByRole('button', { name: 'Replace the address' }).click();
  await expect.poll(async () => (await address.count()) === 1 && (await address.inputValue()) !== first, WAIT).toBe(true);
  const second = await address.inputValue();
  expect((await fetch(first)).status).toBe(404);
  expect((await readFeed(second)).some((e) => String(e.summary) === summary)).toBe(true);

  await card.getByRole('button', { name: 'Turn off', exact: true }).click();
  await card
    .getByRole('group', { name: 'Turn the calendar feed off?' })
    .getByRole('button', { name: 'Yes, turn it off' })
    .click();
  await expect.poll(() => card.getByText('The calendar feed is off.').count(), WAIT).toBe(1);
  expect(await card.getByLabel('Calendar feed address').count()).toBe(0);
  expect((await fetch(second)).status).toBe(404);
}

describe('The calendar feed on the profile', () => {
  it('the coach writes a session for a runner at 375 px; the runner (375 px) and the coach (1280 px) find it in their feeds, replace and turn them off', async () => {
    const ivyId = (await db('users').where({ email: ivy.email }).first('id'))!.id as string;

    // The coach, on a phone, writes a session on Ivy's plan.
    const coachPhone = await signedInPage(coach.email, coach.password, '/squad', 375);
    const coachErrors = watchErrors(coachPhone);
    const week = await nextWednesday(coachPhone);
    await coachPhone.goto(`${server.url}/squad/${ivyId}/plan?week=${week.monday}`);
    await expect.poll(() => coachPhone.getByRole('heading', { name: `${ivy.name}’s plan` }).count(), WAIT).toBe(1);
    await coachPhone.getByRole('button', { name: 'New session', exact: true }).click();
    const editor = coachPhone.getByRole('form', { name: 'New session', exact: true });
    await editor.getByLabel('Date').fill(week.wednesday);
    await editor.getByLabel('Title (optional)').fill(TITLE);
    await editor.getByLabel('Session in shorthand').fill(SHORTHAND);
    await editor.getByRole('button', { name: 'Save session' }).click();
    await expect.poll(() => coachPhone.getByRole('status').filter({ hasText: 'Session added.' }).count(), WAIT).toBe(1);
    expect(await noSideways(coachPhone)).toBeLessThanOrEqual(0);
    expect(coachErrors).toEqual([]);
    await coachPhone.close();

    // Ivy, on a phone: the session on her plan, written by the coach; her feed holds it; plan e-mails off.
    const phone = await signedInPage(ivy.email, ivy.password, `/plan?week=${week.monday}`, 375);
    const ivyErrors = watchErrors(phone);
    const ivyCard = phone.getByRole('article', { name: new RegExp(`^${TITLE} on `) });
    await expect.poll(() => ivyCard.getByText(new RegExp(`^written by ${coach.name}`)).count(), WAIT).toBe(1);
    await phone.goto(`${server.url}/profile`);
    await feedCycle(phone, TITLE, week.wednesday, 'calendar-feed-runner-375');

    const notices = phone.getByRole('checkbox', { name: 'My coach changes my plan' });
    expect(await notices.isChecked()).toBe(true);
    await notices.uncheck();
    await expect
      .poll(() => phone.getByRole('status').filter({ hasText: 'Off: no more of these e-mails.' }).count(), WAIT)
      .toBe(1);
    expect((await db('users').where({ id: ivyId }).first('notify_on_plan_change'))!.notify_on_plan_change).toBe(false);
    await notices.check();
    await expect.poll(() => phone.getByRole('status').filter({ hasText: 'On: these e-mails are sent.' }).count(), WAIT).toBe(1);
    expect(ivyErrors).toEqual([]);
    await phone.close();

    // The coach, on a desktop: their feed holds the squad's sessions, named by runner.
    const desk = await signedInPage(coach.email, coach.password, '/profile', 1280);
    const deskErrors = watchErrors(desk);
    await feedCycle(desk, `${ivy.name}: ${TITLE}`, week.wednesday, 'calendar-feed-coach-1280');
    // A coach has no coach: the plan-change switch is a runner's only.
    expect(await desk.getByRole('checkbox', { name: 'My coach changes my plan' }).count()).toBe(0);
    expect(deskErrors).toEqual([]);
    await desk.close();
  });
});
