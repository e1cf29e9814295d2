import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { localDateTime } from '../../shared/runs/local-time.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { screenshot, watchErrors } from '../support/browser.ts';
import { callApi, signInThroughPage, useBrowserSession } from '../support/browser-session.ts';
import { createUser } from '../support/factories.ts';

// Whose clock (client/README.md): the browser's clock is set to Asia/Tokyo (UTC+9 all year), the runner's profile to
// America/Chicago (UTC−6 in late November; IANA tz database, file `northamerica`): 15 hours apart. The generated run
// starts at 03:30 UTC on Tue 24 Nov 2026 — 21:30 on Mon 23 Nov on the runner's clock, 12:30 on the 24th in Tokyo.
// The generated lake lies in open sea (shared/tracks/synthetic.ts), so the run takes the runner's profile zone.
const DEVICE_ZONE = 'Asia/Tokyo';
const RUNNER_ZONE = 'America/Chicago';
const STARTED = '2026-11-24T03:30:00.000Z';
const WEEK = '2026-11-23';
const SIZES = [
  { width: 375, height: 812 },
  { width: 1280, height: 800 },
];
/** Pages build the week on the server under load: allow more than the 1 s default. */
const WAIT = { timeout: 15_000 };
const COACH_WORDS = `(runner's clock, ${RUNNER_ZONE})`;
const RUNNER_WORDS = `(${RUNNER_ZONE} clock)`;

const session = useBrowserSession({ timezoneId: DEVICE_ZONE });

function eveningRun(): Buffer {
  const run = generateLakeRun({
    start_t: Date.parse(STARTED),
    phases: [{ kind: 'run', duration_s: 1800, speed_mps: 3 }],
    seed: 7,
    sample_s: 5,
  });
  return Buffer.from(writeGpx('Evening loop', [run.points]));
}

/** "HH:mm" of an instant on the runner's clock, by the server's own dating code (not the client's formatter). */
const runnerClock = (iso: string) => localDateTime(Date.parse(iso), RUNNER_ZONE).time;
const deviceClock = (iso: string) => localDateTime(Date.parse(iso), DEVICE_ZONE).time;

async function noSidewaysScroll(page: Page): Promise<void> {
  expect(await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)).toBeLessThanOrEqual(0);
}

describe("the runner's clock on a device set to a far zone", () => {
  it('a coach and the runner read the run, its note and check-in at the runner’s local time, at 375 and 1280 px', async () => {
    const stamp = Date.now().toString(36);
    const coach = await createUser({ role: 'coach', name: 'Rue Farshore', email: `rue-${stamp}@example.test` });
    const runner = await createUser({ name: 'Lio Homeward', email: `lio-${stamp}@example.test` });
    await db('users').where({ id: coach.user.id }).update({ time_zone: DEVICE_ZONE });
    await db('users').where({ id: runner.user.id }).update({ time_zone: RUNNER_ZONE });
    const [squad] = await db('squads')
      .insert({ coach_id: coach.user.id, name: `Far clocks ${stamp}` })
      .returning('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: runner.user.id });

    // The runner uploads the evening run from the Log, then writes a note and checks in.
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, { email: runner.user.email, password: runner.password }, SIZES[1]!);
    const errors = watchErrors(page);
    await page.goto(`${session.server.url}/log`);
    await page
      .getByLabel('Choose files')
      .setInputFiles({ name: 'evening.gpx', mimeType: 'application/gpx+xml', buffer: eveningRun() });
    const uploads = page.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 20_000 }).toMatch(/imported →/);
    await uploads.getByRole('link').first().click();
    await page.waitForURL(/\/runs\/[^/]+$/);
    const runId = new URL(page.url()).pathname.split('/').pop()!;
    const run = await callApi<{ summary: { local_date: string; local_time: string; time_zone: string } }>(
      page,
      'GET',
      `/api/runs/${runId}`,
    );
    expect(run.summary).toMatchObject({ local_date: '2026-11-23', local_time: '21:30', time_zone: RUNNER_ZONE });
    const note = await callApi<{ note: { created_at: string } }>(page, 'POST', `/api/runs/${runId}/notes`, {
      text: 'Late loop after work, legs fine.',
    });
    await callApi(page, 'PUT', `/api/runs/${runId}/checkin`, { soreness: 2, notes: '' });
    // A session on Wednesday: its record of changes ("Added …") is read on the runner's clock too.
    await callApi(page, 'POST', '/api/plans', { date: '2026-11-25', title: 'Steady hour', text: '60 min steady' });
    const noteAt = note.note.created_at;
    // The two clocks always read a note differently (15 hours apart): the words must show.
    expect(runnerClock(noteAt)).not.toBe(deviceClock(noteAt));

    const notes = page.getByRole('list', { name: 'Notes on this run' });
    for (const size of SIZES) {
      await page.setViewportSize(size);
      await page.goto(`${session.server.url}/runs/${runId}`);
      // The start line names the run's zone; the note says whose clock its time is on.
      await expect
        .poll(() => page.locator('time', { hasText: 'Mon 23 Nov 2026, 21:30 (America/Chicago)' }).count(), WAIT)
        .toBe(1);
      await expect.poll(() => notes.textContent(), WAIT).toContain(`${runnerClock(noteAt)} ${RUNNER_WORDS}`);
      await noSidewaysScroll(page);
      await screenshot(page, `runner-clock-run-runner-${size.width}`);

      await page.goto(`${session.server.url}/week/${WEEK}`);
      const monday = page.getByRole('listitem', { name: 'Monday 23 November' });
      await expect.poll(() => monday.textContent(), WAIT).toContain(`21:30 ${RUNNER_WORDS}`);
      await noSidewaysScroll(page);
      await screenshot(page, `runner-clock-my-week-${size.width}`);
    }

    expect(errors).toEqual([]);
    await page.close();

    // The coach, on the same far clock.
    const coachPage = await session.browser.context.newPage();
    await signInThroughPage(coachPage, session.server.url, { email: coach.user.email, password: coach.password }, SIZES[0]!);
    await coachReads(coachPage, runner.user.id, runId, noteAt);
  });
});

