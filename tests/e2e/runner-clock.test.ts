import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { db } from '../../server/lib/db.ts';
import { calendarDaysAgo, localDateTime } from '../../shared/runs/local-time.ts';
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
/** Said once per card (session 10), not after every line. */
const COACH_CARD_WORDS = `Dates and times on the runner's clock, ${RUNNER_ZONE}.`;
const RUNNER_CARD_WORDS = `Dates and times on the ${RUNNER_ZONE} clock.`;

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

/** "today", "yesterday", "N days ago" for a day count, as the screens word "last upload". */
const daysAgoWords = (days: number) => (days <= 0 ? 'today' : days === 1 ? 'yesterday' : `${days} days ago`);

/**
 * An upload moment that the runner's calendar and this device's count differently for the next half hour (the two
 * are 15 hours apart, so some hour of the last two days always is), by the server's own date code. The squad
 * overview counted it on the coach's calendar before session 10.
 */
function uploadTheCalendarsCountApart(now: number): { at: Date; runnerDays: string; deviceDays: string } {
  for (let hoursBack = 1; hoursBack < 48; hoursBack++) {
    const at = now - hoursBack * 3_600_000;
    const checks = [0, 10, 20, 30].map((minutes) => now + minutes * 60_000);
    const apart = checks.every(
      (t) => daysAgoWords(calendarDaysAgo(at, RUNNER_ZONE, t)) !== daysAgoWords(calendarDaysAgo(at, DEVICE_ZONE, t)),
    );
    const steady = checks.every((t) => calendarDaysAgo(at, RUNNER_ZONE, t) === calendarDaysAgo(at, RUNNER_ZONE, now));
    if (apart && steady) {
      return {
        at: new Date(at),
        runnerDays: daysAgoWords(calendarDaysAgo(at, RUNNER_ZONE, now)),
        deviceDays: daysAgoWords(calendarDaysAgo(at, DEVICE_ZONE, now)),
      };
    }
  }
  throw new Error('no hour of the last two days is counted apart by the two calendars');
}

/** How many times `words` appear in `text`. */
const occurrences = (text: string | null, words: string) => (text ?? '').split(words).length - 1;

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
    // The upload moved to an hour the two calendars count apart, before the notes and check-in below (their writes
    // move the runner's week counter on, so no week assembled before this change is served).
    const lastUpload = uploadTheCalendarsCountApart(Date.now());
    expect(lastUpload.runnerDays).not.toBe(lastUpload.deviceDays);
    await db('runs').where({ id: runId }).update({ created_at: lastUpload.at });
    const note = await callApi<{ note: { created_at: string } }>(page, 'POST', `/api/runs/${runId}/notes`, {
      text: 'Late loop after work, legs fine.',
    });
    // Several notes on the run and on the week: the runner's clock is named once per card, not on every line.
    await callApi(page, 'POST', `/api/runs/${runId}/notes`, { text: 'Second half felt easier.' });
    for (const text of ['Busy week at work.', 'Slept short on Sunday.']) {
      await callApi(page, 'POST', `/api/runners/${runner.user.id}/weeks/${WEEK}/notes`, { text });
    }
    await callApi(page, 'PUT', `/api/runs/${runId}/checkin`, { soreness: 2, notes: '' });
    // A session on Wednesday: its record of changes ("Added …") is read on the runner's clock too.
    await callApi(page, 'POST', '/api/plans', { date: '2026-11-25', title: 'Steady hour', text: '60 min steady' });
    const noteAt = note.note.created_at;
    // The two clocks always read a note differently (15 hours apart): the words must show.
    expect(runnerClock(noteAt)).not.toBe(deviceClock(noteAt));

    const notes = page.getByRole('list', { name: 'Notes on this run' });
    const cardWords = page.locator('[data-clock="card"]', { hasText: RUNNER_CARD_WORDS });
    for (const size of SIZES) {
      await page.setViewportSize(size);
      await page.goto(`${session.server.url}/runs/${runId}`);
      // The start line names the run's zone; the notes card names whose clock once, its two notes show bare times.
      await expect
        .poll(() => page.locator('time', { hasText: 'Mon 23 Nov 2026, 21:30 (America/Chicago)' }).count(), WAIT)
        .toBe(1);
      await expect.poll(() => notes.locator('li').count(), WAIT).toBe(2);
      expect(await notes.textContent()).toContain(runnerClock(noteAt));
      expect(await notes.textContent()).not.toContain('clock');
      await expect.poll(() => cardWords.count(), WAIT).toBe(1);
      await noSidewaysScroll(page);
      await screenshot(page, `runner-clock-run-runner-${size.width}`);

      await page.goto(`${session.server.url}/week/${WEEK}`);
      const monday = page.getByRole('listitem', { name: 'Monday 23 November' });
      await expect.poll(() => monday.textContent(), WAIT).toContain('21:30');
      expect(await monday.textContent()).not.toContain('clock');
      // Once for the days card and once for the notes card; the week's two notes show bare times.
      await expect.poll(() => cardWords.count(), WAIT).toBe(2);
      const weekNotes = page.getByRole('list', { name: 'Notes on this week' });
      await expect.poll(() => weekNotes.locator('li').count(), WAIT).toBe(2);
      expect(await weekNotes.textContent()).not.toContain('clock');
      // "Last upload" counts the runner's own days, and says whose when this device would count otherwise.
      expect(await page.locator('body').textContent()).toContain(`${lastUpload.runnerDays} ${RUNNER_WORDS}`);
      await noSidewaysScroll(page);
      await screenshot(page, `runner-clock-my-week-${size.width}`);
    }

    expect(errors).toEqual([]);
    await page.close();

    // The coach, on the same far clock.
    const coachPage = await session.browser.context.newPage();
    await signInThroughPage(coachPage, session.server.url, { email: coach.user.email, password: coach.password }, SIZES[0]!);
    await coachReads(coachPage, { squadId: squad!.id as string, runnerId: runner.user.id, runId, noteAt, lastUpload });
  });
});

