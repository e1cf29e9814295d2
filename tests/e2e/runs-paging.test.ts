import type { Page } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { importFiles, type UploadedFile } from '../../server/features/runs/index.ts';
import { db, type UserRow } from '../../server/lib/db.ts';
import { createStoreFromEnv } from '../../server/lib/storage.ts';
import { mondayOf } from '../../shared/plans/weeks.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { screenshot, watchErrors } from '../support/browser.ts';
import { signInThroughPage, useBrowserSession } from '../support/browser-session.ts';
import { createUser } from '../support/factories.ts';

// Issue 19: the Log pages through a runner's runs by keyset cursor (`?page=N&after=…`, decision 46 in
// server/features/runs/README.md), and the coach's pages of a runner list that runner's runs by week and month.

const PHONE = { width: 375, height: 812 };
const DESKTOP = { width: 1280, height: 800 };
/** Three pages of 20 (the Log's page size) and five over: 45 runs, one a day up to yesterday. */
const RUN_COUNT = 45;
const DAY_MS = 86_400_000;
const WAIT = { timeout: 15_000 };

const { server, browser } = useBrowserSession();

let runner: { user: UserRow; password: string };
let coach: { user: UserRow; password: string };
/** Each run's local date (the profile is UTC), by name. */
const runDates = new Map<string, string>();

beforeAll(async () => {
  const stamp = Date.now();
  runner = await createUser({ name: 'Wren Pager', email: `wren-${stamp}@example.test` });
  coach = await createUser({ name: 'Oda Pager', email: `oda-${stamp}@example.test`, role: 'coach' });
  const [squad] = await db('squads').insert({ coach_id: coach.user.id, name: 'Paging squad' }).returning('id');
  await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });

  // Short generated lake runs of different lengths (so sorting by distance differs from the date order),
  // imported through the real import path so each run page has its track and splits.
  const midnight = Math.floor(stamp / DAY_MS) * DAY_MS;
  const files: UploadedFile[] = [];
  for (let i = 1; i <= RUN_COUNT; i++) {
    const name = `Paging run ${String(i).padStart(2, '0')}`;
    const start = midnight - (RUN_COUNT + 1 - i) * DAY_MS + 7 * 3_600_000; // 07:00 UTC, run 45 yesterday
    runDates.set(name, new Date(start).toISOString().slice(0, 10));
    const minutes = 8 + ((i * 7) % 13);
    const run = generateLakeRun({
      start_t: start,
      phases: [{ kind: 'run', duration_s: minutes * 60, speed_mps: 3 }],
      sample_s: 5,
      seed: i,
    });
    files.push({ name: `${name}.gpx`, data: Buffer.from(writeGpx(name, [run.points])) });
  }
  const store = await createStoreFromEnv(server.config.dataDir, process.env);
  const result = await importFiles(runner.user, files, store);
  expect(result.rejected).toEqual([]);
  expect(result.imported).toHaveLength(RUN_COUNT);
  for (const imported of result.imported) {
    await db('runs')
      .where({ id: imported.id })
      .update({ name: imported.file.replace(/\.gpx$/, '') });
  }
}, 120_000);

/** The run names of the Log's runs table, top to bottom. */
async function listedRuns(page: Page): Promise<string[]> {
  const table = page.getByRole('table', { name: 'Your runs' });
  await table.waitFor(WAIT);
  return (await table.getByRole('link').allTextContents()).map((t) => t.trim());
}

/** The run names of one page of the runs list, as the API gives it by page number (the offset read). */
async function apiPage(page: Page, number: number, sort = 'date'): Promise<string[]> {
  const res = await page.request.get(`${server.url}/api/runs?page=${number}&per_page=20&sort=${sort}`);
  expect(res.status()).toBe(200);
  return ((await res.json()) as { runs: Array<{ name: string }> }).runs.map((r) => r.name);
}

