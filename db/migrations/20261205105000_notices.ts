import type { Knex } from 'knex';

/**
 * E-mail notices (issue 16): a per-kind switch for every notice, the moment each switch last changed
 * (an unsubscribe link older than that is refused), the queue that batches notices before they are
 * sent, and the headers of each caught development message.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.boolean('notify_on_note').notNullable().defaultTo(true);
    t.boolean('notify_on_pain_alert').notNullable().defaultTo(true);
    t.boolean('notify_on_squad_leave').notNullable().defaultTo(true);
    t.boolean('notify_on_digest').notNullable().defaultTo(true);
  });
  await knex.schema.createTable('notice_switch_changes', (t) => {
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.timestamp('changed_at', { useTz: true }).notNullable();
    t.primary(['user_id', 'kind']);
  });
  // One row per event worth telling someone about; rows of one batch are merged into one e-mail.
  await knex.schema.createTable('notices', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('recipient_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('kind').notNullable().checkIn(['import', 'note', 'pain_alert', 'squad_leave']);
    // Rows with the same recipient, kind and batch key go out together.
    t.text('batch_key').notNullable();
    t.jsonb('payload').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('sent_at', { useTz: true });
    t.text('outcome').checkIn(['sent', 'switched-off', 'nothing-left', 'failed']);
    t.smallint('attempts').notNullable().defaultTo(0);
    t.timestamp('retry_at', { useTz: true });
  });
  await knex.raw('create index notices_open on notices (recipient_id, kind, batch_key) where sent_at is null');
  await knex.schema.alterTable('dev_outbox', (t) => {
    t.jsonb('headers').notNullable().defaultTo('{}');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('dev_outbox', (t) => t.dropColumn('headers'));
  await knex.schema.dropTable('notices');
  await knex.schema.dropTable('notice_switch_changes');
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('notify_on_note');
    t.dropColumn('notify_on_pain_alert');
    t.dropColumn('notify_on_squad_leave');
    t.dropColumn('notify_on_digest');
  });
}
