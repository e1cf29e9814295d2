import { describe, expect, it } from 'vitest';
import { DEMO_PEOPLE } from '../../db/seeds/01_demo_people.ts';
import { screenshot } from '../support/browser.ts';
import { callApi, signInThroughPage, useBrowserSession } from '../support/browser-session.ts';

/** Forms never lose work (issue 17): drafts survive a reload, a refused save keeps everything and answers at the field. */
const runner = DEMO_PEOPLE.find((p) => p.email.startsWith('priya@'))!;

const session = useBrowserSession();

describe('fuel taken on the run page', () => {
  it('checks fields where they are typed, keeps a draft over a reload, and a refused save keeps every entry with the message at the field', async () => {
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, runner, { width: 375, height: 812 });
    await page.waitForURL(/\/log$/);
    const suffix = Date.now().toString(36);
    await callApi(page, 'POST', '/api/fuel-items', {
      name: `chews ${suffix}`,
      carbohydrate_g: 24,
      sodium_mg: 50,
      caffeine_mg: 0,
      fluid_ml: 0,
    });
    const { item: gel } = await callApi<{ item: { id: string } }>(page, 'POST', '/api/fuel-items', {
      name: `gel ${suffix}`,
      carbohydrate_g: 22,
      sodium_mg: 40,
      caffeine_mg: 0,
      fluid_ml: 0,
    });
    const { runs } = await callApi<{ runs: { id: string }[] }>(page, 'GET', '/api/runs?per_page=1');
    await page.goto(`${session.server.url}/runs/${runs[0]!.id}`);
    const taken = page.getByRole('form', { name: 'Fuel taken' });
    await taken.waitFor();

    // The picker starts empty; a bad amount and a bad time are refused at their fields, in their words.
    const what = taken.getByLabel('What you took');
    expect(await what.inputValue()).toBe('');
    await taken.getByRole('button', { name: 'Add to the record' }).click();
    await expect.poll(() => taken.getByText('Choose what you took: one of your fuel items or water.').count()).toBe(1);
    await what.selectOption({ label: 'water' });
    await taken.getByLabel('Millilitres (ml)', { exact: true }).fill('-200');
    await taken.getByLabel('Time (h:mm from the start)').fill('9:99');
    await taken.getByRole('button', { name: 'Add to the record' }).click();
    await expect.poll(() => taken.getByText('Write the time as h:mm from the start, e.g. 1:15.').count()).toBe(1);
    await expect.poll(() => taken.getByText('At least 1 ml.').count()).toBe(1);
    expect(await taken.getByLabel(/^Millilitres \(ml\), entry/).count()).toBe(0);

    // Two items and how it went.
    for (const [name, servings, time] of [
      [`chews ${suffix}`, '2', '0:40'],
      [`gel ${suffix}`, '1', '1:20'],
    ] as const) {
      await what.selectOption({ label: name });
      await taken.getByLabel('Servings', { exact: true }).fill(servings);
      await taken.getByLabel('Time (h:mm from the start)').fill(time);
      await taken.getByRole('button', { name: 'Add to the record' }).click();
    }
    await expect.poll(() => taken.getByLabel(/^Servings, entry/).count()).toBe(2);
    await taken.getByLabel('Stomach (1–5)').selectOption('4');
    await taken.getByLabel('Energy (1–5)').selectOption('3');
    await taken.getByLabel('Fuel notes').fill('Chews went down well; the gel late.');

    // A reload keeps all of it (a draft on this device).
    await page.reload();
    await taken.waitFor();
    await expect.poll(() => taken.getByLabel(/^Servings, entry/).count()).toBe(2);
    expect(await taken.getByLabel('Servings, entry 1').inputValue()).toBe('2');
    expect(await taken.getByLabel('Time, entry 2').inputValue()).toBe('1:20');
    expect(await taken.getByLabel('Stomach (1–5)').inputValue()).toBe('4');
    expect(await taken.getByLabel('Fuel notes').inputValue()).toBe('Chews went down well; the gel late.');

    // The gel is deleted elsewhere (another tab): the server refuses the save and names entry 2.
    await callApi(page, 'DELETE', `/api/fuel-items/${gel.id}`);
    await taken.getByRole('button', { name: 'Save fuel taken' }).click();
    await expect.poll(() => taken.getByText(/^Not saved: /).count()).toBe(1);
    const atField = taken.getByText(new RegExp(`^gel ${suffix}: `));
    await expect.poll(() => atField.count()).toBe(1);
    await screenshot(page, 'fuel-taken-refused-375');
    expect(await taken.getByLabel(/^Servings, entry/).count()).toBe(2);
    expect(await taken.getByLabel('Servings, entry 1').inputValue()).toBe('2');
    expect(await taken.getByLabel('Energy (1–5)').inputValue()).toBe('3');
    expect(await taken.getByLabel('Fuel notes').inputValue()).toBe('Chews went down well; the gel late.');

    // Removing the named entry and saving again works, and the draft is gone.
    await taken.getByRole('button', { name: 'Remove entry 2' }).click();
    await taken.getByRole('button', { name: 'Save fuel taken' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Fuel taken saved.' }).count()).toBe(1);
    const stored = await page.evaluate(() =>
      Object.keys(localStorage).filter((k) => k.startsWith('pacewright:draft:fuel-taken:')),
    );
    expect(stored).toEqual([]);
    await page.close();
  });

  it('the after-run check-in keeps a draft over a reload until it is saved', async () => {
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, runner, { width: 375, height: 812 });
    await page.waitForURL(/\/log$/);
    const { runs } = await callApi<{ runs: { id: string }[] }>(page, 'GET', '/api/runs?per_page=2');
    await page.goto(`${session.server.url}/runs/${runs[1]!.id}`);
    const checkin = page.getByRole('form', { name: 'After-run check-in' });
    await checkin.waitFor();
    await checkin.getByLabel('Sleep the night before (hours)').fill('7.5');
    await checkin.getByLabel('Soreness (1–5)').selectOption('2');
    await checkin.getByLabel('Check-in notes').fill('Calves tight after the hills.');

    await page.reload();
    await checkin.waitFor();
    await expect.poll(() => checkin.getByText(/^Restored what you entered earlier on this device/).count()).toBe(1);
    expect(await checkin.getByLabel('Sleep the night before (hours)').inputValue()).toBe('7.5');
    expect(await checkin.getByLabel('Soreness (1–5)').inputValue()).toBe('2');
    expect(await checkin.getByLabel('Check-in notes').inputValue()).toBe('Calves tight after the hills.');

    await checkin.getByRole('button', { name: 'Save check-in' }).click();
    await expect.poll(() => checkin.getByText('Check-in saved.').count()).toBe(1);
    const stored = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('pacewright:draft:checkin:')));
    expect(stored).toEqual([]);
    // What was saved is what the server now holds.
    const saved = await callApi<{ checkin: { sleep_hours: number; notes: string } | null }>(
      page,
      'GET',
      `/api/runs/${runs[1]!.id}/checkin`,
    );
    expect(saved.checkin?.sleep_hours).toBe(7.5);
    await page.close();
  });
});

