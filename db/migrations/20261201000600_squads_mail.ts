import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Messages caught by the development mail catcher (never used when SMTP_URL points at a real server).
  await knex.schema.createTable('dev_outbox', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('to').notNullable();
    t.text('subject').notNullable();
    t.text('text').notNullable();
    t.text('html').notNullable();
    t.timestamp('sent_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('invitations', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('squad_id').notNullable().references('squads.id').onDelete('CASCADE');
    t.uuid('invited_by').references('users.id').onDelete('SET NULL');
    t.text('email').notNullable();
    t.text('token_hash').notNullable().unique();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true });
    t.uuid('accepted_by').references('users.id').onDelete('SET NULL');
    t.timestamp('revoked_at', { useTz: true });
    t.index(['squad_id']);
  });
  await knex.schema.createTable('password_resets', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('token_hash').notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true });
  });
  await knex.schema.createTable('week_notes', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.date('week_start').notNullable();
    t.uuid('author_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('text').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['runner_id', 'week_start']);
  });
  await knex.schema.createTable('week_reviews', (t) => {
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.date('week_start').notNullable();
    t.uuid('coach_id').notNullable().references('users.id').onDelete('CASCADE');
    t.timestamp('reviewed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['runner_id', 'week_start', 'coach_id']);
  });
  await knex.schema.alterTable('users', (t) => {
    t.boolean('notify_on_import').notNullable().defaultTo(true);
    t.smallint('week_starts_on').notNullable().defaultTo(1); // 0 = Sunday … 6 = Saturday; Monday by default
    t.text('sex'); // 'male' | 'female' | null: only for Banister TRIMP's coefficients
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('notify_on_import');
    t.dropColumn('week_starts_on');
    t.dropColumn('sex');
  });
  for (const table of ['week_reviews', 'week_notes', 'password_resets', 'invitations', 'dev_outbox'])
    await knex.schema.dropTable(table);
}
