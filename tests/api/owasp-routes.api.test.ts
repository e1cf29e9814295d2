import { randomBytes, randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, readdirSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Express } from 'express';
import jwt, { type SignOptions } from 'jsonwebtoken';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import yauzl from 'yauzl';
import Stripe from 'stripe';
import { createApp } from '../../server/app.ts';
import { startPaymentFake } from '../../server/features/fees/payment-fake.ts';
import { startImportWorker, stopImportWorker } from '../../server/features/history/import-queue.ts';
import { afterAnswerSettled } from '../../server/lib/after-answer.ts';
import { signUnsubscribeToken } from '../../server/features/notices/unsubscribe-token.ts';
import { db } from '../../server/lib/db.ts';
import { captureLogLines } from '../../server/lib/logger.ts';
import { createFsStore } from '../../server/lib/storage.ts';
import { CSRF_COOKIE, CSRF_HEADER, SESSION_COOKIE } from '../../shared/auth/schemas.ts';
import type { Role } from '../../shared/users/schemas.ts';
import { generateLakeRun } from '../../shared/tracks/synthetic.ts';
import { writeGpx } from '../../shared/tracks/write-track.ts';
import { createUser } from '../support/factories.ts';
import { pollUntil } from '../support/poll.ts';
import { recordedMail, recordingMailer, signedInAgent, testConfig, type BrowserAgent } from '../support/test-app.ts';
import { buildZip } from '../support/zip-builder.ts';

/**
 * Issue 8: the OWASP basics, checked on every route the app serves. The routes come from the
 * app itself (its Express stack, cross-checked with /api/openapi.json); ROUTES below holds one
 * row of fixtures per route, and the first test fails when a route has no row or a row lacks a
 * fixture the checks need, so no route can be added without being checked.
 *
 * Every answer seen in this file also goes through `answer`: hardening headers, no 5xx, no stack
 * trace in an error, no password, hash or token in the body (zip entries included). Every log line
 * written while the file runs is read too (`captureLogLines`) and must hold no secret.
 */

const dataDir = mkdtempSync(path.join(tmpdir(), 'pacewright-owasp-'));
const config = testConfig({
  dataDir,
  // Small limits so the 413s are cheap to provoke; the fixture run (66 KB) still fits.
  uploadMaxFileBytes: 128 * 1024,
  uploadMaxArchiveBytes: 256 * 1024,
  authRateLimit: { windowMs: 60_000, max: 100_000 },
});
const store = createFsStore(dataDir);
// The local fake of the payment service (issue 20): checkouts, the portal and signed webhook events, all on loopback.
const paymentFake = await startPaymentFake({ webhookSecret: config.payments.webhookSecret });
config.payments.url = paymentFake.url;
const app = createApp({ config, store, mailer: recordingMailer });
paymentFake.setDeliver(
  async (payload, signature) =>
    (
      await request(app)
        .post('/api/payments/webhook')
        .set('content-type', 'application/json')
        .set('stripe-signature', signature)
        .send(payload)
    ).status,
);
const signer = new Stripe('sk_test_signer');

// ---------------------------------------------------------------------------------------------
// The world every check runs against: two runners, two coaches with a squad each, an admin, and
// the owner's run, plans, fuel, races, notes, tokens, invitations and a finished bulk import.
// ---------------------------------------------------------------------------------------------

const PEOPLE = ['owner', 'other runner', 'coach', 'other coach', 'admin', 'spare'] as const;
type Person = (typeof PEOPLE)[number];
const ROLES: Record<Person, Role> = {
  owner: 'runner',
  'other runner': 'runner',
  coach: 'coach',
  'other coach': 'coach',
  admin: 'admin',
  // The account an admin changes and whose password is reset, so the owner's tokens survive.
  spare: 'runner',
};

interface Member {
  id: string;
  email: string;
  password: string;
  bearer: Record<string, string>;
  browser: BrowserAgent;
}

interface World {
  people: Record<Person, Member>;
  ids: {
    run: string;
    plan: string;
    fuelItem: string;
    raceResult: string;
    namedToken: string;
    squad: string;
    invitation: string;
    import: string;
    weekNote: string;
    library: string;
    batch: string;
    /** A squad with a monthly fee the owner pays (a running subscription at the fake). */
    paidSquad: string;
  };
  /** An open checkout of the owner's at the fake, for the development route that completes it. */
  checkoutUrl: string;
  inviteToken: string;
  resetToken: string;
  /** The owner's calendar feed path value (`cal_….ics`). */
  calendarToken: string;
  signUpToken: string;
  /** A one-click unsubscribe token of the owner's (`uns_…`), as a notice e-mail carries it. */
  unsubscribeToken: string;
  week: string;
  newPassword: string;
}

/** Every password used in this file: none may ever appear in an answer or a log line. */
const passwords = new Set<string>();

function newPassword(label: string): string {
  const password = `${label} passphrase ${randomBytes(6).toString('hex')}`;
  passwords.add(password);
  return password;
}

let gpxCounter = 0;
/** A small generated run around the invented lake, different each call (so never a duplicate). */
function freshGpx(): Buffer {
  gpxCounter += 1;
  const run = generateLakeRun({
    start_t: Date.UTC(2026, 2, 4, 6, 30) + gpxCounter * 86_400_000,
    phases: [{ kind: 'run', duration_s: 600, speed_mps: 3.2 }],
    sample_s: 5,
  });
  return Buffer.from(writeGpx(`Lake loop ${gpxCounter}`, [run.points]));
}

function historyZip(): Buffer {
  return buildZip([{ name: 'history/lake-loop.gpx', data: freshGpx() }]);
}

/** The link token in the last e-mail to `to` (invitation and reset links are only ever mailed). */
function linkTokenMailedTo(to: string, prefix: 'inv' | 'rst' | 'sgn'): string {
  const mail = recordedMail.filter((m) => m.to === to).at(-1);
  const token = mail?.text.match(new RegExp(`(${prefix}_[A-Za-z0-9_-]{43})`))?.[1];
  if (!token) throw new Error(`no ${prefix} link was mailed to ${to}`);
  return token;
}

async function must(label: string, test: request.Test, status: number): Promise<request.Response> {
  const res = await test;
  if (res.status !== status) throw new Error(`${label}: expected ${status}, got ${res.status} ${JSON.stringify(res.body)}`);
  return res;
}

async function waitForImport(browser: BrowserAgent, id: string): Promise<{ status: string; rejected: unknown[] }> {
  const res = await pollUntil(
    async () => {
      const { status, body } = await browser.agent.get(`/api/imports/${id}`);
      return { status, body };
    },
    ({ status, body }) => status === 200 && (body.status === 'done' || body.status === 'failed'),
    `import ${id} to finish`,
    30_000,
  );
  return res.body;
}

