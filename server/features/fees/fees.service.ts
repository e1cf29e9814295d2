import type Stripe from 'stripe';
import type { Actor } from '../../../shared/auth/permissions.ts';
import { addDays, billingStatus, lastDayBefore } from '../../../shared/fees/billing-status.ts';
import { isCurrencyCode } from '../../../shared/fees/currencies.ts';
import { NO_FEE, type BillingAnswer, type Fee, type FeeInput, type MyFee, type Receipt } from '../../../shared/fees/schemas.ts';
import { inTransaction, type Db, type FeePayerRow, type FeeReceiptRow, type SquadFeeRow } from '../../lib/db.ts';
import { AppError, BadRequestError, ConflictError, NotFoundError } from '../../lib/errors.ts';
import { logger } from '../../lib/logger.ts';
import {
  findSquadById,
  isSquadMember,
  listMembers,
  squadCoachedBy,
  squadCoachedOrJoinedBy,
  squadJoinedBy,
} from '../squads/index.ts';
import { findUserById } from '../users/index.ts';
import {
  claimPaymentEvent,
  findCustomerId,
  findPayer,
  findSquadFee,
  insertReceipt,
  listPayers,
  listPayersWithSubscription,
  listReceipts,
  listSquadsWithFeeOfRunner,
  monthTotals,
  saveCustomerId,
  setPaymentEventOutcome,
  setSubscriptionEventAt,
  upsertPayer,
  upsertSquadFee,
} from './fees.repository.ts';
import { callService, paymentsUnavailable, signatureChecker } from './payments-client.ts';

const today = (now: Date) => now.toISOString().slice(0, 10);
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function toFee(
  row:
    Partial<Pick<SquadFeeRow, 'kind' | 'amount_minor' | 'currency' | 'first_month_discount_minor' | 'block_weeks'>> | undefined,
): Fee {
  if (!row?.kind || row.kind === 'none') return NO_FEE;
  const currency = row.currency?.trim() ?? '';
  return {
    kind: row.kind,
    amount_minor: row.amount_minor ?? null,
    currency: isCurrencyCode(currency) ? currency : null,
    first_month_discount_minor: row.first_month_discount_minor ?? null,
    block_weeks: row.block_weeks ?? null,
  };
}

const toReceipt = (r: FeeReceiptRow): Receipt => ({
  id: r.id,
  amount_minor: r.amount_minor,
  currency: r.currency.trim(),
  paid_at: r.paid_at.toISOString(),
  period_start: r.period_start,
  period_end: r.period_end,
});

function requireService(stripe: Stripe | null): Stripe {
  if (!stripe) throw paymentsUnavailable();
  return stripe;
}

// ---------------------------------------------------------------------------------------------------------------
// The coach sets the fee.
// ---------------------------------------------------------------------------------------------------------------

/** The squad's fee as the invitation page shows it (no fee when never set). */
export async function feeOfSquad(squadId: string): Promise<Fee> {
  return toFee(await findSquadFee(squadId));
}

export async function getSquadFee(actor: Actor, squadId: string): Promise<Fee> {
  await squadCoachedOrJoinedBy(actor, squadId);
  return toFee(await findSquadFee(squadId));
}

/**
 * Sets the squad's fee. New checkouts use it at once; a runner already paying keeps the period paid for, and the
 * new amount applies from their next period (README: "a change applies from the next period").
 */
export async function setSquadFee(actor: Actor, squadId: string, input: FeeInput, stripe: Stripe | null): Promise<Fee> {
  await squadCoachedBy(actor, squadId);
  const saved = await upsertSquadFee({
    squad_id: squadId,
    kind: input.kind,
    amount_minor: input.kind === 'none' ? null : input.amount_minor!,
    currency: input.kind === 'none' ? null : input.currency!,
    first_month_discount_minor: input.kind === 'monthly' ? (input.first_month_discount_minor ?? null) : null,
    block_weeks: input.kind === 'block' ? input.block_weeks! : null,
    updated_by: actor.id,
  });
  const fee = toFee(saved);
  await moveSubscriptionsToFee(squadId, fee, stripe);
  return fee;
}

