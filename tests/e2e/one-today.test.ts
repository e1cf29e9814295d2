import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { todayIn } from '../../shared/runs/local-time.ts';
import { METRES_PER_FOOT } from '../../shared/units.ts';
import { screenshot, watchErrors } from '../support/browser.ts';
import { callApi, signInThroughPage, useBrowserSession } from '../support/browser-session.ts';
import { createUser } from '../support/factories.ts';

// Issue 17, "one today, one time zone". The browser's own clock zone is Pacific/Pago_Pago (UTC−11 all
// year) and the runner's profile says Pacific/Kiritimati (UTC+14 all year; IANA tzdata): 25 hours apart,
// so the two calendar dates always differ and a page that dates by the device shows the wrong day.
const DEVICE_ZONE = 'Pacific/Pago_Pago';
const PROFILE_ZONE = 'Pacific/Kiritimati';
const PHONE = { width: 375, height: 812 };
const DESKTOP = { width: 1280, height: 800 };

const session = useBrowserSession({ timezoneId: DEVICE_ZONE });

/** The `aria-label` ("Saturday 5 December") of the day the page marks "today", on a week of day cards. */
async function dayMarkedToday(page: Page): Promise<string | null> {
  const day = page.locator('li', { has: page.locator('h3 span', { hasText: /^today$/ }) });
  await expect.poll(() => day.count()).toBe(1);
  return day.getAttribute('aria-label');
}

/** "Saturday 5 December" for a `YYYY-MM-DD`, as the week pages label their days. */
function longDay(date: string): string {
  return new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', timeZone: 'UTC' }).format(
    new Date(`${date}T00:00:00Z`),
  );
}

async function timeZoneSelect(page: Page, baseUrl: string) {
  await page.goto(`${baseUrl}/profile`);
  const select = page.getByLabel('Time zone');
  await expect.poll(() => select.count()).toBe(1);
  return select;
}