async function buildWorld(): Promise<World> {
  const people = {} as Record<Person, Member>;
  for (const person of PEOPLE) {
    const password = newPassword(person);
    const { user } = await createUser({ role: ROLES[person], password, name: `Test ${person}` });
    const issued = await must('token', request(app).post('/api/auth/token').send({ email: user.email, password }), 200);
    people[person] = {
      id: user.id,
      email: user.email,
      password,
      bearer: { Authorization: `Bearer ${issued.body.token as string}` },
      browser: await signedInAgent(app, user.email, password),
    };
  }
  const { owner, coach } = people;
  const as = (p: Member) => ({
    post: (url: string) => request(app).post(url).set(p.bearer),
    put: (url: string) => request(app).put(url).set(p.bearer),
  });

  const squad = (await must('squad', as(coach).post('/api/squads').send({ name: 'Harbor Line' }), 201)).body.squad.id;
  const otherSquad = (await must('other squad', as(people['other coach']).post('/api/squads').send({ name: 'Ridge Road' }), 201))
    .body.squad.id;
  const secondSquad = (await must('second squad', as(coach).post('/api/squads').send({ name: 'Track Tuesdays' }), 201)).body.squad
    .id;
  await db('squad_members').insert([
    { squad_id: squad, runner_id: owner.id },
    { squad_id: otherSquad, runner_id: people['other runner'].id },
  ]);

  const run = await must(
    'run',
    as(owner).post('/api/runs').attach('files', readFileSync('fixtures/gps-samples/run-hr-4s.gpx'), 'run-hr-4s.gpx'),
    201,
  );
  const runId = run.body.imported[0].id as string;
  const plan = (await must('plan', as(owner).post('/api/plans').send({ date: '2012-10-24', text: '45 min easy' }), 201)).body.plan
    .id as string;
  const library = (
    await must('library session', as(owner).post('/api/library').send({ name: 'Easy hour', text: '60 min easy' }), 201)
  ).body.session.id as string;
  const batch = (
    await must(
      'assigned',
      as(owner)
        .post('/api/plans/assign')
        .send({ runner_ids: [owner.id], date: '2012-10-21', text: '3 mi easy' }),
      201,
    )
  ).body.batch_id as string;
  await must('day mark', as(owner).put('/api/days/2012-10-23').send({ kind: 'rest' }), 200);
  const calendarUrl = (await must('calendar feed', as(owner).post('/api/me/calendar'), 201)).body.url as string;
  const fuelItem = (await must('fuel item', as(owner).post('/api/fuel-items').send(FUEL_ITEM), 201)).body.item.id as string;
  await must('plan fuel plan', as(owner).put(`/api/plans/${plan}/fuel-plan`).send(FUEL_PLAN), 200);
  await must('goal race', as(owner).put('/api/me/goal-race').send(GOAL_RACE), 200);
  await must('goal fuel plan', as(owner).put('/api/me/goal-race/fuel-plan').send(FUEL_PLAN), 200);
  const raceResult = (await must('race result', as(owner).post('/api/me/race-results').send(RACE_RESULT), 201)).body.result
    .id as string;
  await must('run note', as(owner).post(`/api/runs/${runId}/notes`).send({ text: 'Felt steady.' }), 201);
  const weekNote = (
    await must('week note', as(coach).post(`/api/runners/${owner.id}/weeks/2012-10-22/notes`).send({ text: 'Good week.' }), 201)
  ).body.note.id as string;
  // Only a website session can mint a named token (issue 13 #12).
  const namedToken = (
    await must(
      'named token',
      owner.browser.agent.post('/api/auth/tokens').set(CSRF_HEADER, owner.browser.csrf).send({ name: 'Spreadsheet' }),
      201,
    )
  ).body.id as string;
  const invitation = (
    await must('invitation', as(coach).post(`/api/squads/${squad}/invitations`).send({ email: 'invitee@example.test' }), 201)
  ).body.invitation.id as string;
  await must('invitation to accept', as(coach).post(`/api/squads/${secondSquad}/invitations`).send({ email: owner.email }), 201);
  await must('reset request', request(app).post('/api/auth/password-reset').send({ email: people.spare.email }), 202);
  const signUpAddress = `joining-${randomUUID().slice(0, 8)}@example.test`;
  await must(
    'sign-up',
    request(app)
      .post('/api/auth/register')
      .send({ email: signUpAddress, password: newPassword('joining'), name: 'Joining Runner', role: 'runner' }),
    201,
  );
  // Reset and sign-up mail goes out after the answer (issue 13 #7).
  await afterAnswerSettled();
  const monthlyFee = { kind: 'monthly', amount_minor: 4500, currency: 'USD' };
  await must('fee', as(coach).put(`/api/squads/${squad}/fee`).send(monthlyFee), 200);
  const paidSquad = (await must('paid squad', as(coach).post('/api/squads').send({ name: 'Paid Mornings' }), 201)).body.squad
    .id as string;
  await db('squad_members').insert({ squad_id: paidSquad, runner_id: owner.id });
  await must('paid squad fee', as(coach).put(`/api/squads/${paidSquad}/fee`).send(monthlyFee), 200);
  const paidCheckout = (await must('paid checkout', as(owner).post(`/api/squads/${paidSquad}/checkout`), 201)).body.url as string;
  await must('pay', request(app).post('/api/dev/payments/complete').send({ url: paidCheckout, card: '4242424242424242' }), 200);
  const checkoutUrl = (await must('checkout', as(owner).post(`/api/squads/${squad}/checkout`), 201)).body.url as string;
  const imported = await must('import', as(owner).post('/api/imports').attach('file', historyZip(), 'history.zip'), 202);
  const importId = imported.body.import.id as string;
  await waitForImport(owner.browser, importId);

  return {
    people,
    ids: {
      run: runId,
      plan,
      fuelItem,
      raceResult,
      namedToken,
      squad,
      invitation,
      import: importId,
      weekNote,
      library,
      batch,
      paidSquad,
    },
    checkoutUrl,
    inviteToken: linkTokenMailedTo(owner.email, 'inv'),
    calendarToken: calendarUrl.split('/').at(-1)!,
    unsubscribeToken: signUnsubscribeToken(config.jwtSecret, { userId: owner.id, kind: 'note', issuedAt: new Date() }),
    resetToken: linkTokenMailedTo(people.spare.email, 'rst'),
    signUpToken: linkTokenMailedTo(signUpAddress, 'sgn'),
    week: '2012-10-22',
    newPassword: newPassword('new'),
  };
}

const FUEL_ITEM = { name: 'energy gel', serving: '1 gel', carbohydrate_g: 25, sodium_mg: 50, caffeine_mg: 0, fluid_ml: 0 };
const FUEL_PLAN = { body_mass_kg: 70, easy_pace_s_per_km: 330, intakes: [] };
const GOAL_RACE = { name: 'Lake Tamsel Marathon', date: '2027-04-18', distance_m: 42195, goal_time_s: 12_600 };
const RACE_RESULT = { date: '2026-05-01', distance_m: 10_000, time_s: 2400 };

// ---------------------------------------------------------------------------------------------
// The table: one row per route, keyed like the OpenAPI document ("METHOD /api/path/{param}").
// ---------------------------------------------------------------------------------------------

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** A path parameter's fixture: the owner's real value, and what made-up values must get. */
type Param =
  /** The id of a stored row: someone else's answers 404, a made-up uuid 404, garbage 400 or 404. */
  | { kind: 'id'; value: (w: World) => string }
  /** A secret link token: a made-up or garbage one gets `madeUp`. */
  | { kind: 'secret'; value: (w: World) => string; madeUp: number }
  /** A plain value such as a date: garbage gets 400. */
  | { kind: 'value'; value: (w: World) => string };

interface Row {
  /** Who makes the valid call; `anyone` for public routes (no sign-in). */
  caller: Person | 'anyone';
  params?: Record<string, Param>;
  query?: (w: World) => Record<string, string>;
  /** A valid JSON body; required exactly when the route documents one. */
  body?: (w: World) => object;
  /** What a POST/PUT/PATCH without a JSON body takes instead. */
  takes?: 'nothing' | 'gps-files' | 'gps-archive' | 'signed-event';
  /** Also takes `?runner_id=`: someone else's runner id must answer 404 too. */
  runnerIdQuery?: true;
  /** Why nobody is a stranger to these ids (otherwise the caller's unrelated counterpart is). */
  noStranger?: string;
  /** The answer may carry the bearer token it has just issued. */
  issuesToken?: true;
  /** Needs a website session: a bearer token gets 403 cookie-session-required (issue 13 #12). */
  cookieOnly?: true;
}

const id = (value: (w: World) => string): Param => ({ kind: 'id', value });
const runId = id((w) => w.ids.run);
const planId = id((w) => w.ids.plan);
const ownerId = id((w) => w.people.owner.id);
const squadId = id((w) => w.ids.squad);
const weekStart: Param = { kind: 'value', value: (w) => w.week };

