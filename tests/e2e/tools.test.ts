import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import type { RunningServer } from '../../server/index.ts';
import { launchBrowser, screenshot, signIn, startAppServer, watchErrors } from '../support/browser.ts';

let server: RunningServer;
let browser: Awaited<ReturnType<typeof launchBrowser>>;

beforeAll(async () => {
  server = await startAppServer();
  browser = await launchBrowser();
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

async function toolsPage(width: number): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize({ width, height: 900 });
  await page.goto(`${server.url}/sign-in?next=%2Ftools`);
  const runner = DEMO_PEOPLE.find((p) => p.role === 'runner')!;
  await signIn(page, runner.email, runner.password);
  await page.waitForURL(/\/tools$/);
  return page;
}

describe('Tools page', () => {
  it('a runner turns a half in 1:25:00 into equivalents (Riegel 2:57:13, Daniels & Gilbert 2:57:24) and a goal into splits', async () => {
    const page = await toolsPage(1200);
    const errors = watchErrors(page);

    const resultForm = page.locator('section', { has: page.getByRole('heading', { name: 'Race equivalents' }) });
    await resultForm.getByLabel('Distance').selectOption('half');
    await resultForm.getByLabel('Your time').fill('1:25:00');
    await resultForm.getByRole('button', { name: 'Show equivalents' }).click();
    const marathonRow = page.getByRole('row', { name: /^Marathon/ });
    await expect.poll(() => marathonRow.first().textContent()).toMatch(/2:57:13.*2:57:24/); // references.md §3.1, §3.2
    // Every training pace band says where it comes from (product.md: every computed number explains itself).
    await expect.poll(() => page.getByRole('cell', { name: /common practice/ }).count()).toBe(5);

    const paceForm = page.locator('section', { has: page.getByRole('heading', { name: 'Pace calculator' }) });
    await paceForm.getByLabel('Distance').selectOption('marathon');
    await paceForm.getByLabel('Goal time').fill('3:00:00');
    await paceForm.getByRole('button', { name: 'Show paces' }).click();
    // references.md §1: a 3:00:00 marathon is 411.9188 s/mi (6:52) and 255.9545 s/km (4:16).
    await expect.poll(() => paceForm.getByText('6:52 /mi').count()).toBeGreaterThan(0);
    await expect.poll(() => paceForm.getByText('4:16 /km').count()).toBeGreaterThan(0);
    await screenshot(page, 'tools-desktop');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('shows a sentence beside the field for a bad time, and works at 375 px without the page scrolling sideways', async () => {
    const page = await toolsPage(375);
    const paceForm = page.locator('section', { has: page.getByRole('heading', { name: 'Pace calculator' }) });
    await paceForm.getByLabel('Goal time').fill('3 hours');
    await paceForm.getByRole('button', { name: 'Show paces' }).click();
    await expect.poll(() => paceForm.getByText(/Enter the time as h:mm:ss/).count()).toBe(1);

    await paceForm.getByLabel('Goal time').fill('3:30:00');
    await paceForm.getByLabel('Negative split (optional)').fill('2:00');
    await paceForm.getByText('km', { exact: true }).click();
    await paceForm.getByRole('button', { name: 'Show paces' }).click();
    await expect.poll(() => paceForm.getByRole('region', { name: 'Splits per km' }).count()).toBe(1);
    await expect.poll(() => paceForm.getByText('Second half', { exact: true }).count()).toBe(1);
    const resultForm = page.locator('section', { has: page.getByRole('heading', { name: 'Race equivalents' }) });
    await resultForm.getByLabel('Your time').fill('1:40:00');
    await resultForm.getByRole('button', { name: 'Show equivalents' }).click();
    await expect.poll(() => page.getByRole('region', { name: 'Training pace ranges' }).count()).toBe(1);

    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'tools-phone');
    await page.close();
  });
});
