import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('email').notNullable();
    t.text('password_hash').notNullable();
    t.text('name').notNullable();
    t.text('role').notNullable().defaultTo('runner');
    t.text('unit').notNullable().defaultTo('mi');
    t.integer('birth_year');
    t.integer('resting_hr');
    t.integer('max_hr');
    t.decimal('weight_kg', 5, 1);
    t.text('time_zone').notNullable().defaultTo('UTC');
    t.timestamps(true, true);
  });
  await knex.raw('create unique index users_email_unique on users (lower(email))');
  await knex.raw("alter table users add constraint users_role_check check (role in ('runner','coach','admin'))");
  await knex.raw("alter table users add constraint users_unit_check check (unit in ('mi','km'))");

  await knex.schema.createTable('api_tokens', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('name').notNullable();
    // SHA-256 of the token: a leaked table does not leak usable tokens.
    t.text('token_hash').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('last_used_at', { useTz: true });
    t.index(['user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('api_tokens');
  await knex.schema.dropTable('users');
}