const ROUTES: Record<string, Row> = {
  'GET /api/health': { caller: 'anyone' },
  'GET /api/openapi.json': { caller: 'anyone' },
  'GET /api/docs': { caller: 'anyone' },
  'GET /api/dev/outbox': { caller: 'anyone' },

  'POST /api/auth/register': {
    caller: 'anyone',
    body: (w) => ({ email: `new-${randomUUID()}@example.test`, password: w.newPassword, name: 'New Runner', role: 'runner' }),
  },
  'POST /api/auth/register/{token}': {
    caller: 'anyone',
    params: { token: { kind: 'secret', value: (w) => w.signUpToken, madeUp: 400 } },
    takes: 'nothing',
  },
  'POST /api/auth/login': { caller: 'anyone', body: (w) => ({ email: w.people.owner.email, password: w.people.owner.password }) },
  'POST /api/auth/logout': { caller: 'anyone', takes: 'nothing' },
  'POST /api/auth/token': {
    caller: 'anyone',
    body: (w) => ({ email: w.people.owner.email, password: w.people.owner.password }),
    issuesToken: true,
  },
  'POST /api/auth/password-reset': { caller: 'anyone', body: (w) => ({ email: w.people.spare.email }) },
  'POST /api/auth/password-reset/{token}': {
    caller: 'anyone',
    params: { token: { kind: 'secret', value: (w) => w.resetToken, madeUp: 400 } },
    body: (w) => ({ password: w.newPassword }),
  },
  'GET /api/auth/me': { caller: 'owner' },
  'GET /api/auth/tokens': { caller: 'owner' },
  'POST /api/auth/tokens': { caller: 'owner', body: () => ({ name: 'Nightly script' }), issuesToken: true, cookieOnly: true },
  // Other people than the owner: these end sessions and tokens the other checks still use.
  'POST /api/auth/sign-out-everywhere': { caller: 'other coach', takes: 'nothing' },
  'POST /api/me/password': {
    caller: 'other runner',
    body: (w) => ({ current_password: w.people['other runner'].password, new_password: w.newPassword }),
    cookieOnly: true,
  },
  'DELETE /api/auth/tokens/{id}': { caller: 'owner', params: { id: id((w) => w.ids.namedToken) } },

  'GET /api/me': { caller: 'owner' },
  'PATCH /api/me': { caller: 'owner', body: () => ({ name: 'Renamed Runner' }) },
  'DELETE /api/me': { caller: 'owner', body: (w) => ({ password: w.people.owner.password }) },
  'GET /api/me/export': { caller: 'owner' },
  'GET /api/me/coaches': { caller: 'owner' },
  'GET /api/me/storage': { caller: 'owner' },

  'GET /api/admin/users': { caller: 'admin' },
  'PATCH /api/admin/users/{id}': {
    caller: 'admin',
    params: { id: id((w) => w.people.spare.id) },
    body: () => ({ role: 'coach' }),
    noStranger: 'admins manage every account',
  },

  'POST /api/runs': { caller: 'owner', takes: 'gps-files' },
  'GET /api/runs': { caller: 'owner', runnerIdQuery: true },
  'GET /api/runs/{id}': { caller: 'owner', params: { id: runId } },
  'PATCH /api/runs/{id}': { caller: 'owner', params: { id: runId }, body: () => ({ name: 'Renamed run' }) },
  'DELETE /api/runs/{id}': { caller: 'owner', params: { id: runId } },
  'GET /api/runs/{id}/splits.csv': { caller: 'owner', params: { id: runId }, query: () => ({ unit: 'km' }) },
  'GET /api/runs/{id}/track': { caller: 'owner', params: { id: runId } },
  'GET /api/runs/{id}/original': { caller: 'owner', params: { id: runId } },
  'GET /api/runs/{id}/notes': { caller: 'owner', params: { id: runId } },
  'POST /api/runs/{id}/notes': { caller: 'owner', params: { id: runId }, body: () => ({ text: 'Windy on the far side.' }) },
  'GET /api/runs/{id}/plan-check': { caller: 'owner', params: { id: runId } },
  'GET /api/runs/{id}/plan-check.csv': { caller: 'owner', params: { id: runId } },
  'PUT /api/runs/{id}/plan': { caller: 'owner', params: { id: runId }, body: (w) => ({ plan_id: w.ids.plan }) },
  'GET /api/runs/{id}/fuel-taken': { caller: 'owner', params: { id: runId } },
  'PUT /api/runs/{id}/fuel-taken': { caller: 'owner', params: { id: runId }, body: () => ({ entries: [] }) },
  'GET /api/runs/{id}/checkin': { caller: 'owner', params: { id: runId } },
  'PUT /api/runs/{id}/checkin': { caller: 'owner', params: { id: runId }, body: () => ({ mood: 4 }) },

  'POST /api/imports': { caller: 'owner', takes: 'gps-archive' },
  'GET /api/imports/{id}': { caller: 'owner', params: { id: id((w) => w.ids.import) } },

  'GET /api/me/goal-race': { caller: 'owner', runnerIdQuery: true },
  'PUT /api/me/goal-race': { caller: 'owner', body: () => GOAL_RACE },
  'DELETE /api/me/goal-race': { caller: 'owner' },
  'GET /api/me/race-results': { caller: 'owner', runnerIdQuery: true },
  'POST /api/me/race-results': { caller: 'owner', body: () => RACE_RESULT },
  'DELETE /api/me/race-results/{id}': { caller: 'owner', params: { id: id((w) => w.ids.raceResult) } },
  'GET /api/me/goal-race/fuel-plan': { caller: 'owner', runnerIdQuery: true },
  'PUT /api/me/goal-race/fuel-plan': { caller: 'owner', body: () => FUEL_PLAN, runnerIdQuery: true },
  'DELETE /api/me/goal-race/fuel-plan': { caller: 'owner', runnerIdQuery: true },

  'GET /api/tools/equivalents': { caller: 'owner', query: () => ({ distance_m: '10000', time_s: '2400' }) },
  'GET /api/tools/paces': { caller: 'owner', query: () => ({ distance_m: '10000', time_s: '2400' }) },

  'POST /api/plans/parse': { caller: 'owner', body: () => ({ text: '2 mi easy, 6 x 800m @ 5K w/ 400m jog' }) },
  'POST /api/plans': { caller: 'owner', body: () => ({ date: '2012-10-25', text: '5 mi easy' }) },
  'GET /api/plans': { caller: 'owner', query: () => ({ from: '2012-10-01', to: '2012-10-31' }), runnerIdQuery: true },
  'POST /api/plans/copy-week': { caller: 'owner', body: () => ({ from_start: '2012-10-22', to_start: '2012-10-29' }) },
  'GET /api/plans/{id}': { caller: 'owner', params: { id: planId } },
  'PATCH /api/plans/{id}': { caller: 'owner', params: { id: planId }, body: () => ({ title: 'Moved' }) },
  'DELETE /api/plans/{id}': { caller: 'owner', params: { id: planId } },
  'GET /api/plans/{id}/fuel-plan': { caller: 'owner', params: { id: planId } },
  'PUT /api/plans/{id}/fuel-plan': { caller: 'owner', params: { id: planId }, body: () => FUEL_PLAN },
  'DELETE /api/plans/{id}/fuel-plan': { caller: 'owner', params: { id: planId } },
  'PUT /api/runners/{id}/pace-tolerance': { caller: 'owner', params: { id: ownerId }, body: () => ({ pace_tolerance: 0.03 }) },
  'POST /api/plans/assign': {
    caller: 'owner',
    body: (w) => ({ runner_ids: [w.people.owner.id], date: '2012-10-26', text: '4 mi easy' }),
  },
  'DELETE /api/plans/batches/{id}': { caller: 'owner', params: { id: id((w) => w.ids.batch) } },
  'GET /api/plans/{id}/changes': { caller: 'owner', params: { id: planId } },
  'GET /api/library': { caller: 'owner' },
  'POST /api/library': { caller: 'owner', body: () => ({ name: `Hills ${randomUUID().slice(0, 8)}`, text: '8 x 1 min' }) },
  'PATCH /api/library/{id}': { caller: 'owner', params: { id: id((w) => w.ids.library) }, body: () => ({ title: 'Easy hour' }) },
  'DELETE /api/library/{id}': { caller: 'owner', params: { id: id((w) => w.ids.library) } },
  'GET /api/days': { caller: 'owner', query: () => ({ from: '2012-10-22', to: '2012-10-28' }), runnerIdQuery: true },
  'PUT /api/days/{date}': {
    caller: 'owner',
    params: { date: { kind: 'value', value: () => '2012-10-24' } },
    body: () => ({ kind: 'cross-training', minutes: 40 }),
  },
  'DELETE /api/days/{date}': {
    caller: 'owner',
    params: { date: { kind: 'value', value: () => '2012-10-23' } },
    runnerIdQuery: true,
  },
  'GET /api/runners/{id}': { caller: 'owner', params: { id: ownerId } },
  // The coach's feed is made and turned off, so the owner's address stays valid for its own row.
  'GET /api/me/calendar': { caller: 'owner' },
  'POST /api/me/calendar': { caller: 'coach', takes: 'nothing', issuesToken: true },
  'DELETE /api/me/calendar': { caller: 'coach' },
  'GET /api/calendar/{token}': {
    caller: 'anyone',
    params: { token: { kind: 'secret', value: (w) => w.calendarToken, madeUp: 404 } },
  },

  'GET /api/fuel-items': { caller: 'owner', runnerIdQuery: true },
  'POST /api/fuel-items': { caller: 'owner', body: () => FUEL_ITEM },
  'PATCH /api/fuel-items/{id}': { caller: 'owner', params: { id: id((w) => w.ids.fuelItem) }, body: () => ({ caffeine_mg: 40 }) },
  'DELETE /api/fuel-items/{id}': { caller: 'owner', params: { id: id((w) => w.ids.fuelItem) } },

  'GET /api/runners/{id}/week': { caller: 'owner', params: { id: ownerId }, query: (w) => ({ start: w.week }) },
  'GET /api/runners/{id}/week.csv': { caller: 'owner', params: { id: ownerId }, query: (w) => ({ start: w.week }) },
  'POST /api/runners/{id}/weeks/{start}/notes': {
    caller: 'owner',
    params: { id: ownerId, start: weekStart },
    body: () => ({ text: 'Legs were heavy.' }),
  },
  'GET /api/me/unread': { caller: 'owner' },
  'GET /api/me/notices': { caller: 'owner' },
  'PATCH /api/me/notices': { caller: 'owner', body: () => ({ note: true }) },
  'GET /api/notices/unsubscribe/{token}': {
    caller: 'anyone',
    params: { token: { kind: 'secret', value: (w) => w.unsubscribeToken, madeUp: 400 } },
  },
  'POST /api/notices/unsubscribe/{token}': {
    caller: 'anyone',
    params: { token: { kind: 'secret', value: (w) => w.unsubscribeToken, madeUp: 400 } },
    body: () => ({ 'List-Unsubscribe': 'One-Click' }),
  },
  'POST /api/notes/{id}/read': { caller: 'owner', params: { id: id((w) => w.ids.weekNote) }, takes: 'nothing' },
  'PUT /api/runners/{id}/weeks/{start}/review': {
    caller: 'coach',
    params: { id: ownerId, start: weekStart },
    body: () => ({ reviewed: true }),
  },

  'POST /api/squads': { caller: 'coach', body: () => ({ name: 'Dawn Group' }) },
  'GET /api/squads': { caller: 'owner' },
  'POST /api/squads/{id}/invitations': {
    caller: 'coach',
    params: { id: squadId },
    body: () => ({ email: `runner-${randomUUID().slice(0, 8)}@example.test` }),
  },
  'DELETE /api/squads/{id}/invitations/{invitationId}': {
    caller: 'coach',
    params: { id: squadId, invitationId: id((w) => w.ids.invitation) },
  },
  'DELETE /api/squads/{id}/members/{runnerId}': { caller: 'coach', params: { id: squadId, runnerId: ownerId } },
  'GET /api/squads/{id}/overview': { caller: 'coach', params: { id: squadId }, query: (w) => ({ week: w.week }) },
  'GET /api/squads/{id}/overview.csv': { caller: 'coach', params: { id: squadId }, query: (w) => ({ week: w.week }) },
  'POST /api/squads/{id}/digest': { caller: 'coach', params: { id: squadId }, body: (w) => ({ week: w.week }) },
  'GET /api/squads/{id}/fee': { caller: 'owner', params: { id: squadId } },
  'PUT /api/squads/{id}/fee': {
    caller: 'coach',
    params: { id: squadId },
    body: () => ({ kind: 'monthly', amount_minor: 5000, currency: 'EUR', first_month_discount_minor: 1000 }),
  },
  'POST /api/squads/{id}/checkout': { caller: 'owner', params: { id: squadId }, takes: 'nothing' },
  'POST /api/squads/{id}/fee/cancel': { caller: 'owner', params: { id: id((w) => w.ids.paidSquad) }, takes: 'nothing' },
  'POST /api/me/fees/portal': { caller: 'owner', takes: 'nothing' },
  'GET /api/me/fees': { caller: 'owner' },
  'GET /api/squads/{id}/billing': { caller: 'coach', params: { id: squadId } },
  'GET /api/squads/{id}/billing.csv': { caller: 'coach', params: { id: squadId } },
  'PUT /api/squads/{id}/members/{runnerId}/fee-waiver': {
    caller: 'coach',
    params: { id: squadId, runnerId: ownerId },
    body: () => ({ waived: true }),
  },
  'POST /api/payments/webhook': { caller: 'anyone', takes: 'signed-event' },
  // The declined test card: a complete, valid call that leaves the owner due, so the checkout row can still pay.
  'POST /api/dev/payments/complete': { caller: 'anyone', body: (w) => ({ url: w.checkoutUrl, card: '4000000000000002' }) },
  'GET /api/invitations/{token}': {
    caller: 'anyone',
    params: { token: { kind: 'secret', value: (w) => w.inviteToken, madeUp: 400 } },
  },
  'POST /api/invitations/{token}/accept': {
    caller: 'owner',
    params: { token: { kind: 'secret', value: (w) => w.inviteToken, madeUp: 400 } },
    takes: 'nothing',
  },
};