type CoachView = {
  squadId: string;
  runnerId: string;
  runId: string;
  noteAt: string;
  lastUpload: { runnerDays: string; deviceDays: string };
};

async function coachReads(page: Page, { squadId, runnerId, runId, noteAt, lastUpload }: CoachView): Promise<void> {
  const errors = watchErrors(page);
  const notes = page.getByRole('list', { name: 'Notes on this run' });
  const cardWords = page.locator('[data-clock="card"]', { hasText: COACH_CARD_WORDS });
  const week = await callApi<{ time_zone: string; days: Array<{ runs: Array<{ checkin: { updated_at: string } | null }> }> }>(
    page,
    'GET',
    `/api/runners/${runnerId}/week?start=${WEEK}`,
  );
  expect(week.time_zone).toBe(RUNNER_ZONE);
  const checkedAt = week.days[0]!.runs[0]!.checkin!.updated_at;
  for (const size of SIZES) {
    await page.setViewportSize(size);
    // The squad overview's "last upload" counts the runner's days (before: the coach's), naming whose when they differ.
    await page.goto(`${session.server.url}/squad?squad=${squadId}&week=${WEEK}`);
    const overview = page.getByRole('table', { name: /one row per runner/ });
    await expect.poll(() => overview.locator('tbody tr').count(), WAIT).toBeGreaterThan(0);
    if (size.width < 640) await page.getByRole('button', { name: 'All figures: Lio Homeward' }).click();
    await expect.poll(() => overview.textContent(), WAIT).toContain(`${lastUpload.runnerDays} ${COACH_WORDS}`);
    expect(await overview.textContent()).not.toContain(lastUpload.deviceDays);
    // The new-notes card lists the runner's four notes until the coach opens them (below, in the first round): it
    // names the runner's clock once in its heading.
    const newNotes = page.locator('section', { has: page.getByRole('heading', { name: /^New notes/ }) });
    if (size === SIZES[0]) {
      await expect.poll(() => newNotes.locator('li').count(), WAIT).toBe(4);
      expect(occurrences(await newNotes.textContent(), COACH_CARD_WORDS)).toBe(1);
      expect(occurrences(await newNotes.textContent(), 'clock')).toBe(1);
    }
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-squad-overview-coach-${size.width}`);

    await page.goto(`${session.server.url}/squad/${runnerId}/week/${WEEK}`);
    // The run is on the runner's Monday (the coach's clock says Tuesday 12:30), at 21:30; the days card says whose
    // clock once above the days, and the run's start, check-in and two notes show bare times.
    const monday = page.getByRole('listitem', { name: 'Monday 23 November' });
    const entry = monday.locator(`[data-run-id="${runId}"]`);
    await expect.poll(() => entry.textContent(), WAIT).toContain(runnerClock(checkedAt));
    expect(await entry.locator('time').first().textContent()).toBe('21:30');
    const text = (await entry.textContent()) ?? '';
    expect(text).toContain(runnerClock(noteAt));
    expect(text).not.toContain('clock');
    expect(await entry.getByRole('list', { name: 'Notes on this run' }).locator('li').count()).toBe(2);
    await expect.poll(() => cardWords.count(), WAIT).toBe(2);
    expect(occurrences(await page.locator('main').textContent(), COACH_WORDS)).toBe(1); // the last upload's alone
    expect(await page.getByRole('list', { name: 'Notes on this week' }).textContent()).not.toContain('clock');
    expect(await page.locator('main').textContent()).toContain(`${lastUpload.runnerDays} ${COACH_WORDS}`);
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-week-review-coach-${size.width}`);

    await page.goto(`${session.server.url}/runs/${runId}`);
    await expect.poll(() => page.locator('time', { hasText: 'Mon 23 Nov 2026, 21:30 (America/Chicago)' }).count(), WAIT).toBe(1);
    await expect.poll(() => notes.locator('li').count(), WAIT).toBe(2);
    expect(await notes.textContent()).toContain(runnerClock(noteAt));
    expect(await notes.textContent()).not.toContain('clock');
    await expect.poll(() => cardWords.count(), WAIT).toBe(1);
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-run-coach-${size.width}`);

    await page.goto(`${session.server.url}/squad/${runnerId}/plan?week=${WEEK}`);
    const edit = page.getByRole('button', { name: /^Edit Steady hour on / });
    await expect.poll(() => edit.count(), WAIT).toBe(1);
    await edit.click();
    const changes = page.getByRole('region', { name: 'Changes to this session' });
    await expect.poll(() => changes.textContent(), WAIT).toContain(COACH_CARD_WORDS);
    expect(await changes.locator('li').first().textContent()).not.toContain('clock');
    await noSidewaysScroll(page);
    await screenshot(page, `runner-clock-plan-changes-coach-${size.width}`);
  }
  expect(errors).toEqual([]);
  await page.close();
}
