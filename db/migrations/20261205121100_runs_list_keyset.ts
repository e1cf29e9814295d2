import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // Keyset paging of the runs list (issue 19, server/features/runs/README.md): the date order with its id
  // tie-break read straight from one index, forwards or backwards. It replaces (user_id, started_at), its prefix.
  await knex.schema.alterTable('runs', (t) => {
    t.index(['user_id', 'started_at', 'id'], 'runs_user_started_id_index');
  });
  await knex.raw('drop index if exists runs_user_id_started_at_index');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('runs', (t) => {
    t.index(['user_id', 'started_at']);
  });
  await knex.raw('drop index if exists runs_user_started_id_index');
}