// ---------------------------------------------------------------------------------------------
// The routes the app really serves, read from its Express stack, and what the OpenAPI says.
// ---------------------------------------------------------------------------------------------

interface StackLayer {
  route?: { path: string; methods: Record<string, boolean> };
  handle?: { stack?: StackLayer[] };
  rawPath?: string;
}

/** `/runs/:id` → `/runs/{id}`, the OpenAPI spelling. */
const openApiPath = (expressPath: string) => expressPath.replace(/:(\w+)/g, '{$1}');

/** Every (method, path) the app answers, walking nested routers (mount paths from Express 5's `rawPath`). */
function servedRoutes(expressApp: Express): string[] {
  const found: string[] = [];
  const walk = (stack: StackLayer[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        for (const method of Object.keys(layer.route.methods)) {
          if (method !== '_all') found.push(`${method.toUpperCase()} ${openApiPath(prefix + layer.route.path)}`);
        }
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, prefix + (layer.rawPath && layer.rawPath !== '/' ? layer.rawPath : ''));
      }
    }
  };
  walk((expressApp as unknown as { router: { stack: StackLayer[] } }).router.stack, '');
  return found.sort();
}

/** Served next to the router, not through it, so not in the document they produce. */
const UNDOCUMENTED = ['GET /api/docs', 'GET /api/openapi.json'];

interface Operation {
  'x-access': string;
  requestBody?: unknown;
  responses: Record<string, unknown>;
}
let documented: Record<string, Operation> = {};

