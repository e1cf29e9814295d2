/**
 * The local fake of the payment service (development and tests only; never imported in production — see
 * README.md). It answers the subset of the service's HTTP API that Pacewright calls through the official SDK
 * (customers, coupons, checkout sessions, subscriptions, invoices, portal sessions), serves a plain checkout
 * page where the service's public test card numbers pay or decline, and delivers events signed with the SDK's
 * own test-header helper to the app's webhook.
 *
 * State lives in memory: a restart forgets everything, which is fine for a development double.
 */
import { randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import Stripe from 'stripe';
import { isCurrencyCode, minorToDecimalText } from '../../../shared/fees/currencies.ts';
import { TEST_CARDS } from '../../../shared/fees/schemas.ts';

type Json = Record<string, unknown>;

export interface PaymentFake {
  url: string;
  /** Where events go; set once the app listens. */
  setDeliver(deliver: Deliver): void;
  subscriptions(): Json[];
  close(): Promise<void>;
}

/** Hands one signed event to the app; resolves with the HTTP status the app answered. */
export type Deliver = (payload: string, signature: string) => Promise<number>;

const MAX_BODY_BYTES = 64 * 1024;
const signer = new Stripe('sk_test_signer_only');

const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
const nowSeconds = () => Math.floor(Date.now() / 1000);

/** `line_items[0][price_data][unit_amount]=4500` → `{line_items: {0: {price_data: {unit_amount: '4500'}}}}`. */
export function parseBracketForm(body: string): Json {
  const out: Json = {};
  for (const [key, value] of new URLSearchParams(body)) {
    const parts = key.replace(/\]/g, '').split('[');
    let node = out;
    parts.forEach((part, i) => {
      if (part === '__proto__' || part === 'constructor' || part === 'prototype') return;
      if (i === parts.length - 1) node[part] = value;
      else node = (node[part] ??= {}) as Json;
    });
  }
  return out;
}

/** One calendar month after `unixSeconds` (UTC), as the service bills monthly subscriptions. */
function addMonth(unixSeconds: number): number {
  const d = new Date(unixSeconds * 1000);
  d.setUTCMonth(d.getUTCMonth() + 1);
  return Math.floor(d.getTime() / 1000);
}

const escapeHtml = (text: string) =>
  text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title><link rel="icon" href="data:,"><style>
