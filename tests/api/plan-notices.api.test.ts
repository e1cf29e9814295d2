import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import type { MailCatcher } from '../../server/features/mail/mail-catcher.ts';
import { sendPlanChangeNotices } from '../../server/features/plans/plan-notices.ts';
import { db } from '../../server/lib/db.ts';
import type { Mailer } from '../../server/lib/mailer.ts';
import { createUser } from '../support/factories.ts';
import { startTestMail } from '../support/mail.ts';
import { testConfig } from '../support/test-app.ts';

// Issue 15: a runner whose coach changes their plan gets ONE e-mail per editing burst, through the
// real SMTP path (nodemailer → the mail catcher → dev_outbox). The sweep is driven directly with a
// clock, so nothing waits for the 10 quiet minutes to pass.

const PUBLIC_URL = 'http://pacewright.test';
/** The app and the sweep share one config, so the sweep's signed unsubscribe links verify in the app. */
const CONFIG = testConfig({ publicUrl: PUBLIC_URL });
let catcher: MailCatcher;
let mailer: Mailer;
beforeAll(async () => ({ catcher, mailer } = await startTestMail()));
afterAll(async () => catcher.close());

type App = ReturnType<typeof createApp>;
const appWithMail = (): App => createApp({ config: CONFIG, mailer });

const outbox = async (app: App) =>
  (await request(app).get('/api/dev/outbox')).body.messages as Array<{
    to: string;
    subject: string;
    text: string;
    html: string;
    headers: Record<string, string>;
  }>;

async function person(app: App, role: 'runner' | 'coach', name: string, email: string) {
  const { user, password } = await createUser({ role, name, email });
  const token = (await request(app).post('/api/auth/token').send({ email, password })).body.token as string;
  return { id: user.id, auth: { Authorization: `Bearer ${token}` } };
}

async function squadOf(app: App) {
  const coach = await person(app, 'coach', 'Dana Coach', 'dana@example.test');
  const runner = await person(app, 'runner', 'Ivy Runner', 'ivy@example.test');
  const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Harbor' })).body.squad.id as string;
  await db('squad_members').insert({ squad_id: squad, runner_id: runner.id });
  return { coach, runner };
}

/** The instant of the runner's latest recorded change, plus `minutes`. */
async function afterLastChange(runnerId: string, minutes: number): Promise<Date> {
  const row = await db('plan_changes').where({ runner_id: runnerId }).max<{ max: Date }>('created_at as max').first();
  return new Date(row!.max.getTime() + minutes * 60_000);
}

/** Three edits by the coach on two sessions of the week of Monday 4 Jan 2027. */
async function threeCoachEdits(app: App, coach: { auth: Record<string, string> }, runnerId: string) {
  const saturday = await request(app)
    .post('/api/plans')
    .set(coach.auth)
    .send({ runner_id: runnerId, date: '2027-01-09', title: 'Long run', text: '14 mi easy' });
  expect(saturday.status).toBe(201);
  const edited = await request(app).patch(`/api/plans/${saturday.body.plan.id}`).set(coach.auth).send({ text: '16 mi easy' });
  expect(edited.status).toBe(200);
  const sunday = await request(app)
    .post('/api/plans')
    .set(coach.auth)
    .send({ runner_id: runnerId, date: '2027-01-10', title: 'Recovery', text: '5 mi easy' });
  expect(sunday.status).toBe(201);
}

