import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import Stripe from 'stripe';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { createPaymentsClient } from '../../server/features/fees/payments-client.ts';
import { reconcileSubscriptions } from '../../server/features/fees/fees.service.ts';
import { startPaymentFake, type PaymentFake } from '../../server/features/fees/payment-fake.ts';
import { db } from '../../server/lib/db.ts';
import { captureLogLines } from '../../server/lib/logger.ts';
import { addDays, lastDayBefore } from '../../shared/fees/billing-status.ts';
import { BillingAnswerSchema, MyFeesAnswerSchema, TEST_CARDS } from '../../shared/fees/schemas.ts';
import { createUser } from '../support/factories.ts';
import { recordingMailer, testConfig } from '../support/test-app.ts';

/**
 * Coach fees (issue 20) against the local fake of the payment service, driven through the official SDK. Events are
 * signed with the SDK's own test-header helper (`generateTestHeaderString`), as the fake signs its own.
 */

const webhookSecret = `whsec_test_${randomUUID().replace(/-/g, '')}`;
const sdk = new Stripe('sk_test_for_signing');
let fake: PaymentFake;
let app: Express;

function appFor(paymentsUrl: string | null): Express {
  const config = testConfig({ payments: { url: paymentsUrl, secretKey: 'sk_test_local_fake', webhookSecret, fakePort: 0 } });
  return createApp({ config, mailer: recordingMailer, payments: createPaymentsClient(config) });
}

beforeAll(async () => {
  fake = await startPaymentFake({ webhookSecret });
  app = appFor(fake.url);
  fake.setDeliver(
    async (payload, signature) =>
      (
        await request(app)
          .post('/api/payments/webhook')
          .set('content-type', 'application/json')
          .set('stripe-signature', signature)
          .send(payload)
      ).status,
  );
});

afterAll(async () => {
  await fake.close();
});

const today = (at = Date.now()) => new Date(at).toISOString().slice(0, 10);
/**
 * What `expected` gives for the instants just before and just after a payment: one value, or two when the payment ran
 * across midnight (UTC), where the service's "today" may fall on either side. The test then holds at any hour.
 */
const eitherSideOf = <T>(before: number, after: number, expected: (at: number) => T): T[] => [
  ...new Set([expected(before), expected(after)]),
];

async function bearer(role: 'runner' | 'coach') {
  const { user, password } = await createUser({
    role,
    name: role === 'coach' ? 'Test Coach' : `Runner ${randomUUID().slice(0, 4)}`,
  });
  const token = (await request(app).post('/api/auth/token').send({ email: user.email, password })).body.token as string;
  return { id: user.id, auth: { Authorization: `Bearer ${token}` } };
}

/** A coach with a squad of two runners, and a stranger of each role. */
async function world() {
  const coach = await bearer('coach');
  const runner = await bearer('runner');
  const second = await bearer('runner');
  const stranger = await bearer('runner');
  const otherCoach = await bearer('coach');
  const squad = (await request(app).post('/api/squads').set(coach.auth).send({ name: 'Harbor Line' })).body.squad.id as string;
  await db('squad_members').insert([
    { squad_id: squad, runner_id: runner.id },
    { squad_id: squad, runner_id: second.id },
  ]);
  return { coach, runner, second, stranger, otherCoach, squad };
}

type World = Awaited<ReturnType<typeof world>>;

async function setMonthly(w: World, amount = 4500, extra: object = {}) {
  const res = await request(app)
    .put(`/api/squads/${w.squad}/fee`)
    .set(w.coach.auth)
    .send({ kind: 'monthly', amount_minor: amount, currency: 'USD', ...extra });
  expect(res.status).toBe(200);
  return res;
}

async function pay(w: World, who: { auth: Record<string, string> }, card: string = TEST_CARDS.pays) {
  const checkout = await request(app).post(`/api/squads/${w.squad}/checkout`).set(who.auth);
  expect(checkout.status).toBe(201);
  const done = await request(app).post('/api/dev/payments/complete').send({ url: checkout.body.url, card });
  expect(done.status).toBe(200);
  return done.body as { outcome: string };
}