/**
 * Running subscriptions of the squad take the new monthly amount without proration: the service bills it from the
 * next invoice, so the current, paid period is untouched. A squad whose fee stops being monthly lets them run to the
 * end of the paid period. Failures are logged and left to the nightly reconcile report.
 */
async function moveSubscriptionsToFee(squadId: string, fee: Fee, stripe: Stripe | null): Promise<void> {
  const running = (await listPayers(squadId)).filter((p) => p.subscription_id && !p.ended);
  if (!stripe || running.length === 0) return;
  for (const payer of running) {
    try {
      const subscription = await stripe.subscriptions.retrieve(payer.subscription_id!);
      const item = subscription.items.data[0];
      if (fee.kind !== 'monthly') {
        await stripe.subscriptions.update(subscription.id, { cancel_at_period_end: true });
      } else if (item && item.price.unit_amount !== fee.amount_minor) {
        await stripe.subscriptions.update(subscription.id, {
          proration_behavior: 'none',
          items: [
            {
              id: item.id,
              price_data: {
                currency: fee.currency!.toLowerCase(),
                unit_amount: fee.amount_minor!,
                recurring: { interval: 'month' },
                product: typeof item.price.product === 'string' ? item.price.product : 'prod_squad_fee',
              },
            },
          ],
        });
      }
    } catch (err) {
      logger.warn({ err, squadId, subscription: payer.subscription_id }, 'could not move a subscription to the new fee');
    }
  }
}

// ---------------------------------------------------------------------------------------------------------------
// The runner pays.
// ---------------------------------------------------------------------------------------------------------------

export async function startCheckout(actor: Actor, squadId: string, stripe: Stripe | null, appUrl: string, now = new Date()) {
  const squad = await squadJoinedBy(actor, squadId);
  const fee = toFee(await findSquadFee(squadId));
  if (fee.kind === 'none' || !fee.currency || !fee.amount_minor)
    throw new ConflictError('This squad has no fee to pay.', 'no-fee');
  const payer = await findPayer(squadId, actor.id);
  const state = billingStatus(fee.kind, payer && { ...payer }, today(now));
  if (state.status === 'waived')
    throw new ConflictError('Your coach has waived your fee: there is nothing to pay.', 'fee-waived');
  if (fee.kind === 'monthly' && payer?.subscription_id && !payer.ended && !payer.cancel_at_period_end)
    throw new ConflictError('You already pay this squad’s monthly fee.', 'already-subscribed');
  const service = requireService(stripe);
  const user = (await findUserById(actor.id))!;
  const metadata = {
    squad_id: squadId,
    runner_id: actor.id,
    ...(fee.kind === 'block' ? { block_weeks: String(fee.block_weeks) } : {}),
  };
  const session = await callService(async () => {
    const customerId =
      (await findCustomerId(actor.id)) ??
      (await service.customers.create({ email: user.email, metadata: { user_id: actor.id } })).id;
    // The first-month discount applies to a runner's first ever payment in this squad only.
    const firstTime = !payer?.paid_through;
    const coupon =
      fee.kind === 'monthly' && fee.first_month_discount_minor && firstTime
        ? await service.coupons.create({
            amount_off: fee.first_month_discount_minor,
            currency: fee.currency!.toLowerCase(),
            duration: 'once',
          })
        : null;
    const created = await service.checkout.sessions.create({
      mode: fee.kind === 'monthly' ? 'subscription' : 'payment',
      customer: customerId,
      client_reference_id: `${squadId}:${actor.id}`,
      line_items: [
        {
          quantity: 1,
          price_data: {
            currency: fee.currency!.toLowerCase(),
            unit_amount: fee.amount_minor!,
            product_data: {
              name: fee.kind === 'monthly' ? `${squad.name}: monthly fee` : `${squad.name}: ${fee.block_weeks}-week block`,
            },
            ...(fee.kind === 'monthly' ? { recurring: { interval: 'month' as const } } : {}),
          },
        },
      ],
      ...(coupon ? { discounts: [{ coupon: coupon.id }] } : {}),
      metadata,
      ...(fee.kind === 'monthly' ? { subscription_data: { metadata } } : { payment_intent_data: { metadata } }),
      success_url: `${appUrl}/fees?paid=${encodeURIComponent(squadId)}`,
      cancel_url: `${appUrl}/fees`,
    });
    // Stored only once the checkout exists, so a failure leaves nothing half-made on our side.
    await saveCustomerId(actor.id, customerId);
    return created;
  });
  if (!session.url) throw paymentsUnavailable();
  return { url: session.url };
}

