import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningServer } from '../../server/index.ts';
import { db } from '../../server/lib/db.ts';
import { UPLOAD_QUIET_SECONDS, NOTE_BATCH_SECONDS } from '../../shared/notices/batching.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { launchBrowser, screenshot, signIn, startAppServerWithPublicUrl, watchErrors } from '../support/browser.ts';

// Issue 16, "Done when": a runner (375 px) uploads a long run, records fuel taken and a check-in with
// soreness 4 and writes a note; the coach (1280 px) gets exactly one e-mail for the upload and one
// alert for the soreness (read from the server's own mail catcher through the outbox), opens the week
// review and sees the note, the check-in and the fuel with an unread marker that clears, and replies;
// the runner sees the count in the navigation and the reply on the run. Batched notices are sent by
// calling the server's own sweep at a chosen instant, never by waiting. Last, the coach turns upload
// e-mails off from the link in that e-mail, signed out.

const WAIT = { timeout: 20_000 };
const PHONE = { width: 375, height: 812 };
const DESKTOP = { width: 1280, height: 900 };
const TAG = Date.now().toString(36);
const NOTE = `Legs heavy from mile 9; the water at 0:45 helped (${TAG}).`;
const REPLY = `Easy 30 minutes tomorrow, then tell me how the legs feel (${TAG}).`;

let server: RunningServer;
let browser: Awaited<ReturnType<typeof launchBrowser>>;
let coach: { id: string; email: string; password: string; name: string };
let runner: { id: string; email: string; password: string; name: string };

interface CaughtMail {
  to: string;
  subject: string;
  text: string;
  headers: Record<string, string>;
}

/** What the server's mail catcher received for `email` (the development outbox). */
async function mailTo(email: string): Promise<CaughtMail[]> {
  const res = await fetch(`${server.url}/api/dev/outbox`);
  expect(res.status).toBe(200);
  const { messages } = (await res.json()) as { messages: CaughtMail[] };
  return messages.filter((m) => m.to === email);
}

const isoDate = (d: Date) => d.toISOString().slice(0, 10);
/** Yesterday in UTC, the runner's time zone here: the run lies in the past whatever the hour. */
const runDay = isoDate(new Date(Date.now() - 86_400_000));

/** A 100-minute long run on the invented lake loop, started 07:00 on `runDay`, as a GPX file. */
function longRunFile(): string {
  const run = generateLakeRun({
    start_t: Date.parse(`${runDay}T07:00:00Z`),
    phases: [{ kind: 'run', duration_s: 6000, speed_mps: 3.1 }],
    sample_s: 5,
  });
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'pacewright-words-')), `long-run-${TAG}.gpx`);
  writeFileSync(file, writeGpx(`Long run ${TAG}`, [run.points]));
  return file;
}