async function billing(w: World) {
  const res = await request(app).get(`/api/squads/${w.squad}/billing`).set(w.coach.auth);
  expect(res.status).toBe(200);
  return BillingAnswerSchema.parse(res.body);
}

const memberOf = (b: Awaited<ReturnType<typeof billing>>, id: string) => b.members.find((m) => m.runner_id === id)!;

function signed(event: object, options: { secret?: string; timestamp?: number } = {}) {
  const payload = JSON.stringify(event);
  const header = sdk.webhooks.generateTestHeaderString({
    payload,
    secret: options.secret ?? webhookSecret,
    timestamp: options.timestamp,
  });
  return { payload, header };
}

function postEvent(payload: string, header?: string) {
  const test = request(app).post('/api/payments/webhook').set('content-type', 'application/json');
  return (header ? test.set('stripe-signature', header) : test).send(payload);
}

const nowS = () => Math.floor(Date.now() / 1000);

function invoicePaid(
  w: World,
  runnerId: string,
  options: { id?: string; start?: number; end?: number; amount?: number; subscription?: string } = {},
) {
  const start = options.start ?? nowS();
  const end = options.end ?? start + 30 * 86_400;
  return {
    id: `evt_${randomUUID().replace(/-/g, '')}`,
    object: 'event',
    created: nowS(),
    type: 'invoice.paid',
    data: {
      object: {
        id: options.id ?? `in_${randomUUID().replace(/-/g, '')}`,
        object: 'invoice',
        amount_paid: options.amount ?? 4500,
        currency: 'usd',
        status_transitions: { paid_at: start },
        lines: { data: [{ period: { start, end } }] },
        parent: {
          subscription_details: {
            subscription: options.subscription ?? 'sub_ordered',
            metadata: { squad_id: w.squad, runner_id: runnerId },
          },
        },
      },
    },
  };
}

function subscriptionEvent(w: World, runnerId: string, created: number, fields: object) {
  return {
    id: `evt_${randomUUID().replace(/-/g, '')}`,
    object: 'event',
    created,
    type: 'customer.subscription.updated',
    data: {
      object: {
        id: 'sub_ordered',
        object: 'subscription',
        status: 'active',
        cancel_at_period_end: false,
        metadata: { squad_id: w.squad, runner_id: runnerId },
        ...fields,
      },
    },
  };
}

async function tableCounts() {
  const counts: Record<string, string> = {};
  for (const table of ['payment_events', 'fee_payers', 'fee_receipts', 'payment_customers', 'squad_fees'] as const)
    counts[table] = String((await db(table).count({ n: '*' }).first())?.n);
  return counts;
}

