import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const person = (role: 'runner' | 'coach' | 'admin') => DEMO_PEOPLE.find((p) => p.role === role)!;

const { server, browser } = useBrowserSession();

async function navLinks(page: Page): Promise<string[]> {
  const nav = page.getByRole('navigation', { name: 'Main' });
  await nav.waitFor();
  return (await nav.getByRole('link').allTextContents()).map((t) => t.trim());
}

async function freshPage(): Promise<Page> {
  await browser.context.clearCookies();
  return browser.context.newPage();
}

describe('signing in', () => {
  it('a signed-out visitor to /plan is sent to sign-in, and back to /plan after signing in as a demo runner', async () => {
    const page = await freshPage();
    // 401 on /api/auth/me is how the app learns it is signed out; not an error.
    const errors = watchErrors(page, [/401/]);
    await page.goto(`${server.url}/plan`);
    await page.waitForURL(/\/sign-in\?next=%2Fplan/);
    await expect.poll(() => page.getByRole('heading', { level: 1 }).first().textContent()).toMatch(/sign in/i);
    const font = await page.evaluate(async () => {
      await document.fonts.ready;
      return document.fonts.check('16px "Source Sans 3"');
    });
    expect(font).toBe(true);
    const background = await page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);
    expect(background).toBe('rgb(246, 244, 239)'); // paper #f6f4ef (product.md)
    await screenshot(page, 'sign-in');

    const runner = person('runner');
    await signIn(page, runner.email, runner.password);
    await page.waitForURL(/\/plan$/);
    expect(await navLinks(page)).toEqual(['Log', 'Plan', 'My week', 'Tools']);
    await expect.poll(() => page.getByRole('button', { name: new RegExp(runner.name) }).count()).toBe(1);
    await screenshot(page, 'app-shell-runner');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('a wrong password shows a sentence and stays on sign-in', async () => {
    const page = await freshPage();
    await page.goto(`${server.url}/sign-in`);
    await signIn(page, person('runner').email, 'not the password');
    await expect.poll(() => page.getByRole('alert').first().textContent()).toMatch(/do not match/);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await page.close();
  });

  it('a coach sees Squad; a runner sent to /squad does not get it', async () => {
    const page = await freshPage();
    await page.goto(`${server.url}/sign-in`);
    const coach = person('coach');
    await signIn(page, coach.email, coach.password);
    await page.waitForURL(/\/log$/);
    expect(await navLinks(page)).toEqual(['Log', 'Plan', 'My week', 'Squad', 'Tools']);
    await screenshot(page, 'app-shell-coach');

    await browser.context.clearCookies();
    await page.goto(`${server.url}/sign-in`);
    const runner = person('runner');
    await signIn(page, runner.email, runner.password);
    await page.waitForURL(/\/log$/);
    await page.goto(`${server.url}/squad`);
    await expect.poll(() => new URL(page.url()).pathname).not.toBe('/squad');
    expect(await navLinks(page)).not.toContain('Squad');
    await page.close();
  });

  it('the admin sees Admin and the list of users', async () => {
    const page = await freshPage();
    await page.goto(`${server.url}/sign-in?next=%2Fadmin`);
    const admin = person('admin');
    await signIn(page, admin.email, admin.password);
    await page.waitForURL(/\/admin$/);
    expect(await navLinks(page)).toContain('Admin');
    await expect.poll(() => page.getByRole('cell', { name: person('coach').email }).count()).toBe(1);
    await screenshot(page, 'admin');
    await page.close();
  });

  it('at 375 px wide the page does not scroll sideways', async () => {
    const page = await freshPage();
    await page.setViewportSize({ width: 375, height: 740 });
    await page.goto(`${server.url}/sign-in`);
    const runner = person('runner');
    await signIn(page, runner.email, runner.password);
    await page.waitForURL(/\/log$/);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'app-shell-phone');
    await page.close();
  });
});
