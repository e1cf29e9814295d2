import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Sign-up by e-mailed link (issue 13 #7): the answer is the same whether or not the address has
  // an account; the account is made when the link comes back. A row with no token records a
  // notice sent to an existing account's owner; both kinds count towards the per-address limit.
  await knex.schema.createTable('sign_up_requests', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable();
    t.text('token_hash').unique();
    t.text('name');
    t.text('role');
    t.text('password_hash');
    t.text('next_path');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
    t.index(['email', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_up_requests');
}