describe('the e-mail per editing burst', () => {
  it('three edits by the coach make one e-mail, sent once the plan has been quiet for 10 minutes, listing every change', async () => {
    const app = appWithMail();
    const { coach, runner } = await squadOf(app);
    await threeCoachEdits(app, coach, runner.id);
    // The runner's own change needs no notice and is not listed.
    await request(app).post('/api/plans').set(runner.auth).send({ date: '2027-01-06', text: '6 mi easy' });

    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 0))).toBe(0);
    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 9.9))).toBe(0);
    expect(await outbox(app)).toEqual([]);

    const quiet = await afterLastChange(runner.id, 10);
    expect(await sendPlanChangeNotices(mailer, CONFIG, quiet)).toBe(1);
    const messages = await outbox(app);
    expect(messages).toHaveLength(1);
    const [notice] = messages;
    expect(notice!.to).toBe('ivy@example.test');
    expect(notice!.subject).toBe('Dana Coach changed 2 sessions in your week of 4 Jan');
    const changeLines = notice!.text.split('\n').filter((line) => line.startsWith('- '));
    expect(changeLines).toEqual([
      '- Added for Sat 9 Jan: 14 mi easy.',
      '- Sat 9 Jan: Changed session "14 mi easy" → "16 mi easy".',
      '- Added for Sun 10 Jan: 5 mi easy.',
    ]);
    expect(notice!.text).toContain(`${PUBLIC_URL}/plan?week=2027-01-04`);
    expect(notice!.text).toMatch(new RegExp(`Turn these e-mails off: ${PUBLIC_URL}/notices/off/uns_[A-Za-z0-9_-]+\\n`));
    expect(notice!.html).toContain('Open your plan');
    // The HTML's way out is a link to the same page as the text's address, not the address as plain text.
    const offPage = /Turn these e-mails off: (\S+)\n/.exec(notice!.text)![1]!;
    expect(notice!.html).toContain(`<a href="${offPage}"`);
    expect(notice!.html).toMatch(/<a href="[^"]+"[^>]*>Turn these e-mails off<\/a>/);
    expect(notice!.html).not.toContain(`Turn these e-mails off: ${offPage}`);

    // Sent once: the next sweeps find nothing new.
    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 30))).toBe(0);
    expect(await outbox(app)).toHaveLength(1);
    expect(await db('plan_changes').where({ runner_id: runner.id }).whereNull('noticed_at')).toEqual([]);
  });

  it('the profile switch turned off: no e-mail, and turning it back on sends no old changes', async () => {
    const app = appWithMail();
    const { coach, runner } = await squadOf(app);
    const off = await request(app).patch('/api/me').set(runner.auth).send({ notify_on_plan_change: false });
    expect(off.status).toBe(200);
    expect(off.body.profile.notify_on_plan_change).toBe(false);
    await threeCoachEdits(app, coach, runner.id);

    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 11))).toBe(0);
    expect(await outbox(app)).toEqual([]);

    await request(app).patch('/api/me').set(runner.auth).send({ notify_on_plan_change: true });
    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 20))).toBe(0);
    expect(await outbox(app)).toEqual([]);
  });

  it('a coach editing without a 10-minute pause still gets one e-mail out after an hour', async () => {
    const app = appWithMail();
    const { coach, runner } = await squadOf(app);
    await threeCoachEdits(app, coach, runner.id);
    const now = await afterLastChange(runner.id, 1);
    // The first change an hour back, the others a minute ago: the burst never went quiet.
    const first = await db('plan_changes').where({ runner_id: runner.id }).orderBy('created_at').first('id');
    await db('plan_changes')
      .where({ id: first!.id })
      .update({ created_at: new Date(now.getTime() - 60 * 60_000) });
    expect(await sendPlanChangeNotices(mailer, CONFIG, now)).toBe(1);
    expect((await outbox(app)).map((m) => m.subject)).toEqual(['Dana Coach changed 2 sessions in your week of 4 Jan']);
  });

  it('a send that fails leaves the changes waiting; the next sweep sends them once', async () => {
    const app = appWithMail();
    const { coach, runner } = await squadOf(app);
    await threeCoachEdits(app, coach, runner.id);
    const later = await afterLastChange(runner.id, 11);
    const broken: Mailer = {
      send: () => Promise.reject(new Error('the mail server is away')),
    };
    expect(await sendPlanChangeNotices(broken, CONFIG, later)).toBe(0);
    expect(await db('plan_changes').where({ runner_id: runner.id }).whereNull('noticed_at')).toHaveLength(3);
    expect(await sendPlanChangeNotices(mailer, CONFIG, later)).toBe(1);
    expect(await outbox(app)).toHaveLength(1);
  });

  it('carries the one-click unsubscribe (RFC 8058); its POST, without sign-in, turns off the plan-change e-mail and nothing else', async () => {
    const app = appWithMail();
    const { coach, runner } = await squadOf(app);
    await threeCoachEdits(app, coach, runner.id);
    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 10))).toBe(1);
    const [notice] = await outbox(app);
    // RFC 8058 §3.1: both headers, the first an HTTPS-or-HTTP URI in angle brackets.
    expect(notice!.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
    const target = new URL(/^<(.+)>$/.exec(notice!.headers['list-unsubscribe']!)![1]!);
    expect(target.origin).toBe(PUBLIC_URL);
    expect(target.pathname).toMatch(/^\/api\/notices\/unsubscribe\/uns_[A-Za-z0-9_-]+$/);

    const switchesOf = () =>
      db('users')
        .where({ id: runner.id })
        .first(
          'notify_on_import',
          'notify_on_note',
          'notify_on_pain_alert',
          'notify_on_squad_leave',
          'notify_on_digest',
          'notify_on_plan_change',
        );
    const before = await switchesOf();
    expect(before).toEqual({
      notify_on_import: true,
      notify_on_note: true,
      notify_on_pain_alert: true,
      notify_on_squad_leave: true,
      notify_on_digest: true,
      notify_on_plan_change: true,
    });
    // What a mail program sends: form-encoded, no cookie, no token.
    const off = await request(app).post(target.pathname).type('form').send('List-Unsubscribe=One-Click');
    expect(off.status).toBe(200);
    expect(off.body).toEqual({ kind: 'plan_change', label: 'My coach changes my plan', on: false });
    expect(await switchesOf()).toEqual({ ...before, notify_on_plan_change: false });
    expect((await request(app).get('/api/me/notices').set(runner.auth)).body.switches.plan_change).toBe(false);

    // The next round of changes sends nothing.
    await request(app).post('/api/plans').set(coach.auth).send({ runner_id: runner.id, date: '2027-01-11', text: '4 mi easy' });
    expect(await sendPlanChangeNotices(mailer, CONFIG, await afterLastChange(runner.id, 11))).toBe(0);
    expect(await outbox(app)).toHaveLength(1);
  });
});