export async function cancelAtPeriodEnd(actor: Actor, squadId: string, stripe: Stripe | null): Promise<void> {
  await squadJoinedBy(actor, squadId);
  const payer = await findPayer(squadId, actor.id);
  if (!payer?.subscription_id || payer.ended)
    throw new ConflictError('You have no running monthly fee in this squad.', 'no-subscription');
  const service = requireService(stripe);
  await callService(() => service.subscriptions.update(payer.subscription_id!, { cancel_at_period_end: true }));
  await upsertPayer(squadId, actor.id, { cancel_at_period_end: true });
}

export async function portalLink(actor: Actor, stripe: Stripe | null, appUrl: string) {
  const customerId = await findCustomerId(actor.id);
  if (!customerId) throw new ConflictError('You have not paid a fee yet, so there is no card on file to change.', 'no-customer');
  const service = requireService(stripe);
  const portal = await callService(() =>
    service.billingPortal.sessions.create({ customer: customerId, return_url: `${appUrl}/fees` }),
  );
  return { url: portal.url };
}

export async function myFees(actor: Actor, now = new Date()): Promise<MyFee[]> {
  const squads = await listSquadsWithFeeOfRunner(actor.id);
  const result: MyFee[] = [];
  for (const squad of squads) {
    const fee = toFee(squad);
    const payer = await findPayer(squad.id, actor.id);
    if (fee.kind === 'none' && !payer) continue;
    const state = billingStatus(fee.kind, payer, today(now));
    result.push({
      squad: { id: squad.id, name: squad.name },
      fee,
      status: state.status,
      overdue_days: state.overdue_days,
      paid_through: payer?.paid_through ?? null,
      cancel_at_period_end: payer?.cancel_at_period_end ?? false,
      has_subscription: Boolean(payer?.subscription_id && !payer.ended),
      receipts: (await listReceipts({ squad_id: squad.id, runner_id: actor.id })).map(toReceipt),
    });
  }
  return result;
}

// ---------------------------------------------------------------------------------------------------------------
// The coach's view.
// ---------------------------------------------------------------------------------------------------------------

export async function squadBilling(
  actor: Actor,
  squadId: string,
  now = new Date(),
): Promise<BillingAnswer & { squadName: string }> {
  const squad = await squadCoachedBy(actor, squadId);
  const fee = toFee(await findSquadFee(squadId));
  const payers = new Map((await listPayers(squadId)).map((p) => [p.runner_id, p]));
  const receipts = await listReceipts({ squad_id: squadId });
  const members = (await listMembers(squadId)).map((m) => {
    const payer = payers.get(m.id);
    const state = billingStatus(fee.kind, payer, today(now));
    return {
      runner_id: m.id,
      name: m.name,
      status: state.status,
      overdue_days: state.overdue_days,
      paid_through: payer?.paid_through ?? null,
      cancel_at_period_end: payer?.cancel_at_period_end ?? false,
      waived: payer?.waived ?? false,
      receipts: receipts.filter((r) => r.runner_id === m.id).map(toReceipt),
    };
  });
  return { squadName: squad.name, fee, members, totals: await monthTotals(squadId) };
}

export async function setWaiver(actor: Actor, squadId: string, runnerId: string, waived: boolean) {
  await squadCoachedBy(actor, squadId);
  if (!(await isSquadMember(squadId, runnerId))) throw new NotFoundError('This runner is not in your squad.');
  await upsertPayer(squadId, runnerId, { waived });
}

// ---------------------------------------------------------------------------------------------------------------
// Webhooks: verified, stored by event id, applied exactly once in one transaction, in any order.
// ---------------------------------------------------------------------------------------------------------------

type EventObject = Record<string, unknown>;

