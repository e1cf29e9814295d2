import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const runner = DEMO_PEOPLE.find((p) => p.role === 'runner')!;
const WRITTEN = '2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down';
const REWRITTEN = '2 mi warm-up, 5 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-down';

const { server, browser } = useBrowserSession();

async function planPage(width: number): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize({ width, height: 900 });
  await page.goto(`${server.url}/sign-in?next=%2Fplan`);
  await signIn(page, runner.email, runner.password);
  await page.waitForURL(/\/plan$/);
  return page;
}

/** Today on the browser's clock, as the page computes it. */
async function browserToday(page: Page): Promise<string> {
  return page.evaluate(() => {
    const d = new Date();
    return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
  });
}

describe('Plan page', () => {
  it('writes a session in shorthand, edits it in the builder, saves it and sees it in the week', async () => {
    const page = await planPage(1280);
    // The copy onto a week with sessions is answered 409 first (the page then asks); the browser logs that answer.
    const errors = watchErrors(page, [/status of 409/]);
    // The demo runner's goal race, ten weeks out (db/seeds/02_demo_runs.ts).
    await expect.poll(() => page.getByText('Lakeside Marathon').count()).toBe(1);
    await expect.poll(() => page.getByText(/\d+ days to go/).count()).toBe(1);

    await page.getByRole('button', { name: 'New session', exact: true }).click();
    const editor = page.getByRole('form', { name: 'New session', exact: true });
    await editor.getByLabel('Date').fill(await browserToday(page));
    await editor.getByLabel('Title (optional)').fill('Track 800s');
    const shorthand = editor.getByLabel('Session in shorthand');
    await shorthand.fill(WRITTEN);

    // The builder follows: warm-up, a repeat of 6 × (rep, jog), cool-down.
    const repeatCount = editor.getByLabel('Repeat count');
    await expect.poll(() => repeatCount.inputValue()).toBe('6');
    const repeat = editor.getByRole('group', { name: 'repeat 2', exact: true });
    await expect.poll(() => repeat.getByLabel('Kind, repeat 2 part 1').inputValue()).toBe('rep');
    await expect.poll(() => repeat.getByLabel('Kind, repeat 2 part 2').inputValue()).toBe('recovery jog');
    expect(await repeat.getByLabel('Fast, repeat 2 part 1, pace').inputValue()).toBe('2:55');
    expect(await editor.getByLabel('Kind, part 1').inputValue()).toBe('warm-up');

    // …and the shorthand follows the builder.
    await repeatCount.fill('5');
    await expect.poll(() => shorthand.inputValue()).toBe(REWRITTEN);
    await screenshot(page, 'plan-editor');

    await editor.getByRole('button', { name: 'Save session' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Session added.' }).count()).toBe(1);
    const week = page.getByRole('list').filter({ has: page.getByRole('heading', { name: 'Track 800s' }) });
    await expect
      .poll(() =>
        week.getByText(REWRITTEN.replace('2 mi warm-up, ', '').replace(', 2 mi cool-down', ''), { exact: false }).count(),
      )
      .toBe(1);
    await screenshot(page, 'plan-week');

    // Move it to the next day with the date field, then delete it after confirming.
    const today = await browserToday(page);
    const tomorrow = new Date(Date.parse(`${today}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
    await page.getByRole('button', { name: /^Edit Track 800s on / }).click();
    const edit = page.getByRole('form', { name: 'Edit session: Track 800s' });
    await edit.getByLabel('Date').fill(tomorrow);
    await edit.getByRole('button', { name: 'Save changes' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Session saved.' }).count()).toBe(1);
    await page.goto(`${server.url}/plan?week=${tomorrow}`);
    const tomorrowDay = page.getByRole('listitem', { name: new RegExp(`^\\w+,? ${Number(tomorrow.slice(8))} `) });
    await expect.poll(() => tomorrowDay.getByRole('heading', { name: 'Track 800s' }).count()).toBe(1);
    await page.getByRole('button', { name: /^Edit Track 800s on / }).click();
    await page.getByRole('button', { name: 'Delete session' }).click();
    await page.getByRole('button', { name: 'Yes, delete' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Session deleted.' }).count()).toBe(1);
    await expect.poll(() => page.getByRole('heading', { name: 'Track 800s' }).count()).toBe(0);
    await page.goto(`${server.url}/plan`);

    // Past weeks show each run's plan check as a word with its glyph.
    await page.getByRole('link', { name: 'Previous week' }).click();
    await expect.poll(() => page.getByText(/(as planned|partly)$/).count()).toBeGreaterThan(0);
    await screenshot(page, 'plan-week-before');
    await page.getByRole('button', { name: 'Copy this week to next week' }).click();
    // This week already has the demo coach's sessions: the page asks before copying onto them.
    const ask = page.getByRole('alertdialog', { name: 'The next week has sessions' });
    await expect.poll(() => ask.getByText(/already has \d+ sessions?/).count()).toBe(1);
    await ask.getByRole('button', { name: 'Replace them' }).click();
    await expect
      .poll(() =>
        page
          .getByRole('status')
          .filter({ hasText: /^Copied \d+ sessions to the week of/ })
          .count(),
      )
      .toBe(1);
    await page.getByRole('link', { name: 'Month', exact: true }).click();
    await page.waitForURL(/view=month/);
    await expect.poll(() => page.getByRole('table').count()).toBe(1);
    await screenshot(page, 'plan-month');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('points at the mistake in a malformed shorthand, and works at 375 px without the page scrolling sideways', async () => {
    const page = await planPage(375);
    await page.getByRole('button', { name: 'New session', exact: true }).click();
    const editor = page.getByRole('form', { name: 'New session', exact: true });
    const shorthand = editor.getByLabel('Session in shorthand');
    await shorthand.fill('2 mi warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 mi cool-dwn');
    await expect.poll(() => editor.getByText("'cool-dwn' is not a part kind", { exact: false }).count()).toBe(1);
    await expect.poll(() => shorthand.getAttribute('aria-invalid')).toBe('true');
    await expect.poll(() => editor.getByText(/^At character \d+, expected a kind/).count()).toBe(1);
    // The builder keeps the last readable version; saving is refused with the same sentence.
    await editor.getByRole('button', { name: 'Save session' }).click();
    await expect.poll(() => editor.getByRole('alert').textContent()).toMatch(/cannot be read yet/);

    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'plan-phone');
    await page.close();
  });
});