describe('the fuel plan form', () => {
  it('answers each field in the words of its label, keeps a draft over a reload, and a refused save keeps everything with the answer at the field', async () => {
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, runner, { width: 375, height: 812 });
    await page.waitForURL(/\/log$/);
    const suffix = Date.now().toString(36);
    const { item: gel } = await callApi<{ item: { id: string } }>(page, 'POST', '/api/fuel-items', {
      name: `plan gel ${suffix}`,
      carbohydrate_g: 22,
      sodium_mg: 40,
      caffeine_mg: 0,
      fluid_ml: 0,
    });
    await page.goto(`${session.server.url}/goal-race/fuel`);
    const form = page.getByRole('form', { name: 'Fuel plan inputs' });
    await form.waitFor();

    // Checked where typed, once the field is left, in the words of its label (the runner's unit is mi).
    await form.getByLabel('Body mass (kg)').fill('sixty');
    await form.getByLabel(/^Easy pace/).fill('9.30');
    await form.getByLabel('Start time of day (optional, HH:MM)').click();
    const massProblem = form.getByText('Write the body mass in kg, e.g. 62.');
    await expect.poll(() => massProblem.count()).toBe(1);
    await expect.poll(() => form.getByText('Write the easy pace as m:ss per mi, e.g. 9:30.').count()).toBe(1);
    // The message is tied to its field (read out with it), not listed at the bottom in internal names.
    expect(await form.getByLabel('Body mass (kg)').getAttribute('aria-invalid')).toBe('true');
    expect(await form.getByRole('textbox', { name: 'Body mass (kg)' }).getAttribute('aria-describedby')).toContain(
      (await massProblem.getAttribute('id')) ?? 'no id',
    );
    expect(await form.getByText(/body mass kg|s per km|seconds/).count()).toBe(0);
    await form.getByLabel('Body mass (kg)').fill('58');
    await form.getByLabel(/^Easy pace/).fill('9:30');
    await expect.poll(() => massProblem.count()).toBe(0);

    // A new intake's picker starts empty; saving without a choice is answered at the picker.
    await form.getByRole('button', { name: 'Add an intake' }).click();
    const what = form.getByLabel(/^What, intake \d+/).last();
    expect(await what.inputValue()).toBe('');
    await form.getByRole('button', { name: 'Save and compute the schedule' }).click();
    await expect.poll(() => form.getByText('Choose an item or a bottle for this intake.').count()).toBe(1);
    await expect.poll(() => form.getByText(/^Not saved yet: 2 fields need a fix, see the messages beside them/).count()).toBe(1);
    await what.selectOption({ label: `plan gel ${suffix}` });
    await form
      .getByLabel(/^Every \(mi\), intake \d+/)
      .last()
      .fill('5');
    const intakes = await form.getByLabel(/^What, intake \d+/).count();

    // A reload keeps all of it.
    await page.reload();
    await form.waitFor();
    await expect.poll(() => form.getByText(/^Restored what you entered earlier on this device/).count()).toBe(1);
    expect(await form.getByLabel('Body mass (kg)').inputValue()).toBe('58');
    expect(await form.getByLabel(/^Easy pace/).inputValue()).toBe('9:30');
    expect(await form.getByLabel(/^What, intake \d+/).count()).toBe(intakes);
    expect(
      await form
        .getByLabel(/^What, intake \d+/)
        .last()
        .inputValue(),
    ).toBe(`item:${gel.id}`);
    expect(
      await form
        .getByLabel(/^Every \(mi\), intake \d+/)
        .last()
        .inputValue(),
    ).toBe('5');

    // The gel is deleted elsewhere: the server refuses, its answer sits at that intake's picker, nothing is lost.
    await callApi(page, 'DELETE', `/api/fuel-items/${gel.id}`);
    await form.getByRole('button', { name: 'Save and compute the schedule' }).click();
    await expect.poll(() => form.getByText(/^Not saved: see the messages beside the fields\./).count()).toBe(1);
    const answer = form.getByText('There is no fuel item with this id.');
    await expect.poll(() => answer.count()).toBe(1);
    expect(
      await form
        .getByLabel(/^What, intake \d+/)
        .last()
        .getAttribute('aria-describedby'),
    ).toBe(await answer.getAttribute('id'));
    await screenshot(page, 'fuel-plan-refused-375');
    expect(await form.getByLabel('Body mass (kg)').inputValue()).toBe('58');
    expect(await form.getByLabel(/^Easy pace/).inputValue()).toBe('9:30');
    expect(
      await form
        .getByLabel(/^Every \(mi\), intake \d+/)
        .last()
        .inputValue(),
    ).toBe('5');

    // Removing that intake and saving works, and the draft is gone.
    await form.getByRole('button', { name: `Remove intake ${intakes}` }).click();
    await form.getByRole('button', { name: 'Save and compute the schedule' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Fuel plan saved.' }).count()).toBe(1);
    const stored = await page.evaluate(() =>
      Object.keys(localStorage).filter((k) => k.startsWith('pacewright:draft:fuel-plan:')),
    );
    expect(stored).toEqual([]);
    const saved = await callApi<{ fuel_plan: { body_mass_kg: number } }>(page, 'GET', '/api/me/goal-race/fuel-plan');
    expect(saved.fuel_plan.body_mass_kg).toBe(58);
    await page.close();
  });
});

describe('the session editor', () => {
  it('checks the date and title where typed, reopens with its draft after a reload, and a refused save keeps everything with the answer at the field', async () => {
    const page = await session.browser.context.newPage();
    await signInThroughPage(page, session.server.url, runner, { width: 375, height: 812 });
    await page.waitForURL(/\/log$/);
    const suffix = Date.now().toString(36);
    await page.goto(`${session.server.url}/plan?week=2027-06-07`);
    await page.getByRole('button', { name: 'New session', exact: true }).click();
    const editor = page.getByRole('form', { name: 'New session', exact: true });
    await editor.waitFor();

    // The date is checked once it is left, with the server's schema, in words.
    const date = editor.getByLabel('Date', { exact: true });
    await date.fill('1850-06-09');
    await editor.getByLabel('Title (optional)').click();
    const outOfRange = editor.getByText('Pick a date between 1 January 1900 and 31 December 2100.');
    await expect.poll(() => outOfRange.count()).toBe(1);
    expect(await date.getAttribute('aria-invalid')).toBe('true');
    await date.fill('2027-06-09');
    await expect.poll(() => outOfRange.count()).toBe(0);

    // A title with an invisible control character (pasted from somewhere) is refused at the field by
    // the shared plan schema the server also uses; nothing typed is lost and nothing is sent.
    await editor.getByLabel('Title (optional)').fill(`Hill repeats ${suffix}\u0007`);
    await editor.getByLabel('Session in shorthand').fill('2 mi easy, 6 x 1 min @ 5K w/ 2 min jog');
    await editor.getByLabel('Notes (optional)').fill('Grass loop by the water tower.');
    await expect.poll(() => page.url()).toMatch(/[?&]new=/);

    // A reload reopens the editor with all of it.
    await page.reload();
    await editor.waitFor();
    await expect.poll(() => editor.getByText(/^Restored what you entered earlier on this device/).count()).toBe(1);
    expect(await date.inputValue()).toBe('2027-06-09');
    expect(await editor.getByLabel('Title (optional)').inputValue()).toBe(`Hill repeats ${suffix}\u0007`);
    expect(await editor.getByLabel('Session in shorthand').inputValue()).toBe('2 mi easy, 6 x 1 min @ 5K w/ 2 min jog');
    expect(await editor.getByLabel('Notes (optional)').inputValue()).toBe('Grass loop by the water tower.');

    // Saving is refused with the answer under the title, in words; nothing typed is lost, nothing is sent.
    const planWrites: string[] = [];
    page.on('request', (request) => {
      if (request.method() !== 'GET' && new URL(request.url()).pathname.startsWith('/api/plans')) planWrites.push(request.url());
    });
    await editor.getByRole('button', { name: 'Save session' }).click();
    const answer = editor.getByText(/^This text holds an invisible control character/);
    await expect.poll(() => answer.count()).toBe(1);
    expect(await editor.getByLabel('Title (optional)').getAttribute('aria-invalid')).toBe('true');
    expect(await editor.getByLabel('Title (optional)').getAttribute('aria-describedby')).toContain(
      (await answer.getAttribute('id')) ?? 'no id',
    );
    await screenshot(page, 'session-editor-refused-375');
    expect(await editor.getByLabel('Notes (optional)').inputValue()).toBe('Grass loop by the water tower.');
    expect(await editor.getByLabel('Session in shorthand').inputValue()).toBe('2 mi easy, 6 x 1 min @ 5K w/ 2 min jog');
    expect(planWrites).toEqual([]);

    // Retyping the title clears the answer; the save goes through, the draft and the address entry go.
    await editor.getByLabel('Title (optional)').fill(`Hill repeats ${suffix}`);
    await expect.poll(() => answer.count()).toBe(0);
    await editor.getByRole('button', { name: 'Save session' }).click();
    await expect.poll(() => page.getByRole('status').filter({ hasText: 'Session added.' }).count()).toBe(1);
    const stored = await page.evaluate(() => Object.keys(localStorage).filter((k) => k.startsWith('pacewright:draft:session:')));
    expect(stored).toEqual([]);
    expect(page.url()).not.toMatch(/[?&](new|edit)=/);
    await page.close();
  });
});
