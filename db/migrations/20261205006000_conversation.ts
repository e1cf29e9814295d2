import type { Knex } from 'knex';

/**
 * What the runner says reaches the coach (issue 16): who has opened which note, and notes flagged as about
 * pain or illness.
 */
export async function up(knex: Knex): Promise<void> {
  for (const table of ['run_notes', 'week_notes']) {
    await knex.schema.alterTable(table, (t) => {
      t.text('concern').nullable().checkIn(['pain', 'illness']);
    });
  }
  // One row per note a user has opened. Note ids are random UUIDs in both note tables, so one id column serves both.
  await knex.schema.createTable('note_reads', (t) => {
    t.uuid('note_id').notNullable();
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.timestamp('read_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['user_id', 'note_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('note_reads');
  for (const table of ['run_notes', 'week_notes']) {
    await knex.schema.alterTable(table, (t) => {
      t.dropColumn('concern');
    });
  }
}