const BAD_SIGNATURE = () =>
  new AppError(400, 'bad-signature', 'This event does not carry a valid signature from the payment service, so it was ignored.');

export async function receiveWebhook(rawBody: unknown, signature: string | undefined, secret: string): Promise<string> {
  if (!Buffer.isBuffer(rawBody) || !signature) throw BAD_SIGNATURE();
  let event: Stripe.Event;
  try {
    // Checks the HMAC and that the timestamp is within the SDK's default tolerance (300 s).
    event = signatureChecker.webhooks.constructEvent(rawBody, signature, secret);
  } catch {
    throw BAD_SIGNATURE();
  }
  return inTransaction(async (trx) => {
    // Two deliveries of one event at once: the second waits on the key until the first commits, then skips.
    if (!(await claimPaymentEvent(event.id, event.type, trx))) return 'duplicate';
    const outcome = await applyEvent(trx, event);
    await setPaymentEventOutcome(event.id, outcome, trx);
    if (outcome === 'unknown runner or squad')
      logger.warn({ event: event.id, type: event.type }, 'payment event for an unknown customer, acknowledged');
    return outcome;
  });
}

/** The squad and runner an object belongs to, from the metadata we put on every checkout and subscription. */
async function ownerOf(trx: Db, metadata: unknown): Promise<{ squadId: string; runnerId: string } | null> {
  const m = (metadata ?? {}) as Record<string, unknown>;
  const squadId = typeof m.squad_id === 'string' && UUID.test(m.squad_id) ? m.squad_id : null;
  const runnerId = typeof m.runner_id === 'string' && UUID.test(m.runner_id) ? m.runner_id : null;
  if (!squadId || !runnerId) return null;
  const [squad, runner] = await Promise.all([findSquadById(squadId, trx), findUserById(runnerId, trx)]);
  return squad && runner ? { squadId, runnerId } : null;
}

const dayOf = (unixSeconds: number) => new Date(unixSeconds * 1000).toISOString().slice(0, 10);

async function applyEvent(trx: Db, event: Stripe.Event): Promise<string> {
  const object = event.data.object as unknown as EventObject;
  switch (event.type) {
    case 'checkout.session.completed': {
      const owner = await ownerOf(trx, object.metadata);
      if (!owner) return 'unknown runner or squad';
      if (object.mode === 'subscription') {
        await upsertPayer(
          owner.squadId,
          owner.runnerId,
          {
            subscription_id: String(object.subscription),
            ended: false,
            cancel_at_period_end: false,
          },
          trx,
        );
        return 'subscription linked';
      }
      if (object.payment_status !== 'paid') return 'not paid yet';
      const weeks = Number((object.metadata as Record<string, string>).block_weeks);
      if (!Number.isInteger(weeks) || weeks < 1) return 'block without a length';
      // A block starts today, or the day after an earlier paid period ends.
      const payer = await findPayer(owner.squadId, owner.runnerId, trx);
      const paidDay = dayOf(Number(object.created) || event.created);
      const start = payer?.paid_through && payer.paid_through >= paidDay ? addDays(payer.paid_through, 1) : paidDay;
      const end = addDays(start, weeks * 7 - 1);
      await recordReceipt(trx, {
        payment_ref: String(object.id),
        squad_id: owner.squadId,
        runner_id: owner.runnerId,
        amount_minor: Number(object.amount_total),
        currency: String(object.currency).toUpperCase(),
        paid_at: new Date(event.created * 1000),
        period_start: start,
        period_end: end,
      });
      await upsertPayer(owner.squadId, owner.runnerId, { paid_through: end }, trx);
      return 'block paid';
    }
    case 'invoice.paid': {
      const details = ((object.parent as EventObject | undefined)?.subscription_details ?? {}) as EventObject;
      const owner = await ownerOf(trx, details.metadata);
      if (!owner) return 'unknown runner or squad';
      const line = (((object.lines as EventObject | undefined)?.data as EventObject[] | undefined) ?? [])[0];
      const period = (line?.period ?? { start: object.period_start, end: object.period_end }) as { start: number; end: number };
      const paidThrough = lastDayBefore(Number(period.end));
      await recordReceipt(trx, {
        payment_ref: String(object.id),
        squad_id: owner.squadId,
        runner_id: owner.runnerId,
        amount_minor: Number(object.amount_paid),
        currency: String(object.currency).toUpperCase(),
        paid_at: new Date(Number((object.status_transitions as EventObject | undefined)?.paid_at ?? event.created) * 1000),
        period_start: dayOf(Number(period.start)),
        period_end: paidThrough,
      });
      await upsertPayer(
        owner.squadId,
        owner.runnerId,
        { subscription_id: String(details.subscription), paid_through: paidThrough },
        trx,
      );
      return 'period paid';
    }
    case 'customer.subscription.updated':
    case 'customer.subscription.deleted': {
      const owner = await ownerOf(trx, object.metadata);
      if (!owner) return 'unknown runner or squad';
      const payer = await findPayer(owner.squadId, owner.runnerId, trx);
      // An older state arriving after a newer one changes nothing.
      if (payer?.subscription_event_at && Number(payer.subscription_event_at) > event.created)
        return 'older than the stored state';
      const ended =
        event.type === 'customer.subscription.deleted' || ['canceled', 'incomplete_expired'].includes(String(object.status));
      await upsertPayer(
        owner.squadId,
        owner.runnerId,
        { subscription_id: String(object.id), cancel_at_period_end: Boolean(object.cancel_at_period_end), ended },
        trx,
      );
      await setSubscriptionEventAt(owner.squadId, owner.runnerId, String(event.created), trx);
      return ended ? 'subscription ended' : 'subscription updated';
    }
    case 'invoice.payment_failed':
      return 'payment failed (the runner stays due)';
    default:
      return 'ignored';
  }
}

