import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Assembled weeks, cached and invalidated exactly (issue 19; server/features/week-cache/README.md): every write
  // that feeds a runner's week bumps their counter in the same transaction; a stored week is valid while the
  // counter, the code version and the runner's local date it was built for are unchanged.
  await knex.schema.createTable('week_input_counters', (t) => {
    t.uuid('runner_id').primary().references('users.id').onDelete('CASCADE');
    t.bigInteger('counter').notNullable().defaultTo(0);
  });
  await knex.schema.createTable('assembled_weeks', (t) => {
    t.uuid('runner_id').notNullable().references('users.id').onDelete('CASCADE');
    t.date('week_start').notNullable();
    /** What the week was built for besides the runner: review or overview, read by the runner or a coach, unit. */
    t.text('variant').notNullable();
    t.bigInteger('counter').notNullable();
    t.text('code_version').notNullable();
    t.date('today').notNullable();
    t.jsonb('body').notNullable();
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['runner_id', 'week_start', 'variant']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('assembled_weeks');
  await knex.schema.dropTable('week_input_counters');
}