async function coachReads(page: Page, runnerId: string, runId: string, noteAt: string): Promise<void> {
  const errors = watchErrors(page);
  const notes = page.getByRole('list', { name: 'Notes on this run' });
  const week = await callApi<{ time_zone: string; days: Array<{ runs: Array<{ checkin: { updated_at: string } | null }> }> }>(
    page,
    'GET',
    `/api/runners/${runnerId}/week?start=${WEEK}`,
  );
  expect(week.time_zone).toBe(RUNNER_ZONE);
  const checkedAt = week.days[0]!.runs[0]!.checkin!.updated_at;
  for (const size of SIZES) {
    await page.setViewportSize(size);
    await page.goto(`${session.server.url}/squad/${runnerId}/week/${WEEK}`);
    // The run is on the runner's Monday (the coach's clock says Tuesday 12:30), at 21:30 with whose clock it is.
    const monday = page.getByRole('listitem', { name: 'Monday 23 November' });
    const entry = monday.locator(`[data-run-id="${runId}"]`);
    await expect.poll(() => entry.textContent(), WAIT).toContain(`21:30 ${COACH_WORDS}`);
    expect(await entry.locator('time').first().textContent()).toBe('21:30');
    const text = (await entry.textContent()) ?? '';
    expect(text).toContain(`${runnerClock(noteAt)} ${COACH_WORDS}`);
    expect(text).toContain(`${runnerClock(checkedAt)} ${COACH_WORDS}`);
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-week-review-coach-${size.width}`);

    await page.goto(`${session.server.url}/runs/${runId}`);
    await expect.poll(() => page.locator('time', { hasText: 'Mon 23 Nov 2026, 21:30 (America/Chicago)' }).count(), WAIT).toBe(1);
    await expect.poll(() => notes.textContent(), WAIT).toContain(`${runnerClock(noteAt)} ${COACH_WORDS}`);
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-run-coach-${size.width}`);

    await page.goto(`${session.server.url}/squad/${runnerId}/plan?week=${WEEK}`);
    const edit = page.getByRole('button', { name: /^Edit Steady hour on / });
    await expect.poll(() => edit.count(), WAIT).toBe(1);
    await edit.click();
    const changes = page.getByRole('region', { name: 'Changes to this session' });
    await expect.poll(() => changes.textContent(), WAIT).toContain(COACH_WORDS);
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-plan-changes-coach-${size.width}`);
  }
  expect(errors).toEqual([]);
  await page.close();
}