interface RouteCase {
  key: string;
  method: Method;
  /** OpenAPI-style path, e.g. /api/runs/{id}. */
  path: string;
  row: Row;
  /** The documented success status (200 for the two undocumented pages). */
  success: number;
  isWrite: boolean;
}

function routeCases(): RouteCase[] {
  return servedRoutes(app)
    .filter((key) => ROUTES[key])
    .map((key) => {
      const [method, routePath] = key.split(' ') as [string, string];
      const success = Object.keys(documented[key]?.responses ?? { 200: {} }).find((code) => code.startsWith('2'));
      return {
        key,
        method: method.toLowerCase() as Method,
        path: routePath,
        row: ROUTES[key]!,
        success: Number(success),
        isWrite: method !== 'GET',
      };
    });
}

const pathParamsOf = (routePath: string) => [...routePath.matchAll(/\{(\w+)\}/g)].map((m) => m[1]!);

// ---------------------------------------------------------------------------------------------
// Calling a route, and the checks every answer must pass.
// ---------------------------------------------------------------------------------------------

interface CallOptions {
  /** Path values already URL-encoded, replacing the world's. */
  params?: Record<string, string>;
  query?: Record<string, string>;
  headers?: Record<string, string>;
  /** A raw JSON text instead of the row's body. */
  rawJson?: string;
}

type Client = Pick<ReturnType<typeof request.agent>, Method>;

function urlOf(c: RouteCase, w: World, options: CallOptions): string {
  const url = c.path.replace(/\{(\w+)\}/g, (_match, name: string) => {
    if (options.params?.[name] !== undefined) return options.params[name];
    const param = c.row.params?.[name];
    if (!param) throw new Error(`${c.key}: no fixture for {${name}}`);
    return encodeURIComponent(param.value(w));
  });
  const query = new URLSearchParams({ ...(c.row.query?.(w) ?? {}), ...(options.query ?? {}) }).toString();
  return query ? `${url}?${query}` : url;
}

function call(client: Client, c: RouteCase, w: World, options: CallOptions = {}): request.Test {
  let test = client[c.method](urlOf(c, w, options));
  if (options.headers) test = test.set(options.headers);
  if (options.rawJson !== undefined) return test.set('Content-Type', 'application/json').send(options.rawJson);
  if (c.row.body) return test.send(c.row.body(w));
  if (c.row.takes === 'gps-files') return test.attach('files', freshGpx(), 'lake-loop.gpx');
  if (c.row.takes === 'gps-archive') return test.attach('file', historyZip(), 'history.zip');
  if (c.row.takes === 'signed-event') {
    // A harmless event the app stores and acknowledges, signed with the SDK's own test helper.
    const payload = JSON.stringify({
      id: `evt_${randomUUID().replace(/-/g, '')}`,
      object: 'event',
      created: Math.floor(Date.now() / 1000),
      type: 'customer.created',
      data: { object: { id: 'cus_x', object: 'customer' } },
    });
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: config.payments.webhookSecret });
    return test.set('Content-Type', 'application/json').set('Stripe-Signature', signature).send(payload);
  }
  return test;
}

/** Who sends a request: a client (with its cookies, if any) and the headers it adds. */
interface Caller {
  client: Client;
  headers: Record<string, string>;
}

/** A signed-in browser: session cookie plus the matching CSRF header (as the real client sends). */
function asBrowser(w: World, person: Person): Caller {
  const { browser } = w.people[person];
  return { client: browser.agent, headers: { [CSRF_HEADER]: browser.csrf } };
}

function callerOf(c: RouteCase, w: World): Caller {
  return c.row.caller === 'anyone' ? { client: request(app), headers: {} } : asBrowser(w, c.row.caller);
}

interface Answer {
  status: number;
  code: string | undefined;
  body: Record<string, unknown>;
  text: string;
}

/** Problems found in the current test, all reported together at its end. */
let problems: string[] = [];

function expectStatus(label: string, got: Answer, expected: number | number[], code?: string): void {
  const allowed = ([] as number[]).concat(expected);
  if (!allowed.includes(got.status) || (code !== undefined && got.code !== code)) {
    problems.push(
      `${label}: expected ${allowed.join(' or ')}${code ? ` ${code}` : ''}, got ${got.status} ${got.text.slice(0, 200)}`,
    );
  }
}

const HARDENING_HEADERS: Record<string, RegExp> = {
  'content-security-policy': /default-src 'self'.*frame-ancestors 'self'.*object-src 'none'/,
  'x-content-type-options': /^nosniff$/,
  'x-frame-options': /^SAMEORIGIN$/,
  'strict-transport-security': /^max-age=\d{7,}/,
  'referrer-policy': /^no-referrer$/,
  'cross-origin-opener-policy': /^same-origin$/,
  'cross-origin-resource-policy': /^same-origin$/,
};

const STACK_TRACE = /\n\s+at |\bat \S+ \(|\/work\/|node_modules|\.[cm]?[jt]s:\d+/;

const SECRET_PATTERNS: Array<[string, RegExp]> = [
  ['a bcrypt hash', /\$2[aby]\$\d\d\$/],
  ['a password hash column', /password_hash/],
  ['a session token (JWT)', /eyJ[\w-]{8,}\.eyJ[\w-]{8,}\.[\w-]*/],
  ['a bearer token', /pw_[A-Za-z0-9_-]{43}/],
  ['a password-reset link token', /rst_[A-Za-z0-9_-]{43}/],
  ['an invitation link token', /inv_[A-Za-z0-9_-]{43}/],
  ['a calendar feed address', /cal_[A-Za-z0-9_-]{43}/],
  ['a sign-up link token', /sgn_[A-Za-z0-9_-]{43}/],
  ['an unsubscribe link token', /uns_[A-Za-z0-9_-]{60,}/],
];

/** What secret `text` reveals, if any (a just-issued bearer token may be allowed). */
function secretsIn(text: string, allowBearerToken = false): string[] {
  const found = SECRET_PATTERNS.filter(
    ([what, pattern]) =>
      !(allowBearerToken && (what === 'a bearer token' || what === 'a calendar feed address')) && pattern.test(text),
  ).map(([what]) => what);
  for (const password of passwords) if (text.includes(password)) found.push(`the password "${password}"`);
  return found;
}

async function zipEntriesText(zip: Buffer): Promise<string> {
  const zipfile = await yauzl.fromBufferPromise(zip, { lazyEntries: true });
  const texts: string[] = [];
  await new Promise<void>((resolve, reject) => {
    zipfile.on('entry', (entry: yauzl.Entry) => {
      zipfile.openReadStream(entry, (err, stream) => {
        if (err) return reject(err);
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('end', () => {
          texts.push(`${entry.fileName}\n${Buffer.concat(chunks).toString('utf8')}`);
          zipfile.readEntry();
        });
      });
    });
    zipfile.on('end', resolve);
    zipfile.on('error', reject);
    zipfile.readEntry();
  });
  return texts.join('\n');
}

/** Sends `test` and checks the answer against everything every answer must satisfy. */
async function answer(route: RouteCase | string, test: request.Test): Promise<Answer> {
  const label = typeof route === 'string' ? route : route.key;
  // The two routes that issue a bearer token show it once, in their answer.
  const issuesToken = typeof route !== 'string' && route.row.issuesToken === true;
  // Raw bytes whatever the type (CSV, GPX, zip), so every answer can be searched.
  const res = await test.buffer(true).parse((stream, done) => {
    const chunks: Buffer[] = [];
    stream.on('data', (chunk: Buffer) => chunks.push(chunk));
    stream.on('end', () => done(null, Buffer.concat(chunks)));
  });
  const raw = res.body as Buffer;
  const contentType = String(res.headers['content-type'] ?? '');
  const text = raw.toString('utf8');
  let body: Record<string, unknown> = {};
  if (contentType.startsWith('application/json') && text) body = JSON.parse(text) as Record<string, unknown>;

  if (res.status >= 500) {
    const logged = logLines.filter((line) => line.includes('"level":50')).at(-1);
    const cause = logged ? (JSON.parse(logged) as { err?: { message?: string } }).err?.message : undefined;
    problems.push(`${label}: answered ${res.status} ${text.slice(0, 200)} (logged: ${cause})`);
  }
  for (const [header, pattern] of Object.entries(HARDENING_HEADERS)) {
    if (!pattern.test(String(res.headers[header] ?? ''))) problems.push(`${label}: header ${header} is "${res.headers[header]}"`);
  }
  if (res.headers['x-powered-by'] !== undefined) problems.push(`${label}: says x-powered-by`);
  // An error is {error: sentence, code}; the one other 4xx body is an upload's 422 import result (api-contract.md).
  const isImportResult = res.status === 422 && Array.isArray(body.rejected);
  if (res.status >= 400 && !isImportResult) {
    if (typeof body.error !== 'string' || !/^[A-Z].*[.!?)]$/.test(body.error) || typeof body.code !== 'string') {
      problems.push(`${label}: the ${res.status} is not a JSON {error: sentence, code}: ${text.slice(0, 200)}`);
    }
    if (STACK_TRACE.test(text)) problems.push(`${label}: the error body shows code internals: ${text.slice(0, 300)}`);
  }
  const readable = contentType.startsWith('application/zip') ? await zipEntriesText(raw) : text;
  for (const secret of secretsIn(readable, issuesToken)) problems.push(`${label}: the answer contains ${secret}`);
  return { status: res.status, code: typeof body.code === 'string' ? body.code : undefined, body, text };
}

