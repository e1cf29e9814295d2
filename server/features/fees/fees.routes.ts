import { CSV } from '../../../shared/api/media-types.ts';
import type { Request } from 'express';
import type Stripe from 'stripe';
import { z } from 'zod';
import { toCsv } from '../../../shared/csv/csv-writer.ts';
import { minorToDecimalText, isCurrencyCode } from '../../../shared/fees/currencies.ts';
import {
  BillingAnswerSchema,
  DevCompleteAnswerSchema,
  DevCompleteInputSchema,
  FeeAnswerSchema,
  FeeWaiverAnswerSchema,
  FeeInputSchema,
  MyFeesAnswerSchema,
  UrlAnswerSchema,
  WaiverInputSchema,
} from '../../../shared/fees/schemas.ts';
import type { AppConfig } from '../../config.ts';
import { createApiRouter } from '../../lib/api-router.ts';
import { requireActor } from '../../lib/authorize.ts';
import { AppError, BadRequestError, NotFoundError } from '../../lib/errors.ts';
import { parseIdParam } from '../../lib/ids.ts';
import {
  cancelAtPeriodEnd,
  getSquadFee,
  myFees,
  portalLink,
  receiveWebhook,
  setSquadFee,
  setWaiver,
  squadBilling,
  startCheckout,
} from './fees.service.ts';

/**
 * Where the service sends the runner back to. In production the configured public address; elsewhere the address
 * the browser used, because development and test servers often listen on a free port the config does not know.
 */
function appUrlOf(req: Request, config: AppConfig): string {
  return config.env === 'production'
    ? config.publicUrl
    : `${req.protocol}://${req.get('host') ?? `${config.host}:${config.port}`}`;
}