/** Nothing wider than the window: no sideways scroll, and the element sits inside the viewport's width. */
async function fitsWidth(page: Page, width: number, selector = 'nav[aria-label="Pages of runs"]'): Promise<void> {
  expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
  const box = await page.locator(selector).first().boundingBox();
  expect(box).not.toBeNull();
  expect(box!.x).toBeGreaterThanOrEqual(0);
  expect(box!.x + box!.width).toBeLessThanOrEqual(width);
}

/** The list requests the page sends to the API, to see which were read by cursor. */
function listRequests(page: Page): URL[] {
  const seen: URL[] = [];
  page.on('request', (r) => {
    const url = new URL(r.url());
    if (url.pathname === '/api/runs' && url.searchParams.get('per_page') === '20') seen.push(url);
  });
  return seen;
}

describe('the Log pages by cursor', () => {
  for (const size of [PHONE, DESKTOP]) {
    it(`at ${size.width} px: two pages on, back, open a run, come back, reload a shared deep link, newer by cursor`, async () => {
      const page = await browser.context.newPage();
      await signInThroughPage(page, server.url, { email: runner.user.email, password: runner.password }, size);
      const errors = watchErrors(page);
      const requests = listRequests(page);
      await page.goto(`${server.url}/log`);
      const pages = [await apiPage(page, 1), await apiPage(page, 2), await apiPage(page, 3)];
      expect(pages.map((p) => p.length)).toEqual([20, 20, 5]);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[0]);
      const pager = page.getByRole('navigation', { name: 'Pages of runs' });
      await expect.poll(() => pager.textContent(), WAIT).toContain('Page 1 of 3');

      // Two pages on: each address carries the page number and the cursor, and the runs are the offset pages' runs.
      await pager.getByRole('link', { name: /Older/ }).click();
      await page.waitForURL(/\/log\?page=2&after=[\w-]+$/);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[1]);
      const pageTwoUrl = page.url();
      await pager.getByRole('link', { name: /Older/ }).click();
      await page.waitForURL(/\/log\?page=3&after=[\w-]+$/);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[2]);
      await expect.poll(() => pager.textContent(), WAIT).toContain('Page 3 of 3');
      expect(await pager.getByRole('link', { name: /Older/ }).count()).toBe(0);
      await fitsWidth(page, size.width);
      await screenshot(page, `log-paging-page-3-${size.width}`);
      const pageThreeUrl = page.url();

      // The deep pages were read after a cursor, never by their number.
      const deep = requests.filter((u) => u.searchParams.has('after'));
      expect(deep.length).toBeGreaterThanOrEqual(2);
      expect(deep.every((u) => u.searchParams.get('page') === '1')).toBe(true);
      expect(requests.some((u) => u.searchParams.get('page') === '2' || u.searchParams.get('page') === '3')).toBe(false);

      // Back returns to page 2, with its runs.
      await page.goBack();
      await page.waitForURL(pageTwoUrl);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[1]);

      // Open a run of page 2 and come back to the same page.
      const chosen = pages[1]![7]!;
      await page.getByRole('table', { name: 'Your runs' }).getByRole('link', { name: chosen, exact: true }).click();
      await page.waitForURL(/\/runs\/[^/]+$/);
      await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent(), WAIT).toBe(chosen);
      await page.getByRole('table', { name: /^Splits per/ }).waitFor(WAIT);
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      await page.goBack();
      await page.waitForURL(pageTwoUrl);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[1]);

      // The deep address is shareable: a fresh tab of the same person shows the same page.
      const shared = await browser.context.newPage();
      await shared.setViewportSize(size);
      await shared.goto(pageThreeUrl);
      await expect.poll(() => listedRuns(shared), WAIT).toEqual(pages[2]);
      await shared.close();

      // "Newer" from page 3 goes to page 2 by the cursor this tab saw, then to page 1.
      await page.goto(pageThreeUrl);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[2]);
      await pager.getByRole('link', { name: /Newer/ }).click();
      await page.waitForURL(pageTwoUrl);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[1]);
      await pager.getByRole('link', { name: /Newer/ }).click();
      await page.waitForURL(/\/log$/);
      await expect.poll(() => listedRuns(page), WAIT).toEqual(pages[0]);
      expect(errors).toEqual([]);
      await page.close();
    });
  }

  it('a sorted list pages by its own cursor, and a damaged cursor says so in a sentence', async () => {
    const page = await browser.context.newPage();
    await signInThroughPage(page, server.url, { email: runner.user.email, password: runner.password }, DESKTOP);
    const errors = watchErrors(page, [/status of 400/]);
    await page.goto(`${server.url}/log?sort=distance`);
    const firstPage = await apiPage(page, 1, 'distance');
    await expect.poll(() => listedRuns(page), WAIT).toEqual(firstPage);
    const pager = page.getByRole('navigation', { name: 'Pages of runs' });
    await pager.getByRole('link', { name: /Next/ }).click();
    await page.waitForURL(/\/log\?page=2&after=[\w-]+&sort=distance$/);
    await expect.poll(() => listedRuns(page), WAIT).toEqual(await apiPage(page, 2, 'distance'));

    // A new order starts again at its first page, without the cursor of the old one.
    const movingHeader = page
      .getByRole('table', { name: 'Your runs' })
      .getByRole('columnheader', { name: 'Moving', exact: true });
    await movingHeader.getByRole('button').click();
    await page.waitForURL(/\/log\?sort=duration$/);
    await expect.poll(() => listedRuns(page), WAIT).toEqual(await apiPage(page, 1, 'duration'));

    await page.goto(`${server.url}/log?page=2&after=not-a-cursor`);
    const alert = page.getByRole('alert');
    await expect.poll(() => alert.textContent(), WAIT).toContain('This link to more runs no longer works.');
    expect(errors).toEqual([]);
    await page.close();
  });
});

