import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Rides and hikes (issue #14): the file's sport and its speeds decide at import, the runner can
  // change it; only runs count in running totals and plan checks. Runs stored before are runs.
  await knex.schema.alterTable('runs', (t) => {
    t.text('activity_kind').notNullable().defaultTo('run');
  });
  await knex.raw("alter table runs add constraint runs_activity_kind_check check (activity_kind in ('run', 'ride', 'hike'))");
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('runs', (t) => {
    t.dropColumn('activity_kind');
  });
}