describe('PUT /api/squads/:id/fee', () => {
  it('the coach sets none, monthly or a block; the answer is the stored fee', async () => {
    const w = await world();
    const monthly = await setMonthly(w, 4500, { first_month_discount_minor: 500 });
    expect(monthly.body.fee).toEqual({
      kind: 'monthly',
      amount_minor: 4500,
      currency: 'USD',
      first_month_discount_minor: 500,
      block_weeks: null,
    });
    const block = await request(app)
      .put(`/api/squads/${w.squad}/fee`)
      .set(w.coach.auth)
      .send({ kind: 'block', amount_minor: 12000, currency: 'EUR', block_weeks: 12 });
    expect(block.body.fee).toMatchObject({ kind: 'block', amount_minor: 12000, currency: 'EUR', block_weeks: 12 });
    const none = await request(app).put(`/api/squads/${w.squad}/fee`).set(w.coach.auth).send({ kind: 'none' });
    expect(none.body.fee).toEqual({
      kind: 'none',
      amount_minor: null,
      currency: null,
      first_month_discount_minor: null,
      block_weeks: null,
    });
    // Runners of the squad read it; strangers cannot.
    expect((await request(app).get(`/api/squads/${w.squad}/fee`).set(w.runner.auth)).body.fee.kind).toBe('none');
    expect((await request(app).get(`/api/squads/${w.squad}/fee`).set(w.stranger.auth)).status).toBe(404);
  });

  it('refuses a fee of 0, negative, fractional, absurdly high, in an unknown currency or with stray fields, and changes nothing', async () => {
    const w = await world();
    await setMonthly(w, 4500);
    const before = await tableCounts();
    const stored = await db('squad_fees').first();
    const BAD: Array<[object, RegExp]> = [
      [{ kind: 'monthly', amount_minor: 0, currency: 'USD' }, /between 1\.00 and 1000\.00 USD/],
      [{ kind: 'monthly', amount_minor: -4500, currency: 'USD' }, /between/],
      [{ kind: 'monthly', amount_minor: 45.5, currency: 'USD' }, /whole number/],
      [{ kind: 'monthly', amount_minor: 1e12, currency: 'USD' }, /between/],
      [{ kind: 'monthly', amount_minor: 4500, currency: 'XYZ' }, /Pick one of these currencies/],
      [{ kind: 'monthly', amount_minor: 4500 }, /Pick the currency/],
      [{ kind: 'none', amount_minor: 4500 }, /without a fee takes no amount/],
      [{ kind: 'block', amount_minor: 4500, currency: 'USD', block_weeks: 0 }, /1 to 52 weeks/],
      [{ kind: 'monthly', amount_minor: 4500, currency: 'USD', first_month_discount_minor: 4500 }, /at least 1\.00 USD/],
      [{ kind: 'monthly', amount_minor: '4500', currency: 'USD' }, /whole number/],
    ];
    for (const [body, message] of BAD) {
      const res = await request(app).put(`/api/squads/${w.squad}/fee`).set(w.coach.auth).send(body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(JSON.stringify(res.body), JSON.stringify(body)).toMatch(message);
    }
    expect(await tableCounts()).toEqual(before);
    expect(await db('squad_fees').first()).toEqual(stored);
  });

  it('a runner gets 403; another coach gets 404 for a squad that is not theirs', async () => {
    const w = await world();
    const body = { kind: 'monthly', amount_minor: 4500, currency: 'USD' };
    expect((await request(app).put(`/api/squads/${w.squad}/fee`).set(w.runner.auth).send(body)).status).toBe(403);
    expect((await request(app).put(`/api/squads/${w.squad}/fee`).set(w.otherCoach.auth).send(body)).status).toBe(404);
    expect(await db('squad_fees').count({ n: '*' }).first()).toEqual({ n: '0' });
  });
});

describe('POST /api/squads/:id/checkout and the fake checkout page', () => {
  it('a runner pays the monthly fee with the test card: receipt, paid through the period end, coach sees "paid"', async () => {
    const w = await world();
    const before = Date.now();
    await setMonthly(w, 4500);
    const checkout = await request(app).post(`/api/squads/${w.squad}/checkout`).set(w.runner.auth);
    expect(checkout.status).toBe(201);
    expect(checkout.body.url).toMatch(new RegExp(`^${fake.url}/checkout/cs_test_`));
    // The hosted page is the fake's: our server never sees a card number.
    const page = await fetch(checkout.body.url as string);
    expect(await page.text()).toContain('Card number');

    expect(
      (await request(app).post('/api/dev/payments/complete').send({ url: checkout.body.url, card: TEST_CARDS.pays })).body
        .outcome,
    ).toBe('paid');
    const b = await billing(w);
    const after = Date.now();
    const paid = memberOf(b, w.runner.id);
    expect(paid.status).toBe('paid');
    // One calendar month from the payment (the fake bills like the service: same time next month); the period ends
    // during that day, so it is the last day paid for.
    const lastDayPaid = (at: number) => {
      const next = new Date(at);
      next.setUTCMonth(next.getUTCMonth() + 1);
      return lastDayBefore(Math.floor(next.getTime() / 1000));
    };
    expect(eitherSideOf(before, after, lastDayPaid)).toContain(paid.paid_through);
    expect(paid.receipts).toHaveLength(1);
    expect(paid.receipts[0]).toMatchObject({ amount_minor: 4500, currency: 'USD' });
    expect(memberOf(b, w.second.id).status).toBe('due');
    expect(b.totals).toHaveLength(1);
    expect(eitherSideOf(before, after, (at) => today(at).slice(0, 7))).toContain(b.totals[0]!.month);
    expect(b.totals[0]).toMatchObject({ currency: 'USD', amount_minor: 4500, payments: 1 });

    const mine = MyFeesAnswerSchema.parse((await request(app).get('/api/me/fees').set(w.runner.auth)).body);
    expect(mine.fees[0]).toMatchObject({ status: 'paid', has_subscription: true, receipts: [{ amount_minor: 4500 }] });
    // Paying twice is refused with a sentence.
    const again = await request(app).post(`/api/squads/${w.squad}/checkout`).set(w.runner.auth);
    expect(again.status).toBe(409);
    expect(again.body.error).toMatch(/already pay/);
  });

  it('a declined card leaves the runner due, with no receipt', async () => {
    const w = await world();
    await setMonthly(w);
    expect(await pay(w, w.second, TEST_CARDS.declined)).toEqual({ outcome: 'declined', message: 'Your card was declined.' });
    const b = await billing(w);
    expect(memberOf(b, w.second.id)).toMatchObject({ status: 'due', paid_through: null, receipts: [] });
    expect(await db('fee_receipts').count({ n: '*' }).first()).toEqual({ n: '0' });
  });

  it('the first-month discount is taken off the first payment only', async () => {
    const w = await world();
    await setMonthly(w, 4500, { first_month_discount_minor: 1500 });
    await pay(w, w.runner);
    expect(memberOf(await billing(w), w.runner.id).receipts[0]?.amount_minor).toBe(3000);
  });

  it('a one-off block fee is paid in payment mode and covers N weeks from today', async () => {
    const w = await world();
    await request(app)
      .put(`/api/squads/${w.squad}/fee`)
      .set(w.coach.auth)
      .send({ kind: 'block', amount_minor: 9000, currency: 'GBP', block_weeks: 12 });
    const before = Date.now();
    await pay(w, w.runner);
    const member = memberOf(await billing(w), w.runner.id);
    const firstDay = member.receipts[0]?.period_start ?? '';
    expect(eitherSideOf(before, Date.now(), today)).toContain(firstDay);
    expect(member).toMatchObject({ status: 'paid', paid_through: addDays(firstDay, 12 * 7 - 1) });
    expect(member.receipts[0]).toMatchObject({ amount_minor: 9000, currency: 'GBP' });
  });

  it('a runner not in the squad gets 404, a squad without a fee 409, and nothing is made', async () => {
    const w = await world();
    expect((await request(app).post(`/api/squads/${w.squad}/checkout`).set(w.runner.auth)).status).toBe(409);
    await setMonthly(w);
    const before = await tableCounts();
    const res = await request(app).post(`/api/squads/${w.squad}/checkout`).set(w.stranger.auth);
    expect(res.status).toBe(404);
    expect(await tableCounts()).toEqual(before);
  });

  it('with the payment service down, the runner reads a clear sentence and nothing is half-made', async () => {
    const w = await world();
    await setMonthly(w);
    const down = await startPaymentFake({ webhookSecret });
    const downUrl = down.url;
    await down.close();
    const before = await tableCounts();
    const res = await request(appFor(downUrl)).post(`/api/squads/${w.squad}/checkout`).set(w.runner.auth);
    expect(res.status).toBe(503);
    expect(res.body.error).toBe(
      'The payment service cannot be reached just now, so nothing was charged. Please try again in a few minutes.',
    );
    expect(await tableCounts()).toEqual(before);
  });

  it('cancelling stops at the end of the paid period: the service is told, the coach sees cancelled with the date', async () => {
    const w = await world();
    await setMonthly(w);
    await pay(w, w.runner);
    expect((await request(app).post(`/api/squads/${w.squad}/fee/cancel`).set(w.runner.auth)).status).toBe(204);
    const member = memberOf(await billing(w), w.runner.id);
    expect(member).toMatchObject({ status: 'cancelled', cancel_at_period_end: true });
    expect(member.paid_through).not.toBeNull();
    const payer = await db('fee_payers').where({ runner_id: w.runner.id }).first();
    expect(fake.subscriptions().find((s) => s.id === payer?.subscription_id)?.cancel_at_period_end).toBe(true);
    // The hosted portal link for the card on file.
    const portal = await request(app).post('/api/me/fees/portal').set(w.runner.auth);
    expect(portal.status).toBe(201);
    expect(portal.body.url).toMatch(new RegExp(`^${fake.url}/portal/bps_`));
  });

  it('a fee change applies from the next period: the running subscription takes the new price, the paid receipt stays', async () => {
    const w = await world();
    await setMonthly(w, 4500);
    await pay(w, w.runner);
    await setMonthly(w, 5000);
    const payer = await db('fee_payers').where({ runner_id: w.runner.id }).first();
    const subscription = fake.subscriptions().find((s) => s.id === payer?.subscription_id) as {
      items: { data: Array<{ price: { unit_amount: number } }> };
    };
    expect(subscription.items.data[0]?.price.unit_amount).toBe(5000);
    expect(memberOf(await billing(w), w.runner.id).receipts.map((r) => r.amount_minor)).toEqual([4500]);
  });
});

describe('POST /api/payments/webhook', () => {
  it('refuses unsigned, forged and stale events with 400 and changes nothing', async () => {
    const w = await world();
    const event = invoicePaid(w, w.runner.id);
    const before = await tableCounts();
    const { payload } = signed(event);
    const unsigned = await postEvent(payload);
    const forged = await postEvent(payload, signed(event, { secret: 'whsec_someone_else' }).header);
    const stale = await postEvent(payload, signed(event, { timestamp: nowS() - 301 }).header);
    // A valid signature over other bytes: the body was changed on the way.
    const tampered = await postEvent(payload.replace('4500', '1'), signed(event).header);
    for (const res of [unsigned, forged, stale, tampered]) {
      expect(res.status).toBe(400);
      expect(res.body.code).toBe('bad-signature');
    }
    expect(await tableCounts()).toEqual(before);
  });

  it('the same event delivered five times makes one change', async () => {
    const w = await world();
    await setMonthly(w);
    const { payload, header } = signed(invoicePaid(w, w.runner.id));
    const answers = await Promise.all(Array.from({ length: 5 }, () => postEvent(payload, header)));
    expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200, 200]);
    expect(answers.filter((a) => a.body.outcome === 'duplicate')).toHaveLength(4);
    expect(await db('fee_receipts').count({ n: '*' }).first()).toEqual({ n: '1' });
    expect(await db('payment_events').count({ n: '*' }).first()).toEqual({ n: '1' });
  });

  it('handles events in any order: a late checkout.session.completed after invoice.paid, an old subscription state after a new one', async () => {
    const w = await world();
    await setMonthly(w);
    const end = nowS() + 30 * 86_400;
    const invoice = signed(invoicePaid(w, w.runner.id, { end }));
    expect((await postEvent(invoice.payload, invoice.header)).status).toBe(200);
    const session = signed({
      id: `evt_${randomUUID().replace(/-/g, '')}`,
      object: 'event',
      created: nowS() - 5,
      type: 'checkout.session.completed',
      data: {
        object: {
          id: 'cs_test_late',
          object: 'checkout.session',
          mode: 'subscription',
          subscription: 'sub_ordered',
          payment_status: 'paid',
          metadata: { squad_id: w.squad, runner_id: w.runner.id },
        },
      },
    });
    expect((await postEvent(session.payload, session.header)).body.outcome).toBe('subscription linked');
    expect(memberOf(await billing(w), w.runner.id)).toMatchObject({ status: 'paid', paid_through: lastDayBefore(end) });

    // An older invoice arriving later never moves "paid through" back.
    const older = signed(invoicePaid(w, w.runner.id, { start: nowS() - 60 * 86_400, end: nowS() - 30 * 86_400 }));
    await postEvent(older.payload, older.header);
    expect(memberOf(await billing(w), w.runner.id).paid_through).toBe(lastDayBefore(end));

    const newer = signed(subscriptionEvent(w, w.runner.id, nowS(), { cancel_at_period_end: true }));
    const stale = signed(subscriptionEvent(w, w.runner.id, nowS() - 100, { cancel_at_period_end: false }));
    await postEvent(newer.payload, newer.header);
    expect((await postEvent(stale.payload, stale.header)).body.outcome).toBe('older than the stored state');
    expect(memberOf(await billing(w), w.runner.id).status).toBe('cancelled');
  });

  it('an event for an unknown customer is logged and acknowledged', async () => {
    const w = await world();
    const lines: string[] = [];
    const stop = captureLogLines((line) => lines.push(line), 'warn');
    try {
      const { payload, header } = signed(invoicePaid({ ...w, squad: randomUUID() }, randomUUID()));
      const res = await postEvent(payload, header);
      expect(res.status).toBe(200);
      expect(res.body.outcome).toBe('unknown runner or squad');
    } finally {
      stop();
    }
    expect(lines.some((line) => line.includes('unknown customer'))).toBe(true);
    expect(await db('fee_receipts').count({ n: '*' }).first()).toEqual({ n: '0' });
  });
});

