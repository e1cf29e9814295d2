import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // One row per signed-in browser (issue 13 #3): the session cookie names its row, so sign-out,
  // "sign out everywhere", a password change and a reset end sessions by deleting rows.
  await knex.schema.createTable('sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.index(['user_id']);
  });
  // Failed password checks (issue 13 #6, issue 17): one row per failure and per key (an account
  // or an address), counted over a sliding window and pruned once older than it.
  await knex.schema.createTable('credential_failures', (t) => {
    t.bigIncrements('id');
    t.text('key').notNullable();
    t.timestamp('failed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['key', 'failed_at']);
    t.index(['failed_at']);
  });
  await knex.schema.alterTable('password_resets', (t) => {
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['user_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('password_resets', (t) => {
    t.dropIndex(['user_id', 'created_at']);
    t.dropColumn('created_at');
  });
  await knex.schema.dropTable('credential_failures');
  await knex.schema.dropTable('sessions');
}
