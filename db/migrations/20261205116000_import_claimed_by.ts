import type { Knex } from 'knex';

/**
 * Which process claimed each bulk-import file (`host:pid`, issue 19): with web and worker processes
 * scaled apart, an operator can see which worker imported what, and the two-web-two-worker test
 * proves that no web process ever did.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('import_files', (t) => {
    t.text('claimed_by').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('import_files', (t) => {
    t.dropColumn('claimed_by');
  });
}
