import { db, type Db, type FeePayerRow, type FeeReceiptRow, type SquadFeeRow } from '../../lib/db.ts';

export async function findSquadFee(squadId: string, trx: Db = db): Promise<SquadFeeRow | undefined> {
  return trx('squad_fees').where({ squad_id: squadId }).first();
}

export async function upsertSquadFee(row: Omit<SquadFeeRow, 'updated_at'>, trx: Db = db): Promise<SquadFeeRow> {
  const [saved] = await trx('squad_fees')
    .insert({ ...row, updated_at: new Date() })
    .onConflict('squad_id')
    .merge()
    .returning('*');
  return saved!;
}

export async function findPayer(squadId: string, runnerId: string, trx: Db = db): Promise<FeePayerRow | undefined> {
  return trx('fee_payers').where({ squad_id: squadId, runner_id: runnerId }).first();
}

export async function listPayers(squadId: string, trx: Db = db): Promise<FeePayerRow[]> {
  return trx('fee_payers').where({ squad_id: squadId });
}

export async function listReceipts(where: { squad_id: string; runner_id?: string }, trx: Db = db) {
  return trx('fee_receipts').where(where).orderBy('paid_at', 'desc');
}

export async function findCustomerId(userId: string, trx: Db = db): Promise<string | undefined> {
  return (await trx('payment_customers').where({ user_id: userId }).first())?.customer_id;
}

export async function saveCustomerId(userId: string, customerId: string, trx: Db = db): Promise<void> {
  await trx('payment_customers').insert({ user_id: userId, customer_id: customerId }).onConflict('user_id').ignore();
}

/** A payer row exists from the first thing we learn about a runner in a squad; fields merge in. */
export async function upsertPayer(
  squadId: string,
  runnerId: string,
  fields: Partial<Pick<FeePayerRow, 'subscription_id' | 'waived' | 'cancel_at_period_end' | 'ended'>> & { paid_through?: string },
  trx: Db = db,
): Promise<void> {
  const { paid_through, ...rest } = fields;
  const insert = { squad_id: squadId, runner_id: runnerId, ...rest, paid_through: paid_through ?? null, updated_at: new Date() };
  const merge: Record<string, unknown> = { ...rest, updated_at: new Date() };
  // A later paid period only ever moves "paid through" forward, whatever order the events come in.
  if (paid_through) merge.paid_through = trx.raw('greatest(fee_payers.paid_through, excluded.paid_through)');
  await trx('fee_payers').insert(insert).onConflict(['squad_id', 'runner_id']).merge(merge);
}

/** Squads the runner belongs to, with their fee (none when never set). */
export async function listSquadsWithFeeOfRunner(runnerId: string, trx: Db = db) {
  return trx('squad_members')
    .join('squads', 'squads.id', 'squad_members.squad_id')
    .leftJoin('squad_fees', 'squad_fees.squad_id', 'squads.id')
    .where('squad_members.runner_id', runnerId)
    .orderBy('squads.name')
    .select<Array<{ id: string; name: string } & Partial<Omit<SquadFeeRow, 'squad_id' | 'updated_at' | 'updated_by'>>>>(
      'squads.id',
      'squads.name',
      'squad_fees.kind',
      'squad_fees.amount_minor',
      'squad_fees.currency',
      'squad_fees.first_month_discount_minor',
      'squad_fees.block_weeks',
    );
}

/** Money received per UTC calendar month and currency, newest month first. */
export async function monthTotals(squadId: string, trx: Db = db) {
  const rows = await trx('fee_receipts')
    .where({ squad_id: squadId })
    .groupByRaw("to_char(paid_at at time zone 'UTC', 'YYYY-MM'), currency")
    .orderByRaw('1 desc, 2')
    .select<Array<{ month: string; currency: string; amount_minor: string; payments: string }>>(
      trx.raw("to_char(paid_at at time zone 'UTC', 'YYYY-MM') as month"),
      'currency',
      trx.raw('sum(amount_minor)::bigint as amount_minor'),
      trx.raw('count(*) as payments'),
    );
  return rows.map((r) => ({
    month: r.month,
    currency: r.currency.trim(),
    amount_minor: Number(r.amount_minor),
    payments: Number(r.payments),
  }));
}

/**
 * Records a payment event as being handled; false when it was already recorded (a second delivery).
 * Two deliveries at once: the second waits on the key until the first commits, then gets false.
 */
export async function claimPaymentEvent(eventId: string, type: string, trx: Db = db): Promise<boolean> {
  const fresh = await trx('payment_events')
    .insert({ event_id: eventId, type, outcome: 'handling' })
    .onConflict('event_id')
    .ignore()
    .returning('event_id');
  return fresh.length > 0;
}

export async function setPaymentEventOutcome(eventId: string, outcome: string, trx: Db = db): Promise<void> {
  await trx('payment_events').where({ event_id: eventId }).update({ outcome });
}

/** The time of the newest subscription state stored (an older one arriving later changes nothing). */
export async function setSubscriptionEventAt(squadId: string, runnerId: string, eventAt: string, trx: Db = db): Promise<void> {
  await trx('fee_payers').where({ squad_id: squadId, runner_id: runnerId }).update({ subscription_event_at: eventAt });
}

/** A receipt is stored once per payment reference, however often its event arrives. */
export async function insertReceipt(receipt: Omit<FeeReceiptRow, 'id'>, trx: Db = db): Promise<void> {
  await trx('fee_receipts').insert(receipt).onConflict('payment_ref').ignore();
}

export async function listPayersWithSubscription(trx: Db = db): Promise<FeePayerRow[]> {
  return trx('fee_payers').whereNotNull('subscription_id');
}