describe("the coach's pages of a runner", () => {
  for (const size of [PHONE, DESKTOP]) {
    it(`at ${size.width} px list the runner's runs of a week and open one; Back returns to the week`, async () => {
      const page = await browser.context.newPage();
      await signInThroughPage(page, server.url, { email: coach.user.email, password: coach.password }, size);
      const errors = watchErrors(page);
      const lastRunDate = runDates.get(`Paging run ${RUN_COUNT}`)!;
      const monday = mondayOf(lastRunDate);
      const weekRuns = [...runDates].filter(([, date]) => date >= monday && date <= lastRunDate).map(([name]) => name);
      expect(weekRuns.length).toBeGreaterThan(0);

      const weekUrl = `${server.url}/squad/${runner.user.id}/plan?week=${monday}`;
      await page.goto(weekUrl);
      const runLinks = page.getByRole('link', { name: /· Paging run \d\d$/ });
      await expect.poll(() => runLinks.count(), WAIT).toBe(weekRuns.length);
      const names = (await runLinks.allTextContents()).map((t) => t.replace(/^.*· /, ''));
      expect(names.sort()).toEqual([...weekRuns].sort());
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      await screenshot(page, `coach-runner-week-${size.width}`);

      await runLinks.first().click();
      await page.waitForURL(/\/runs\/[^/]+$/);
      await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent(), WAIT).toMatch(/^Paging run \d\d$/);
      expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
      await screenshot(page, `coach-runner-run-${size.width}`);
      await page.goBack();
      await page.waitForURL(weekUrl);
      await expect.poll(() => runLinks.count(), WAIT).toBe(weekRuns.length);

      if (size === DESKTOP) {
        // The month view lists the month's runs in one read (≤ 200 a page: a month of runs fits; no paging needed).
        const month = lastRunDate.slice(0, 7);
        const monthRuns = [...runDates.values()].filter((d) => d.startsWith(month)).length;
        await page.goto(`${server.url}/squad/${runner.user.id}/plan?view=month&month=${month}`);
        await expect.poll(() => page.getByRole('link', { name: /, Paging run \d\d$/ }).count(), WAIT).toBe(monthRuns);
        await screenshot(page, 'coach-runner-month-1280');
      }
      expect(errors).toEqual([]);
      await page.close();
    });
  }
});
