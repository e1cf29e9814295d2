import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  // One uploaded history archive; the counters are kept current after every file, so progress survives restarts.
  await knex.schema.createTable('imports', (t) => {
    t.uuid('id').primary();
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('status').notNullable().defaultTo('queued');
    t.text('archive_name').notNullable();
    t.integer('total').notNullable();
    t.integer('done').notNullable().defaultTo(0);
    t.integer('imported').notNullable().defaultTo(0);
    t.integer('duplicates').notNullable().defaultTo(0);
    t.jsonb('rejected').notNullable().defaultTo('[]'); // [{ file, error }]
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('finished_at', { useTz: true });
    t.index(['user_id', 'created_at']);
  });
  await knex.raw(
    "alter table imports add constraint imports_status_check check (status in ('queued','running','done','failed'))",
  );

  // One zip entry of an import: `position` is its place in the archive's central directory.
  await knex.schema.createTable('import_files', (t) => {
    t.uuid('import_id').notNullable().references('imports.id').onDelete('CASCADE');
    t.integer('position').notNullable();
    t.text('name').notNullable();
    t.text('status').notNullable(); // pending | working | imported | duplicate | rejected
    t.timestamp('claimed_at', { useTz: true });
    t.jsonb('result');
    t.primary(['import_id', 'position']);
  });
  await knex.raw(
    "alter table import_files add constraint import_files_status_check check (status in ('pending','working','imported','duplicate','rejected'))",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('import_files');
  await knex.schema.dropTable('imports');
}
