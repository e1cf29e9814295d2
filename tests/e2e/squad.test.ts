import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const coach = DEMO_PEOPLE.find((p) => p.role === 'coach')!;
const runners = DEMO_PEOPLE.filter((p) => p.role === 'runner');
/** Pages load the built app and build each runner's week on the server: allow more than the 1 s default. */
const WAIT = { timeout: 15_000 };
const NOTE = 'Good week. Keep Thursday easy: conversational pace, no watch-checking.';

const { server, browser } = useBrowserSession();

async function signedInPage(email: string, password: string, next: string, width = 1280): Promise<Page> {
  const page = await browser.context.newPage();
  await page.setViewportSize({ width, height: 900 });
  await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(next)}`);
  await signIn(page, email, password);
  await page.waitForURL((url) => url.pathname === next.split('?')[0]);
  return page;
}

/** The overview table's "Run" figures, top to bottom (e.g. "31.2 mi" → 31.2). */
async function runDistances(page: Page): Promise<number[]> {
  const table = page.getByRole('table', { name: /one row per runner/ });
  const rows = await table.getByRole('row').all();
  const values: number[] = [];
  for (const row of rows.slice(1)) values.push(Number.parseFloat((await row.getByRole('cell').nth(1).textContent()) ?? ''));
  return values;
}

describe('Squad', () => {
  it('shows the coach the squad’s last week, opens a runner’s week review, writes a note and marks it reviewed; the runner reads the note', async () => {
    await browser.context.clearCookies();
    const page = await signedInPage(coach.email, coach.password, '/squad');
    const errors = watchErrors(page);

    // The demo runs cover the three weeks before this one: step back a week.
    await page.getByRole('link', { name: 'Previous week' }).click();
    await page.waitForURL(/\/squad\?week=\d{4}-\d{2}-\d{2}$/);
    const table = page.getByRole('table', { name: /one row per runner/ });
    for (const runner of runners) {
      await expect.poll(() => table.getByRole('link', { name: `${runner.name}: week review` }).count(), WAIT).toBe(1);
    }
    // Other journeys may have added runners to the demo squad; the three demo runners are there whatever else is.
    await expect
      .poll(() => table.getByRole('img', { name: /^12 weeks: \d+ → \d+ mi/ }).count(), WAIT)
      .toBeGreaterThanOrEqual(runners.length);

    // Sort by run distance: most first on the first click.
    await table.getByRole('button', { name: 'Run', exact: true }).click();
    await expect
      .poll(() => table.getByRole('columnheader', { name: 'Run', exact: true }).getAttribute('aria-sort'), WAIT)
      .toBe('descending');
    const distances = await runDistances(page);
    expect(distances.length).toBeGreaterThanOrEqual(runners.length);
    expect(distances[0]).toBeGreaterThan(0);
    expect([...distances].sort((a, b) => b - a)).toEqual(distances);
    await screenshot(page, 'squad');

    // The weekly digest goes out, and the page says what it said, heading by heading.
    await page.getByRole('button', { name: 'Send weekly digest' }).click();
    const receipt = page.getByRole('status').filter({ hasText: /^Weekly digest for the week of/ });
    await expect.poll(() => receipt.count(), WAIT).toBe(1);
    for (const heading of ['To look at', 'No run uploaded this week', 'Running without a plan this week', 'On plan']) {
      expect(await receipt.getByText(new RegExp(`^${heading} \\(\\d+\\)$`)).count()).toBe(1);
    }
    await screenshot(page, 'squad-digest');
    await receipt.getByRole('button', { name: 'Dismiss' }).click();

    // The runner with the most distance: their week review.
    const top = table
      .getByRole('row')
      .nth(1)
      .getByRole('link', { name: /: week review$/ });
    const name = ((await top.textContent()) ?? '').trim();
    const runner = runners.find((r) => r.name === name)!;
    expect(runner).toBeDefined();
    await top.click();
    await page.waitForURL(/\/squad\/[^/]+\/week\/\d{4}-\d{2}-\d{2}$/);
    const start = new URL(page.url()).pathname.split('/').at(-1)!;
    await expect.poll(() => page.getByRole('heading', { name, level: 1 }).count(), WAIT).toBe(1);
    const days = page.getByRole('listitem', { name: /^(Monday|Tuesday|Wednesday|Thursday|Friday|Saturday|Sunday) / });
    await expect.poll(() => days.count(), WAIT).toBe(7);
    await expect.poll(() => page.getByText(/as planned|partly/).count(), WAIT).toBeGreaterThan(0);

    // Flags, each with its reason, or the plain "no flags".
    await expect.poll(() => page.getByRole('heading', { name: 'Flags', level: 2 }).count(), WAIT).toBe(1);
    await expect
      .poll(async () => (await page.getByText('No flags this week.').count()) + (await page.getByText('Source:').count()), WAIT)
      .toBeGreaterThan(0);
    await expect.poll(() => page.getByText(/^This week’s load ÷ the average week of the last four/).count(), WAIT).toBe(1);

    await page.getByLabel('Note on this week').fill(NOTE);
    await page.getByRole('button', { name: 'Add note' }).click();
    const notes = page.getByRole('list', { name: 'Notes on this week' });
    await expect.poll(() => notes.getByText(NOTE).count(), WAIT).toBe(1);

    await page.getByRole('button', { name: 'Mark reviewed' }).click();
    await expect.poll(() => page.getByRole('button', { name: 'Reviewed ✓ — undo' }).count(), WAIT).toBe(1);
    await expect.poll(() => page.getByText(/Reviewed by you on /).count(), WAIT).toBe(1);
    await screenshot(page, 'week-review');

    // Back on the squad page the week shows as reviewed.
    await page.getByRole('link', { name: '← All runners' }).click();
    await page.waitForURL(/\/squad\?week=/);
    const reviewedRow = page.getByRole('row').filter({ has: page.getByRole('link', { name: `${name}: week review` }) });
    await expect.poll(() => reviewedRow.getByText('reviewed', { exact: true }).count(), WAIT).toBe(1);
    expect(errors).toEqual([]);
    await page.close();

    // On a phone the table scrolls inside its card; the page does not scroll sideways.
    const phone = await browser.context.newPage();
    await phone.setViewportSize({ width: 375, height: 800 });
    await phone.goto(`${server.url}/squad?week=${start}`);
    await expect
      .poll(
        () =>
          phone
            .getByRole('table', { name: /one row per runner/ })
            .getByRole('row')
            .count(),
        WAIT,
      )
      .toBeGreaterThan(runners.length);
    const overflow = await phone.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(phone, 'squad-phone');
    await phone.close();

    // The runner sees the coach's note on their own week.
    await browser.context.clearCookies();
    const own = await signedInPage(runner.email, runner.password, `/week/${start}`);
    await expect.poll(() => own.getByRole('heading', { name: 'My week', level: 1 }).count(), WAIT).toBe(1);
    await expect.poll(() => own.getByRole('list', { name: 'Notes on this week' }).getByText(NOTE).count(), WAIT).toBe(1);
    await expect.poll(() => own.getByText(`${coach.name} (coach)`, { exact: false }).count(), WAIT).toBe(1);
    await expect.poll(() => own.getByText(new RegExp(`Reviewed by ${coach.name} on `)).count(), WAIT).toBe(1);
    await screenshot(own, 'my-week');
    await own.close();
  });
});
