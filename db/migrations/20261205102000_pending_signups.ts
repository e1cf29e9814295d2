import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Sign-up answers the same for a new and a taken address (issue 13 #7): a new address's sign-up
  // waits here until the e-mailed link comes back. Its id is the one already answered, and it
  // becomes the user's id.
  await knex.schema.createTable('pending_signups', (t) => {
    t.uuid('id').primary();
    t.text('token_hash').notNullable().unique();
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('role').notNullable();
    t.text('password_hash').notNullable();
    t.text('next_path');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.index(['email', 'created_at']);
  });
  // "Someone tried to create an account with this address" notices to an account's owner: kept
  // only to count them towards the per-address e-mail limit.
  await knex.schema.createTable('sign_up_notices', (t) => {
    t.bigIncrements('id');
    t.text('email').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['email', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_up_notices');
  await knex.schema.dropTable('pending_signups');
}
