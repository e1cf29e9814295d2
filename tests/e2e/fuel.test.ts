import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth/schemas.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

// Ivy runs in miles; her demo long runs are "2 h easy, 30 min @ MP" (db/seeds/02_demo_runs.ts).
const RUNNER = DEMO_PEOPLE.find((p) => p.email.startsWith('ivy@'))!;
const LONG_RUN = 'Long run, goal-pace finish';

const { server, browser } = useBrowserSession();

/** The latest past long run the runner has a session plan for, and the run uploaded that day (read as the page does). */
async function findLongRun(page: Page): Promise<{ date: string; runId: string }> {
  return page.evaluate(async (title) => {
    const d = new Date();
    const today = `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
    const from = new Date(d.getTime() - 35 * 86_400_000).toISOString().slice(0, 10);
    const { plans } = (await (await fetch(`/api/plans?from=${from}&to=${today}`)).json()) as {
      plans: Array<{ date: string; title: string }>;
    };
    const dates = plans
      .filter((p) => p.title === title && p.date < today)
      .map((p) => p.date)
      .sort()
      .reverse();
    for (const date of dates) {
      const { runs } = (await (await fetch(`/api/runs?page=1&per_page=10&from=${date}&to=${date}`)).json()) as {
        runs: Array<{ id: string }>;
      };
      if (runs[0]) return { date, runId: runs[0].id };
    }
    throw new Error('no past long run with a run');
  }, LONG_RUN);
}

/** Deletes a run from the signed-in page, as the app does (CSRF header from the cookie). */
async function deleteRun(page: Page, runId: string): Promise<void> {
  const status = await page.evaluate(
    async ({ runId, cookie, header }) => {
      const token = document.cookie
        .split('; ')
        .find((c) => c.startsWith(`${cookie}=`))
        ?.slice(cookie.length + 1);
      const res = await fetch(`/api/runs/${runId}`, { method: 'DELETE', headers: { [header]: decodeURIComponent(token ?? '') } });
      return res.status;
    },
    { runId, cookie: CSRF_COOKIE, header: CSRF_HEADER },
  );
  expect(status).toBe(204);
}

/** The long run as a GPX file on `date`: 2 h easy then 30 min quicker, starting 12:30 UTC (early morning in Chicago). */
function writeLongRunFile(date: string): string {
  const phases: Phase[] = [
    { kind: 'run', duration_s: 7200, speed_mps: 3.1 },
    { kind: 'run', duration_s: 1800, speed_mps: 3.6 },
  ];
  const run = generateLakeRun({ start_t: Date.parse(`${date}T12:30:00Z`), phases, seed: 77, gps_sigma_m: 1, sample_s: 5 });
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'pacewright-fuel-')), `long-run-${date}.gpx`);
  writeFileSync(file, writeGpx('Long run', [run.points]));
  return file;
}

describe('Fuel', () => {
  it('adds a fuel item, plans a gel every 5 miles and a bottle drink on a long run, prints it, uploads the run and records fuel taken against the plan and a check-in', async () => {
    await browser.context.clearCookies();
    const page = await browser.context.newPage();
    await page.goto(`${server.url}/sign-in?next=%2Ftools`);
    await signIn(page, RUNNER.email, RUNNER.password);
    await page.waitForURL(/\/tools$/);
    // Watched from here: the sign-in page's own "who is signed in?" answers 401 by design.
    const errors = watchErrors(page);

    // Tools → Fuel items: add a generic gel.
    await page.getByRole('link', { name: 'Fuel items' }).click();
    await page.waitForURL(/\/fuel$/);
    const add = page.getByRole('form', { name: 'Add a fuel item' });
    // The shared schema refuses a negative amount before anything is sent.
    await add.getByLabel('Name').fill('energy gel');
    await add.getByLabel('Carbohydrate (g)').fill('-5');
    await add.getByRole('button', { name: 'Add item' }).click();
    await expect.poll(() => add.getByText('Carbohydrate cannot be negative.').count()).toBe(1);
    await add.getByLabel('Serving').fill('1 sachet');
    await add.getByLabel('Carbohydrate (g)').fill('25');
    await add.getByLabel('Sodium (mg)').fill('50');
    await add.getByRole('button', { name: 'Add item' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Added energy gel.' }).count()).toBe(1);
    const list = page.getByRole('list', { name: 'Your fuel items' });
    await expect.poll(() => list.getByText('25 g carbohydrate', { exact: false }).count()).toBe(1);

    // The Plan page's session panel links to the session's fuel plan.
    const { date, runId } = await findLongRun(page);
    await page.goto(`${server.url}/plan?week=${date}`);
    await page.getByRole('button', { name: new RegExp(`^Edit ${LONG_RUN} on `) }).click();
    await page.getByRole('link', { name: `Fuel plan for ${LONG_RUN}` }).click();
    await page.waitForURL(/\/plan\/[^/]+\/fuel$/);
    await expect.poll(() => page.getByRole('heading', { name: `Fuel plan: ${LONG_RUN}` }).count()).toBe(1);
    // Cautions are on the page before anything is computed.
    await expect.poll(() => page.getByRole('region', { name: 'Cautions' }).getByText('Drink to thirst').count()).toBe(1);

    const form = page.getByRole('form', { name: 'Fuel plan inputs' });
    await form.getByLabel('Body mass (kg)').fill('58');
    await form.getByLabel(/^Easy pace/).fill('9:30');
    await form.getByRole('button', { name: 'Add an intake' }).click();
    const intake = form.getByRole('group', { name: 'Intake 1' });
    await intake.getByLabel('What, intake 1').selectOption({ label: 'energy gel (1 sachet)' });
    await intake.getByLabel('When, intake 1').selectOption('every_distance');
    await intake.getByLabel('Unit, intake 1').selectOption('mi');
    await intake.getByLabel('Every (mi), intake 1').fill('5');
    // Bottle A: 500 ml with one gel mixed in (25 g carbohydrate), 200 ml drunk at 0:30.
    await form.getByRole('button', { name: 'Add a bottle' }).click();
    const bottle = form.getByRole('group', { name: 'Bottle 1' });
    await bottle.getByRole('button', { name: 'Mix in an item' }).click();
    // The picker starts empty (issue 17): nothing goes into the bottle unasked.
    const mixed = bottle.getByLabel('Mixed in, bottle 1 item 1');
    expect(await mixed.inputValue()).toBe('');
    await mixed.selectOption({ index: 1 });
    await expect.poll(() => bottle.getByText('25 g carbohydrate', { exact: false }).count()).toBe(1);
    await form.getByRole('button', { name: 'Add an intake' }).click();
    const drink = form.getByRole('group', { name: 'Intake 2' });
    await drink.getByLabel('What, intake 2').selectOption({ label: 'a drink from bottle A' });
    await drink.getByLabel('Ml each, intake 2').fill('200');
    await drink.getByLabel('When, intake 2').selectOption('at_times');
    await drink.getByLabel('At (h:mm, separated by commas), intake 2').fill('0:30');
    await form.getByRole('button', { name: 'Save and compute the schedule' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Fuel plan saved.' }).count()).toBe(1);

    const schedule = page.getByRole('table', { name: 'Fuel schedule: each intake by distance and clock' });
    const gelRows = schedule.getByRole('row').filter({ hasText: 'energy gel ×1' });
    await expect.poll(() => gelRows.count()).toBeGreaterThanOrEqual(2);
    expect(await gelRows.first().getByRole('cell').first().textContent()).toBe('5.00');
    const hours = page.getByRole('table', { name: 'Hourly totals against the targets' });
    await expect.poll(() => hours.getByRole('row', { name: /^whole run/ }).count()).toBe(1);
    await expect.poll(() => hours.getByText(/[✓▽△] (within|under|over)/).count()).toBeGreaterThan(0);
    // Each proposed target names its source.
    await expect.poll(() => page.getByText(/Jeukendrup 2014/).count()).toBeGreaterThan(0);
    const cautions = page.getByRole('region', { name: 'Cautions' });
    await expect.poll(() => cautions.getByText('Drink to thirst', { exact: false }).count()).toBe(1);
    await expect
      .poll(() =>
        cautions
          .getByText('A physician, a registered dietitian or a qualified coach has the last word', { exact: false })
          .count(),
      )
      .toBeGreaterThan(0);
    await screenshot(page, 'fuel-plan');

    // The night-before sheet: no app navigation, a Print button.
    await page.getByRole('link', { name: 'Printable sheet for the night before' }).click();
    await page.waitForURL(/\/fuel\/print$/);
    await expect.poll(() => page.getByRole('heading', { name: 'Lay out' }).count()).toBe(1);
    expect(await page.getByRole('navigation', { name: 'Main' }).count()).toBe(0);
    await expect.poll(() => page.getByText(/× energy gel/).count()).toBe(1);
    await expect.poll(() => page.getByRole('heading', { name: 'When to take what' }).count()).toBe(1);
    await expect.poll(() => page.getByRole('region', { name: 'Cautions' }).count()).toBe(1);
    await page.evaluate(() => {
      (window as unknown as { printed: number }).printed = 0;
      window.print = () => {
        (window as unknown as { printed: number }).printed++;
      };
    });
    await page.getByRole('button', { name: 'Print' }).click();
    await expect.poll(() => page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1);
    await page.emulateMedia({ media: 'print' });
    await screenshot(page, 'fuel-print');
    await page.emulateMedia({ media: 'screen' });

    // After the long run the runner uploads it (the demo run of that day is replaced by a fresh upload).
    await deleteRun(page, runId);
    await page.goto(`${server.url}/log`);
    await page.getByLabel('Choose files').setInputFiles(writeLongRunFile(date));
    const uploads = page.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 30_000 }).toMatch(/imported →/);
    await uploads.getByRole('link').first().click();
    await page.waitForURL(/\/runs\/[^/]+$/);

    // The run that day: tick off the first planned gel, say how it went, and see planned vs taken.
    const taken = page.getByRole('form', { name: 'Fuel taken' });
    const firstGel = taken.getByRole('checkbox', { name: /^energy gel ×1 at mi 5\.00/ });
    // The planned intakes come after the run's fuel-taken answer names the fuel plan: allow for the extra requests.
    await expect.poll(() => firstGel.count(), { timeout: 10_000 }).toBe(1);
    await firstGel.check();
    // The planned drink is ticked off too; only half of it went down.
    const plannedDrink = taken.getByRole('checkbox', { name: /^bottle A, 200 ml at mi .* \(0:30:00\)$/ });
    await plannedDrink.check();
    await expect.poll(() => taken.getByLabel('Time, entry 2').inputValue()).toBe('0:30');
    await expect.poll(() => taken.getByLabel('Millilitres (ml), entry 2').inputValue()).toBe('200');
    await taken.getByLabel('Millilitres (ml), entry 2').fill('100');
    await taken.getByLabel('Stomach (1–5)').selectOption('4');
    await taken.getByLabel('Energy (1–5)').selectOption('3');
    await taken.getByRole('button', { name: 'Save fuel taken' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Fuel taken saved.' }).count()).toBe(1);
    const versus = page.getByRole('table', { name: 'Planned and taken per hour' });
    const whole = versus.getByRole('row', { name: /^whole run/ });
    // Taken: the gel's 25 g and half the drink's 10 g; the drink's 100 ml in the first hour.
    await expect.poll(() => whole.getByRole('cell').nth(1).textContent()).toBe('30');
    const firstHour = versus.getByRole('row', { name: /^0:00–1:00/ });
    await expect.poll(() => firstHour.getByRole('cell').nth(2).textContent()).toBe('200');
    await expect.poll(() => firstHour.getByRole('cell').nth(3).textContent()).toBe('100');
    // The fluid and sodium numbers keep their cautions on the run page.
    await expect.poll(() => page.getByRole('region', { name: 'Cautions' }).getByText('Drink to thirst').count()).toBe(1);

    // The after-run check-in: the cold-water caution shows as soon as cold water is entered.
    const checkin = page.getByRole('form', { name: 'After-run check-in' });
    await checkin.getByLabel('Sleep the night before (hours)').fill('7.5');
    await checkin.getByLabel('Soreness (1–5)').selectOption('3');
    expect(await checkin.getByRole('region', { name: 'Cold-water caution' }).count()).toBe(0);
    await checkin.getByLabel('Water temperature (°C)').fill('8');
    const cold = checkin.getByRole('region', { name: 'Cold-water caution' });
    await expect.poll(() => cold.getByText(/cold-shock response/).count()).toBe(1);
    await expect.poll(() => cold.getByText(/Source: Cold shock: Datta & Tipton 2006/).count()).toBe(1);
    await checkin.getByLabel('Minutes in cold water').fill('10');
    await expect.poll(() => checkin.getByText('Colder than the 10–15 °C the pooled studies used.').count()).toBe(1);
    await checkin.getByRole('button', { name: 'Save check-in' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Check-in saved.' }).count()).toBe(1);

    expect(errors).toEqual([]);
    await page.close();
  });
});
