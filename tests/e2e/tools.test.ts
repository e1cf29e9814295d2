import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

const { server, browser } = useBrowserSession();

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
    await expect.poll(() => marathonRow.first().textContent()).toMatch(/2:57:13.*2:57:24/); // REFERENCES.md §3.1, §3.2
    // Training ranges are named by race effort, plus easy and steady; each says where it comes from
    // (product.md: every computed number explains itself).
    const ranges = page.getByRole('region', { name: 'Training pace ranges' });
    await expect
      .poll(() => ranges.getByRole('rowheader').evaluateAll((cells) => cells.map((c) => c.firstChild?.textContent)))
      .toEqual(['Easy', 'Steady', 'Marathon effort', 'Half marathon effort', '10K effort', '5K effort', 'Mile effort']);
    expect(await ranges.getByRole('cell', { name: /our own choice/ }).count()).toBe(2);
    expect(
      await ranges.getByRole('cell', { name: /^Riegel \(1981\) and Daniels & Gilbert \(1979\) race equivalents$/ }).count(),
    ).toBe(5);
    // The demo runner reads miles: marathon effort from the half spans Riegel 2:57:13 (6:46 /mi) to D&G 2:57:24 (6:46 /mi).
    await expect.poll(() => ranges.getByRole('row', { name: /^Marathon effort/ }).textContent()).toMatch(/in a plan: @ MP.*6:46/);
    expect(await ranges.textContent()).not.toMatch(/threshold|interval|repetition/i);

    const paceForm = page.locator('section', { has: page.getByRole('heading', { name: 'Pace calculator' }) });
    await paceForm.getByLabel('Distance').selectOption('marathon');
    await paceForm.getByLabel('Goal time').fill('3:00:00');
    await paceForm.getByRole('button', { name: 'Show paces' }).click();
    // REFERENCES.md §1: a 3:00:00 marathon is 411.9188 s/mi (6:52) and 255.9545 s/km (4:16).
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

    // A refused entry clears the results it no longer matches (issue 17): no old splits beside a new error.
    await paceForm.getByLabel('Goal time').fill('half past three');
    await paceForm.getByRole('button', { name: 'Show paces' }).click();
    await expect.poll(() => paceForm.getByText(/Enter the time as h:mm:ss/).count()).toBe(1);
    expect(await paceForm.getByRole('region', { name: 'Splits per km' }).count()).toBe(0);
    await resultForm.getByLabel('Your time').fill('soon');
    await resultForm.getByRole('button', { name: 'Show equivalents' }).click();
    await expect.poll(() => page.getByRole('region', { name: 'Training pace ranges' }).count()).toBe(0);

    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'tools-phone');
    await page.close();
  });

  it('a coach at 1280 px sees the same race-effort words on the Tools page and in the plan editor', async () => {
    const coach = DEMO_PEOPLE.find((p) => p.role === 'coach')!;
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto(`${server.url}/sign-in?next=%2Ftools`);
    await signIn(page, coach.email, coach.password);
    await page.waitForURL(/\/tools$/);
    const errors = watchErrors(page);

    const resultForm = page.locator('section', { has: page.getByRole('heading', { name: 'Race equivalents' }) });
    await resultForm.getByLabel('Distance').selectOption('10k');
    await resultForm.getByLabel('Your time').fill('40:00');
    await resultForm.getByRole('button', { name: 'Show equivalents' }).click();
    const ranges = page.getByRole('region', { name: 'Training pace ranges' });
    // A 10K in 40:00 is 6:26 /mi by both models at its own distance (REFERENCES.md §1: 4:00/km = 386.2426 s/mi).
    await expect.poll(() => ranges.getByRole('row', { name: /^10K effort/ }).textContent()).toMatch(/in a plan: @ 10K.*6:26/);
    const toolsWords = await ranges
      .getByRole('rowheader')
      .evaluateAll((cells) => cells.map((c) => c.firstChild?.textContent ?? ''));
    await screenshot(page, 'tools-coach-desktop');

    await page.goto(`${server.url}/plan`);
    await page.getByRole('button', { name: 'New session', exact: true }).click();
    const editor = page.getByRole('form', { name: 'New session', exact: true });
    await editor.getByLabel('Session in shorthand').fill('3 mi @ 10K');
    const effort = editor.getByLabel('Race effort, part 1');
    await expect
      .poll(() => effort.evaluate((el: HTMLSelectElement) => el.selectedOptions[0]?.textContent))
      .toBe('10K effort (@ 10K)');
    const editorWords = await effort.evaluate((el: HTMLSelectElement) => [...el.options].map((o) => o.textContent ?? ''));
    // Every race effort the plan editor offers is named as on the Tools page.
    const effortWords = editorWords.filter((w) => !w.startsWith('Goal race pace'));
    expect(effortWords.length).toBeGreaterThanOrEqual(4); // MP, HMP, 10K, 5K at least
    for (const word of effortWords) {
      expect(toolsWords).toContain(word.replace(/ \(@ .*\)$/, ''));
    }
    expect(editorWords).toHaveLength(5);
    await screenshot(page, 'plan-editor-race-effort');
    expect(errors).toEqual([]);
    await page.close();
  });
});
