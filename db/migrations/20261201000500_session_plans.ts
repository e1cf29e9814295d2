import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('session_plans', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    // Who wrote it: the runner or one of their coaches. Kept when a coach account goes.
    t.uuid('author_id').references('users.id').onDelete('SET NULL');
    t.date('date').notNullable();
    t.text('title').notNullable();
    t.text('notes').notNullable().defaultTo('');
    t.jsonb('items').notNullable();
    t.timestamps(true, true);
    t.index(['runner_id', 'date']);
  });
  // A run's plan: set automatically by local date at import time or on request, or chosen by the runner.
  // A row with plan_id null means "no plan" was chosen on purpose (unlinked), so auto-linking stays off.
  await knex.schema.createTable('run_plan_links', (t) => {
    t.uuid('run_id').primary().references('runs.id').onDelete('CASCADE');
    t.uuid('plan_id').references('session_plans.id').onDelete('CASCADE');
    t.timestamp('linked_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.alterTable('users', (t) => {
    // ±share of the target pace that still counts as on pace (0.02 = ±2 %).
    t.double('pace_tolerance').notNullable().defaultTo(0.02);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => t.dropColumn('pace_tolerance'));
  await knex.schema.dropTable('run_plan_links');
  await knex.schema.dropTable('session_plans');
}