// ---------------------------------------------------------------------------------------------
// Database state: "nothing changed" means every table and every stored file is as it was.
// ---------------------------------------------------------------------------------------------

function filesUnder(dir: string): string[] {
  if (!existsSync(dir)) return [];
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.relative(dataDir, path.join(entry.parentPath, entry.name)))
    .sort();
}

/** Every table's content and the stored files; the shared limits' request counts and upload slots are bookkeeping, not data. */
async function snapshot(): Promise<Record<string, string>> {
  const { rows: tables } = await db.raw<{ rows: Array<{ tablename: string }> }>(
    "select tablename from pg_tables where schemaname = 'public' and tablename not like 'knex_migrations%' and tablename not in ('rate_limit_hits', 'upload_slots') order by tablename",
  );
  const state: Record<string, string> = {};
  for (const { tablename } of tables) {
    const { rows } = await db.raw<{ rows: Array<{ n: number; digest: string }> }>(
      "select count(*)::int as n, md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as digest from ?? t",
      [tablename],
    );
    state[tablename] = `${rows[0]!.n} rows, ${rows[0]!.digest}`;
  }
  state['stored files'] = filesUnder(dataDir).join(', ');
  state['mail sent'] = String(recordedMail.length);
  return state;
}

function expectUnchanged(label: string, before: Record<string, string>, after: Record<string, string>): void {
  for (const key of Object.keys({ ...before, ...after })) {
    if (before[key] !== after[key]) problems.push(`${label} changed ${key}: ${before[key]} → ${after[key]}`);
  }
}

// ---------------------------------------------------------------------------------------------

const logLines: string[] = [];
let stopCapture: () => void = () => {};

beforeAll(async () => {
  stopCapture = captureLogLines((line) => logLines.push(line));
  documented = Object.fromEntries(
    Object.entries((await request(app).get('/api/openapi.json')).body.paths as Record<string, Record<string, Operation>>).flatMap(
      ([routePath, operations]) =>
        Object.entries(operations).map(([method, operation]) => [`${method.toUpperCase()} ${routePath}`, operation] as const),
    ),
  );
  await startImportWorker(store, { dataDir, maxEntryBytes: config.uploadMaxFileBytes, pollingIntervalSeconds: 0.5 });
});

afterAll(async () => {
  await stopImportWorker();
  await paymentFake.close();
  stopCapture();
});

beforeEach(() => {
  problems = [];
  logLines.length = 0;
});

afterEach(() => {
  // Every request is logged, so an empty log would mean the capture saw nothing.
  expect(logLines.length).toBeGreaterThan(0);
  const leaks = logLines.flatMap((line) =>
    secretsIn(line).map((secret) => `a log line contains ${secret}: ${line.slice(0, 300)}`),
  );
  expect(leaks).toEqual([]);
});

