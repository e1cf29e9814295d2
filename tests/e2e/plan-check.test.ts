import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { generateLakeRun, type Phase } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

// A day far from the demo data (which lies around today), so the only plan that day is this test's.
const PLAN_DATE = '2025-06-14';
const WORKOUT = '2 km warm-up, 6 x 800 m @ 2:55-3:00 w/ 400 m jog, 2 km cool-down';
// 2:57.5 per 800 m, the middle of the range; the 4th rep is jogged at recovery pace (skipped).
const REP = 800 / 177.5;
const JOG = 2.2;

const RUNNER = DEMO_PEOPLE.find((p) => p.email.startsWith('priya@'))!;

const { server, browser } = useBrowserSession();
let workDir: string;

beforeAll(() => {
  workDir = mkdtempSync(path.join(tmpdir(), 'pacewright-plan-check-'));
});

afterAll(() => {
  if (workDir) rmSync(workDir, { recursive: true, force: true });
});

/**
 * The workout as a GPX file, generated as tests/api/plans.api.test.ts does: 2 km warm-up, 6 × 800 m
 * with 400 m jogs, 2 km cool-down. The invented lake lies at open sea, so the run's local date comes
 * from the profile's time zone (America/Chicago for the demo runners): 12:00 UTC is the same date there.
 */
function writeWorkoutFile(repSpeeds: number[]): string {
  const stretches: Array<[number, number]> = [[2000, 3.0]];
  for (const speed of repSpeeds) stretches.push([800, speed], [400, JOG]);
  stretches.push([2000, 2.9]);
  const phases: Phase[] = stretches.map(([m, v]) => ({ kind: 'run', duration_s: m / v, speed_mps: v }));
  const [year, month, day] = PLAN_DATE.split('-').map(Number) as [number, number, number];
  const run = generateLakeRun({ start_t: Date.UTC(year, month - 1, day, 12), phases, seed: 4, gps_sigma_m: 1 });
  const file = path.join(workDir, `track-session-${PLAN_DATE}.gpx`);
  writeFileSync(file, writeGpx('Track session', [run.points]));
  return file;
}

/** Writes the session in shorthand on the Plan page, as a runner would, and waits for it to be saved. */
async function writePlanInShorthand(page: Page, body: { date: string; title: string; text: string }): Promise<void> {
  await page.goto(`${server.url}/plan?week=${body.date}`);
  await page.getByRole('button', { name: 'New session', exact: true }).click();
  const editor = page.getByRole('form', { name: 'New session', exact: true });
  await editor.getByLabel('Date').fill(body.date);
  await editor.getByLabel('Title (optional)').fill(body.title);
  await editor.getByLabel('Session in shorthand').fill(body.text);
  // The builder follows the shorthand before saving: a repeat of six.
  await expect.poll(() => editor.getByLabel('Repeat count').inputValue()).toBe('6');
  await editor.getByRole('button', { name: 'Save session' }).click();
  await expect.poll(() => page.getByRole('status').filter({ hasText: 'Session added.' }).count()).toBe(1);
}

async function signedInPage(): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.goto(`${server.url}/sign-in`);
  await signIn(page, RUNNER.email, RUNNER.password);
  await page.waitForURL(/\/log$/);
  return page;
}

/** Part label and verdict word of each body row of the plan check table, in order. */
async function partRows(table: Locator): Promise<Array<{ part: string; verdict: string }>> {
  const out: Array<{ part: string; verdict: string }> = [];
  for (const row of await table.getByRole('row').all()) {
    if ((await row.getByRole('rowheader').count()) === 0) continue; // column headers and note lines
    const cells = (await row.getByRole('cell').allTextContents()).map((t) => t.trim());
    // the part is the row header; cells: #, planned, distance run, time, stops, pace, target, difference, ♥, verdict ("● on pace")
    const part = ((await row.getByRole('rowheader').textContent()) ?? '').trim();
    out.push({ part, verdict: cells.at(-1)!.replace(/^[●▲▼◐○◇–]\s*/, '') });
  }
  return out;
}

