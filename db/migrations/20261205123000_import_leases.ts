import type { Knex } from 'knex';

/**
 * Leases on bulk-import work (issue 13 #9): a worker beats `heartbeat_at` on the files it holds and on
 * the imports it works on; a periodic sweep in every job-running process gives back a file whose
 * heartbeat stopped (its worker was killed) and queues its import again, without a restart.
 * `attempts` counts the claims of a file, so a file that kills its worker every time is given up
 * after a few instead of looping for ever.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('import_files', (t) => {
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('heartbeat_at', { useTz: true }).nullable();
  });
  await knex.schema.alterTable('imports', (t) => {
    t.timestamp('heartbeat_at', { useTz: true }).nullable();
  });
  // Files claimed before this migration: one attempt, beaten when they were claimed.
  await knex.raw("update import_files set attempts = 1, heartbeat_at = claimed_at where status = 'working'");
  // The sweep reads only the files in hand.
  await knex.raw("create index import_files_working_heartbeat on import_files (heartbeat_at) where status = 'working'");
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists import_files_working_heartbeat');
  await knex.schema.alterTable('imports', (t) => {
    t.dropColumn('heartbeat_at');
  });
  await knex.schema.alterTable('import_files', (t) => {
    t.dropColumn('heartbeat_at');
    t.dropColumn('attempts');
  });
}