export function createFeesRouter(config: AppConfig, stripe: Stripe | null) {
  const api = createApiRouter();

  api.route(
    {
      method: 'get',
      path: '/squads/:id/fee',
      tag: 'fees',
      summary: 'The squad’s fee (its coach and its runners)',
      access: 'own-data',
      params: { id: parseIdParam },
      response: FeeAnswerSchema,
    },
    async (req, res) => {
      res.json({ fee: await getSquadFee(requireActor(res), req.params.id) });
    },
  );

  api.route(
    {
      method: 'put',
      path: '/squads/:id/fee',
      tag: 'fees',
      summary: 'Set the squad’s fee: none, monthly (optional first-month discount) or a one-off block of N weeks',
      access: 'squads:manage',
      params: { id: parseIdParam },
      body: FeeInputSchema,
      response: FeeAnswerSchema,
    },
    async (req, res) => {
      res.json({ fee: await setSquadFee(requireActor(res), req.params.id, req.body, stripe) });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/squads/:id/checkout',
      tag: 'fees',
      summary: 'Start paying the squad’s fee: the payment service’s hosted checkout page (a runner of the squad)',
      access: 'own-data',
      params: { id: parseIdParam },
      response: UrlAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json(await startCheckout(requireActor(res), req.params.id, stripe, appUrlOf(req, config)));
    },
  );

  api.route(
    {
      method: 'post',
      path: '/squads/:id/fee/cancel',
      tag: 'fees',
      summary: 'Stop a monthly fee at the end of the paid period (the runner)',
      access: 'own-data',
      params: { id: parseIdParam },
      status: 204,
    },
    async (req, res) => {
      await cancelAtPeriodEnd(requireActor(res), req.params.id, stripe);
      res.status(204).end();
    },
  );

  api.route(
    {
      method: 'post',
      path: '/me/fees/portal',
      tag: 'fees',
      summary: 'A link to the payment service’s hosted page for changing the card on file',
      access: 'own-data',
      response: UrlAnswerSchema,
      status: 201,
    },
    async (req, res) => {
      res.status(201).json(await portalLink(requireActor(res), stripe, appUrlOf(req, config)));
    },
  );

  api.route(
    {
      method: 'get',
      path: '/me/fees',
      tag: 'fees',
      summary: 'Your fees: per squad that charges one, its status, paid-through date and receipts',
      access: 'own-data',
      response: MyFeesAnswerSchema,
    },
    async (_req, res) => {
      res.json({ fees: await myFees(requireActor(res)) });
    },
  );

  api.route(
    {
      method: 'get',
      path: '/squads/:id/billing',
      tag: 'fees',
      summary: 'Who has paid through which date, who is due or overdue, cancelled or waived; totals per month (the coach)',
      access: 'squads:manage',
      params: { id: parseIdParam },
      response: BillingAnswerSchema,
    },
    async (req, res) => {
      const { squadName: _name, ...billing } = await squadBilling(requireActor(res), req.params.id);
      res.json(billing);
    },
  );

  api.route(
    {
      method: 'get',
      path: '/squads/:id/billing.csv',
      file: [CSV],
      tag: 'fees',
      summary: 'The billing view as CSV: one row per runner',
      access: 'squads:manage',
      params: { id: parseIdParam },
    },
    async (req, res) => {
      const billing = await squadBilling(requireActor(res), req.params.id);
      const rows = billing.members.map((m) => {
        const byCurrency = new Map<string, number>();
        for (const r of m.receipts) byCurrency.set(r.currency, (byCurrency.get(r.currency) ?? 0) + r.amount_minor);
        const [currency, total] = [...byCurrency.entries()][0] ?? [billing.fee.currency ?? '', 0];
        const paid = isCurrencyCode(currency) ? { csvNumber: minorToDecimalText(total, currency) } : null;
        return [
          m.name,
          m.status,
          m.paid_through,
          m.overdue_days,
          m.cancel_at_period_end ? 'yes' : 'no',
          m.receipts.length,
          paid,
          currency,
        ];
      });
      const slug =
        billing.squadName
          .toLowerCase()
          .replace(/[^a-z0-9]+/g, '-')
          .replace(/^-|-$/g, '') || 'squad';
      res
        .type('text/csv; charset=utf-8')
        .attachment(`${slug}-billing.csv`)
        .send(
          toCsv(
            ['runner', 'status', 'paid_through', 'overdue_days', 'cancel_at_period_end', 'payments', 'paid_total', 'currency'],
            rows,
          ),
        );
    },
  );

  api.route(
    {
      method: 'put',
      path: '/squads/:id/members/:runnerId/fee-waiver',
      tag: 'fees',
      summary: 'Waive (or stop waiving) a runner’s fee (the coach)',
      access: 'squads:manage',
      params: { id: parseIdParam, runnerId: parseIdParam },
      body: WaiverInputSchema,
      response: FeeWaiverAnswerSchema,
    },
    async (req, res) => {
      await setWaiver(requireActor(res), req.params.id, req.params.runnerId, req.body.waived);
      res.json({ waived: req.body.waived });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/payments/webhook',
      tag: 'fees',
      summary: 'The payment service’s signed events (raw body, Stripe-Signature header); each handled exactly once',
      access: 'public',
      response: z.object({ received: z.literal(true), outcome: z.string() }),
    },
    async (req, res) => {
      const outcome = await receiveWebhook(req.body, req.get('stripe-signature'), config.payments.webhookSecret);
      res.json({ received: true, outcome });
    },
  );

  api.route(
    {
      method: 'post',
      path: '/dev/payments/complete',
      tag: 'fees',
      summary: 'Development only: submit the local fake’s checkout page with a test card, as a runner would',
      access: 'public',
      body: DevCompleteInputSchema,
      response: DevCompleteAnswerSchema,
    },
    async (req, res) => {
      if (config.env === 'production') throw new NotFoundError();
      const base = config.payments.url;
      const { url, card } = req.body as z.infer<typeof DevCompleteInputSchema>;
      // Only the fake's own checkout pages: this route must never become a way to make the server fetch anything else.
      if (!base || !url.startsWith(`${base}/checkout/`) || !/\/checkout\/cs_test_[0-9a-f]{24}$/.test(url))
        throw new BadRequestError('This is not a checkout page of the local payment double.', 'not-a-checkout');
      const answer = await fetch(url, { method: 'POST', body: new URLSearchParams({ card }), redirect: 'manual' });
      if (answer.status === 303) return void res.json({ outcome: 'paid', message: 'Paid.' });
      if (answer.status === 402) return void res.json({ outcome: 'declined', message: 'Your card was declined.' });
      if (answer.status === 404) throw new NotFoundError('This checkout does not exist.');
      if (answer.status === 410) throw new AppError(410, 'checkout-finished', 'This checkout is already finished.');
      throw new BadRequestError(
        'Use one of the test card numbers: 4242424242424242 pays, 4000000000000002 is declined.',
        'not-a-test-card',
      );
    },
  );

  return api;
}