describe('plan check on the run page', () => {
  it('a planned interval session with a skipped rep shows each part’s verdict and the session as partly', async () => {
    const page = await signedInPage();
    // Watched from here: before signing in, a 401 on /api/auth/me is how the app learns it is signed out.
    const errors = watchErrors(page);

    await writePlanInShorthand(page, { date: PLAN_DATE, title: 'Track 6 × 800 m', text: WORKOUT });

    await page.goto(`${server.url}/log`);
    await page.getByLabel('Choose files').setInputFiles(writeWorkoutFile([REP, REP, REP, JOG, REP, REP]));
    const uploads = page.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 20_000 }).toMatch(/imported →/);
    await uploads.getByRole('link').first().click();
    await page.waitForURL(/\/runs\/[^/]+$/);

    const table = page.getByRole('table', { name: /^Plan check, part by part, pace per mi/ });
    // 14 parts unrolled, less the recovery after rep 6, which the plan did not write (issue #14).
    await expect.poll(() => table.getByRole('rowheader').count(), { timeout: 20_000 }).toBe(13);
    const rows = await partRows(table);
    const reps = rows.filter((r) => r.part.startsWith('rep '));
    expect(reps.map((r) => r.part)).toEqual(['rep 1 of 6', 'rep 2 of 6', 'rep 3 of 6', 'rep 4 of 6', 'rep 5 of 6', 'rep 6 of 6']);
    expect(reps.map((r) => r.verdict)).toEqual(['on pace', 'on pace', 'on pace', 'missed', 'on pace', 'on pace']);
    // The warm-up has no pace target: it is run by feel (issue #14).
    expect(rows[0]).toEqual({ part: 'warm-up', verdict: 'by feel' });
    // The reps at a glance: how many on pace, each rep's pace (the skipped one "–"), average, fastest and slowest.
    const repsLine = (await page.getByRole('list', { name: 'Reps at a glance' }).textContent()) ?? '';
    expect(repsLine).toMatch(
      /^6 × 800 m: 5 of 6 on pace · (\d:\d\d ){3}– (\d:\d\d ){2}\/mi · average \d:\d\d · fastest \d:\d\d, slowest \d:\d\d · first to last /,
    );
    // The skipped rep says why, on the line under it.
    expect(await table.textContent()).toMatch(/Part 8: run at recovery pace: rep skipped\./);

    // The session verdict as a sentence, then the plan it was checked against.
    await page.getByText(/^Partly as planned: 5 of 6 reps on pace, rep 4 missed/).waitFor();
    await page.getByText('Track 6 × 800 m', { exact: true }).waitFor();
    await page.getByText(WORKOUT, { exact: true }).waitFor();
    await screenshot(page, 'plan-check');

    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Plan check CSV' }).click(),
    ]);
    const csv = readFileSync((await download.path())!, 'utf8');
    expect(csv.split('\r\n')[0]).toMatch(/^part,kind,planned_distance_m/);
    expect(csv.trim().split('\r\n')).toHaveLength(1 + 13);

    // The owner unlinks the plan, then goes back to the plan of the run's day.
    await page.getByRole('button', { name: 'Unlink' }).click();
    await page.getByText('No session plan on this day.').waitFor();
    await expect.poll(() => page.getByLabel('Link this run to a plan').textContent()).toContain('Track 6 × 800 m');
    await page.getByRole('button', { name: 'Back to the same-day plan' }).click();
    await expect.poll(() => table.getByRole('rowheader').count()).toBe(13);

    expect(errors).toEqual([]);
    await page.close();
  });

  it('on the profile the runner sets the goal race, adds a race result and widens the tolerance', async () => {
    const page = await signedInPage();
    const errors = watchErrors(page);
    await page.goto(`${server.url}/profile`);

    // The demo runner's goal race is filled in; a time that is not h:mm:ss gets a sentence beside the field.
    const goalForm = page.locator('form').filter({ has: page.getByRole('button', { name: 'Save goal race' }) });
    await expect.poll(() => goalForm.getByLabel('Race name').inputValue()).toBe('Lakeside Marathon');
    await goalForm.getByLabel('Goal time').fill('3:5');
    await goalForm.getByRole('button', { name: 'Save goal race' }).click();
    await goalForm.getByText(/^Enter the time as h:mm:ss/).waitFor();
    await goalForm.getByLabel('Goal time').fill('3:10:00');
    await goalForm.getByRole('button', { name: 'Save goal race' }).click();
    await page.getByRole('status').filter({ hasText: 'Goal race saved.' }).waitFor();
    await page.getByText(/Lakeside Marathon · .* · Marathon · goal 3:10:00 \(7:15 \/mi\)/).waitFor();

    const resultForm = page.locator('form').filter({ has: page.getByRole('button', { name: 'Add result' }) });
    await resultForm.getByLabel('Race name').fill('Harbor Line 10K');
    await resultForm.getByLabel('Race date').fill('2026-09-20');
    await resultForm.getByLabel('Distance', { exact: true }).selectOption({ label: '10K' });
    await resultForm.getByLabel('Finish time').fill('41:30');
    await resultForm.getByRole('button', { name: 'Add result' }).click();
    const results = page.getByRole('table', { name: 'Your race results, newest first' });
    await expect.poll(() => results.getByRole('rowheader').allTextContents()).toEqual(['Harbor Line 10K']);
    expect(await results.textContent()).toMatch(/20 Sept? 2026.*10K.*0:41:30.*6:41 \/mi/);

    await page.getByLabel('Tolerance (± %)').fill('2.5');
    await page.getByRole('button', { name: 'Save tolerance' }).click();
    await page.getByRole('status').filter({ hasText: 'Tolerance saved: ±2.5 %.' }).waitFor();
    await screenshot(page, 'profile-goals');

    await results.getByRole('button', { name: 'Delete Harbor Line 10K' }).click();
    await results.getByRole('button', { name: 'Delete “Harbor Line 10K”' }).click();
    await page.getByText('No race results yet. Add your latest race below.').waitFor();
    expect(errors).toEqual([]);
    await page.close();
  });
});