describe('GET /api/squads/:id/billing', () => {
  it('shows overdue with the days since the paid period ended, waived, and never locks the runner out', async () => {
    const w = await world();
    await setMonthly(w);
    const start = nowS() - 36 * 86_400;
    const end = start + 30 * 86_400;
    const { payload, header } = signed(invoicePaid(w, w.runner.id, { start, end }));
    await postEvent(payload, header);
    const before = Date.now();
    const member = memberOf(await billing(w), w.runner.id);
    expect(member.status).toBe('overdue');
    const overdueDays = (at: number) =>
      Math.round((Date.parse(`${today(at)}T00:00:00Z`) - Date.parse(`${lastDayBefore(end)}T00:00:00Z`)) / 86_400_000);
    expect(eitherSideOf(before, Date.now(), overdueDays)).toContain(member.overdue_days);
    expect(member.overdue_days).toBeGreaterThanOrEqual(5);
    // Overdue changes nothing about the runner's own data.
    expect((await request(app).get('/api/runs').set(w.runner.auth)).status).toBe(200);

    expect(
      (
        await request(app)
          .put(`/api/squads/${w.squad}/members/${w.second.id}/fee-waiver`)
          .set(w.coach.auth)
          .send({ waived: true })
      ).status,
    ).toBe(200);
    expect(memberOf(await billing(w), w.second.id).status).toBe('waived');
    expect((await request(app).post(`/api/squads/${w.squad}/checkout`).set(w.second.auth)).status).toBe(409);
  });

  it('another coach reading the squad gets 404; a runner 403', async () => {
    const w = await world();
    expect((await request(app).get(`/api/squads/${w.squad}/billing`).set(w.otherCoach.auth)).status).toBe(404);
    expect((await request(app).get(`/api/squads/${w.squad}/billing`).set(w.runner.auth)).status).toBe(403);
    expect((await request(app).get(`/api/squads/${w.squad}/billing.csv`).set(w.otherCoach.auth)).status).toBe(404);
  });

  it('the CSV has one row per runner with status, paid through and the total paid', async () => {
    const w = await world();
    await setMonthly(w, 4500);
    await pay(w, w.runner);
    const res = await request(app).get(`/api/squads/${w.squad}/billing.csv`).set(w.coach.auth);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toBe('runner,status,paid_through,overdue_days,cancel_at_period_end,payments,paid_total,currency');
    expect(lines).toHaveLength(3);
    expect(lines.find((l) => l.includes(',paid,'))).toMatch(/,paid,\d{4}-\d\d-\d\d,0,no,1,45\.00,USD$/);
    expect(lines.find((l) => l.includes(',due,'))).toMatch(/,due,,0,no,0,0\.00,USD$/);
  });
});

describe('the nightly reconcile', () => {
  it('finds no difference after a normal payment, and reports one when the stored state drifts', async () => {
    const w = await world();
    await setMonthly(w);
    await pay(w, w.runner);
    const stripe = createPaymentsClient(
      testConfig({ payments: { url: fake.url, secretKey: 'sk_test_local_fake', webhookSecret, fakePort: 0 } }),
    )!;
    const payer = (await db('fee_payers').where({ runner_id: w.runner.id }).first())!;
    const own = (await reconcileSubscriptions(stripe)).filter((d) => d.subscription_id === payer.subscription_id);
    expect(own).toEqual([]);
    await db('fee_payers').where({ runner_id: w.runner.id }).update({ cancel_at_period_end: true, paid_through: '2020-01-31' });
    const drift = (await reconcileSubscriptions(stripe)).filter((d) => d.subscription_id === payer.subscription_id);
    expect(drift.map((d) => d.what).sort()).toEqual(['cancel at period end', 'paid through']);
  });
});