describe('one time zone for the profile list and for "today"', () => {
  it('the profile lists current IANA names at 375 and 1280 px, and an old name from an older client shows as the new one', async () => {
    const { user, password } = await createUser({ name: 'Tove Zones', email: `tove-${Date.now()}@example.test` });
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, { email: user.email, password }, PHONE);
    const errors = watchErrors(page);

    const select = await timeZoneSelect(page, session.server.url);
    const values = await select.locator('option').evaluateAll((options) => options.map((o) => (o as HTMLOptionElement).value));
    // IANA tz database, file `backward`: Asia/Calcutta → Asia/Kolkata, Europe/Kiev → Europe/Kyiv.
    expect(values).toEqual(expect.arrayContaining(['Asia/Kolkata', 'Europe/Kyiv', 'UTC']));
    expect(values).not.toContain('Asia/Calcutta');
    expect(values).not.toContain('Europe/Kiev');
    // The select fits the phone's width.
    const box = await select.boundingBox();
    expect(box!.x).toBeGreaterThanOrEqual(0);
    expect(box!.x + box!.width).toBeLessThanOrEqual(PHONE.width);
    await select.selectOption('Europe/Kyiv');
    await page.getByRole('button', { name: 'Save profile' }).click();
    await expect.poll(() => page.getByText('Profile saved.').count()).toBe(1);
    await screenshot(page, 'profile-time-zone-375');

    // An older client sends the outdated name: stored and shown as the current one.
    await page.setViewportSize(DESKTOP);
    const answer = await callApi<{ profile: { time_zone: string } }>(page, 'PATCH', '/api/me', { time_zone: 'Asia/Calcutta' });
    expect(answer.profile.time_zone).toBe('Asia/Kolkata');
    const again = await timeZoneSelect(page, session.server.url);
    await expect.poll(() => again.inputValue()).toBe('Asia/Kolkata');
    const wide = await again.boundingBox();
    expect(wide!.x + wide!.width).toBeLessThanOrEqual(DESKTOP.width);
    await screenshot(page, 'profile-time-zone-1280');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('the Plan page and My week mark the same today, the profile’s, not the device’s', async () => {
    const { user, password } = await createUser({ name: 'Kit Dateline', email: `kit-${Date.now()}@example.test` });
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, { email: user.email, password }, PHONE);
    const errors = watchErrors(page);
    await callApi(page, 'PATCH', '/api/me', { time_zone: PROFILE_ZONE });

    // The page really runs on the device zone (its own Date says so), and its date is not the profile's.
    const deviceDate = await page.evaluate(() => {
      const d = new Date();
      return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
    });
    expect(deviceDate).toBe(todayIn(DEVICE_ZONE));
    const expected = todayIn(PROFILE_ZONE);
    expect(expected).not.toBe(deviceDate);

    await page.goto(`${session.server.url}/plan`);
    const onPlan = await dayMarkedToday(page);
    await page.goto(`${session.server.url}/week`);
    const onMyWeek = await dayMarkedToday(page);
    await screenshot(page, 'my-week-profile-today-375');

    // Read again after the pages: a test that crosses Kiritimati's midnight accepts the later date.
    const expectedNow = todayIn(PROFILE_ZONE);
    expect([longDay(expected), longDay(expectedNow)]).toContain(onPlan);
    expect(onMyWeek).toBe(onPlan);
    expect(onPlan).not.toBe(longDay(deviceDate));
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe("a coach's view of a runner's plan", () => {
  it('marks the runner’s today, not the coach’s, at 375 and 1280 px', async () => {
    // The coach reads the device's zone (Pago_Pago), the runner lives in Kiritimati: 25 hours apart.
    const stamp = Date.now().toString(36);
    const coach = await createUser({ role: 'coach', name: 'Cleo Westwater', email: `cleo-${stamp}@example.test` });
    const runner = await createUser({ name: 'Kai Eastmost', email: `kai-${stamp}@example.test` });
    await db('users').where({ id: coach.user.id }).update({ time_zone: DEVICE_ZONE });
    await db('users').where({ id: runner.user.id }).update({ time_zone: PROFILE_ZONE });
    const [squad] = await db('squads')
      .insert({ coach_id: coach.user.id, name: `Dateline squad ${stamp}` })
      .returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });

    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, { email: coach.user.email, password: coach.password }, PHONE);
    const errors = watchErrors(page);
    for (const size of [PHONE, DESKTOP]) {
      await page.setViewportSize(size);
      const before = todayIn(PROFILE_ZONE);
      await page.goto(`${session.server.url}/squad/${runner.user.id}/plan`);
      await expect.poll(() => page.getByRole('heading', { name: `${runner.user.name}’s plan` }).count()).toBe(1);
      const marked = await dayMarkedToday(page);
      // A test that crosses Kiritimati's midnight accepts the later date; the coach's date is never one of them.
      expect([longDay(before), longDay(todayIn(PROFILE_ZONE))]).toContain(marked);
      expect(marked).not.toBe(longDay(todayIn(DEVICE_ZONE)));
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      expect(overflow).toBeLessThanOrEqual(0);
      await screenshot(page, `coach-runner-plan-today-${size.width}`);
    }
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe('one unit setting for every page', () => {
  it('miles show climb in feet; the run page’s km choice moves the top bar too and is remembered after a reload', async () => {
    const { user, password } = await createUser({ name: 'Una Units', email: `una-${Date.now()}@example.test` });
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, { email: user.email, password }, DESKTOP);
    const errors = watchErrors(page);
    await page.goto(`${session.server.url}/log`);
    await page.getByLabel('Choose files').setInputFiles(path.resolve('fixtures/gps-samples/watch-run-3-laps.tcx'));
    const uploads = page.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 20_000 }).toMatch(/imported →/);
    await uploads.getByRole('link').first().click();
    await page.waitForURL(/\/runs\/[^/]+$/);
    const runId = new URL(page.url()).pathname.split('/').pop()!;
    const { summary } = await callApi<{ summary: { ascent_m: number; descent_m: number } }>(page, 'GET', `/api/runs/${runId}`);
    expect(summary.ascent_m).toBeGreaterThan(0);

    // Miles: climb in feet (international foot, 0.3048 m exactly), in the summary and the splits' columns.
    const climb = page.locator('dl div', { has: page.getByText('Climb / descent', { exact: true }) }).locator('dd');
    const feet = (m: number) => Math.round(m / METRES_PER_FOOT);
    await expect.poll(() => climb.textContent()).toBe(`↑ ${feet(summary.ascent_m)} ft ↓ ${feet(summary.descent_m)} ft`);
    const splits = page.getByRole('table', { name: /^Splits per mile/ });
    await expect.poll(() => splits.getByText('Climb in feet').count()).toBe(1);

    // km on the splits card: the top bar's switch follows, the climb turns to metres.
    const topBar = page.getByRole('group', { name: 'Distance unit' });
    await expect.poll(() => topBar.getByRole('radio', { name: 'mi' }).isChecked()).toBe(true);
    await page.getByRole('group', { name: 'Split unit' }).getByRole('radio', { name: 'km' }).check();
    await expect.poll(() => topBar.getByRole('radio', { name: 'km' }).isChecked()).toBe(true);
    await expect.poll(() => climb.textContent()).toBe(`↑ ${Math.round(summary.ascent_m)} m ↓ ${Math.round(summary.descent_m)} m`);
    await expect
      .poll(() =>
        page
          .getByRole('table', { name: /^Splits per kilometre/ })
          .getByText('Climb in metres')
          .count(),
      )
      .toBe(1);
    await expect.poll(async () => (await callApi<{ profile: { unit: string } }>(page, 'GET', '/api/me')).profile.unit).toBe('km');

    // Remembered: a reload keeps km on the card and in the top bar.
    await page.reload();
    await page.getByRole('table', { name: /^Splits per kilometre/ }).waitFor();
    await expect
      .poll(() => page.getByRole('group', { name: 'Distance unit' }).getByRole('radio', { name: 'km' }).isChecked())
      .toBe(true);
    await screenshot(page, 'run-km-remembered-1280');
    expect(errors).toEqual([]);
    await page.close();
  });
});