body{font-family:system-ui,sans-serif;background:#eef1f5;color:#222;margin:0;padding:24px}
main{max-width:420px;margin:0 auto;background:#fff;border:1px solid #cdd3db;border-radius:6px;padding:20px}
label{display:block;margin:12px 0 4px}input{width:100%;box-sizing:border-box;font-size:18px;padding:10px;border:1px solid #889}
button{margin-top:14px;width:100%;min-height:44px;font-size:17px;background:#334;color:#fff;border:0;border-radius:4px}
.note{font-size:14px;color:#555}.error{color:#8a1c1c;font-weight:600}
</style></head><body><main>${body}</main></body></html>`;
}

interface Session extends Json {
  id: string;
  mode: 'subscription' | 'payment';
  status: 'open' | 'complete' | 'expired';
  customer: string;
  metadata: Json;
  success_url: string;
  cancel_url: string;
  amount_total: number;
  currency: string;
  url: string;
}

export async function startPaymentFake(options: {
  port?: number;
  webhookSecret: string;
  deliver?: Deliver;
}): Promise<PaymentFake> {
  let deliver: Deliver | undefined = options.deliver;
  const customers = new Map<string, Json>();
  const coupons = new Map<string, Json>();
  const sessions = new Map<string, Session>();
  const subscriptions = new Map<string, Json>();
  const invoices = new Map<string, Json>();
  const portals = new Map<string, Json>();
  let base = '';

  async function send(type: string, object: Json): Promise<void> {
    const event = {
      id: newId('evt'),
      object: 'event',
      api_version: '2026-11-18.endive',
      created: nowSeconds(),
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      type,
      data: { object },
    };
    const payload = JSON.stringify(event);
    if (!deliver) return;
    // The service retries failed deliveries; a development double tries three times, then gives up.
    for (let attempt = 1; attempt <= 3; attempt++) {
      const signature = signer.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret });
      const status = await deliver(payload, signature).catch(() => 0);
      if (status >= 200 && status < 300) return;
    }
  }

  function invoiceFor(subscription: Json, amount: number, start: number, end: number): Json {
    const invoice = {
      id: newId('in'),
      object: 'invoice',
      customer: subscription.customer,
      status: 'paid',
      amount_paid: amount,
      amount_due: amount,
      currency: subscription.currency,
      created: nowSeconds(),
      status_transitions: { paid_at: nowSeconds() },
      period_start: start,
      period_end: end,
      lines: { object: 'list', data: [{ period: { start, end }, amount, currency: subscription.currency }] },
      parent: {
        type: 'subscription_details',
        subscription_details: { subscription: subscription.id, metadata: subscription.metadata },
      },
    };
    invoices.set(invoice.id, invoice);
    return invoice;
  }

  /** A test card paid: the session completes; a subscription and its first invoice appear; events go out. */
  async function complete(session: Session): Promise<void> {
    session.status = 'complete';
    session.payment_status = 'paid';
    if (session.mode === 'subscription') {
      const start = nowSeconds();
      const end = addMonth(start);
      const line = session.line as { unit_amount: number; currency: string };
      const subscription: Json = {
        id: newId('sub'),
        object: 'subscription',
        customer: session.customer,
        status: 'active',
        cancel_at_period_end: false,
        currency: line.currency,
        metadata: session.metadata,
        created: start,
        items: {
          object: 'list',
          data: [
            {
              id: newId('si'),
              object: 'subscription_item',
              price: {
                id: newId('price'),
                unit_amount: line.unit_amount,
                currency: line.currency,
                recurring: { interval: 'month' },
              },
              current_period_start: start,
              current_period_end: end,
            },
          ],
        },
      };
      subscriptions.set(subscription.id as string, subscription);
      session.subscription = subscription.id;
      const invoice = invoiceFor(subscription, session.amount_total, start, end);
      session.invoice = invoice.id;
      await send('checkout.session.completed', session);
      await send('invoice.paid', invoice);
    } else {
      session.payment_intent = newId('pi');
      await send('checkout.session.completed', session);
    }
  }

  async function api(method: string, path: string, form: Json, query: URLSearchParams): Promise<[number, Json]> {
    const seg = path.split('/').filter(Boolean); // ['v1', ...]
    if (method === 'POST' && path === '/v1/customers') {
      const customer = {
        id: newId('cus'),
        object: 'customer',
        email: form.email ?? null,
        metadata: form.metadata ?? {},
        created: nowSeconds(),
      };
      customers.set(customer.id, customer);
      return [200, customer];
    }
    if (method === 'POST' && path === '/v1/coupons') {
      const coupon = {
        id: newId('coupon'),
        object: 'coupon',
        amount_off: Number(form.amount_off),
        currency: form.currency,
        duration: form.duration,
      };
      coupons.set(coupon.id, coupon);
      return [200, coupon];
    }
    if (method === 'POST' && path === '/v1/checkout/sessions') {
      const mode = form.mode === 'payment' ? 'payment' : 'subscription';
      const customer = String(form.customer ?? '');
      if (!customers.has(customer))
        return [400, { error: { type: 'invalid_request_error', message: `No such customer: '${customer}'` } }];
      const item = ((form.line_items as Json | undefined)?.['0'] ?? {}) as Json;
      const priceData = (item.price_data ?? {}) as Json;
      const unitAmount = Number(priceData.unit_amount);
      const currency = String(priceData.currency ?? '');
      if (!Number.isInteger(unitAmount) || unitAmount <= 0 || !currency)
        return [400, { error: { type: 'invalid_request_error', message: 'line_items[0][price_data] is incomplete' } }];
      const couponId = (((form.discounts as Json | undefined)?.['0'] ?? {}) as Json).coupon as string | undefined;
      const discount = couponId ? Number(coupons.get(couponId)?.amount_off ?? 0) : 0;
      const id = newId('cs_test');
      const metadata = {
        ...((form.metadata as Json) ?? {}),
        ...(((form.subscription_data as Json | undefined)?.metadata as Json) ?? {}),
      };
      const session: Session = {
        id,
        object: 'checkout.session',
        mode,
        status: 'open',
        payment_status: 'unpaid',
        customer,
        metadata,
        client_reference_id: form.client_reference_id ?? null,
        success_url: String(form.success_url ?? ''),
        cancel_url: String(form.cancel_url ?? ''),
        amount_total: unitAmount - discount,
        currency,
        line: { unit_amount: unitAmount, currency, name: ((priceData.product_data as Json | undefined)?.name as string) ?? '' },
        subscription: null,
        created: nowSeconds(),
        url: `${base}/checkout/${id}`,
      };
      sessions.set(id, session);
      return [200, session];
    }
    if (method === 'GET' && seg[1] === 'checkout' && seg[2] === 'sessions' && seg[3]) {
      const session = sessions.get(seg[3]);
      return session ? [200, session] : [404, { error: { type: 'invalid_request_error', message: 'No such checkout session' } }];
    }
    if (method === 'GET' && path === '/v1/subscriptions') {
      const status = query.get('status');
      const data = [...subscriptions.values()].filter((s) => status === 'all' || s.status === (status ?? 'active'));
      return [200, { object: 'list', data, has_more: false, url: '/v1/subscriptions' }];
    }
    if (seg[1] === 'subscriptions' && seg[2]) {
      const subscription = subscriptions.get(seg[2]);
      if (!subscription) return [404, { error: { type: 'invalid_request_error', message: 'No such subscription' } }];
      if (method === 'POST') {
        if (form.cancel_at_period_end !== undefined) subscription.cancel_at_period_end = form.cancel_at_period_end === 'true';
        const newPrice = ((((form.items as Json | undefined)?.['0'] ?? {}) as Json).price_data ?? null) as Json | null;
        const item = ((subscription.items as Json).data as Json[])[0]!;
        // Without proration the new price is billed from the next invoice on.
        if (newPrice)
          item.price = { ...(item.price as Json), unit_amount: Number(newPrice.unit_amount), currency: newPrice.currency };
        await send('customer.subscription.updated', subscription);
      }
      return [200, subscription];
    }
    if (method === 'GET' && path === '/v1/invoices') {
      const customer = query.get('customer');
      const data = [...invoices.values()].filter((i) => !customer || i.customer === customer);
      return [200, { object: 'list', data, has_more: false, url: '/v1/invoices' }];
    }
    if (method === 'POST' && path === '/v1/billing_portal/sessions') {
      const portal = {
        id: newId('bps'),
        object: 'billing_portal.session',
        customer: form.customer,
        return_url: form.return_url,
        url: '',
      };
      portal.url = `${base}/portal/${portal.id}`;
      portals.set(portal.id, portal);
      return [200, portal];
    }
    return [404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${method}: ${path})` } }];
  }

  function checkoutPage(session: Session, message = ''): string {
    const code = session.currency.toUpperCase();
    const amount = `${isCurrencyCode(code) ? minorToDecimalText(session.amount_total, code) : session.amount_total} ${code}`;
    const what = session.mode === 'subscription' ? `${amount} now, then monthly` : `${amount} once`;
    return page(
      'Test checkout',
      `<h1>Test checkout</h1><p>${escapeHtml(String((session.line as Json).name ?? ''))}</p><p><strong>${escapeHtml(what)}</strong></p>
<p class="note">Local payment double: no real money moves. Card ${TEST_CARDS.pays} pays; ${TEST_CARDS.declined} is declined.</p>
${message ? `<p class="error" role="alert">${escapeHtml(message)}</p>` : ''}
<form method="post" action="/checkout/${escapeHtml(session.id)}"><label for="card">Card number</label>
<input id="card" name="card" inputmode="numeric" autocomplete="off" required><button type="submit">Pay</button></form>
<p><a href="${escapeHtml(session.cancel_url)}">Back without paying</a></p>`,
    );
  }

  async function pages(req: IncomingMessage, res: ServerResponse, path: string, body: string): Promise<void> {
    const [, area, id, action] = path.split('/');
    const html = (status: number, text: string) => {
      res.writeHead(status, { 'content-type': 'text/html; charset=utf-8' });
      res.end(text);
    };
    if (area === 'checkout' && id) {
      const session = sessions.get(id);
      if (!session) return html(404, page('Not found', '<p>This checkout does not exist.</p>'));
      if (session.status !== 'open') return html(410, page('Done', '<p>This checkout is already finished.</p>'));
      if (req.method === 'GET') return html(200, checkoutPage(session));
      const card = String(new URLSearchParams(body).get('card') ?? '').replace(/\s/g, '');
      if (card === TEST_CARDS.declined) return html(402, checkoutPage(session, 'Your card was declined.'));
      if (card !== TEST_CARDS.pays) return html(400, checkoutPage(session, 'Use one of the test card numbers shown above.'));
      await complete(session);
      res.writeHead(303, { location: session.success_url });
      return void res.end();
    }
    if (area === 'portal' && id) {
      const portal = portals.get(id);
      if (!portal) return html(404, page('Not found', '<p>This page does not exist.</p>'));
      const owned = [...subscriptions.values()].filter((s) => s.customer === portal.customer);
      if (req.method === 'POST' && action === 'cancel') {
        for (const s of owned) {
          s.cancel_at_period_end = true;
          await send('customer.subscription.updated', s);
        }
        res.writeHead(303, { location: String(portal.return_url) });
        return void res.end();
      }
      const list = owned.map(
        (s) => `<li>${escapeHtml(s.id as string)}: ${s.cancel_at_period_end ? 'ends at period end' : 'renews monthly'}</li>`,
      );
      return html(
        200,
        page(
          'Test billing portal',
          `<h1>Test billing portal</h1><ul>${list.join('')}</ul><form method="post" action="/portal/${escapeHtml(id)}/cancel"><button>Cancel at period end</button></form>
<p><a href="${escapeHtml(String(portal.return_url))}">Back</a></p>`,
        ),
      );
    }
    html(404, page('Not found', '<p>Not found.</p>'));
  }

  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > MAX_BODY_BYTES) req.destroy();
      else chunks.push(chunk);
    });
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const url = new URL(req.url ?? '/', 'http://fake.local');
      const handle = url.pathname.startsWith('/v1/')
        ? api(req.method ?? 'GET', url.pathname, parseBracketForm(body), url.searchParams).then(([status, json]) => {
            res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req') });
            res.end(JSON.stringify(json));
          })
        : pages(req, res, url.pathname, body);
      handle.catch((err: unknown) => {
        res.writeHead(500, { 'content-type': 'application/json' });
        res.end(JSON.stringify({ error: { type: 'api_error', message: String(err) } }));
      });
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', resolve);
  });
  const address = server.address();
  base = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}`;
  return {
    url: base,
    setDeliver(next) {
      deliver = next;
    },
    subscriptions: () => [...subscriptions.values()],
    async close() {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
