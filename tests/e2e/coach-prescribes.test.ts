import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE, DEMO_SQUAD_NAME } from '../../db/seeds/01_demo_people.ts';
import { db } from '../../server/lib/db.ts';
import { CSRF_COOKIE, CSRF_HEADER } from '../../shared/auth/schemas.ts';
import { createUser } from '../support/factories.ts';
import { screenshot, signIn, watchErrors } from '../support/browser.ts';
import { useBrowserSession } from '../support/browser-session.ts';

// Issue 15, "Done when": the demo coach keeps a session in the library, applies it to three runners
// on Saturday, opens one runner's Plan and moves it to Sunday; the runner sees it with "written by"
// the coach. Copying a week twice never doubles; a runner who left the squad is no longer editable.

const coach = DEMO_PEOPLE.find((p) => p.role === 'coach')!;
const runners = DEMO_PEOPLE.filter((p) => p.role === 'runner');
const ivy = runners[0]!;
const WAIT = { timeout: 15_000 };
const LIBRARY_NAME = `Hill repeats ${Date.now().toString(36)}`;

const { server, browser } = useBrowserSession();

async function signedInPage(email: string, password: string, next: string, width = 1280): Promise<Page> {
  await browser.context.clearCookies();
  const page = await browser.context.newPage();
  await page.setViewportSize({ width, height: 900 });
  await page.goto(`${server.url}/sign-in?next=${encodeURIComponent(next)}`);
  await signIn(page, email, password);
  await page.waitForURL((url) => url.pathname === next.split('?')[0]);
  return page;
}

/** Monday of next week and its Saturday and Sunday, on the browser's clock (the page's). */
async function nextWeek(page: Page): Promise<{ monday: string; saturday: string; sunday: string; following: string }> {
  return page.evaluate(() => {
    const d = new Date();
    const iso = (t: Date) =>
      `${t.getFullYear()}-${String(t.getMonth() + 1).padStart(2, '0')}-${String(t.getDate()).padStart(2, '0')}`;
    const monday = new Date(d.getFullYear(), d.getMonth(), d.getDate() - ((d.getDay() + 6) % 7) + 7);
    const plus = (n: number) => new Date(monday.getFullYear(), monday.getMonth(), monday.getDate() + n);
    return { monday: iso(monday), saturday: iso(plus(5)), sunday: iso(plus(6)), following: iso(plus(7)) };
  });
}

async function runnerId(email: string): Promise<string> {
  return (await db('users').where({ email }).first('id'))!.id;
}

const noSideways = (page: Page) =>
  page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