describe('OWASP basics on every route', () => {
  it('the table has a row with every fixture the checks need for every route the app serves', async () => {
    const served = servedRoutes(app);
    expect(served.length).toBeGreaterThan(50);
    // The OpenAPI document and the app agree: nothing served is undocumented by accident.
    expect(served.filter((key) => !UNDOCUMENTED.includes(key))).toEqual(Object.keys(documented).sort());

    for (const key of served) {
      const row = ROUTES[key];
      if (!row) {
        problems.push(`${key} has no row in ROUTES: add one so the security checks cover it`);
        continue;
      }
      const [method, routePath] = key.split(' ') as [string, string];
      const operation = documented[key];
      const params = pathParamsOf(routePath);
      const fixtures = Object.keys(row.params ?? {});
      if (params.sort().join() !== fixtures.sort().join()) {
        problems.push(`${key}: path parameters {${params.join('}, {')}} need exactly these fixtures, has ${fixtures.join(', ')}`);
      }
      if (Boolean(operation?.requestBody) !== Boolean(row.body)) {
        problems.push(
          `${key}: ${operation?.requestBody ? 'documents a JSON body but the row has none' : 'the row has a body the route does not take'}`,
        );
      }
      if (['POST', 'PUT', 'PATCH'].includes(method) && !row.body && !row.takes) {
        problems.push(`${key}: say what this write takes (nothing, gps-files or gps-archive)`);
      }
      const isPublic = operation ? operation['x-access'] === 'public' : UNDOCUMENTED.includes(key);
      if (isPublic !== (row.caller === 'anyone'))
        problems.push(`${key}: caller "${row.caller}" but access is ${operation?.['x-access']}`);
    }
    for (const key of Object.keys(ROUTES))
      if (!served.includes(key)) problems.push(`ROUTES has a row for ${key}, which is not served`);

    // Something real was answered: the document itself passes the generic checks.
    const doc = await answer('GET /api/openapi.json', request(app).get('/api/openapi.json'));
    expect(doc.status).toBe(200);
    expect(problems).toEqual([]);
  });

  it('without a live session or token every protected route answers 401 and changes nothing; public routes stay open', async () => {
    const w = await buildWorld();
    const owner = w.people.owner;
    const session = (claims: object, secret: string, options: SignOptions) =>
      jwt.sign(claims, secret, { audience: 'pacewright-session', ...options });
    const mint = (name: string) =>
      owner.browser.agent.post('/api/auth/tokens').set(CSRF_HEADER, owner.browser.csrf).send({ name });
    const revoked = (await must('token', mint('Old'), 201)).body;
    await must('revoke', request(app).delete(`/api/auth/tokens/${revoked.id}`).set(owner.bearer), 204);
    const expired = (await must('token', mint('Aged'), 201)).body;
    await db('api_tokens')
      .where({ id: expired.id })
      .update({ expires_at: new Date(Date.now() - 86_400_000) });

    const csrf = 'csrf-value-of-this-browser';
    const withCookie = (token: string) => ({
      Cookie: `${SESSION_COOKIE}=${token}; ${CSRF_COOKIE}=${csrf}`,
      [CSRF_HEADER]: csrf,
    });
    const CREDENTIALS: Array<[string, Record<string, string>, string]> = [
      ['no credentials', {}, 'not-signed-in'],
      [
        'a session signed with another secret',
        withCookie(session({}, 'someone-elses-secret-0123456789abcdef', { subject: owner.id, expiresIn: '1h' })),
        'session-ended',
      ],
      [
        'an unsigned session (alg none)',
        withCookie(jwt.sign({ sub: owner.id, aud: 'pacewright-session' }, '', { algorithm: 'none' })),
        'session-ended',
      ],
      [
        'an expired session',
        withCookie(session({ exp: Math.floor(Date.now() / 1000) - 60 }, config.jwtSecret, { subject: owner.id })),
        'session-ended',
      ],
      [
        'a session for someone who no longer exists',
        withCookie(session({}, config.jwtSecret, { subject: randomUUID(), expiresIn: '1h' })),
        'session-ended',
      ],
      [
        'a session minted for another audience',
        withCookie(jwt.sign({}, config.jwtSecret, { subject: owner.id, audience: 'somewhere-else', expiresIn: '1h' })),
        'session-ended',
      ],
      ['a revoked bearer token', { Authorization: `Bearer ${revoked.token as string}` }, 'invalid-token'],
      ['an expired bearer token', { Authorization: `Bearer ${expired.token as string}` }, 'invalid-token'],
      ['a made-up bearer token', { Authorization: `Bearer pw_${randomBytes(32).toString('base64url')}` }, 'invalid-token'],
      [
        'a session token sent as a bearer token',
        { Authorization: `Bearer ${session({}, config.jwtSecret, { subject: owner.id, expiresIn: '1h' })}` },
        'invalid-token',
      ],
    ];

    const cases = routeCases();
    const before = await snapshot();
    let checked = 0;
    for (const c of cases.filter((route) => route.row.caller !== 'anyone')) {
      // Independent reads or refused writes: sent side by side.
      await Promise.all(
        CREDENTIALS.map(async ([what, headers, code]) => {
          expectStatus(`${c.key} with ${what}`, await answer(c, call(request(app), c, w, { headers })), 401, code);
          checked++;
        }),
      );
    }
    expectUnchanged('calls without a live session', before, await snapshot());
    expect(checked).toBeGreaterThan(50 * CREDENTIALS.length);

    // Public routes answer without signing in, and a browser whose session has ended still reaches them.
    for (const c of cases.filter((route) => route.row.caller === 'anyone')) {
      for (const [what, headers] of CREDENTIALS.slice(0, 4)) {
        const got = await answer(c, call(request(app), c, w, { headers }));
        if ([401, 403].includes(got.status)) problems.push(`${c.key} with ${what}: public, yet answered ${got.status}`);
      }
    }
    expect(problems).toEqual([]);
  }, 120_000);

  it('cookie-authenticated writes without the CSRF header, or with another value, answer 403 and change nothing; bearer writes need no header', async () => {
    const w = await buildWorld();
    const writes = routeCases().filter((c) => c.isWrite);
    expect(writes.length).toBeGreaterThan(35);

    const before = await snapshot();
    for (const c of writes) {
      // Every write route, public ones too: a signed-in browser's cookie must never ride along unchecked.
      const person = c.row.caller === 'anyone' ? 'owner' : c.row.caller;
      const { browser } = w.people[person];
      expectStatus(`${c.key} without the CSRF header`, await answer(c, call(browser.agent, c, w)), 403, 'csrf-failed');
      expectStatus(
        `${c.key} with another CSRF value`,
        await answer(c, call(browser.agent, c, w, { headers: { [CSRF_HEADER]: `${browser.csrf}x` } })),
        403,
        'csrf-failed',
      );
    }
    expectUnchanged('writes refused for CSRF', before, await snapshot());

    // The same writes with a bearer token and no CSRF header do what they say. Deletions go last,
    // the most specific first, and the account itself at the very end.
    const order = (c: RouteCase) => (c.method === 'delete' ? 1_000 - c.path.length : 0);
    for (const c of [...writes].sort((a, b) => order(a) - order(b))) {
      const person = c.row.caller === 'anyone' ? 'owner' : c.row.caller;
      const got = await answer(c, call(request(app), c, w, { headers: w.people[person].bearer }));
      if (c.row.cookieOnly) {
        expectStatus(`${c.key} with a bearer token`, got, 403, 'cookie-session-required');
        const { client, headers } = asBrowser(w, person);
        expectStatus(`${c.key} with the website session`, await answer(c, call(client, c, w, { headers })), c.success);
      } else expectStatus(`${c.key} with a bearer token`, got, c.success);
    }
    // Let the archive just imported finish before the next test empties the tables.
    const unfinished = await db('imports').whereNotIn('status', ['done', 'failed']).select('id');
    for (const { id: importId } of unfinished) await waitForImport(w.people.coach.browser, importId).catch(() => undefined);
    expect(problems).toEqual([]);
  }, 120_000);

  it("another user's ids answer 404, made-up ids 404, garbage 400 or 404, and nothing changes", async () => {
    const w = await buildWorld();
    const GARBAGE = [
      'not-an-id',
      '0',
      encodeURIComponent("1' OR '1'='1"),
      encodeURIComponent('../../etc/passwd'),
      '%E0%A4%A', // malformed percent-encoding
      'x'.repeat(300),
      `${randomUUID()}%00`,
    ];
    const STRANGER: Record<string, Person> = { owner: 'other runner', coach: 'other coach' };
    const cases = routeCases().filter((c) => c.row.params || c.row.runnerIdQuery);
    expect(cases.length).toBeGreaterThan(35);

    const before = await snapshot();
    for (const c of cases) {
      const params = Object.entries(c.row.params ?? {});
      const ids = params.filter(([, p]) => p.kind === 'id').map(([name]) => name);
      const send = (options: CallOptions, as: Caller = callerOf(c, w)) =>
        answer(c, call(as.client, c, w, { ...options, headers: { ...as.headers, ...options.headers } }));
      // The checks of one route are independent reads or refused writes, so they run side by side.
      const checks: Array<Promise<void>> = [];
      const check = (label: string, options: CallOptions, expected: number | number[], as?: Caller) =>
        checks.push(send(options, as).then((got) => expectStatus(label, got, expected)));

      if (ids.length > 0) {
        const stranger = c.row.caller === 'anyone' ? undefined : STRANGER[c.row.caller];
        if (!stranger && !c.row.noStranger) problems.push(`${c.key}: who is a stranger to these ids? (set noStranger)`);
        if (stranger) check(`${c.key} by ${stranger} with the real ids`, {}, 404, asBrowser(w, stranger));
        // No oracle: unrelated people get the same answer for a real id as for one that does not exist.
        const madeUpIds = Object.fromEntries(ids.map((name) => [name, randomUUID()]));
        for (const other of c.row.caller === 'admin' ? [] : (['other runner', 'other coach'] as const)) {
          checks.push(
            Promise.all([send({}, asBrowser(w, other)), send({ params: madeUpIds }, asBrowser(w, other))]).then(
              ([real, missing]) => {
                if (real.status !== missing.status) {
                  problems.push(`${c.key} by ${other}: ${real.status} for the real ids but ${missing.status} for made-up ones`);
                }
              },
            ),
          );
        }
      }
      for (const [name, param] of params) {
        const label = `${c.key} with {${name}}`;
        if (param.kind === 'id') check(`${label} made up`, { params: { [name]: randomUUID() } }, 404);
        if (param.kind === 'secret') {
          const madeUp = `${param.value(w).slice(0, 4)}${randomBytes(32).toString('base64url')}`;
          check(`${label} made up`, { params: { [name]: madeUp } }, param.madeUp);
        }
        const expected = param.kind === 'id' ? [400, 404] : param.kind === 'secret' ? [param.madeUp, 400, 404] : [400];
        for (const garbage of GARBAGE) check(`${label} = ${garbage.slice(0, 40)}`, { params: { [name]: garbage } }, expected);
      }
      if (c.row.runnerIdQuery) {
        const stranger = STRANGER[c.row.caller as string]!;
        check(`${c.key}?runner_id= by ${stranger}`, { query: { runner_id: w.people.owner.id } }, 404, asBrowser(w, stranger));
        check(`${c.key}?runner_id= made up`, { query: { runner_id: randomUUID() } }, 404);
        check(`${c.key}?runner_id= garbage`, { query: { runner_id: "1' OR '1'='1" } }, 400);
      }
      await Promise.all(checks);
    }
    expectUnchanged("calls with other people's or made-up ids", before, await snapshot());
    expect(problems).toEqual([]);
  }, 120_000);

  it('a JSON body over the limit answers 413 on every write route, so does an upload over its limit, and nothing is kept', async () => {
    const w = await buildWorld();
    const limit = Number(/^(\d+)mb$/i.exec(config.jsonLimit)?.[1]) * 1024 * 1024;
    expect(limit).toBeGreaterThan(0);
    const oversized = JSON.stringify({ text: 'x'.repeat(limit + 1024) });
    const writes = routeCases().filter((c) => c.isWrite || c.row.body);

    const before = await snapshot();
    for (const c of writes) {
      const { client, headers } = callerOf(c, w);
      expectStatus(
        `${c.key} with ${Math.round(oversized.length / 1024)} KB of JSON`,
        await answer(c, call(client, c, w, { headers, rawJson: oversized })),
        413,
        'too-large',
      );
    }
    // Uploads: every route that takes files, with one just over its limit.
    const uploads = routeCases().filter((c) => c.row.takes === 'gps-files' || c.row.takes === 'gps-archive');
    expect(uploads.map((c) => c.key).sort()).toEqual(['POST /api/imports', 'POST /api/runs']);
    for (const c of uploads) {
      const { client, headers } = asBrowser(w, 'owner');
      const [field, size, name] =
        c.row.takes === 'gps-files'
          ? ['files', config.uploadMaxFileBytes + 1, 'huge.gpx']
          : ['file', config.uploadMaxArchiveBytes + 1, 'huge.zip'];
      const test = client[c.method](c.path).set(headers).attach(field, randomBytes(size), name);
      expectStatus(`${c.key} with a file of ${size} bytes`, await answer(c, test), 413, 'too-large');
    }
    expectUnchanged('oversized requests', before, await snapshot());
    expect(problems).toEqual([]);
  }, 120_000);

  it('XML entity attacks in a single upload or inside a history archive are refused with a sentence; nothing is fetched, stored or echoed', async () => {
    // A listener on loopback: an external entity or DTD that got fetched would show up here.
    let fetched = 0;
    const listener: Server = createServer((_req, res) => {
      fetched++;
      res.end('<!ENTITY leak "LEAKED-BY-LURE">');
    });
    await new Promise<void>((resolve) => listener.listen(0, '127.0.0.1', resolve));
    const address = listener.address();
    const lure = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}/evil.dtd`;
    try {
      const password = newPassword('xml');
      const { user } = await createUser({ password });
      const browser = await signedInAgent(app, user.email, password);
      const point = (t: string) => `<trkpt lat="46.2" lon="-31.4"><time>2026-01-01T00:00:0${t}Z</time></trkpt>`;
      const track = (name: string) =>
        `<gpx version="1.1" creator="test"><trk><name>${name}</name><trkseg>${point('0')}${point('5')}</trkseg></trk></gpx>`;
      const HEAD = '<?xml version="1.0"?>';
      const HOSTILE: Array<[string, Buffer]> = [
        [
          'billion-laughs.gpx',
          Buffer.from(
            `${HEAD}<!DOCTYPE gpx [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;"><!ENTITY d "&c;&c;&c;&c;&c;&c;&c;&c;&c;&c;">]>${track('&d;')}`,
          ),
        ],
        ['external-file.gpx', Buffer.from(`${HEAD}<!DOCTYPE gpx [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>${track('&xxe;')}`)],
        ['external-url.gpx', Buffer.from(`${HEAD}<!DOCTYPE gpx [<!ENTITY xxe SYSTEM "${lure}">]>${track('&xxe;')}`)],
        [
          'parameter-entity.gpx',
          Buffer.from(`${HEAD}<!DOCTYPE gpx [<!ENTITY % remote SYSTEM "${lure}"> %remote;]>${track('&leak;')}`),
        ],
        ['doctype-system.gpx', Buffer.from(`${HEAD}<!DOCTYPE gpx SYSTEM "${lure}">${track('&leak;')}`)],
        ['doctype-system-only.gpx', Buffer.from(`${HEAD}<!DOCTYPE gpx SYSTEM "${lure}">${track('Lake loop')}`)],
        [
          'external-entity.tcx',
          Buffer.from(
            `${HEAD}<!DOCTYPE TrainingCenterDatabase [<!ENTITY xxe SYSTEM "file:///etc/passwd">]><TrainingCenterDatabase><Activities><Activity Sport="Running"><Notes>&xxe;</Notes></Activity></Activities></TrainingCenterDatabase>`,
          ),
        ],
        [
          'compressed-bomb.gpx.gz',
          gzipSync(`${HEAD}<!DOCTYPE gpx [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;">]>${track('&b;')}`),
        ],
        [
          'utf16-external.gpx',
          Buffer.concat([
            Buffer.from([0xff, 0xfe]),
            Buffer.from(
              `<?xml version="1.0" encoding="UTF-16"?><!DOCTYPE gpx [<!ENTITY xxe SYSTEM "file:///etc/passwd">]>${track('&xxe;')}`,
              'utf16le',
            ),
          ]),
        ],
      ];
      const ECHOES = /root:|\/etc\/passwd|aaaaaaaaaa|LEAKED-BY-LURE|evil\.dtd|127\.0\.0\.1/;
      const isSentence = (text: unknown) => typeof text === 'string' && /^[A-Z][^<>&]*\.$/.test(text);

      for (const [name, content] of HOSTILE) {
        const got = await answer(
          `POST /api/runs with ${name}`,
          browser.agent.post('/api/runs').set(CSRF_HEADER, browser.csrf).attach('files', content, name),
        );
        expectStatus(`POST /api/runs with ${name}`, got, 422);
        const rejected = got.body.rejected as Array<{ error: string }> | undefined;
        if (rejected?.length !== 1 || !isSentence(rejected[0]!.error)) {
          problems.push(`POST /api/runs with ${name}: not refused with a sentence: ${got.text.slice(0, 300)}`);
        }
        if (ECHOES.test(got.text))
          problems.push(`POST /api/runs with ${name}: the answer echoes the file: ${got.text.slice(0, 300)}`);
      }

      const archive = buildZip(HOSTILE.map(([name, data]) => ({ name: `watch/${name}`, data })));
      const started = await answer(
        'POST /api/imports with hostile files',
        browser.agent.post('/api/imports').set(CSRF_HEADER, browser.csrf).attach('file', archive, 'history.zip'),
      );
      expectStatus('POST /api/imports with hostile files', started, 202);
      const importId = (started.body.import as { id: string }).id;
      await waitForImport(browser, importId);
      const progress = await answer('GET /api/imports/{id}', browser.agent.get(`/api/imports/${importId}`));
      const rejected = (progress.body.rejected ?? []) as Array<{ file: string; error: string }>;
      expect(rejected.map((r) => r.file).sort()).toEqual(HOSTILE.map(([name]) => `watch/${name}`).sort());
      for (const r of rejected)
        if (!isSentence(r.error)) problems.push(`import of ${r.file}: not refused with a sentence: ${r.error}`);
      expect(progress.body.imported).toBe(0);
      if (ECHOES.test(progress.text)) problems.push(`GET /api/imports/{id} echoes a file: ${progress.text.slice(0, 300)}`);

      expect(await db('runs').count({ n: '*' }).first()).toEqual({ n: '0' });
      expect(await db('source_files').count({ n: '*' }).first()).toEqual({ n: '0' });
      expect(filesUnder(path.join(dataDir, 'files', user.id))).toEqual([]);
      expect(fetched).toBe(0);
      expect(problems).toEqual([]);
    } finally {
      await new Promise((resolve) => listener.close(resolve));
    }
  }, 120_000);
});