async function recordReceipt(trx: Db, receipt: Omit<FeeReceiptRow, 'id'>): Promise<void> {
  if (!Number.isInteger(receipt.amount_minor) || !/^[A-Z]{3}$/.test(receipt.currency))
    throw new BadRequestError('The event carries no valid amount.');
  await insertReceipt(receipt, trx);
}

// ---------------------------------------------------------------------------------------------------------------
// Nightly reconcile: the service's own list of subscriptions against ours.
// ---------------------------------------------------------------------------------------------------------------

export interface ReconcileDifference {
  subscription_id: string;
  what: string;
  ours: string;
  theirs: string;
}

export async function reconcileSubscriptions(stripe: Stripe): Promise<ReconcileDifference[]> {
  const differences: ReconcileDifference[] = [];
  const ours = new Map<string, FeePayerRow>((await listPayersWithSubscription()).map((p) => [p.subscription_id!, p]));
  const seen = new Set<string>();
  for await (const subscription of stripe.subscriptions.list({ status: 'all', limit: 100 })) {
    seen.add(subscription.id);
    const payer = ours.get(subscription.id);
    if (!payer) {
      differences.push({ subscription_id: subscription.id, what: 'not stored here', ours: '—', theirs: subscription.status });
      continue;
    }
    const ended = ['canceled', 'incomplete_expired'].includes(subscription.status);
    if (ended !== payer.ended)
      differences.push({ subscription_id: subscription.id, what: 'ended', ours: String(payer.ended), theirs: String(ended) });
    if (subscription.cancel_at_period_end !== payer.cancel_at_period_end)
      differences.push({
        subscription_id: subscription.id,
        what: 'cancel at period end',
        ours: String(payer.cancel_at_period_end),
        theirs: String(subscription.cancel_at_period_end),
      });
    const periodEnd = subscription.items.data[0]?.current_period_end;
    if (periodEnd && !ended && payer.paid_through !== lastDayBefore(periodEnd))
      differences.push({
        subscription_id: subscription.id,
        what: 'paid through',
        ours: payer.paid_through ?? '—',
        theirs: lastDayBefore(periodEnd),
      });
  }
  for (const [id, payer] of ours)
    if (!seen.has(id) && !payer.ended)
      differences.push({ subscription_id: id, what: 'unknown to the service', ours: 'running', theirs: '—' });
  if (differences.length) logger.warn({ differences }, 'payments reconcile found differences');
  else logger.info('payments reconcile: stored state matches the service');
  return differences;
}