describe('The coach prescribes', () => {
  it('keeps a session in the library, applies it to three runners on Saturday, moves one to Sunday; the runner sees it written by the coach', async () => {
    const page = await signedInPage(coach.email, coach.password, '/plan');
    const errors = watchErrors(page);
    const week = await nextWeek(page);

    // Write a session on the coach's own plan and keep it in the library.
    await page.goto(`${server.url}/plan?week=${week.monday}`);
    await page.getByRole('button', { name: 'New session', exact: true }).click();
    const editor = page.getByRole('form', { name: 'New session', exact: true });
    await editor.getByLabel('Date').fill(week.monday);
    await editor.getByLabel('Title (optional)').fill('Hill repeats');
    await editor.getByLabel('Session in shorthand').fill('2 mi easy, 8 x 1 min @ 5:40-5:50/mi w/ 2 min jog, 2 mi easy');
    await editor.getByRole('button', { name: 'Save session' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Session added.' }).count(), WAIT).toBe(1);
    await page.getByRole('button', { name: /^Edit Hill repeats on / }).click();
    const save = page.getByRole('form', { name: 'Save to library' });
    await save.getByLabel('Library name').fill(LIBRARY_NAME);
    await save.getByRole('button', { name: 'Save to library' }).click();
    await expect.poll(() => save.getByRole('status').textContent(), WAIT).toBe(`Saved to your library as “${LIBRARY_NAME}”.`);

    // Apply it to the three demo runners on Saturday.
    await page.getByRole('button', { name: `Apply ${LIBRARY_NAME} to…` }).click();
    const apply = page.getByRole('form', { name: `Apply ${LIBRARY_NAME}` });
    await apply.getByLabel('Date').fill(week.saturday);
    await apply.getByRole('button', { name: 'None' }).click();
    for (const r of runners) await apply.getByLabel(r.name).check();
    await apply.getByRole('button', { name: 'Add to 3 runners' }).click();
    await expect
      .poll(
        () =>
          page
            .getByRole('status')
            .filter({ hasText: `Added “${LIBRARY_NAME}” to 3 runners on` })
            .count(),
        WAIT,
      )
      .toBe(1);
    const ivyId = await runnerId(ivy.email);
    for (const r of runners) {
      const id = await runnerId(r.email);
      const rows = await db('session_plans').where({ runner_id: id, date: week.saturday, title: 'Hill repeats' });
      expect(rows).toHaveLength(1);
    }

    // From the squad overview, open Ivy's plan for next week: her name in the heading, the session on Saturday.
    await page.goto(`${server.url}/squad?week=${week.monday}`);
    await page.getByRole('link', { name: `${ivy.name}: plan` }).click();
    await page.waitForURL(new RegExp(`/squad/${ivyId}/plan`));
    await expect.poll(() => page.getByRole('heading', { name: `${ivy.name}’s plan` }).count(), WAIT).toBe(1);
    const saturday = page.getByRole('listitem', { name: new RegExp(`^Saturday,? ${Number(week.saturday.slice(8))} `) });
    const sunday = page.getByRole('listitem', { name: new RegExp(`^Sunday,? ${Number(week.sunday.slice(8))} `) });
    const card = saturday.getByRole('article', { name: /^Hill repeats on / });
    await expect.poll(() => card.getByText(`written by ${coach.name}`).count(), WAIT).toBe(1);

    // Drag it to Sunday.
    // A real pointer drag, in small steps: Chromium starts an HTML5 drag only after the pointer has moved a little.
    const from = (await card.getByRole('heading').boundingBox())!;
    const to = (await sunday.boundingBox())!;
    await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
    await page.mouse.down();
    await page.mouse.move(from.x + from.width / 2 + 12, from.y + from.height / 2 + 12, { steps: 4 });
    await page.mouse.move(to.x + to.width / 2, to.y + to.height / 2, { steps: 12 });
    await page.mouse.up();
    await expect
      .poll(
        () =>
          page
            .getByRole('status')
            .filter({ hasText: /^Moved Hill repeats from Sat .* to Sun / })
            .count(),
        WAIT,
      )
      .toBe(1);
    await expect.poll(() => sunday.getByRole('article', { name: /^Hill repeats on / }).count(), WAIT).toBe(1);
    await screenshot(page, 'coach-runner-plan-1280');
    expect(await noSideways(page)).toBeLessThanOrEqual(0);
    expect(errors).toEqual([]);
    await page.close();

    // Ivy sees it on Sunday, written by the coach, with the move in its record of changes.
    const mine = await signedInPage(ivy.email, ivy.password, `/plan?week=${week.monday}`);
    const ivySunday = mine.getByRole('listitem', { name: new RegExp(`^Sunday,? ${Number(week.sunday.slice(8))} `) });
    const ivyCard = ivySunday.getByRole('article', { name: /^Hill repeats on / });
    await expect.poll(() => ivyCard.getByText(new RegExp(`^written by ${coach.name} · changed today`)).count(), WAIT).toBe(1);
    await ivyCard.getByRole('button', { name: /^Edit Hill repeats on / }).click();
    await expect
      .poll(
        () =>
          mine
            .getByRole('region', { name: 'Changes to this session' })
            .getByText(/Moved from Sat .* to Sun /)
            .count(),
        WAIT,
      )
      .toBe(1);
    await mine.close();
  });

  it('copying a week twice never doubles a session; at 375 px "Move to…" offers the days', async () => {
    const page = await signedInPage(coach.email, coach.password, '/squad', 375);
    const errors = watchErrors(page, [/status of 409/]);
    const week = await nextWeek(page);
    const ivyId = await runnerId(ivy.email);
    await page.goto(`${server.url}/squad/${ivyId}/plan?week=${week.monday}`);
    await expect.poll(() => page.getByRole('heading', { name: `${ivy.name}’s plan` }).count(), WAIT).toBe(1);
    const count = async () =>
      Number(
        (await db('session_plans').where({ runner_id: ivyId }).andWhere('date', '>=', week.following).count({ n: '*' }).first())!
          .n,
      );
    const before = await count();
    const source = Number(
      (await db('session_plans')
        .where({ runner_id: ivyId })
        .andWhere('date', '>=', week.monday)
        .andWhere('date', '<', week.following)
        .count({ n: '*' })
        .first())!.n,
    );

    await page.getByRole('button', { name: 'Copy this week to next week' }).click();
    await expect
      .poll(
        () =>
          page
            .getByRole('status')
            .filter({ hasText: /^Copied \d+ sessions? to the week of/ })
            .count(),
        WAIT,
      )
      .toBe(1);
    expect(await count()).toBe(before + source);
    await page.getByRole('button', { name: 'Copy this week to next week' }).click();
    const ask = page.getByRole('alertdialog', { name: 'The next week has sessions' });
    await expect.poll(() => ask.getByText(new RegExp(`already has ${before + source} sessions?`)).count(), WAIT).toBe(1);
    await screenshot(page, 'coach-copy-ask-375');
    await ask.getByRole('button', { name: 'Cancel' }).click();
    // Read once the question has gone (the event), not in the same tick as the click.
    await expect.poll(() => ask.count(), WAIT).toBe(0);
    expect(await count()).toBe(before + source);

    // "Move to…" lists the seven days as large buttons.
    const first = page.getByRole('button', { name: /^Move to another day: / }).first();
    await first.click();
    const days = page
      .getByRole('group', { name: /^Move .* to$/ })
      .first()
      .getByRole('button');
    await expect.poll(() => days.count(), WAIT).toBe(7);
    expect(await noSideways(page)).toBeLessThanOrEqual(0);
    await screenshot(page, 'coach-runner-plan-375');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('a runner who leaves the squad is no longer editable by the coach', async () => {
    const { user } = await createUser({ role: 'runner', name: 'Leaving Runner' });
    const squad = await db('squads').where({ name: DEMO_SQUAD_NAME }).first('id');
    await db('squad_members').insert({ squad_id: squad!.id, runner_id: user.id });
    const page = await signedInPage(coach.email, coach.password, `/squad/${user.id}/plan`);
    await expect.poll(() => page.getByRole('heading', { name: 'Leaving Runner’s plan' }).count(), WAIT).toBe(1);

    await db('squad_members').where({ runner_id: user.id }).delete();
    await page.reload();
    await expect.poll(() => page.getByRole('heading', { name: 'No page at this address' }).count(), WAIT).toBe(1);
    const write = await page.evaluate(
      async ({ id, cookie, header }) => {
        const csrf =
          document.cookie
            .split('; ')
            .find((c) => c.startsWith(`${cookie}=`))
            ?.slice(cookie.length + 1) ?? '';
        const res = await fetch('/api/plans', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', [header]: decodeURIComponent(csrf) },
          body: JSON.stringify({ runner_id: id, date: '2026-12-20', text: '5 mi easy' }),
        });
        return res.status;
      },
      { id: user.id, cookie: CSRF_COOKIE, header: CSRF_HEADER },
    );
    expect(write).toBe(404);
    expect(await db('session_plans').where({ runner_id: user.id })).toHaveLength(0);
    await page.close();
  });
});
