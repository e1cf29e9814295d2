import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const WATCH_FILE = path.resolve('fixtures/gps-samples/watch-run-3-laps.tcx');
const CSV_HEADER = 'split,unit,distance,elapsed_s,moving_s,pace,avg_hr,max_hr,elev_gain_m,elev_loss_m';

const { server, browser } = useBrowserSession();

/** Seconds from the first `m:ss` in a cell ("fastest 7:52" → 472). */
function seconds(text: string): number {
  const match = /(\d+):(\d\d)/.exec(text);
  if (!match) throw new Error(`no pace in "${text}"`);
  return Number(match[1]) * 60 + Number(match[2]);
}

/** Split number and pace of each body row, in the order shown. */
async function splitRows(table: Locator): Promise<Array<{ index: number; pace: number }>> {
  const rows = await table.getByRole('row').all();
  const out: Array<{ index: number; pace: number }> = [];
  for (const row of rows) {
    const header = row.getByRole('rowheader');
    if ((await header.count()) === 0) continue; // the column header row
    const cells = await row.getByRole('cell').allTextContents();
    out.push({ index: Number(await header.textContent()), pace: seconds(cells[3]!) }); // distance, clock, moving, pace
  }
  return out;
}

async function signedInPage(): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.goto(`${server.url}/sign-in`);
  const runner = DEMO_PEOPLE.find((p) => p.role === 'runner')!;
  await signIn(page, runner.email, runner.password);
  await page.waitForURL(/\/log$/);
  return page;
}

describe('importing a watch file', () => {
  it('uploads a TCX, opens the run, sorts the splits, switches to km and downloads the CSV', async () => {
    const page = await signedInPage();
    const errors = watchErrors(page);

    // The seeded runs are listed before anything is uploaded.
    await expect.poll(() => page.getByRole('table', { name: 'Your runs' }).getByRole('link').count()).toBeGreaterThan(0);
    await page.getByLabel('Choose files').setInputFiles(WATCH_FILE);
    const uploads = page.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 20_000 }).toMatch(/imported →.*mi · \d+:\d\d/);
    expect(await uploads.getByRole('progressbar').getAttribute('value')).toBe('100');
    await screenshot(page, 'log');

    await uploads.getByRole('link').first().click();
    await page.waitForURL(/\/runs\/[^/]+$/);
    const splits = page.getByRole('table', { name: /^Splits per mile/ });
    await expect.poll(() => splits.getByRole('rowheader').count()).toBe(3);
    const initial = await splitRows(splits);
    expect(initial.map((r) => r.index)).toEqual([1, 2, 3]);
    expect(await splits.textContent()).toMatch(/fastest/);

    const paceHeader = splits.getByRole('columnheader', { name: 'Pace', exact: true });
    await paceHeader.getByRole('button').click();
    await expect.poll(() => paceHeader.getAttribute('aria-sort')).toBe('ascending');
    const ascending = [...initial].sort((a, b) => a.pace - b.pace).map((r) => r.index);
    expect((await splitRows(splits)).map((r) => r.index)).toEqual(ascending);
    await paceHeader.getByRole('button').click();
    await expect.poll(() => paceHeader.getAttribute('aria-sort')).toBe('descending');
    expect((await splitRows(splits)).map((r) => r.index)).toEqual(
      [...initial].sort((a, b) => b.pace - a.pace).map((r) => r.index),
    );

    // Charts come from a lazily loaded chunk; wait for them before the picture.
    await page.getByText(/^Pace \(per mi/).waitFor();
    await screenshot(page, 'run');

    await page.getByRole('group', { name: 'Split unit' }).getByRole('radio', { name: 'km' }).check();
    const kmSplits = page.getByRole('table', { name: /^Splits per kilometre/ });
    await expect.poll(() => kmSplits.getByRole('rowheader').count()).toBe(5);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'CSV (km)' }).click()]);
    const csv = readFileSync((await download.path())!, 'utf8');
    expect(csv.startsWith(CSV_HEADER)).toBe(true);
    expect(csv.trim().split(/\r?\n/)).toHaveLength(1 + 5);
    // The file is named by the run's date and name (issue 17), e.g. 2026-12-04-morning-run-splits-km.csv.
    expect(download.suggestedFilename()).toMatch(/^\d{4}-\d{2}-\d{2}-[a-z0-9-]+-splits-km\.csv$/);

    // The unit is the profile's one setting (it moved the top bar too): back to miles for the tests after this one.
    await page.getByRole('group', { name: 'Split unit' }).getByRole('radio', { name: 'mi' }).check();
    await page.getByRole('table', { name: /^Splits per mile/ }).waitFor();
    await expect
      .poll(() => page.getByRole('group', { name: 'Distance unit' }).getByRole('radio', { name: 'mi' }).isChecked())
      .toBe(true);

    await page.getByRole('button', { name: 'Rename' }).click();
    await page.getByLabel('Run name').fill('Three laps by the river');
    await page.getByRole('button', { name: 'Save name' }).click();
    await expect.poll(() => page.getByRole('heading', { level: 1 }).textContent()).toBe('Three laps by the river');

    await page.getByRole('button', { name: 'Delete…' }).click();
    await page.getByRole('button', { name: 'Delete run' }).click();
    await page.waitForURL(/\/log$/);
    await page.getByRole('table', { name: 'Your runs' }).waitFor();
    // The list may first show the cached page: wait until the deleted run has left it.
    await expect.poll(() => page.getByRole('link', { name: 'Three laps by the river' }).count()).toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('the runs list headers order all runs through the API and start again at the first page', async () => {
    const page = await signedInPage();
    const errors = watchErrors(page);
    const runs = page.getByRole('table', { name: 'Your runs' });
    const firstRunHref = () => runs.getByRole('link').first().getAttribute('href');
    /** The first run of the whole history in that order, as the API gives it. */
    const firstRunOf = async (sort: string, order: string) => {
      const res = await page.request.get(`${server.url}/api/runs?sort=${sort}&order=${order}&per_page=1`);
      return `/runs/${(await res.json()).runs[0].id as string}`;
    };
    await page.goto(`${server.url}/log?page=2`);
    await runs.waitFor();

    const distanceHeader = runs.getByRole('columnheader', { name: 'Distance', exact: true });
    await distanceHeader.getByRole('button').click();
    await page.waitForURL(/\/log\?sort=distance$/);
    await expect.poll(() => distanceHeader.getAttribute('aria-sort')).toBe('descending');
    await expect.poll(firstRunHref).toBe(await firstRunOf('distance', 'desc'));

    await distanceHeader.getByRole('button').click();
    await page.waitForURL(/\/log\?sort=distance&order=asc$/);
    await expect.poll(() => distanceHeader.getAttribute('aria-sort')).toBe('ascending');
    await expect.poll(firstRunHref).toBe(await firstRunOf('distance', 'asc'));
    expect(errors).toEqual([]);
    await page.close();
  });

  it('at 375 px the Log and the run page do not scroll sideways', async () => {
    const page = await signedInPage();
    await page.setViewportSize({ width: 375, height: 740 });
    const overflow = () => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    await page.getByRole('table', { name: 'Your runs' }).waitFor();
    expect(await overflow()).toBeLessThanOrEqual(0);
    await screenshot(page, 'log-phone');

    await page.getByRole('table', { name: 'Your runs' }).getByRole('link').first().click();
    await page.getByRole('table', { name: /^Splits per/ }).waitFor();
    await page.getByText(/^Pace \(per/).waitFor();
    expect(await overflow()).toBeLessThanOrEqual(0);
    await screenshot(page, 'run-phone');
    await page.close();
  });
});