async function signedInPage(who: { email: string; password: string }, next: string, size: typeof PHONE): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize(size);
  await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(next)}`);
  await signIn(page, who.email, who.password);
  await page.waitForURL((url) => url.pathname === next.split('?')[0]);
  return page;
}

const noSideways = (page: Page) =>
  page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
/** A section's link in the main navigation; its name carries the unread count ("Squad 1 unread note") when there is one. */
const navLink = (page: Page, name: string | RegExp) =>
  page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name, exact: true });

beforeAll(async () => {
  server = await startAppServerWithPublicUrl();
  browser = await launchBrowser();
  const c = await createUser({ role: 'coach', name: 'Wren Coach', email: `wren-${TAG}@example.test` });
  const r = await createUser({ role: 'runner', name: 'Odile Runner', email: `odile-${TAG}@example.test` });
  await db('users').where({ id: c.user.id }).update({ unit: 'mi', time_zone: 'UTC' });
  await db('users').where({ id: r.user.id }).update({ unit: 'mi', time_zone: 'UTC' });
  const [squad] = await db('squads')
    .insert({ coach_id: c.user.id, name: `Quarry Road Runners ${TAG}` })
    .returning('id');
  await db('squad_members').insert({ squad_id: squad!.id, runner_id: r.user.id });
  coach = { id: c.user.id, email: c.user.email, password: c.password, name: c.user.name };
  runner = { id: r.user.id, email: r.user.email, password: r.password, name: r.user.name };
});

afterAll(async () => {
  await browser?.close();
  await server?.close();
});

describe('What the runner says reaches the coach', () => {
  it('upload, fuel, soreness 4 and a note reach the coach in two e-mails and the week review; the reply reaches the runner', async () => {
    // ── The runner, on a phone: upload, fuel taken, check-in, note ──────────────────────────────
    const phone = await signedInPage(runner, '/log', PHONE);
    const runnerErrors = watchErrors(phone);
    await phone.getByLabel('Choose files').setInputFiles(longRunFile());
    const uploads = phone.getByRole('list', { name: 'Uploads' });
    await expect.poll(() => uploads.textContent(), { timeout: 60_000 }).toMatch(/imported →/);
    await uploads.getByRole('link').first().click();
    await phone.waitForURL(/\/runs\/[^/]+$/);
    const runId = phone.url().split('/').pop()!;

    const fuel = phone.getByRole('form', { name: 'Fuel taken' });
    await expect.poll(() => fuel.count(), WAIT).toBe(1);
    await fuel.getByLabel('What you took').selectOption('water');
    await fuel.getByLabel('Millilitres (ml)', { exact: true }).fill('500');
    await fuel.getByLabel('Time (h:mm from the start)').fill('0:45');
    await fuel.getByRole('button', { name: 'Add to the record' }).click();
    await fuel.getByLabel('Stomach (1–5)').selectOption('4');
    await fuel.getByLabel('Energy (1–5)').selectOption('3');
    await fuel.getByRole('button', { name: 'Save fuel taken' }).click();
    await expect.poll(() => phone.getByRole('status').filter({ hasText: 'Fuel taken saved.' }).count(), WAIT).toBe(1);

    const checkin = phone.getByRole('form', { name: 'After-run check-in' });
    await checkin.getByLabel('Sleep the night before (hours)').fill('7');
    await checkin.getByLabel('Soreness (1–5)').selectOption('4');
    await checkin.getByRole('button', { name: 'Save check-in' }).click();
    await expect.poll(() => phone.getByRole('status').filter({ hasText: 'Check-in saved.' }).count(), WAIT).toBe(1);

    await phone.getByLabel('Write a note').fill(NOTE);
    await phone.getByRole('button', { name: 'Add note' }).click();
    await expect.poll(() => phone.getByRole('list', { name: 'Notes on this run' }).getByText(NOTE).count(), WAIT).toBe(1);
    expect(await noSideways(phone)).toBeLessThanOrEqual(0);
    await screenshot(phone, 'runner-words-run-375');
    expect(runnerErrors).toEqual([]);
    await phone.close();

    // ── The coach's e-mail: the soreness alert at once; the upload once its batch is quiet ──────
    await expect
      .poll(async () => (await mailTo(coach.email)).map((m) => m.subject), WAIT)
      .toEqual([`${runner.name} reported soreness 4 of 5`]);
    // The server's sweep at the moment the upload batch falls due (60 s after the last file), and again later.
    await server.sweepNotices(new Date(Date.now() + (UPLOAD_QUIET_SECONDS + 1) * 1000));
    await server.sweepNotices(new Date(Date.now() + (UPLOAD_QUIET_SECONDS + 120) * 1000));
    const coachMail = await mailTo(coach.email);
    const uploadMail = coachMail.filter((m) => m.subject === `${runner.name} uploaded a run`);
    const alerts = coachMail.filter((m) => m.subject === `${runner.name} reported soreness 4 of 5`);
    expect(uploadMail).toHaveLength(1);
    expect(alerts).toHaveLength(1);
    // The note waits for its 15-minute batch: nothing else yet.
    expect(coachMail).toHaveLength(2);
    expect(uploadMail[0]!.text).toContain(`Long run ${TAG}`);
    expect(uploadMail[0]!.text).toMatch(/\d+\.\d{2} mi/);
    expect(alerts[0]!.text).toContain('physician or physiotherapist');

    // ── The coach, at a desk: the count in the navigation, the week review, the marker clears ──
    const desk = await signedInPage(coach, '/squad', DESKTOP);
    const coachErrors = watchErrors(desk);
    await expect.poll(() => navLink(desk, /^Squad\s*1 unread note$/).count(), WAIT).toBe(1);
    await desk.goto(`${server.url}/squad/${runner.id}/week/${runDay}`);
    const entry = desk.locator(`[data-run-id="${runId}"]`);
    await expect.poll(() => entry.count(), WAIT).toBe(1);
    const notes = entry.getByRole('list', { name: 'Notes on this run' });
    await expect.poll(() => notes.getByText(NOTE).count(), WAIT).toBe(1);
    // The note's marker shows on this visit ("new"), and the navigation count is gone at once.
    expect(await notes.locator('[data-unread="true"]').count()).toBe(1);
    await expect.poll(() => desk.getByRole('navigation', { name: 'Main' }).textContent(), WAIT).not.toMatch(/unread/);
    expect(await desk.locator('[data-unread-count]').count()).toBe(0);
    const checkinLine = entry.locator('[data-part="checkin"]');
    expect(await checkinLine.textContent()).toMatch(/sleep 7 h · soreness 4\/5/);
    expect(await checkinLine.getByText('high soreness').count()).toBe(1);
    const fuelLine = entry.locator('[data-part="fuel"]');
    expect(await fuelLine.textContent()).toMatch(
      /Fuel taken: 1 entry, 0 g carbs · 500 ml · 0 mg sodium \(no fuel plan\) · stomach 4\/5 · energy 3\/5/,
    );
    expect(await noSideways(desk)).toBeLessThanOrEqual(0);
    await screenshot(desk, 'runner-words-week-review-1280');

    // Opened: on the next visit the marker is gone.
    await desk.reload();
    await expect.poll(() => notes.getByText(NOTE).count(), WAIT).toBe(1);
    expect(await desk.locator('[data-unread="true"]').count()).toBe(0);

    // Reply from the week review in one step.
    const reply = entry.getByRole('form', { name: 'Reply on this run' });
    await reply.getByLabel('Note on this run').fill(REPLY);
    await reply.getByRole('button', { name: 'Send' }).click();
    await expect.poll(() => notes.getByText(REPLY).count(), WAIT).toBe(1);
    expect(coachErrors).toEqual([]);
    await desk.close();

    // The notes' batch falls due: the runner hears of the reply; the coach, who opened the runner's note, hears nothing more.
    await server.sweepNotices(new Date(Date.now() + (NOTE_BATCH_SECONDS + 60) * 1000));
    expect((await mailTo(coach.email)).map((m) => m.subject).sort()).toEqual(
      [`${runner.name} reported soreness 4 of 5`, `${runner.name} uploaded a run`].sort(),
    );
    const runnerMail = await mailTo(runner.email);
    expect(runnerMail.map((m) => m.subject)).toEqual([`A new note from ${coach.name}`]);
    expect(runnerMail[0]!.text).toContain(REPLY);

    // ── The runner, on the phone again: the count in the navigation, the reply on the run ─────
    const phoneAgain = await signedInPage(runner, '/log', PHONE);
    const againErrors = watchErrors(phoneAgain);
    await expect.poll(() => navLink(phoneAgain, /^Log\s*1 unread note$/).count(), WAIT).toBe(1);
    await phoneAgain.goto(`${server.url}/runs/${runId}`);
    const thread = phoneAgain.getByRole('list', { name: 'Notes on this run' });
    await expect.poll(() => thread.getByText(REPLY).count(), WAIT).toBe(1);
    expect(await thread.locator('[data-unread="true"]').count()).toBe(1);
    await expect.poll(() => phoneAgain.locator('[data-unread-count]').count(), WAIT).toBe(0);
    expect(await noSideways(phoneAgain)).toBeLessThanOrEqual(0);
    await screenshot(phoneAgain, 'runner-words-reply-375');
    expect(againErrors).toEqual([]);
    await phoneAgain.close();

    // ── The upload e-mail's own link, opened signed out: one click turns off exactly that kind ─
    const off = /Turn these e-mails off: (\S+)/.exec(uploadMail[0]!.text)![1]!;
    expect(off.startsWith(`${server.url}/notices/off/uns_`)).toBe(true);
    await browser.context.clearCookies();
    const link = await browser.context.newPage();
    await link.setViewportSize(PHONE);
    const linkErrors = watchErrors(link);
    await link.goto(off);
    await expect.poll(() => link.getByRole('heading', { name: 'Turn off these e-mails?' }).count(), WAIT).toBe(1);
    expect(await link.getByText('Uploads by runners in my squads').count()).toBe(1);
    await link.getByRole('button', { name: 'Turn these e-mails off' }).click();
    await expect.poll(() => link.getByRole('heading', { name: 'E-mails turned off' }).count(), WAIT).toBe(1);
    expect(await link.getByRole('status').textContent()).toContain('“Uploads by runners in my squads” is off');
    expect(
      await db('users')
        .where({ id: coach.id })
        .first('notify_on_import', 'notify_on_note', 'notify_on_pain_alert', 'notify_on_squad_leave', 'notify_on_digest'),
    ).toEqual({
      notify_on_import: false,
      notify_on_note: true,
      notify_on_pain_alert: true,
      notify_on_squad_leave: true,
      notify_on_digest: true,
    });
    expect(await noSideways(link)).toBeLessThanOrEqual(0);
    await screenshot(link, 'runner-words-unsubscribe-375');
    expect(linkErrors).toEqual([]);
    await link.close();
  });
});
