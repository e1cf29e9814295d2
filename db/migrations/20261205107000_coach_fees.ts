import type { Knex } from 'knex';

/**
 * Coach fees (issue 20): a fee per squad, each runner's standing with the payment service, receipts, and every
 * webhook event id seen (handled exactly once). Amounts are integer minor units with the currency beside them.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('squad_fees', (t) => {
    t.uuid('squad_id').primary().references('squads.id').onDelete('CASCADE');
    t.text('kind').notNullable().checkIn(['none', 'monthly', 'block']);
    t.integer('amount_minor').nullable().checkPositive();
    t.specificType('currency', 'char(3)').nullable();
    t.integer('first_month_discount_minor').nullable();
    t.integer('block_weeks').nullable();
    t.uuid('updated_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(
    "alter table squad_fees add constraint squad_fees_amount_with_currency check ((kind = 'none') = (amount_minor is null and currency is null))",
  );

  // The payment service's customer for each user who ever started a checkout.
  await knex.schema.createTable('payment_customers', (t) => {
    t.uuid('user_id').primary().references('users.id').onDelete('CASCADE');
    t.text('customer_id').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  // One runner in one squad: what the service last told us.
  await knex.schema.createTable('fee_payers', (t) => {
    t.uuid('squad_id').notNullable().references('squads.id').onDelete('CASCADE');
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('subscription_id').nullable().unique();
    t.date('paid_through').nullable();
    t.boolean('cancel_at_period_end').notNullable().defaultTo(false);
    t.boolean('ended').notNullable().defaultTo(false);
    t.boolean('waived').notNullable().defaultTo(false);
    // Created time of the newest subscription event applied, so an older one arriving late changes nothing.
    t.bigInteger('subscription_event_at').nullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['squad_id', 'runner_id']);
  });

  await knex.schema.createTable('fee_receipts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    // The service's invoice or checkout session id: one receipt per payment, however often its event comes.
    t.text('payment_ref').notNullable().unique();
    t.uuid('squad_id').notNullable().references('squads.id').onDelete('CASCADE');
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.integer('amount_minor').notNullable();
    t.specificType('currency', 'char(3)').notNullable();
    t.timestamp('paid_at', { useTz: true }).notNullable();
    t.date('period_start').notNullable();
    t.date('period_end').notNullable();
    t.index(['squad_id', 'paid_at']);
  });

  await knex.schema.createTable('payment_events', (t) => {
    t.text('event_id').primary();
    t.text('type').notNullable();
    t.text('outcome').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['payment_events', 'fee_receipts', 'fee_payers', 'payment_customers', 'squad_fees'])
    await knex.schema.dropTable(table);
}
